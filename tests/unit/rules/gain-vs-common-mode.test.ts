import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Blocking, resistor tail only: gain change between the input common-mode extremes.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'gain-vs-common-mode');

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
    title: 'passes a resistor tail with 1.7 points to spare',
    overrides: { topology: 'resistor', isResistorTail: true },
    passed: true,
    margin: 1.7,
    texts: ['resistor tail', '0.3 %', 'between input common mode −2 V and 2 V', '1.7 % to spare'],
  },
  {
    title: 'fails a resistor tail 1.8 points over',
    overrides: { topology: 'resistor', isResistorTail: true, gainVsCommonModePercent: 3.8, gainVsCommonModeMarginPercent: -1.8 },
    passed: false,
    margin: -1.8,
    texts: ['3.8 %', '1.8 % beyond the ±2 % gain tolerance'],
  },
  {
    title: 'is not applicable to a mirror tail',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['Not applicable', 'degenerated-mirror tail'],
  },
])('gain-vs-common-mode: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'gain-vs-common-mode', passed, severity: 'blocking', margin });
  expect(result.marginUnit).toBe('%');
  for (const text of texts) expect(result.reason).toContain(text);
});
