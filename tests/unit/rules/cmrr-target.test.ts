import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking: single-ended (tail-limited) CMRR at the spec frequency, worst corner, against required + margin.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'cmrr-target');

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
    title: 'passes with 8.2 dB to spare',
    overrides: {},
    passed: true,
    margin: 8.2,
    texts: ['94.2 dB', 'at 1 kHz', 'ICM −2 V, 85 °C', '80 dB required + 6 dB margin', '8.2 dB to spare'],
  },
  {
    title: 'fails 2.9 dB short at DC',
    overrides: { cmrrAtFrequencyDb: 83.1, cmrrMarginDb: -2.9, cmrrFrequencyHz: 0 },
    passed: false,
    margin: -2.9,
    texts: ['83.1 dB', 'at DC', '2.9 dB short'],
  },
])('cmrr-target: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'cmrr-target', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('dB');
  for (const text of texts) expect(result.reason).toContain(text);
});
