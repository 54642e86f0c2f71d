import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets an offset limit: the statistical offset at the spec's sigmas, worst case beside it.
testRuleCases('input-offset', { severity: 'blocking', marginUnit: 'V' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 0.0008,
    texts: ['1.2 mV at 3 σ', 'worst case 1.9 mV', 'ICM 1.5 V, 85 °C', '2 mV limit', '800 µV to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { offsetAtSigmasV: 2.5e-3, offsetMarginV: -0.5e-3 },
    passed: false,
    margin: -0.0005,
    texts: ['2.5 mV at 3 σ', '500 µV above the 2 mV limit'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { offsetTargetSet: false, offsetAtSigmasV: null, offsetWorstCaseV: null, offsetMaxV: null, offsetMarginV: null, offsetCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no offset limit'],
  },
]);
