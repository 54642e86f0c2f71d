import { describe, expect, test } from 'vitest';
import { PREFIX_SPELLINGS, SI_PREFIXES, prefixForExponent, startsWithSpelling } from '#shared/units/si-prefixes';

describe('SI_PREFIXES', () => {
  // [SI] SI Brochure 9th ed., table 7 (decimal prefixes)
  test.each([
    ['f', 'femto', -15],
    ['p', 'pico', -12],
    ['n', 'nano', -9],
    ['µ', 'micro', -6],
    ['m', 'milli', -3],
    ['k', 'kilo', 3],
    ['M', 'mega', 6],
    ['G', 'giga', 9],
    ['T', 'tera', 12],
  ])('%s (%s) is 10^%i [SI]', (symbol, name, exponent) => {
    const prefix = SI_PREFIXES.find((p) => p.symbol === symbol);
    expect(prefix).toMatchObject({ name, exponent });
    expect(prefixForExponent(exponent)?.symbol).toBe(symbol);
  });

  // Spellings typed in forms and SPICE decks (common practice; "meg" per the SPICE convention in DOMAIN.md)
  test.each([
    ['u', -6],
    ['μ', -6],
    ['K', 3],
    ['meg', 6],
    ['MEG', 6],
    ['Meg', 6],
    ['mEG', 6],
  ])('alias %s means 10^%i (common practice)', (spelling, exponent) => {
    const found = PREFIX_SPELLINGS.find((s) => startsWithSpelling(spelling, s) && s.spelling.length === spelling.length);
    expect(found?.prefix.exponent).toBe(exponent);
  });

  test('exponents ascend in steps of 3, skipping 0', () => {
    const exponents = SI_PREFIXES.map((p) => p.exponent);
    expect(exponents).toEqual([-15, -12, -9, -6, -3, 3, 6, 9, 12]);
  });

  test('every spelling is unique and the longest come first', () => {
    const spellings = PREFIX_SPELLINGS.map((s) => s.spelling);
    expect(new Set(spellings).size).toBe(spellings.length);
    const lengths = spellings.map((s) => s.length);
    expect(lengths).toEqual([...lengths].sort((a, b) => b - a));
  });

  test('no prefix for exponents off the table', () => {
    expect(prefixForExponent(0)).toBeUndefined();
    expect(prefixForExponent(-18)).toBeUndefined();
    expect(prefixForExponent(4)).toBeUndefined();
  });
});
