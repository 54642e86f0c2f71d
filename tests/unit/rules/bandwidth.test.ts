import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a bandwidth: the differential bandwidth at the worst corner.
testRuleCases('bandwidth', { severity: 'blocking', marginUnit: 'Hz' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 1400000.0,
    texts: ['2.4 MHz', 'ICM −1.5 V, 85 °C', '1 MHz required', '1.4 MHz to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { bandwidthWorstHz: 0.7e6, bandwidthMarginHz: -0.3e6 },
    passed: false,
    margin: -300000.0,
    texts: ['700 kHz', '300 kHz short of the 1 MHz required', 'tail current'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { bandwidthTargetSet: false, bandwidthWorstHz: null, bandwidthMinHz: null, bandwidthMarginHz: null, bandwidthCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no bandwidth'],
  },
]);
