import { testRuleCases } from '../../helpers/rule-cases';

// Advisory, differential output only: mismatch-limited worst-case CMRR against the requirement.
testRuleCases('cmrr-differential-worst-case', { severity: 'advisory', marginUnit: 'dB' }, [
  {
    title: 'passes with 21.5 dB to spare',
    overrides: {},
    passed: true,
    margin: 21.5,
    texts: ['101.5 dB', 'at 1 kHz', '80 dB required', '21.5 dB to spare'],
  },
  {
    title: 'fails 3.6 dB short',
    overrides: { cmrrDifferentialWorstCaseDb: 76.4, cmrrDifferentialWorstCaseMarginDb: -3.6 },
    passed: false,
    margin: -3.6,
    texts: ['76.4 dB', '3.6 dB short'],
    thinMargin: false,
  },
  {
    title: 'passes 0.4 dB above the requirement, flagged as a thin margin',
    overrides: { cmrrDifferentialWorstCaseDb: 80.4, cmrrDifferentialWorstCaseMarginDb: 0.4 },
    passed: true,
    margin: 0.4,
    texts: ['80.4 dB', '0.4 dB to spare'],
    thinMargin: true,
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
    thinMargin: false,
  },
]);
