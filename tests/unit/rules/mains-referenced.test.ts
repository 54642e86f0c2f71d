import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Advisory caution for mains-referenced inputs (isolation, creepage).
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'mains-referenced');

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
    title: 'passes when not mains-referenced',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['not mark the input as mains-referenced'],
  },
  {
    title: 'cautions when mains-referenced',
    overrides: { mainsReferenced: true },
    passed: false,
    margin: null,
    texts: ['Caution', 'isolation, creepage', 'applicable standard, local codes and licensed practice'],
  },
])('mains-referenced: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'mains-referenced', passed, severity: 'advisory', margin });
  expect(result.marginUnit).toBe(undefined);
  for (const text of texts) expect(result.reason).toContain(text);
});
