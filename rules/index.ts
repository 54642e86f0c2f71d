import { severityOfKind, type RuleSet } from '#shared/engine/types';
import { loadRuleFiles, prepareRules, rulesetVersion, runRules, type RuleFile } from './run-rules';

/** The rule list each RuleSet made here was built from (another thread builds the same RuleSet from it). */
const ruleFilesBySet = new WeakMap<RuleSet, readonly RuleFile[]>();

/**
 * A RuleSet over a rule list: validated and versioned once, here; `evaluate` reuses one Engine.
 * Throws when a rule is invalid or two share a name.
 */
export function createRuleSet(rules: readonly RuleFile[]): RuleSet {
  prepareRules(rules);
  const ruleSet: RuleSet = {
    version: rulesetVersion(rules),
    rules: [...rules].sort((a, b) => a.name.localeCompare(b.name)).map((r) => ({ rule: r.name, title: r.title, kind: r.kind, figure: r.figure, severity: severityOfKind(r.kind) })),
    evaluate: (facts) => runRules(rules, facts),
  };
  ruleFilesBySet.set(ruleSet, rules);
  return ruleSet;
}

/** The rule list a RuleSet was made from by createRuleSet (plain data a worker thread can receive), or undefined for any other RuleSet. */
export function ruleFilesOf(ruleSet: RuleSet): readonly RuleFile[] | undefined {
  return ruleFilesBySet.get(ruleSet);
}

/** Loads the rule files next to run-rules.ts (or in `dir`) into a RuleSet. */
export async function loadRuleSet(dir?: string): Promise<RuleSet> {
  return createRuleSet(await loadRuleFiles(dir));
}
