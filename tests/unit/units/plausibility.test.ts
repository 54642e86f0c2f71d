/**
 * Plausibility notes: the typical ranges are the schema's (`x-typical`); the cases are the ones
 * seen in use (a 60 MW power budget typed as "60M", a 1 GΩ collector resistor) and the M/m
 * confusion between SI (M mega, m milli) and SPICE habit (M milli, MEG mega), SPICE3 manual §2.1.
 */
import { describe, expect, test } from 'vitest';
import designSchema from '#shared/schema/design.schema.json';
import specSchema from '#shared/schema/spec.schema.json';
import { parseQuantity } from '#shared/units/parse-quantity';
import { plausibilityNote, typicalRangeOf } from '#shared/units/plausibility';

const read = (text: string, unit: string) => {
  const parsed = parseQuantity(text, unit);
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.value;
};

describe('plausibilityNote', () => {
  const power = typicalRangeOf(specSchema.properties.powerBudgetW);
  const collector = typicalRangeOf(designSchema.properties.collectorResistanceOhm);

  test('the schema declares the ranges', () => {
    expect(power).toEqual({ min: 1e-5, max: 10 });
    expect(collector).toEqual({ min: 100, max: 1e6 });
  });

  test('"60M" as a power budget is 60 MW: far above the usual, with the milli hint', () => {
    expect(plausibilityNote(read('60M', 'W'), 'W', power)).toBe('60 MW is far above the usual for this field (up to 10 W); M is mega: for 60 mW type m (milli)');
  });

  test('"1G" as a collector resistor is far above the usual, with no hint (1 Ω is not usual either)', () => {
    expect(plausibilityNote(read('1G', 'Ω'), 'Ω', collector)).toBe('1 GΩ is far above the usual for this field (up to 1 MΩ)');
  });

  test('"4.7m" as a tail resistor is 4.7 mΩ: far below the usual, with the mega hint', () => {
    const tailResistor = typicalRangeOf(designSchema.properties.tail.oneOf[0].properties.resistanceOhm);
    expect(tailResistor).toEqual({ min: 100, max: 1e7 });
    expect(plausibilityNote(read('4.7m', 'Ω'), 'Ω', tailResistor)).toBe('4.7 mΩ is far below the usual for this field (from 100 Ω); m is milli: for 4.7 MΩ type M (mega)');
  });

  test.each([
    ['60m', 'W', power],
    ['60 mw', 'W', power],
    ['4k7', 'Ω', collector],
    ['0', 'W', power],
  ])('"%s" %s is usual: no note', (text, unit, typical) => {
    expect(plausibilityNote(read(text, unit), unit, typical)).toBeNull();
  });

  test('a field without a typical range gets no note', () => {
    expect(plausibilityNote(1e9, 'V', undefined)).toBeNull();
    expect(typicalRangeOf(specSchema.properties.supply.properties.positiveV)).toBeUndefined();
  });
});
