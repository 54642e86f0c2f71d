import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Advisory, differential output only: mismatch-limited worst-case CMRR against the requirement.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'cmrr-differential-worst-case');

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
    title: 'passes with 21.5 dB to spare',
    overrides: {},
    passed: true,
    margin: 21.5,
    texts: ['101.5 dB', 'at 1 kHz', '80 dB required', '21.5 dB to spare'],
  },
  {
    title: 'fails 3.6 dB short',
    overrides: { cmrrDifferentialWorstCaseDb: 76.4, cmrrDifferentialWorstCaseMarginDb: -3.6 },
    passed: false,
    margin: -3.6,
    texts: ['76.4 dB', '3.6 dB short'],
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
])('cmrr-differential-worst-case: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'cmrr-differential-worst-case', passed, severity: 'advisory', margin });
  expect(result.marginUnit).toBe('dB');
  for (const text of texts) expect(result.reason).toContain(text);
});
