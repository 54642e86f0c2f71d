import { testRuleCases } from '../../helpers/rule-cases';

// Advisory caution for patient-connected inputs, deferring to IEC 60601-1.
testRuleCases('patient-connected', { severity: 'advisory' }, [
  {
    title: 'passes when not patient-connected',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['not mark the input as patient-connected'],
  },
  {
    title: 'cautions when patient-connected',
    overrides: { patientConnected: true },
    passed: false,
    margin: null,
    texts: ['Caution', 'IEC 60601-1', 'leakage-current', 'local codes and licensed practice'],
  },
]);
