import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: headroom at the highest input common mode (an NPN stage: the pair out of saturation
// with the swing's negative peak; a PNP stage, the mirror image: the tail source's compliance).
testRuleCases('input-common-mode-high', { severity: 'blocking', marginUnit: 'V' }, [
  {
    title: 'passes with 1.35 V to spare',
    overrides: {},
    passed: true,
    margin: 1.35,
    texts: ['2 V', "1.35 V of the pair's collector headroom with the output swing's negative peak remains"],
  },
  {
    title: 'fails 450 mV short',
    overrides: { icmHighV: 6, icmHighMarginV: -0.45 },
    passed: false,
    margin: -0.45,
    texts: ['6 V', 'saturates', '450 mV short'],
  },
  {
    title: 'a PNP stage fails 300 mV short of tail compliance, towards the positive rail',
    overrides: { icmHighV: 8, icmHighMarginV: -0.3, icmHighHeadroom: "the tail source's compliance headroom", icmHighShortfall: 'the tail node sits too close to the positive rail' },
    passed: false,
    margin: -0.3,
    texts: ['8 V', "the tail source's compliance headroom is 300 mV short", 'too close to the positive rail'],
  },
]);
