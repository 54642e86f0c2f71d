import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking: nominal gain within the spec tolerance.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'gain-tolerance');

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
    title: 'passes 1.4 % off within ±5 %',
    overrides: {},
    passed: true,
    margin: 3.6,
    texts: ['differential output', '98.6 V/V', '100 V/V', '−1.4 %', '±5 %', '3.6 % to spare'],
  },
  {
    title: 'fails 7.7 % off',
    overrides: { gainPredicted: 92.3, gainErrorPercent: -7.7, gainMarginPercent: -2.7 },
    passed: false,
    margin: -2.7,
    texts: ['92.3 V/V', '−7.7 %', 'outside ±5 % by 2.7 %'],
  },
])('gain-tolerance: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'gain-tolerance', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('%');
  for (const text of texts) expect(result.reason).toContain(text);
});
