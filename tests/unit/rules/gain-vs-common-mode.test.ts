import { testRuleCases } from '../../helpers/rule-cases';

// Blocking, resistor tail only: gain change between the input common-mode extremes.
testRuleCases('gain-vs-common-mode', { severity: 'blocking', marginUnit: '%' }, [
  {
    title: 'passes a resistor tail with 1.7 points to spare',
    overrides: { topology: 'resistor', isResistorTail: true },
    passed: true,
    margin: 1.7,
    texts: ['resistor tail', '0.3 %', 'between input common mode −2 V and 2 V', '1.7 % to spare'],
  },
  {
    title: 'fails a resistor tail 1.8 points over',
    overrides: { topology: 'resistor', isResistorTail: true, gainVsCommonModePercent: 3.8, gainVsCommonModeMarginPercent: -1.8 },
    passed: false,
    margin: -1.8,
    texts: ['3.8 %', '1.8 % beyond the ±2 % gain tolerance'],
  },
  {
    title: 'is not applicable to a mirror tail',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['Not applicable', 'degenerated-mirror tail'],
  },
]);
