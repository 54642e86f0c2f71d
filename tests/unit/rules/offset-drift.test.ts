import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a drift limit: the offset's drift at the spec's sigmas.
testRuleCases('offset-drift', { severity: 'blocking', marginUnit: 'V/°C' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 6e-06,
    texts: ['4 µV/°C at 3 σ', 'worst case 6.3 µV/°C', '10 µV/°C limit', '6 µV/°C to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { offsetDriftAtSigmasVPerC: 12e-6, offsetDriftMarginVPerC: -2e-6 },
    passed: false,
    margin: -2e-06,
    texts: ['12 µV/°C at 3 σ', '2 µV/°C above the 10 µV/°C limit', 'offset/T'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { driftTargetSet: false, offsetDriftAtSigmasVPerC: null, offsetDriftWorstCaseVPerC: null, offsetDriftMaxVPerC: null, offsetDriftMarginVPerC: null },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no offset drift limit'],
  },
]);
