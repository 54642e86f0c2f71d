import { testRuleCases } from '../../helpers/rule-cases';

// Blocking, differential output only: Monte Carlo yield against the required yield.
testRuleCases('cmrr-yield', { severity: 'blocking', marginUnit: '%' }, [
  {
    title: 'passes with 4.2 points to spare',
    overrides: {},
    passed: true,
    margin: 4.2,
    texts: ['99.2 %', '2000 Monte Carlo samples', '80 dB', '95 % yield required', '4.2 % to spare'],
  },
  {
    title: 'fails 3.5 points short',
    overrides: { monteCarloYieldPercent: 91.5, yieldMarginPercent: -3.5 },
    passed: false,
    margin: -3.5,
    texts: ['Only 91.5 %', '2000', '95 % yield required', '3.5 % short'],
  },
  {
    title: 'is not applicable to a single-ended output',
    overrides: {
      output: 'single-ended',
      isDifferentialOutput: false,
      cmrrDifferentialWorstCaseDb: null,
      cmrrDifferentialWorstCaseMarginDb: null,
      monteCarloYieldPercent: null,
      yieldMarginPercent: null,
    },
    passed: true,
    margin: null,
    texts: ['Not applicable', 'single-ended'],
  },
]);
