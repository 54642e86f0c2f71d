import { testRuleCases } from '../../helpers/rule-cases';

// Advisory caution for patient-connected inputs, deferring to IEC 60601-1.
testRuleCases('patient-connected', { severity: 'advisory' }, [
  {
    title: 'does not apply (n/a, never "holds") when not patient-connected',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['Not applicable', 'not mark the input as patient-connected'],
    applicable: false,
  },
  {
    title: 'cautions when patient-connected',
    overrides: { patientConnected: true },
    passed: false,
    margin: null,
    applicable: true,
    texts: ['Caution', 'IEC 60601-1', 'leakage-current', 'local codes and licensed practice'],
  },
]);
