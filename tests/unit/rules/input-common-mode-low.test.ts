import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking: tail compliance at the lowest input common-mode voltage.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'input-common-mode-low');

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
    title: 'passes with 850 mV of headroom',
    overrides: {},
    passed: true,
    margin: 0.85,
    texts: ['−2 V', '850 mV of compliance headroom'],
  },
  {
    title: 'fails 320 mV short',
    overrides: { icmLowV: -4, icmLowMarginV: -0.32 },
    passed: false,
    margin: -0.32,
    texts: ['−4 V', '320 mV short'],
  },
])('input-common-mode-low: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'input-common-mode-low', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('V');
  for (const text of texts) expect(result.reason).toContain(text);
});
