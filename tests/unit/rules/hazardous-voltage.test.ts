import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Advisory caution: rail span above the usual 60 V DC safe-to-touch limit [IEC 62368-1].
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'hazardous-voltage');

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
    title: 'passes at 24 V',
    overrides: {},
    passed: true,
    margin: 36,
    texts: ['24 V', '60 V DC'],
  },
  {
    title: 'passes at exactly the limit',
    overrides: { railSpanV: 60, hazardousVoltageMarginV: 0 },
    passed: true,
    margin: 0,
    texts: ['60 V, within'],
  },
  {
    title: 'cautions at 70 V',
    overrides: { railSpanV: 70, hazardousVoltageMarginV: -10 },
    passed: false,
    margin: -10,
    texts: ['Caution', 'rails span 70 V', '10 V above the 60 V DC', 'IEC 62368-1', 'applicable standard, local codes and licensed practice'],
  },
])('hazardous-voltage: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'hazardous-voltage', passed, severity: 'advisory', margin });
  expect(result.marginUnit).toBe('V');
  for (const text of texts) expect(result.reason).toContain(text);
});
