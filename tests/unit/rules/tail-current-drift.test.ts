import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Advisory: tail-current change over the spec temperature range against its limit.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'tail-current-drift');

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
    title: 'passes with 7.9 points to spare',
    overrides: {},
    passed: true,
    margin: 7.9,
    texts: ['2.1 %', 'from −40 °C to 85 °C', '10 % limit', '7.9 % to spare'],
  },
  {
    title: 'fails 3.4 points over',
    overrides: { tailCurrentDriftPercent: 13.4, tailCurrentDriftMarginPercent: -3.4 },
    passed: false,
    margin: -3.4,
    texts: ['13.4 %', '3.4 % beyond the 10 % limit'],
  },
])('tail-current-drift: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'tail-current-drift', passed, severity: 'advisory', margin });
  expect(result.marginUnit).toBe('%');
  for (const text of texts) expect(result.reason).toContain(text);
});
