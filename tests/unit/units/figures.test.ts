/**
 * The one figure formatter (shared/units/figures.ts).
 *
 * The sign rules are ECMA-402's `signDisplay` (Intl.NumberFormat): `negative` signs only a
 * negative figure that does not print as zero; `exceptZero` signs every figure that does not
 * print as zero, plus or minus. The minus is U+2212 MINUS SIGN (Unicode, "typographic minus"),
 * the percentage-point unit "pp" (ISO 80000-1 treats % as the number 0.01; a difference of two
 * percentages is in points). Rounding is ECMAScript's Number.prototype.toFixed / toPrecision on
 * the stored double: 1.005 is stored as 1.00499999999999989… (IEEE 754 binary64), so two
 * decimals of it are "1.00".
 */
import { describe, expect, test } from 'vitest';
import {
  formatDb,
  formatDeviationPercent,
  formatFigure,
  formatFixed,
  formatMargin,
  formatPercent,
  formatRatio,
  formatSignedQuantity,
  formatSignificant,
  formatTargetDb,
  formatTolerance,
  MINUS,
} from '#shared/units/figures';

describe('figure text', () => {
  test.each([
    [101.78141, '101.8 dB'],
    [-3.04, '−3.0 dB'],
    [-0.01, '0.0 dB'],
  ])('formatDb(%d) is %s', (v, text) => expect(formatDb(v)).toBe(text));

  test.each([
    [78, '78 dB'],
    [84.5, '84.5 dB'],
  ])('formatTargetDb(%d) is %s', (v, text) => expect(formatTargetDb(v)).toBe(text));

  test.each([
    [100, '100 %'],
    [61.56, '61.6 %'],
  ])('formatPercent(%d) is %s', (v, text) => expect(formatPercent(v)).toBe(text));

  test.each([
    [17.78, 'dB', '+17.8 dB'],
    [-0.302, 'V', '−302 mV'],
    [0.00677, 'W', '+6.77 mW'],
    // A margin between percentages is in percentage points.
    [1, '%', '+1 pp'],
    [-10.94, '%', '−10.9 pp'],
    [0, 'V', '0 V'],
  ])('formatMargin(%d, %s) is %s', (v, unit, text) => expect(formatMargin(v, unit)).toBe(text));

  test.each([
    [2320, 'Ω', '2.32 kΩ'],
    [0.000955, 'A', '955 µA'],
  ])('formatFigure(%d, %s) is %s', (v, unit, text) => expect(formatFigure(v, unit)).toBe(text));

  test.each([
    [0.9, '+0.9 %'],
    [-1.12, '−1.1 %'],
    [-0.009, '0.0 %'],
  ])('formatDeviationPercent(%d) is %s', (v, text) => expect(formatDeviationPercent(v)).toBe(text));

  test.each([
    [23.0001, '23.0'],
    [6.2912, '6.29'],
    [177.7, '178'],
    [-88.9, '−88.9'],
  ])('formatSignificant(%d) is %s', (v, text) => expect(formatSignificant(v)).toBe(text));
});

describe('signs (ECMA-402 signDisplay)', () => {
  test('negative: a minus only on a figure that does not print as zero', () => {
    expect(formatFixed(-1.25, 1)).toBe(`${MINUS}1.3`);
    expect(formatFixed(-0.04, 1)).toBe('0.0');
    expect(formatFixed(0.04, 1)).toBe('0.0');
  });

  test('exceptZero: a plus or a minus, none on a figure that prints as zero', () => {
    expect(formatDb(0.42, { sign: 'exceptZero', decimals: 2 })).toBe('+0.42 dB');
    expect(formatDb(-0.004, { sign: 'exceptZero', decimals: 2 })).toBe('0.00 dB');
    expect(formatPercent(-2.35, { sign: 'exceptZero', trimZeros: false })).toBe(`${MINUS}2.4 %`); // -2.35 is stored as -2.35000000000000008…
  });

  test('a margin that prints as zero has no sign, whichever side it is on', () => {
    expect(formatMargin(0.01, 'dB')).toBe('0.0 dB');
    expect(formatMargin(-0.01, 'dB')).toBe('0.0 dB');
    expect(formatMargin(-0.01, '%')).toBe('0 pp');
  });

  test('signed quantities in engineering notation take the sign of the value (three significant digits never print a nonzero value as 0)', () => {
    expect(formatSignedQuantity(12.3, '%')).toBe('+12.3 %');
    expect(formatSignedQuantity(-4e-9, 'A')).toBe(`${MINUS}4 nA`);
    expect(formatSignedQuantity(0, 'A')).toBe('0 A');
  });
});

describe('rounding is the stored double’s (toFixed), not the decimal text’s', () => {
  test('1.005 (stored as 1.00499999999999989…) prints 1.00; 0.125 (exact) prints 0.13', () => {
    expect(formatFixed(1.005, 2)).toBe('1.00');
    expect(formatFixed(0.125, 2)).toBe('0.13');
  });

  test('no digit grouping: 12345.67 prints as 12345.7', () => {
    expect(formatFixed(12345.67, 1)).toBe('12345.7');
  });
});

describe('tolerances', () => {
  test.each([
    [3, '%', '±3 %'],
    [1.5, 'dB', '±1.5 dB'],
    [0.05, 'V', '±50 mV'],
  ])('formatTolerance(%d, %s) is %s', (tolerance, unit, text) => expect(formatTolerance(tolerance, unit)).toBe(text));
});

describe('size ratios', () => {
  // An emitter-area ratio is a pure number (SI: quantity of dimension one), written with the multiplication sign U+00D7
  test.each([
    [8, '8×'],
    [1, '1×'],
    [1.5, '1.5×'],
    [0.25, '0.25×'],
    [12.345, '12.3×'],
  ])('formatRatio(%d) is %s, no unit and no prefix', (value, text) => expect(formatRatio(value)).toBe(text));
});
