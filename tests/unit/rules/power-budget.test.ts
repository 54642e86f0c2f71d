import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking: worst-corner supply power within the budget.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'power-budget');

async function check(overrides: Partial<OptionFacts>) {
  const [result] = await runRules(rules, makeOptionFacts(overrides));
  return result;
}

interface Row {
  title: string;
  overrides: Partial<OptionFacts>;
  passed: boolean;
  margin: number | null;
  texts: string[];
}

test.each<Row>([
  {
    title: 'passes with 21.6 mW to spare',
    overrides: {},
    passed: true,
    margin: 0.0216,
    texts: ['28.4 mW', '50 mW budget', '21.6 mW to spare'],
  },
  {
    title: 'fails 11.2 mW over',
    overrides: { powerWorstW: 0.0612, powerMarginW: -0.0112 },
    passed: false,
    margin: -0.0112,
    texts: ['61.2 mW', 'exceeds the 50 mW budget by 11.2 mW'],
  },
])('power-budget: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'power-budget', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('W');
  for (const text of texts) expect(result.reason).toContain(text);
});
