import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: pair out of saturation at the highest input common mode with the swing.
testRuleCases('input-common-mode-high', { severity: 'blocking', marginUnit: 'V' }, [
  {
    title: 'passes with 1.35 V to spare',
    overrides: {},
    passed: true,
    margin: 1.35,
    texts: ['2 V', '1.35 V to spare'],
  },
  {
    title: 'fails 450 mV short',
    overrides: { icmHighV: 6, icmHighMarginV: -0.45 },
    passed: false,
    margin: -0.45,
    texts: ['6 V', 'saturates', '450 mV short'],
  },
]);
