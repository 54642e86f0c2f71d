import { describe, expect, test } from 'vitest';
import { parseQuantity } from '#shared/units/parse-quantity';

/** Relative tolerance for parsed values: they are built from decimal text, so exact to rounding. */
const REL_TOL = 1e-12;

describe('parseQuantity: what engineers type', () => {
  // Prefix exponents [SI]; "4k7", "1M" = mega, "meg", "u" = micro are common practice (DOMAIN.md)
  test.each([
    ['4k7', undefined, 4700],
    ['4K7', undefined, 4700],
    ['4.7k', undefined, 4700],
    ['10u', undefined, 10e-6],
    ['10µ', undefined, 10e-6],
    ['10μ', undefined, 10e-6],
    ['2 pF', 'F', 2e-12],
    ['2pF', 'F', 2e-12],
    ['10uF', 'F', 10e-6],
    ['1 fF', 'F', 1e-15],
    ['3F', 'F', 3],
    ['-12 V', 'V', -12],
    ['−12 V', 'V', -12],
    ['+5', 'V', 5],
    ['1M', undefined, 1e6],
    ['1m', undefined, 1e-3],
    ['1meg', undefined, 1e6],
    ['1MEG', 'Ω', 1e6],
    ['1megohm', 'Ω', 1e6],
    ['1Meg', 'Ω', 1e6],
    ['2.2mEg', 'Ω', 2.2e6],
    ['1meg5', 'Ω', 1.5e6],
    ['1 MEGOHM', 'Ω', 1e6],
    // Unit letters in any case where that cannot change the meaning (prefix letters keep theirs)
    ['4.7 pf', 'F', 4.7e-12],
    ['60 mw', 'W', 60e-3],
    ['60 MW', 'W', 60e6],
    ['12 v', 'V', 12],
    ['60 w', 'W', 60],
    ['100 ma', 'A', 0.1],
    ['10 KHZ', 'Hz', 1e4],
    ['68 KOHM', 'Ω', 68e3],
    ['86.3 DB', 'dB', 86.3],
    ['2 f', 'F', 2e-15], // a lone f is femto, as before: F alone is the farad
    ['2 F', 'F', 2],
    ['2.2e-3', undefined, 2.2e-3],
    ['2.2E3', undefined, 2200],
    ['1.5e3k', undefined, 1.5e6],
    ['100 mA', 'A', 0.1],
    ['120 µA', 'A', 120e-6],
    ['68kΩ', 'Ω', 68000],
    ['68k ohm', 'Ω', 68000],
    ['68 kΩ', 'Ω', 68000],
    ['4R7', 'Ω', 4.7],
    ['4k7Ω', 'Ω', 4700],
    ['1M2', 'Ω', 1.2e6],
    ['86.3 dB', 'dB', 86.3],
    ['99 %', '%', 99],
    ['27 °C', '°C', 27],
    ['10 kHz', 'Hz', 1e4],
    ['1 GHz', 'Hz', 1e9],
    ['3 T', undefined, 3e12],
    ['5.', undefined, 5],
    ['.5', undefined, 0.5],
    ['  42  ', undefined, 42],
    ['0', 'V', 0],
    ['-0', 'V', 0],
    // The spec's targets as datasheets quote them: noise density, slew rate (per µs), drift, tempco
    ['8 nV/√Hz', 'V/√Hz', 8e-9],
    ['8nV/rtHz', 'V/√Hz', 8e-9],
    ['8 nv/RTHZ', 'V/√Hz', 8e-9],
    ['3.5n', 'V/√Hz', 3.5e-9],
    ['2 V/µs', 'V/s', 2e6],
    ['2V/us', 'V/s', 2e6],
    ['0.5 V/ns', 'V/s', 5e8],
    ['500 V/ms', 'V/s', 5e5],
    ['2 MV/s', 'V/s', 2e6],
    ['2M', 'V/s', 2e6],
    ['1k5 V/µs', 'V/s', 1.5e9],
    ['5 µV/°C', 'V/°C', 5e-6],
    ['5uV/C', 'V/°C', 5e-6],
    ['0.5 µV/K', 'V/°C', 5e-7],
    ['100 ppm/°C', 'ppm/°C', 100],
    ['25 ppm/K', 'ppm/°C', 25],
    ['20 pF', 'F', 20e-12],
    ['3 µA', 'A', 3e-6],
  ])('"%s" (unit %s) is %d', (text, unit, expected) => {
    const result = parseQuantity(text, unit);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(Math.abs(result.value - expected)).toBeLessThanOrEqual(REL_TOL * Math.abs(expected));
  });

  test.each([
    ['4.7k', 4700],
    ['10u', 1e-5],
    ['2.2e-3', 0.0022],
  ])('"%s" is exactly the double nearest %d (no multiply-rounding error)', (text, expected) => {
    expect(parseQuantity(text)).toEqual({ ok: true, value: expected });
  });

  test.each([
    ['', undefined, 'empty'],
    ['   ', undefined, 'empty'],
    ['abc', undefined, 'not a number'],
    ['k', undefined, 'not a number'],
    ['1,5', undefined, 'decimal separator'],
    ['100 mA', 'V', 'unexpected unit "mA": expected V'],
    ['12 V', 'A', 'unexpected unit "V"'],
    ['12 V', undefined, 'unexpected unit "V"'],
    ['1kk', undefined, 'unexpected unit "kk"'],
    ['4k7k', undefined, 'second prefix'],
    ['2e', undefined, 'unexpected unit "e"'],
    ['3 kdB', 'dB', 'dB takes no prefix'],
    ['3k', '%', '% takes no prefix'],
    ['1e400', undefined, 'out of range'],
    ['4R7', 'V', 'unexpected unit'],
    ['4.7 Pf', 'F', 'unexpected unit "Pf"'], // P would be peta, which no field takes: not guessed
    ['60 mw', 'V', 'unexpected unit "mw": expected V'],
    ['100 kppm/°C', 'ppm/°C', 'ppm/°C takes no prefix'],
    ['2 V/µs', 'V', 'unexpected unit "V/µs": expected V'], // a per-µs spelling belongs to V/s only
    ['2 V/µs', 'V/°C', 'unexpected unit "V/µs"'],
    ['8 nV/Hz', 'V/√Hz', 'unexpected unit "nV/Hz"'], // per hertz is not per root hertz
  ])('"%s" (unit %s) is rejected: %s', (text, unit, fragment) => {
    const result = parseQuantity(text, unit);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.message).toContain(fragment);
  });
});
