import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: nominal gain within the spec tolerance.
testRuleCases('gain-tolerance', { severity: 'blocking', marginUnit: '%' }, [
  {
    title: 'passes 1.4 % off within ±5 %',
    overrides: {},
    passed: true,
    margin: 3.6,
    texts: ['differential output', '98.6 V/V', '100 V/V', '−1.4 %', '±5 %', '3.6 % to spare'],
  },
  {
    title: 'fails 7.7 % off',
    overrides: { gainPredicted: 92.3, gainErrorPercent: -7.7, gainMarginPercent: -2.7 },
    passed: false,
    margin: -2.7,
    texts: ['92.3 V/V', '−7.7 %', 'outside ±5 % by 2.7 %'],
  },
]);
