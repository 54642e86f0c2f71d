import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking: the output swing fits at the nominal input common mode.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'output-swing');

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
    title: 'passes with 2.4 V to spare',
    overrides: {},
    passed: true,
    margin: 2.4,
    texts: ['4 Vpp differential output swing', '1 V peak per collector', '2.4 V to spare'],
  },
  {
    title: 'fails 600 mV short',
    overrides: { outputSwingVpp: 16, swingPeakPerCollectorV: 4, swingMarginV: -0.6 },
    passed: false,
    margin: -0.6,
    texts: ['16 Vpp', '4 V peak per collector', '600 mV short'],
  },
])('output-swing: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'output-swing', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('V');
  for (const text of texts) expect(result.reason).toContain(text);
});
