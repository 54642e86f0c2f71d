import { describe, expect, test } from 'vitest';
import gatedRule from '../../../rules/cmrr-differential-worst-case.json';
import plainRule from '../../../rules/cmrr-target.json';
import { ruleProblems, validateRule } from '../../../rules/validate-rule';

// The rule-file format (DEVELOPERS.md "Adding a rule"; json-rules-engine 7's condition shape and
// built-in operators): one broken part at a time, each giving exactly its own problem.

type Json = Record<string, unknown>;
const LEAF = { fact: 'cmrrMarginDb', operator: 'greaterThanInclusive', value: 0 };

/** A copy of a shipped rule with one change. */
function changed(base: object, change: (rule: Json & { event: { params: Json } }) => void): unknown {
  const rule = structuredClone(base) as Json & { event: { params: Json } };
  change(rule);
  return rule;
}

describe('ruleProblems', () => {
  test('the shipped rules used as bases are valid', () => {
    expect(ruleProblems(plainRule, 'cmrr-target')).toEqual([]);
    expect(ruleProblems(gatedRule, 'cmrr-differential-worst-case')).toEqual([]);
  });

  test.each([[null], [[]], ['rule']])('%j is not a rule', (rule) => {
    expect(ruleProblems(rule)).toEqual(['/: must be an object']);
  });

  test.each([
    ['an unknown top-level key', (r: Json) => (r.extra = 1), ['/: unexpected key "extra"']],
    ['an unknown kind', (r: Json) => (r.kind = 'fatal'), ['/kind: must be "blocking", "advisory" or "caution", got "fatal"']],
    ['a name not in kebab case', (r: Json) => (r.name = 'CMRR_Target'), ['/name: must be kebab-case, got "CMRR_Target"']],
    ['a name with a doubled hyphen', (r: Json) => (r.name = 'cmrr--target'), ['/name: must be kebab-case, got "cmrr--target"']],
    ['a name with a leading mark', (r: Json) => (r.name = '!cmrr'), ['/name: must be kebab-case, got "!cmrr"']],
    ['a name with a trailing mark', (r: Json) => (r.name = 'cmrr!'), ['/name: must be kebab-case, got "cmrr!"']],
    ['a numeric name', (r: Json) => (r.name = 5), ['/name: must be kebab-case, got 5']],
    ['no conditions', (r: Json) => delete r.conditions, ['/conditions: must hold "all", "any" or "not"']],
    ['conditions of another kind', (r: Json) => (r.conditions = { some: [LEAF] }), ['/conditions: must hold "all", "any" or "not"']],
    ['conditions as an array', (r: Json) => (r.conditions = [LEAF]), ['/conditions: must hold "all", "any" or "not"']],
    ['a boolean node with a second key', (r: Json) => (r.conditions = { all: [LEAF], priority: 1 }), ['/conditions: a boolean node holds only "all"']],
    ['an empty "all"', (r: Json) => (r.conditions = { all: [] }), ['/conditions/all: must be a non-empty array']],
    ['an "any" that is no array', (r: Json) => (r.conditions = { any: LEAF }), ['/conditions/any: must be a non-empty array']],
    ['a "not" of a number', (r: Json) => (r.conditions = { not: 5 }), ['/conditions/not: must be an object']],
    ['a child that is no object', (r: Json) => (r.conditions = { all: [LEAF, 5] }), ['/conditions/all/1: must be an object']],
    ['a leaf with an extra key', (r: Json) => (r.conditions = { all: [{ ...LEAF, path: '$.x' }] }), ['/conditions/all/0: unexpected key "path"']],
    ['an unknown fact', (r: Json) => (r.conditions = { all: [{ ...LEAF, fact: 'cmrrDb' }] }), ['/conditions/all/0/fact: unknown fact "cmrrDb"']],
    ['a fact that is no string', (r: Json) => (r.conditions = { all: [{ ...LEAF, fact: 3 }] }), ['/conditions/all/0/fact: unknown fact 3']],
    ['an unknown operator', (r: Json) => (r.conditions = { all: [{ ...LEAF, operator: 'atLeast' }] }), ['/conditions/all/0/operator: unknown operator "atLeast"']],
    ['a leaf without a value', (r: Json) => (r.conditions = { all: [{ fact: 'cmrrMarginDb', operator: 'greaterThan' }] }), ['/conditions/all/0/value: required']],
    ['a value naming an unknown fact', (r: Json) => (r.conditions = { all: [{ ...LEAF, value: { fact: 'nope' } }] }), ['/conditions/all/0/value: unknown fact "nope"']],
    ['no event', (r: Json) => delete r.event, ['/event: must be { "type": string, "params": object }']],
    ['an event type that is no string', (r: Json & { event: Json }) => (r.event.type = 1), ['/event: must be { "type": string, "params": object }']],
    ['event params as an array', (r: Json & { event: Json }) => (r.event.params = []), ['/event: must be { "type": string, "params": object }']],
    ['an extra event key', (r: Json & { event: Json }) => (r.event.priority = 1), ['/event: unexpected key "priority"']],
  ])('%s', (_name, change, expected) => {
    expect(ruleProblems(changed(plainRule, change as (r: Json) => void))).toEqual(expected);
  });

  test.each([
    ['a value naming a known fact', { all: [{ ...LEAF, value: { fact: 'cmrrRequiredDb' } }] }],
    ['a "not" of a leaf', { not: LEAF }],
    ['nested boolean nodes', { all: [{ any: [LEAF, { not: LEAF }] }] }],
    ['every built-in comparing operator', { all: ['equal', 'notEqual', 'lessThan', 'lessThanInclusive', 'greaterThan', 'greaterThanInclusive', 'in', 'notIn', 'contains', 'doesNotContain'].map((operator) => ({ ...LEAF, operator })) }],
  ])('valid: %s', (_name, conditions) => {
    expect(ruleProblems(changed(plainRule, (r) => (r.conditions = conditions)))).toEqual([]);
  });

  test('a name that differs from its file is named with both', () => {
    expect(ruleProblems(plainRule, 'cmrr-goal')).toEqual(['/name: "cmrr-target" differs from the file name "cmrr-goal"']);
  });
});

