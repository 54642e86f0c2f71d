import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking: pair out of saturation at the highest input common mode with the swing.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'input-common-mode-high');

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
    title: 'passes with 1.35 V to spare',
    overrides: {},
    passed: true,
    margin: 1.35,
    texts: ['2 V', '1.35 V to spare'],
  },
  {
    title: 'fails 450 mV short',
    overrides: { icmHighV: 6, icmHighMarginV: -0.45 },
    passed: false,
    margin: -0.45,
    texts: ['6 V', 'saturates', '450 mV short'],
  },
])('input-common-mode-high: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'input-common-mode-high', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('V');
  for (const text of texts) expect(result.reason).toContain(text);
});
