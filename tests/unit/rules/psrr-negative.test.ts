import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a negative-rail rejection: for the spec's output, at the worst corner.
testRuleCases('psrr-negative', { severity: 'blocking', marginUnit: 'dB' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 21,
    texts: ['81 dB', 'ICM −1.5 V, −40 °C', '60 dB required', '21 dB to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { psrrNegativeDb: 52, psrrNegativeMarginDb: -8 },
    passed: false,
    margin: -8,
    texts: ['52 dB', '8 dB short of the 60 dB required', 'output resistance'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { psrrNegativeTargetSet: false, psrrNegativeDb: null, psrrNegativeMinDb: null, psrrNegativeMarginDb: null, psrrNegativeCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no negative-rail rejection'],
  },
]);
