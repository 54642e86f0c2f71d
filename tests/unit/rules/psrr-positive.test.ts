import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a positive-rail rejection: for the spec's output, at the worst corner.
testRuleCases('psrr-positive', { severity: 'blocking', marginUnit: 'dB' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 12,
    texts: ['72 dB', 'differential output', 'ICM 1.5 V, 85 °C', '60 dB required', '12 dB to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { psrrPositiveDb: 55.5, psrrPositiveMarginDb: -4.5 },
    passed: false,
    margin: -4.5,
    texts: ['55.5 dB', '4.5 dB short of the 60 dB required', 'through its load'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { psrrPositiveTargetSet: false, psrrPositiveDb: null, psrrPositiveMinDb: null, psrrPositiveMarginDb: null, psrrPositiveCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no positive-rail rejection'],
  },
]);
