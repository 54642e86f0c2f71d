import { testRuleCases } from '../../helpers/rule-cases';

// Advisory, differential output only: mismatch-limited worst-case CMRR against the requirement.
testRuleCases('cmrr-differential-worst-case', { severity: 'advisory', marginUnit: 'dB' }, [
  {
    title: 'passes with 21.5 dB to spare',
    overrides: {},
    passed: true,
    margin: 21.5,
    texts: ['101.5 dB', 'at 1 kHz', '80 dB required', '21.5 dB to spare', 'by mismatch: load resistors 58 %'],
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
    title: 'passes at 136.4 dB and says the figure is limited only by the model',
    overrides: {
      cmrrDifferentialWorstCaseDb: 136.4,
      cmrrDifferentialWorstCaseMarginDb: 56.4,
      cmrrDifferentialLimitNote: 'Shares of the worst-case common-mode gain by mismatch: Early voltage 90 %, load resistors 10 %, VBE 0 %, beta 0 %. Limited only by the model: above 120 dB, effects it leaves out usually set the real figure.',
    },
    passed: true,
    margin: 56.4,
    texts: ['136.4 dB', 'Early voltage 90 %', 'Limited only by the model'],
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
