import { describe, expect, test } from 'vitest';
import electrode from '../../../api/demo/specs/electrode-amplifier-input.json';
import studio from '../../../api/demo/specs/studio-line-receiver.json';
import { recommend } from '#shared/engine/recommend';
import { validateSpec } from '#shared/validate';
import { FACT_KINDS, fitsFactKind, isFactName } from '../../../rules/fact-kinds';
import { loadRuleSet } from '../../../rules';
import type { OptionFacts } from '#shared/engine/types';

// The kinds the rule loader holds facts to, against the facts the engine really produces: every
// fact of every option of two demo specs (one single-ended, one differential) has a kind, and its
// value fits it. Values are not checked here, only their shape (JSON types, ECMA-262 typeof).

async function optionFacts(document: unknown): Promise<OptionFacts[]> {
  const spec = validateSpec({ ...(document as object), monteCarlo: { samples: 200, seed: 7 } });
  if (!spec.ok) throw new Error(JSON.stringify(spec.errors));
  const result = await recommend(spec.value, await loadRuleSet());
  return result.options.map((option) => option.figures as OptionFacts);
}

describe('FACT_KINDS against the engine\u2019s facts', () => {
  test.each([
    ['electrode amplifier input', electrode],
    ['studio line receiver', studio],
  ])('%s: every fact is named, has a kind and fits it', async (_name, document) => {
    const options = await optionFacts(document);
    expect(options.length).toBeGreaterThan(0);
    for (const facts of options) {
      expect(Object.keys(facts).sort()).toEqual(Object.keys(FACT_KINDS).sort());
      for (const [fact, value] of Object.entries(facts)) {
        expect(isFactName(fact), fact).toBe(true);
        expect(fitsFactKind(FACT_KINDS[fact as keyof OptionFacts], value), `${fact} = ${JSON.stringify(value)}`).toBe(true);
      }
    }
  }, 60_000);
});

describe('fitsFactKind', () => {
  test.each([
    ['number', 1.5, true],
    ['number', NaN, false],
    ['number', Infinity, false],
    ['number', '1', false],
    ['number', null, false],
    ['number-or-null', null, true],
    ['number-or-null', -2, true],
    ['number-or-null', NaN, false],
    ['number-or-null', undefined, false],
    ['boolean', false, true],
    ['boolean', 0, false],
    ['text', '', true],
    ['text', 1, false],
    ['text-list', [], true],
    ['text-list', ['a', 'b'], true],
    ['text-list', ['a', 1], false],
    ['text-list', 'a', false],
  ] as const)('%s accepts %j: %s', (kind, value, fits) => {
    expect(fitsFactKind(kind, value)).toBe(fits);
  });

  test('isFactName answers only for the table\u2019s own keys, not inherited ones', () => {
    expect(isFactName('cmrrMarginDb')).toBe(true);
    expect(isFactName('toString')).toBe(false);
    expect(isFactName('hasOwnProperty')).toBe(false);
  });
});
