import { testRuleCases } from '../../helpers/rule-cases';

// Blocking when a target bounds the tail current: the window the targets leave must not be empty.
testRuleCases('tail-current-window', { severity: 'blocking', marginUnit: undefined }, [
  {
    title: 'passes with a window, saying what set the current and each bound',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['Tail current 431 µA, set by the input bias-current limit', '≥ 9.03 µA for the noise limit'],
  },
  {
    title: 'fails when a floor lies above a ceiling, naming the two requirements and what to change',
    overrides: { tailCurrentWindowEmpty: true, tailCurrentWindowNote: 'No tail current meets every target: the slew-rate target needs 1.2 mA or more, the input bias-current limit allows 400 µA at most.' },
    passed: false,
    margin: null,
    texts: ['the slew-rate target needs 1.2 mA or more', 'the input bias-current limit allows 400 µA at most', 'Relax one of the two requirements'],
  },
  {
    title: 'is not checked when no target bounds the current',
    overrides: { tailCurrentWindowSet: false, tailCurrentWindowEmpty: false },
    passed: true,
    margin: null,
    applicable: false,
    texts: ['Not checked', 'no target of the spec bounds the tail current'],
  },
]);
