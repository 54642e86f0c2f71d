import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when the spec sets a slew rate: the transient's largest rate on the differential output at the slowest corner.
testRuleCases('slew-rate', { severity: 'blocking', marginUnit: 'V/s' }, [
  {
    title: 'passes within the target, naming the corner',
    overrides: {},
    passed: true,
    margin: 4500000.0,
    texts: ['9.5 MV/s', 'ICM −1.5 V, −40 °C', '5 MV/s required', '4.5 MV/s to spare'],
  },
  {
    title: 'fails past the target, saying by how much and what moves it',
    overrides: { slewRateWorstVPerS: 3e6, slewRateMarginVPerS: -2e6 },
    passed: false,
    margin: -2000000.0,
    texts: ['3 MV/s', '2 MV/s short of the 5 MV/s required', '2·Itail/CL'],
  },
  {
    title: 'is not checked when the spec leaves the target out',
    overrides: { slewRateTargetSet: false, slewRateWorstVPerS: null, slewRateMinVPerS: null, slewRateMarginVPerS: null, slewRateCorner: '' },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no slew rate'],
  },
]);
