import type { TopLevelCondition } from 'json-rules-engine';
import type { OptionFacts, RuleKind } from '#shared/engine/types';
import { FACT_KINDS, isFactName } from './fact-kinds';
import { templateProblems } from './format-reason';

/** `event.params` of a rule file: how its check is reported. */
export interface CheckParams {
  /** Fact holding "how far on the good side" (negative when failing); null when the rule has none. */
  marginFact: keyof OptionFacts | null;
  /** Unit of the margin fact ("dB", "V", "W", "%"); null exactly when marginFact is null. */
  marginUnit: string | null;
  passReason: string;
  failReason: string;
  /** Boolean fact; when it is false the check passes as not applicable, with notApplicableReason. */
  appliesWhen?: keyof OptionFacts;
  notApplicableReason?: string;
  /** A passing check whose margin is below this (in marginUnit) is flagged as a thin margin. */
  thinMarginBelow?: number;
}

/**
 * One `rules/<name>.json`: a json-rules-engine rule whose name is its file name, with what its
 * check is called and how it counts (the one home of each rule's metadata, carried on every check).
 */
export interface RuleFile {
  name: string;
  /** Short readable name of the check, e.g. "Power budget" (tables, the report). */
  title: string;
  /** blocking: an option failing it does not pass; advisory: reported only; caution: advisory, a hazard repeated for every option. */
  kind: RuleKind;
  /** The fact holding the figure the rule judges (the cell a failing check marks); null when the rule judges a spec flag. */
  figure: keyof OptionFacts | null;
  conditions: TopLevelCondition;
  event: { type: string; params: CheckParams };
}

const KEBAB_CASE = /^[a-z0-9]+(-[a-z0-9]+)*$/;
const KINDS: readonly string[] = ['blocking', 'advisory', 'caution'] satisfies RuleKind[];
/** Longest title: it names a check in a table cell. */
const TITLE_MAX_LENGTH = 60;
/** json-rules-engine 7's built-in operators that compare (no custom operators are registered). */
const OPERATORS = [
  'equal', 'notEqual', 'lessThan', 'lessThanInclusive', 'greaterThan', 'greaterThanInclusive',
  'in', 'notIn', 'contains', 'doesNotContain',
];
const PARAM_KEYS = [
  'marginFact', 'marginUnit', 'passReason', 'failReason', 'appliesWhen', 'notApplicableReason', 'thinMarginBelow',
];

type Json = Record<string, unknown>;
const isObject = (v: unknown): v is Json => typeof v === 'object' && v !== null && !Array.isArray(v);
const extraKeys = (o: Json, allowed: readonly string[]) => Object.keys(o).filter((k) => !allowed.includes(k));

/** Problems in one condition node (boolean `all`/`any`/`not`, or a leaf comparing a known fact). */
function conditionProblems(node: unknown, path: string): string[] {
  if (!isObject(node)) return [`${path}: must be an object`];
  const op = (['all', 'any', 'not'] as const).find((k) => k in node);
  if (op) {
    if (extraKeys(node, [op]).length) return [`${path}: a boolean node holds only "${op}"`];
    const children = node[op];
    if (op === 'not') return conditionProblems(children, `${path}/not`);
    if (!Array.isArray(children) || children.length === 0) return [`${path}/${op}: must be a non-empty array`];
    return children.flatMap((child, i) => conditionProblems(child, `${path}/${op}/${i}`));
  }
  const problems = extraKeys(node, ['fact', 'operator', 'value']).map((k) => `${path}: unexpected key "${k}"`);
  if (typeof node.fact !== 'string' || !isFactName(node.fact))
    problems.push(`${path}/fact: unknown fact ${JSON.stringify(node.fact)}`);
  if (!OPERATORS.includes(node.operator as string))
    problems.push(`${path}/operator: unknown operator ${JSON.stringify(node.operator)}`);
  if (!('value' in node)) problems.push(`${path}/value: required`);
  if (isObject(node.value) && !(typeof node.value.fact === 'string' && isFactName(node.value.fact)))
    problems.push(`${path}/value: unknown fact ${JSON.stringify(node.value.fact)}`);
  return problems;
}

