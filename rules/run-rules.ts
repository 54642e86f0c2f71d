import { createHash } from 'node:crypto';
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
// Named import: json-rules-engine is CommonJS; Node's ESM loader (tsx, vitest) exposes `Engine`
// as a named export, whereas the default export differs between Node (module.exports) and
// bundler interop (the engine factory).
import { Engine, type RuleProperties } from 'json-rules-engine';
import { severityOfKind, type Check, type OptionFacts } from '#shared/engine/types';
import { FACT_KINDS, fitsFactKind } from './fact-kinds';
import { formatReason } from './format-reason';
import { validateRule, type RuleFile } from './validate-rule';

export type { CheckParams, RuleFile } from './validate-rule';

/** The folder holding the rule files: the one this module sits in. */
export const RULES_DIR = fileURLToPath(new URL('.', import.meta.url));

const byName = (a: RuleFile, b: RuleFile) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0);

function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null) Object.values(value).forEach(deepFreeze);
  return Object.freeze(value);
}

/**
 * Reads and validates every `*.json` in `dir` (the only I/O in rules/). Each file must parse, be
 * a valid rule and carry its file name as `name`. Returns the rules sorted by name, deep-frozen.
 * Throws an Error naming the offending file.
 */
export async function loadRuleFiles(dir: string = RULES_DIR): Promise<readonly RuleFile[]> {
  const files = (await readdir(dir)).filter((f) => f.endsWith('.json')).sort();
  if (files.length === 0) throw new Error(`No rule files (*.json) in ${dir}`);
  const rules = await Promise.all(
    files.map(async (file) => {
      const path = join(dir, file);
      let parsed: unknown;
      try {
        parsed = JSON.parse(await readFile(path, 'utf8'));
      } catch (error) {
        throw new Error(`Invalid rule ${path}: ${(error as Error).message}`);
      }
      return validateRule(parsed, path, file.slice(0, -'.json'.length));
    }),
  );
  return deepFreeze(rules.sort(byName));
}

/** JSON with object keys sorted at every level, no whitespace: equal rules give equal text. */
function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (typeof value === 'object' && value !== null) {
    const entries = Object.entries(value).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

/** sha256 (hex) of the rules' canonical JSON, sorted by name, one per line: whitespace and key order do not count. */
export function rulesetVersion(rules: readonly RuleFile[]): string {
  const text = [...rules].sort(byName).map(canonicalJson).join('\n');
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

interface Prepared {
  sorted: readonly RuleFile[];
  engine: Engine;
  /** Facts the conditions read; only these go to the engine (each fact it is given costs a hash). */
  conditionFacts: readonly string[];
  /** Runs on one Engine are chained: Engine.run keeps a shared status flag, and overlapping runs can skip rules. */
  queue: Promise<unknown>;
}

/** One Engine per rule list (by identity), built on first use; treat a list passed in as immutable. */
const preparedByList = new WeakMap<readonly RuleFile[], Prepared>();

/** Validates a rule list and builds its Engine once; runRules calls it, createRuleSet calls it early. */
export function prepareRules(rules: readonly RuleFile[]): void {
  if (preparedByList.has(rules)) return;
  rules.forEach((rule, i) => validateRule(rule, `#${i} (${String((rule as { name?: unknown })?.name)})`));
  const sorted = [...rules].sort(byName);
  const duplicate = sorted.find((rule, i) => i > 0 && rule.name === sorted[i - 1].name);
  if (duplicate) throw new Error(`Duplicate rule name "${duplicate.name}"`);
  // The engine gets its own copy of the conditions (json-rules-engine may write into them) and
  // no params: reasons are chosen and filled here, and every params object would be cloned per run.
  const engineRules: RuleProperties[] = sorted.map((rule) => ({
    name: rule.name,
    conditions: structuredClone(rule.conditions),
    event: { type: rule.event.type },
  }));
  const engine = new Engine(engineRules, { allowUndefinedFacts: false });
  const conditionFacts = [...new Set(sorted.flatMap((rule) => factsIn(rule.conditions)))].sort();
  preparedByList.set(rules, { sorted, engine, conditionFacts, queue: Promise.resolve() });
}

/** Fact names a condition tree reads, in leaves and in `{ "fact": ... }` values. */
function factsIn(node: unknown): string[] {
  if (Array.isArray(node)) return node.flatMap(factsIn);
  if (typeof node !== 'object' || node === null) return [];
  const { fact, ...rest } = node as Record<string, unknown>;
  return [...(typeof fact === 'string' ? [fact] : []), ...Object.values(rest).flatMap(factsIn)];
}

/** The facts the conditions read, each checked against its kind: a missing or NaN fact throws, never decides. */
function conditionFactValues(prepared: Prepared, facts: Readonly<OptionFacts>): Record<string, unknown> {
  const given = facts as unknown as Record<string, unknown>;
  const values: Record<string, unknown> = {};
  for (const fact of prepared.conditionFacts) {
    const kind = FACT_KINDS[fact as keyof OptionFacts];
    if (!(fact in given)) throw new Error(`Missing fact "${fact}"`);
    if (!fitsFactKind(kind, given[fact])) throw new Error(`Fact "${fact}" is ${String(given[fact])}, not ${kind}`);
    values[fact] = given[fact];
  }
  return values;
}

function toCheck(rule: RuleFile, passed: boolean | undefined, facts: Readonly<OptionFacts>): Check {
  if (passed === undefined) throw new Error(`Rule ${rule.name}: the rules engine returned no result`);
  const params = rule.event.params;
  const notApplicable = params.appliesWhen !== undefined && facts[params.appliesWhen] === false;
  const template = notApplicable ? (params.notApplicableReason as string) : passed ? params.passReason : params.failReason;
  let reason: string;
  try {
    reason = formatReason(template, facts);
  } catch (error) {
    throw new Error(`Rule ${rule.name}: ${(error as Error).message}`);
  }
  const value = params.marginFact === null || notApplicable ? null : facts[params.marginFact];
  if (value !== null && !(typeof value === 'number' && Number.isFinite(value))) {
    throw new Error(`Rule ${rule.name}: margin fact "${params.marginFact}" is ${String(value)}, not a finite number`);
  }
  const check: Check = {
    rule: rule.name,
    passed,
    severity: severityOfKind(rule.kind),
    reason,
    margin: value,
    applicable: !notApplicable,
    title: rule.title,
    kind: rule.kind,
    figure: rule.figure,
  };
  if (params.marginUnit !== null) check.marginUnit = params.marginUnit;
  if (passed && params.thinMarginBelow !== undefined && typeof value === 'number' && value < params.thinMarginBelow) check.thinMargin = true;
  return check;
}

/**
 * Decides every rule on one option's facts. Returns one Check per rule, pass or fail, sorted by
 * rule name. A rule whose `appliesWhen` fact is false passes with its not-applicable reason and a
 * null margin. Throws when a fact a rule needs is missing or malformed (never a silent pass).
 */
export async function runRules(rules: readonly RuleFile[], facts: Readonly<OptionFacts>): Promise<Check[]> {
  prepareRules(rules);
  const prepared = preparedByList.get(rules) as Prepared;
  const run = prepared.queue.then(() => prepared.engine.run(conditionFactValues(prepared, facts)));
  prepared.queue = run.catch(() => undefined);
  const { results, failureResults } = await run;
  const passedByName = new Map<string, boolean>();
  for (const result of results) passedByName.set(result.name, true);
  for (const result of failureResults) passedByName.set(result.name, false);
  return prepared.sorted.map((rule) => toCheck(rule, passedByName.get(rule.name), facts));
}
