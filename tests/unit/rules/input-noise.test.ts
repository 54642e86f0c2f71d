import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a noise limit: input-referred noise at the spec's frequency, at the worst corner.
testRuleCases('input-noise', { severity: 'blocking', marginUnit: 'V/√Hz' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 1.8e-09,
    texts: ['6.2 nV/√Hz', '1 kHz', 'ICM −1.5 V, 85 °C', '8 nV/√Hz', '1.8 nV/√Hz to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { noiseVPerRtHz: 9.1e-9, noiseMarginVPerRtHz: -1.1e-9 },
    passed: false,
    margin: -1.1e-09,
    texts: ['9.1 nV/√Hz', '1.1 nV/√Hz above the 8 nV/√Hz limit', '1/√I'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { noiseTargetSet: false, noiseVPerRtHz: null, noiseMaxVPerRtHz: null, noiseFrequencyHz: null, noiseMarginVPerRtHz: null, noiseCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no noise limit'],
  },
]);