/** Problems in `event.params`, including the not-applicable branch the conditions must carry. */
function paramsProblems(p: Json, conditions: unknown): string[] {
  const problems = extraKeys(p, PARAM_KEYS).map((k) => `/event/params: unexpected key "${k}"`);
  if (p.marginFact === null) {
    if (p.marginUnit !== null) problems.push('/event/params/marginUnit: must be null when marginFact is null');
  } else {
    const kind = typeof p.marginFact === 'string' && isFactName(p.marginFact) ? FACT_KINDS[p.marginFact] : undefined;
    if (kind !== 'number' && kind !== 'number-or-null')
      problems.push(`/event/params/marginFact: must be a numeric fact or null, got ${JSON.stringify(p.marginFact)}`);
    if (typeof p.marginUnit !== 'string' || p.marginUnit === '')
      problems.push('/event/params/marginUnit: must be a unit string');
  }
  if (p.thinMarginBelow !== undefined) {
    if (typeof p.thinMarginBelow !== 'number' || !Number.isFinite(p.thinMarginBelow) || p.thinMarginBelow <= 0)
      problems.push('/event/params/thinMarginBelow: must be a positive number');
    if (p.marginFact === null) problems.push('/event/params/thinMarginBelow: needs a marginFact');
  }
  const templates = ['passReason', 'failReason', ...(p.appliesWhen === undefined ? [] : ['notApplicableReason'])];
  for (const key of templates) {
    const t = p[key];
    if (typeof t !== 'string' || t.trim() === '') problems.push(`/event/params/${key}: must be a non-empty string`);
    else problems.push(...templateProblems(t).map((m) => `/event/params/${key}: ${m}`));
  }
  if (p.appliesWhen === undefined) {
    if (p.notApplicableReason !== undefined) problems.push('/event/params/notApplicableReason: only with appliesWhen');
    return problems;
  }
  const gate = p.appliesWhen;
  if (typeof gate !== 'string' || !isFactName(gate) || FACT_KINDS[gate] !== 'boolean') {
    problems.push(`/event/params/appliesWhen: must name a boolean fact, got ${JSON.stringify(gate)}`);
  } else {
    // Not applicable must mean passed: the rule itself says so, so the JSON alone tells the truth.
    const any = isObject(conditions) && Array.isArray(conditions.any) ? conditions.any : [];
    const gated = any.some((c) => isObject(c) && c.fact === gate && c.operator === 'equal' && c.value === false);
    if (!gated) {
      const leaf = `{ "fact": "${gate}", "operator": "equal", "value": false }`;
      problems.push(`/conditions: with appliesWhen, must be "any" holding ${leaf}`);
    }
  }
  return problems;
}

/** Problems in the rule's metadata: its title, kind and the figure it judges. */
function metadataProblems(rule: Json): string[] {
  const problems: string[] = [];
  const { title, kind, figure } = rule;
  if (typeof title !== 'string' || title.trim() === '' || title !== title.trim() || title.length > TITLE_MAX_LENGTH || /[\p{Cc}{}]/u.test(title))
    problems.push(`/title: must be a one-line name of 1-${TITLE_MAX_LENGTH} characters without braces, got ${JSON.stringify(title)}`);
  if (!KINDS.includes(kind as string))
    problems.push(`/kind: must be "blocking", "advisory" or "caution", got ${JSON.stringify(kind)}`);
  if (figure !== null) {
    const factKind = typeof figure === 'string' && isFactName(figure) ? FACT_KINDS[figure] : undefined;
    if (factKind !== 'number' && factKind !== 'number-or-null')
      problems.push(`/figure: must be a numeric fact or null, got ${JSON.stringify(figure)}`);
  }
  return problems;
}

/** Every problem in a parsed rule file, each as "/json/path: message"; empty when valid. */
export function ruleProblems(rule: unknown, expectedName?: string): string[] {
  if (!isObject(rule)) return ['/: must be an object'];
  const problems = extraKeys(rule, ['name', 'title', 'kind', 'figure', 'conditions', 'event']).map((k) => `/: unexpected key "${k}"`);
  if (typeof rule.name !== 'string' || !KEBAB_CASE.test(rule.name))
    problems.push(`/name: must be kebab-case, got ${JSON.stringify(rule.name)}`);
  else if (expectedName !== undefined && rule.name !== expectedName)
    problems.push(`/name: "${rule.name}" differs from the file name "${expectedName}"`);
  problems.push(...metadataProblems(rule));
  if (!isObject(rule.conditions) || !['all', 'any', 'not'].some((k) => k in (rule.conditions as Json)))
    problems.push('/conditions: must hold "all", "any" or "not"');
  else problems.push(...conditionProblems(rule.conditions, '/conditions'));
  const event = rule.event;
  if (!isObject(event) || typeof event.type !== 'string' || !isObject(event.params))
    return [...problems, '/event: must be { "type": string, "params": object }'];
  problems.push(...extraKeys(event, ['type', 'params']).map((k) => `/event: unexpected key "${k}"`));
  return [...problems, ...paramsProblems(event.params, rule.conditions)];
}

/** Throws one Error naming `source` (a file path or rule name) and every problem; returns the rule typed. */
export function validateRule(rule: unknown, source: string, expectedName?: string): RuleFile {
  const problems = ruleProblems(rule, expectedName);
  if (problems.length) throw new Error(`Invalid rule ${source}: ${problems.join('; ')}`);
  return rule as RuleFile;
}
