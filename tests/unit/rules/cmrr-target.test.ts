import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: single-ended (tail-limited) CMRR at the spec frequency, worst corner, against required + margin.
testRuleCases('cmrr-target', { severity: 'blocking', marginUnit: 'dB' }, [
  {
    title: 'passes with 8.2 dB to spare',
    overrides: {},
    passed: true,
    margin: 8.2,
    texts: ['94.2 dB', 'at 1 kHz', 'ICM −2 V, 85 °C', '80 dB required + 6 dB margin', '8.2 dB to spare'],
    thinMargin: false,
  },
  // A thin margin: passing by under 1 dB at the governing corner is flagged; 1 dB and more is not.
  {
    title: 'passes 0.9 dB above target + margin, flagged as a thin margin',
    overrides: { cmrrAtFrequencyDb: 86.9, cmrrMarginDb: 0.9 },
    passed: true,
    margin: 0.9,
    texts: ['86.9 dB', '0.9 dB to spare'],
    thinMargin: true,
  },
  {
    title: 'passes exactly 1 dB above target + margin, not flagged',
    overrides: { cmrrAtFrequencyDb: 87, cmrrMarginDb: 1 },
    passed: true,
    margin: 1,
    texts: ['1 dB to spare'],
    thinMargin: false,
  },
  {
    title: 'fails 2.9 dB short at DC',
    overrides: { cmrrAtFrequencyDb: 83.1, cmrrMarginDb: -2.9, cmrrFrequencyHz: 0 },
    passed: false,
    margin: -2.9,
    texts: ['83.1 dB', 'at DC', '2.9 dB short'],
    thinMargin: false,
  },
]);
