import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: headroom at the lowest input common mode (an NPN stage: the tail source's compliance;
// a PNP stage, the mirror image: the pair out of saturation with the swing's positive peak).
testRuleCases('input-common-mode-low', { severity: 'blocking', marginUnit: 'V' }, [
  {
    title: 'passes with 850 mV of headroom',
    overrides: {},
    passed: true,
    margin: 0.85,
    texts: ['−2 V', "850 mV of the tail source's compliance headroom remains"],
  },
  {
    title: 'fails 320 mV short',
    overrides: { icmLowV: -4, icmLowMarginV: -0.32 },
    passed: false,
    margin: -0.32,
    texts: ['−4 V', '320 mV short', 'too close to the negative rail'],
  },
  {
    title: 'a PNP stage fails 150 mV short: its pair saturates',
    overrides: { icmLowV: -7, icmLowMarginV: -0.15, icmLowHeadroom: "the pair's collector headroom with the output swing's positive peak", icmLowShortfall: 'the pair saturates' },
    passed: false,
    margin: -0.15,
    texts: ['−7 V', 'positive peak is 150 mV short', 'the pair saturates'],
  },
]);
