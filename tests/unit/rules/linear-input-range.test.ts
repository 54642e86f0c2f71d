import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a linear input range: the 1 % point of the DC transfer at the worst corner.
testRuleCases('linear-input-range', { severity: 'blocking', marginUnit: 'V' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 0.01,
    texts: ['60 mV of differential input', 'ICM 1.5 V, −40 °C', '50 mV required', '10 mV to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { linearInputRangeWorstV: 0.009, linearInputRangeMarginV: -0.041 },
    passed: false,
    margin: -0.041,
    texts: ['9 mV of differential input', '41 mV short of the 50 mV required', 'degeneration'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { linearRangeTargetSet: false, linearInputRangeWorstV: null, linearInputRangeMinV: null, linearInputRangeMarginV: null, linearRangeCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no linear input range'],
  },
]);
