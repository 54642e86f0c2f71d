import { severityOfKind, type RuleSet } from '../shared/engine/types';
import { loadRuleFiles, prepareRules, rulesetVersion, runRules, type RuleFile } from './run-rules';

/**
 * A RuleSet over a rule list: validated and versioned once, here; `evaluate` reuses one Engine.
 * Throws when a rule is invalid or two share a name.
 */
export function createRuleSet(rules: readonly RuleFile[]): RuleSet {
  prepareRules(rules);
  return {
    version: rulesetVersion(rules),
    rules: [...rules].sort((a, b) => a.name.localeCompare(b.name)).map((r) => ({ rule: r.name, title: r.title, kind: r.kind, figure: r.figure, severity: severityOfKind(r.kind) })),
    evaluate: (facts) => runRules(rules, facts),
  };
}

/** Loads the rule files next to run-rules.ts (or in `dir`) into a RuleSet. */
export async function loadRuleSet(dir?: string): Promise<RuleSet> {
  return createRuleSet(await loadRuleFiles(dir));
}
