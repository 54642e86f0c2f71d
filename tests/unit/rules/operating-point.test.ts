import { testRuleCases } from '../../helpers/rule-cases';

// Blocking: no transistor saturated or cut off at any corner; lists them on fail.
testRuleCases('operating-point', { severity: 'blocking' }, [
  {
    title: 'passes with every transistor forward-active',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['forward-active'],
  },
  {
    title: 'fails and lists two problems',
    overrides: {
      operatingPointProblems: ['Q4 saturated at ICM −2 V, −40 °C', 'Q2 saturated at ICM 2 V, 85 °C'],
      operatingPointProblemCount: 2,
    },
    passed: false,
    margin: null,
    texts: ['(2 found)', 'Q4 saturated at ICM −2 V, −40 °C; Q2 saturated at ICM 2 V, 85 °C'],
  },
]);
