import { testRuleCases } from '../../helpers/rule-cases';

// Advisory caution: rail span above the usual 60 V DC safe-to-touch limit [IEC 62368-1].
testRuleCases('hazardous-voltage', { severity: 'advisory', marginUnit: 'V' }, [
  {
    title: 'passes at 24 V',
    overrides: {},
    passed: true,
    margin: 36,
    texts: ['24 V', '60 V DC'],
  },
  {
    title: 'passes at exactly the limit',
    overrides: { railSpanV: 60, hazardousVoltageMarginV: 0 },
    passed: true,
    margin: 0,
    texts: ['60 V, within'],
  },
  {
    title: 'cautions at 70 V',
    overrides: { railSpanV: 70, hazardousVoltageMarginV: -10 },
    passed: false,
    margin: -10,
    texts: ['Caution', 'rails span 70 V', '10 V above the 60 V DC', 'IEC 62368-1', 'applicable standard, local codes and licensed practice'],
  },
]);
