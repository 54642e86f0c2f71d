import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking, differential output only: Monte Carlo yield against the required yield.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'cmrr-yield');

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
    title: 'passes with 4.2 points to spare',
    overrides: {},
    passed: true,
    margin: 4.2,
    texts: ['99.2 %', '2000 Monte Carlo samples', '80 dB', '95 % yield required', '4.2 % to spare'],
  },
  {
    title: 'fails 3.5 points short',
    overrides: { monteCarloYieldPercent: 91.5, yieldMarginPercent: -3.5 },
    passed: false,
    margin: -3.5,
    texts: ['Only 91.5 %', '2000', '95 % yield required', '3.5 % short'],
  },
  {
    title: 'is not applicable to a single-ended output',
    overrides: {
      output: 'single-ended',
      isDifferentialOutput: false,
      cmrrDifferentialWorstCaseDb: null,
      cmrrDifferentialWorstCaseMarginDb: null,
      monteCarloYieldPercent: null,
      yieldMarginPercent: null,
    },
    passed: true,
    margin: null,
    texts: ['Not applicable', 'single-ended'],
  },
])('cmrr-yield: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'cmrr-yield', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('%');
  for (const text of texts) expect(result.reason).toContain(text);
});
