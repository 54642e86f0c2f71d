import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: the swing's peak on the pair's large-signal transfer, compression within the spec's limit.
testRuleCases('output-swing-compression', { severity: 'advisory', marginUnit: '%' }, [
  {
    title: 'passes 1.2 % compressed against a 4 % limit',
    overrides: {},
    passed: true,
    margin: 2.8,
    texts: ['4 Vpp differential', 'compressed 1.2 %', '2.8 % to spare'],
  },
  {
    title: 'fails 15.3 % compressed (1.18 times the linear input)',
    overrides: { swingCompressionPercent: 15.3, swingCompressionMarginPercent: -11.3, swingPeakInputV: 0.0236, swingLinearInputV: 0.02 },
    passed: false,
    margin: -11.3,
    texts: ['compressed 15.3 %', '11.3 % beyond the', '20 mV'],
  },
]);
