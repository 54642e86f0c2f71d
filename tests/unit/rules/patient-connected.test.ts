import { expect, test } from 'vitest';
import { loadRuleFiles, runRules } from '../../../rules/run-rules';
import type { OptionFacts } from '../../../shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

// Advisory caution for patient-connected inputs, deferring to IEC 60601-1.
const rules = (await loadRuleFiles()).filter((rule) => rule.name === 'patient-connected');

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
    title: 'passes when not patient-connected',
    overrides: {},
    passed: true,
    margin: null,
    texts: ['not mark the input as patient-connected'],
  },
  {
    title: 'cautions when patient-connected',
    overrides: { patientConnected: true },
    passed: false,
    margin: null,
    texts: ['Caution', 'IEC 60601-1', 'leakage-current', 'local codes and licensed practice'],
  },
])('patient-connected: $title', async ({ overrides, passed, margin, texts }) => {
  const result = await check(overrides);
  expect(result).toMatchObject({ rule: 'patient-connected', passed, severity: 'advisory', margin });
  expect(result.marginUnit).toBe(undefined);
  for (const text of texts) expect(result.reason).toContain(text);
});
