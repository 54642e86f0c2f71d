import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: the output swing fits at the nominal input common mode.
testRuleCases('output-swing', { severity: 'blocking', marginUnit: 'V' }, [
  {
    title: 'passes with 2.4 V to spare',
    overrides: {},
    passed: true,
    margin: 2.4,
    texts: ['4 Vpp differential output swing', '1 V peak per collector', '2.4 V to spare'],
  },
  {
    title: 'fails 600 mV short',
    overrides: { outputSwingVpp: 16, swingPeakPerCollectorV: 4, swingMarginV: -0.6 },
    passed: false,
    margin: -0.6,
    texts: ['16 Vpp', '4 V peak per collector', '600 mV short'],
  },
]);
