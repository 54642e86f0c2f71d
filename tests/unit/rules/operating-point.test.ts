import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking: no transistor saturated or cut off at any corner; lists them on fail.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'operating-point');

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
    title: 'passes with every transistor forward-active',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['forward-active'],
  },
  {
    title: 'fails and lists two problems',
    overrides: {
      operatingPointProblems: ['Q4 saturated at ICM −2 V, −40 °C', 'Q2 saturated at ICM 2 V, 85 °C'],
      operatingPointProblemCount: 2,
    },
    passed: false,
    margin: null,
    texts: ['(2 found)', 'Q4 saturated at ICM −2 V, −40 °C; Q2 saturated at ICM 2 V, 85 °C'],
  },
])('operating-point: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'operating-point', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe(undefined);
  for (const text of texts) expect(result.reason).toContain(text);
});
