import { testRuleCases } from '../../helpers/rule-cases';

// Advisory: the gain over the four corners (input common mode × temperature) against the tolerance;
// the gain of a bipolar pair goes as IC/VT (common practice), so it moves with temperature.
testRuleCases('gain-over-conditions', { severity: 'advisory', marginUnit: '%' }, [
  {
    title: 'passes 6.2 % off at the worst corner',
    overrides: {},
    passed: true,
    margin: 3.8,
    texts: ['±5 %', '−6.2 % off at ICM 2 V, 85 °C', '3.8 % to spare'],
  },
  {
    title: 'notes 13.5 % off at the hot corner',
    overrides: { gainWorstCornerErrorPercent: -13.5, gainOverConditionsMarginPercent: -3.5, gainWorstCorner: 'ICM −1 V, 70 °C' },
    passed: false,
    margin: -3.5,
    texts: ['−13.5 % off at ICM −1 V, 70 °C', '3.5 % beyond', 'IC/VT'],
  },
]);
