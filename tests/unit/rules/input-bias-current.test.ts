import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a bias-current limit: the mean input current at the worst corner.
testRuleCases('input-bias-current', { severity: 'blocking', marginUnit: 'A' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 9e-07,
    texts: ['2.1 µA per input', 'ICM 1.5 V, −40 °C', '3 µA limit', '900 nA to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { inputBiasCurrentWorstA: 3.4e-6, inputBiasCurrentMarginA: -0.4e-6 },
    passed: false,
    margin: -4e-07,
    texts: ['3.4 µA per input', '400 nA above the 3 µA limit', 'current gain'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { inputBiasTargetSet: false, inputBiasCurrentWorstA: null, inputBiasCurrentMaxA: null, inputBiasCurrentMarginA: null, inputBiasCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no input bias current limit'],
  },
]);
