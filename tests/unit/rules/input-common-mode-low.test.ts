import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: tail compliance at the lowest input common-mode voltage.
testRuleCases('input-common-mode-low', { severity: 'blocking', marginUnit: 'V' }, [
  {
    title: 'passes with 850 mV of headroom',
    overrides: {},
    passed: true,
    margin: 0.85,
    texts: ['−2 V', '850 mV of compliance headroom'],
  },
  {
    title: 'fails 320 mV short',
    overrides: { icmLowV: -4, icmLowMarginV: -0.32 },
    passed: false,
    margin: -0.32,
    texts: ['−4 V', '320 mV short'],
  },
]);
