import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { formatQuantity } from '#shared/units/format-quantity';
import { parseQuantity } from '#shared/units/parse-quantity';
import { logUniform } from '../../helpers/arbitraries';

const UNITS = ['V', 'A', 'Ω', 'W', 'Hz', 'F', 'S', 'dB', '%', '°C', 'V/V', '1'];

describe('formatQuantity then parseQuantity', () => {
  test('reads back the value within the rounding of the digits printed', () => {
    fc.assert(
      fc.property(
        // Log-uniform magnitudes over 10^−20 ... 10^20 (every SI prefix and beyond, equally often)
        logUniform(-20, 20),
        fc.boolean(),
        fc.constantFrom(...UNITS),
        fc.integer({ min: 1, max: 8 }),
        (magnitude, negative, unit, digits) => {
          const value = (negative ? -1 : 1) * magnitude;
          const text = formatQuantity(value, unit, digits);
          const parsed = parseQuantity(text, unit);
          expect(parsed.ok, `${text} did not parse`).toBe(true);
          if (!parsed.ok) return;
          // Rounding to n significant digits moves a value by at most half a unit in the n-th digit
          const relTol = 0.5 * 10 ** (1 - digits) + 1e-12;
          expect(Math.abs(parsed.value - value)).toBeLessThanOrEqual(relTol * Math.abs(value));
        },
      ),
      { numRuns: 2000 },
    );
  });

  test.each([
    ['4.7 kΩ', 'Ω'],
    ['120 µA', 'A'],
    ['−12 V', 'V'],
    ['2 pF', 'F'],
    ['86.3 dB', 'dB'],
    ['1 MHz', 'Hz'],
  ])('"%s" formats back to itself', (text, unit) => {
    const parsed = parseQuantity(text, unit);
    expect(parsed.ok).toBe(true);
    if (parsed.ok) expect(formatQuantity(parsed.value, unit)).toBe(text);
  });
});
