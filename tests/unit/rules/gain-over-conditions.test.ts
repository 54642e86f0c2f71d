import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: the spec states its gain tolerance over its temperature and input common-mode range,
// so the gain at every corner (input common mode × temperature) must stay within it. A bipolar
// pair's gain goes as IC/VT [GM], so it moves with temperature unless the tail current does too.
const TEMPERATURE_REMEDY = 'pair emitter degeneration (the gain then rests on RC/RE more than on IC/VT) or a tail current that rises with temperature (proportional to absolute temperature, as from a ΔVBE cell)';

testRuleCases('gain-over-conditions', { severity: 'blocking', marginUnit: '%' }, [
  {
    title: 'passes 4.9 % off at the worst corner of ±5 % (0.1 % to spare)',
    overrides: { gainTolerancePercent: 5, gainWorstCornerErrorPercent: -4.9, gainOverConditionsMarginPercent: 0.1 },
    passed: true,
    margin: 0.1,
    texts: ['±5 %', '−4.9 % off at ICM 2 V, 85 °C', '0.1 % to spare'],
  },
  {
    title: 'blocks 5.1 % off at the hot corner of ±5 %, naming the corner and the remedy for temperature',
    overrides: { gainTolerancePercent: 5, gainWorstCornerErrorPercent: -5.1, gainOverConditionsMarginPercent: -0.1, gainWorstCorner: 'ICM −1 V, 85 °C' },
    passed: false,
    margin: -0.1,
    texts: ['100 V/V ±5 %', 'at ICM −1 V, 85 °C the gain is −5.1 % off, 0.1 % beyond', 'the temperature moves the gain most', TEMPERATURE_REMEDY],
  },
  {
    // The case: 50 V/V ±5 % over −40…85 °C, 64.6 to 42.5 V/V: +29.2 % at the cold corner.
    title: 'blocks 64.6 V/V against 50 V/V ±5 % at the cold corner',
    overrides: { gainTarget: 50, gainTolerancePercent: 5, gainWorstCornerErrorPercent: 29.2, gainOverConditionsMarginPercent: -24.2, gainWorstCorner: 'ICM 0 V, −40 °C' },
    passed: false,
    margin: -24.2,
    texts: ['50 V/V ±5 %', 'the gain is 29.2 % off', '24.2 % beyond', 'ICM 0 V, −40 °C'],
  },
  {
    title: 'blocks a resistor tail governed by the input common mode, naming a current-source tail as the remedy',
    overrides: {
      gainTolerancePercent: 5,
      gainWorstCornerErrorPercent: 7,
      gainOverConditionsMarginPercent: -2,
      gainOverConditionsCause: 'input common mode',
      gainOverConditionsRemedy: 'a current-source tail instead of the resistor (the tail current then stops following the input common mode)',
    },
    passed: false,
    margin: -2,
    texts: ['the input common mode moves the gain most', 'a current-source tail instead of the resistor'],
  },
]);
