import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: worst-corner supply power within the budget.
testRuleCases('power-budget', { severity: 'blocking', marginUnit: 'W' }, [
  {
    title: 'passes with 21.6 mW to spare',
    overrides: {},
    passed: true,
    margin: 0.0216,
    texts: ['28.4 mW', '50 mW budget', '21.6 mW to spare'],
  },
  {
    title: 'fails 11.2 mW over',
    overrides: { powerWorstW: 0.0612, powerMarginW: -0.0112 },
    passed: false,
    margin: -0.0112,
    texts: ['61.2 mW', 'exceeds the 50 mW budget by 11.2 mW'],
  },
]);
