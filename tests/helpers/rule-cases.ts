/**
 * One passing and one failing case per rule (STYLE.md): each rule's test file lists its rows,
 * this runs them through the real rule file and the runner.
 */
import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../rules/run-rules';
import type { OptionFacts, Severity } from '#shared/engine/types';
import { makeOptionFacts } from './option-facts';

export interface RuleCase {
  title: string;
  overrides: Partial<OptionFacts>;
  passed: boolean;
  margin: number | null;
  /** Texts the reason must contain (numbers as formatted). */
  texts: string[];
  /** When given: whether the check applies to the option (false: shown as not applicable). */
  applicable?: boolean;
  /** When given: whether the check carries the thin-margin flag. */
  thinMargin?: boolean;
}

/** Registers one test per row for the rule `ruleName`. */
export function testRuleCases(ruleName: string, expected: { severity: Severity; marginUnit?: string }, rows: RuleCase[]): void {
  const rules = loadRuleFiles().then((all) => all.filter((rule) => rule.name === ruleName));
  test.each(rows)(`${ruleName}: $title`, async ({ overrides, passed, margin, texts, applicable, thinMargin }) => {
    const [result] = await runRules(await rules, makeOptionFacts(overrides));
    expect(result).toMatchObject({ rule: ruleName, passed, severity: expected.severity, margin });
    if (applicable !== undefined) expect(result.applicable).toBe(applicable);
    if (thinMargin !== undefined) expect(result.thinMargin ?? false).toBe(thinMargin);
    expect(result.marginUnit).toBe(expected.marginUnit);
    for (const text of texts) expect(result.reason).toContain(text);
  });
}