describe('ruleProblems: event params', () => {
  const P = '/event/params';
  test.each([
    ['an unknown key', (p: Json) => (p.colour = 'red'), [`${P}: unexpected key "colour"`]],
    ['a severity in the params (it is the rule\u2019s kind)', (p: Json) => (p.severity = 'blocking'), [`${P}: unexpected key "severity"`]],
    ['a unit without a margin fact', (p: Json) => ((p.marginFact = null), delete p.thinMarginBelow), [`${P}/marginUnit: must be null when marginFact is null`]],
    ['a text fact as the margin', (p: Json) => (p.marginFact = 'topology'), [`${P}/marginFact: must be a numeric fact or null, got "topology"`]],
    ['an unknown margin fact', (p: Json) => (p.marginFact = 'nope'), [`${P}/marginFact: must be a numeric fact or null, got "nope"`]],
    ['an empty unit', (p: Json) => (p.marginUnit = ''), [`${P}/marginUnit: must be a unit string`]],
    ['a numeric unit', (p: Json) => (p.marginUnit = 3), [`${P}/marginUnit: must be a unit string`]],
    ['a zero thin-margin bound', (p: Json) => (p.thinMarginBelow = 0), [`${P}/thinMarginBelow: must be a positive number`]],
    ['a negative thin-margin bound', (p: Json) => (p.thinMarginBelow = -1), [`${P}/thinMarginBelow: must be a positive number`]],
    ['an infinite thin-margin bound', (p: Json) => (p.thinMarginBelow = Infinity), [`${P}/thinMarginBelow: must be a positive number`]],
    ['a textual thin-margin bound', (p: Json) => (p.thinMarginBelow = '1'), [`${P}/thinMarginBelow: must be a positive number`]],
    ['a thin-margin bound without a margin', (p: Json) => ((p.marginFact = null), (p.marginUnit = null)), [`${P}/thinMarginBelow: needs a marginFact`]],
    ['an empty pass reason', (p: Json) => (p.passReason = ''), [`${P}/passReason: must be a non-empty string`]],
    ['a blank fail reason', (p: Json) => (p.failReason = '   '), [`${P}/failReason: must be a non-empty string`]],
    ['a numeric fail reason', (p: Json) => (p.failReason = 5), [`${P}/failReason: must be a non-empty string`]],
    ['a stray brace in a reason', (p: Json) => (p.passReason = 'CMRR {'), [`${P}/passReason: malformed placeholder (stray brace)`]],
    ['a not-applicable reason without a gate', (p: Json) => (p.notApplicableReason = 'n/a'), [`${P}/notApplicableReason: only with appliesWhen`]],
  ])('%s', (_name, change, expected) => {
    expect(ruleProblems(changed(plainRule, (r) => (change as (p: Json) => void)(r.event.params)))).toEqual(expected);
  });

  test.each([
    ['no margin at all', (p: Json) => ((p.marginFact = null), (p.marginUnit = null), delete p.thinMarginBelow)],
    ['a margin fact that may be null', (p: Json) => (p.marginFact = 'yieldMarginPercent')],
    ['a small positive thin-margin bound', (p: Json) => (p.thinMarginBelow = 0.01)],
  ])('valid: %s', (_name, change) => {
    expect(ruleProblems(changed(plainRule, (r) => change(r.event.params)))).toEqual([]);
  });

  const GATE_LEAF = '{ "fact": "isDifferentialOutput", "operator": "equal", "value": false }';
  test.each([
    ['a gate that is a number fact', (r: Json & { event: { params: Json } }) => (r.event.params.appliesWhen = 'cmrrMarginDb'), [`${P}/appliesWhen: must name a boolean fact, got "cmrrMarginDb"`]],
    ['a gate that is no fact', (r: Json & { event: { params: Json } }) => (r.event.params.appliesWhen = 'nope'), [`${P}/appliesWhen: must name a boolean fact, got "nope"`]],
    ['a gate that is no string', (r: Json & { event: { params: Json } }) => (r.event.params.appliesWhen = 1), [`${P}/appliesWhen: must name a boolean fact, got 1`]],
    ['a gate without its reason', (r: Json & { event: { params: Json } }) => delete r.event.params.notApplicableReason, [`${P}/notApplicableReason: must be a non-empty string`]],
    ['a gate the conditions do not carry ("all")', (r: Json) => (r.conditions = { all: (r.conditions as { any: unknown[] }).any }), [`/conditions: with appliesWhen, must be "any" holding ${GATE_LEAF}`]],
    ['a gate leaf testing true', (r: Json) => ((r.conditions as { any: Json[] }).any[0].value = true), [`/conditions: with appliesWhen, must be "any" holding ${GATE_LEAF}`]],
    ['a gate leaf with another operator', (r: Json) => ((r.conditions as { any: Json[] }).any[0].operator = 'notEqual'), [`/conditions: with appliesWhen, must be "any" holding ${GATE_LEAF}`]],
    ['a gate leaf on another fact', (r: Json) => ((r.conditions as { any: Json[] }).any[0].fact = 'isResistorTail'), [`/conditions: with appliesWhen, must be "any" holding ${GATE_LEAF}`]],
  ])('gated rule: %s', (_name, change, expected) => {
    expect(ruleProblems(changed(gatedRule, change as (r: Json) => void))).toEqual(expected);
  });
});

describe('validateRule', () => {
  test('throws one error naming the source and every problem', () => {
    const broken = changed(plainRule, (r) => ((r.name = 'Bad'), (r.event.params.colour = 'red')));
    expect(() => validateRule(broken, 'rules/bad.json')).toThrow(
      'Invalid rule rules/bad.json: /name: must be kebab-case, got "Bad"; /event/params: unexpected key "colour"',
    );
  });

  test('returns the rule itself when valid', () => {
    expect(validateRule(plainRule, 'cmrr-target')).toBe(plainRule);
  });
});
