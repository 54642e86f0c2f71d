import { testRuleCases } from '../../helpers/rule-cases';

// Advisory: tail-current change over the spec temperature range against its limit.
testRuleCases('tail-current-drift', { severity: 'advisory', marginUnit: '%' }, [
  {
    title: 'passes with 7.9 points to spare',
    overrides: {},
    passed: true,
    margin: 7.9,
    texts: ['2.1 %', 'from −40 °C to 85 °C', '10 % limit', '7.9 % to spare'],
  },
  {
    title: 'fails 3.4 points over',
    overrides: { tailCurrentDriftPercent: 13.4, tailCurrentDriftMarginPercent: -3.4 },
    passed: false,
    margin: -3.4,
    texts: ['13.4 %', '3.4 % beyond the 10 % limit'],
  },
]);
