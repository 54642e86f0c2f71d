import { testRuleCases } from '../../helpers/rule-cases';

// Advisory, differential output only: the common mode each collector still carries at the spec
// frequency, against the differential signal, compared with the required rejection: what the
// next stage's input has to take and reject.
testRuleCases('output-common-mode', { severity: 'advisory', marginUnit: 'dB' }, [
  {
    title: 'passes when the common mode left at each collector is 100.2 dB below the signal (20.2 dB to spare)',
    overrides: {},
    passed: true,
    margin: 20.2,
    applicable: true,
    texts: ['0.000964 V/V of the input common mode', 'at 1 kHz', 'ICM −2 V, 85 °C', '100.2 dB below the differential signal', '80 dB required', '20.2 dB to spare'],
  },
  {
    title: 'fails, as advice, when each collector carries 0.0437 V/V at 100 kHz (58 dB) against 60 dB required',
    overrides: { cmrrFrequencyHz: 100e3, cmrrRequiredDb: 60, outputCommonModeGain: 0.0437, outputCommonModeRejectionDb: 58, outputCommonModeMarginDb: -2 },
    passed: false,
    margin: -2,
    applicable: true,
    texts: ['0.0437 V/V', 'at 100 kHz', 'only 58 dB below the differential signal', 'reject at least 2 dB more of it on its own'],
  },
  {
    title: 'does not apply to a single-ended output, whatever the figure',
    overrides: { output: 'single-ended', isDifferentialOutput: false, outputCommonModeMarginDb: -30 },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not applicable', 'single-ended output'],
  },
]);
