import { describe, expect, test } from 'vitest';
import { isOnSeries, snapToSeries } from '#shared/units/e-series';
import { formatFigure, formatFixed, formatSignedQuantity, formatSignificant, formatTolerance, MINUS } from '#shared/units/figures';
import { formatQuantity } from '#shared/units/format-quantity';
import { parseQuantity } from '#shared/units/parse-quantity';
import { plausibilityNote, typicalRangeOf } from '#shared/units/plausibility';
import { PREFIX_SPELLINGS, SI_PREFIXES } from '#shared/units/si-prefixes';
import { readSpiceNumber } from '#shared/units/spice-number';
import { UNIT_SYMBOLS, unitSymbolFor } from '#shared/units/unit-symbols';

// Edges of the units helpers: ties, thresholds, the exact spellings accepted. Sources beside
// each check; where the product chose (the spellings a form accepts), the check says so.

describe('E-series snapping at its edges [IEC60063]', () => {
  // The geometric mean of two neighbours is equally far from both in log terms; the documented
  // rule gives it to the lower one. sqrt(1 × 1.1) and sqrt(2 × 2.2) are exact ties in doubles.
  test.each([
    [1, 1.1],
    [2, 2.2],
  ])('the log-midpoint of E24 %d and %d snaps to the lower', (lower, upper) => {
    const midpoint = Math.sqrt(lower * upper);
    expect(Math.abs(Math.log(lower / midpoint))).toBe(Math.abs(Math.log(upper / midpoint)));
    expect(snapToSeries(midpoint, 'E24')).toBe(lower);
    expect(snapToSeries(midpoint * 1000, 'E24')).toBe(lower * 1000);
  });

  test('a member is on its series even with no tolerance at all', () => {
    expect(isOnSeries(4700, 'E24', 0)).toBe(true);
    expect(isOnSeries(4701, 'E24', 0)).toBe(false);
  });

  test('a value that is not positive and finite is refused with the value named', () => {
    expect(() => snapToSeries(-1, 'E24')).toThrow('snapToSeries needs a positive finite value, got -1');
  });
});

describe('figures at their edges', () => {
  // Engineering text carries no thousands separator (SI Brochure 9th ed., 5.4.4: groups of three
  // may be separated by a space, never by a comma or a point); the app prints none.
  test('no thousands separator', () => {
    expect(formatFixed(12345.6, 1)).toBe('12345.6');
  });

  test('infinities print with their sign', () => {
    expect(formatFixed(Infinity, 1)).toBe('Infinity');
    expect(formatFixed(-Infinity, 1)).toBe(`${MINUS}Infinity`);
    expect(formatFixed(Infinity, 1, { sign: 'exceptZero' })).toBe('+Infinity');
    expect(formatSignedQuantity(-Infinity, 'V')).toBe(`${MINUS}∞ V`);
  });

  test('dB and % figures take one decimal, other units three significant digits', () => {
    expect(formatFigure(101.84, 'dB')).toBe('101.8 dB');
    expect(formatFigure(99.54, '%')).toBe('99.5 %');
    expect(formatFigure(2321, 'Ω')).toBe('2.32 kΩ');
  });

  test('tolerances: % and dB as written, other units in engineering notation', () => {
    expect(formatTolerance(3, '%')).toBe('±3 %');
    expect(formatTolerance(1.5, 'dB')).toBe('±1.5 dB');
    expect(formatTolerance(0.05, 'V')).toBe('±50 mV');
  });

  test('formatSignificant switches to engineering form at 10^digits, not before', () => {
    expect(formatSignificant(999.4)).toBe('999');
    expect(formatSignificant(1000)).toBe('1000');
    expect(formatSignificant(-2.5, 2)).toBe(`${MINUS}2.5`);
  });
});

describe('formatQuantity without a prefix: plain numbers from 1e-3 up to 1e6', () => {
  // Exponent form outside [0.001, 1e6): a choice of this product, written as JavaScript's own
  // exponent form without "+" (ECMA-262 Number.prototype.toExponential).
  test.each([
    [0.001, '0.001 dB'],
    [0.000999, '9.99e-4 dB'],
    [999999, '1e6 dB'],
    [1.234e7, '1.23e7 dB'],
  ])('%d dB prints as %s', (value, text) => {
    expect(formatQuantity(value, 'dB')).toBe(text);
  });

  test('a unit printed as nothing leaves no trailing blank', () => {
    expect(formatQuantity(4.7, '')).toBe('4.7');
  });
});

describe('SPICE numbers at their edges [SPICE: ngspice manual 2.1.2]', () => {
  test.each([
    ['1a', 1],
    ['1z', 1],
    ['1A', 1],
    ['1Z', 1],
    ['+5', 5],
    ['1E3', 1000],
    ['2.5E-3', 0.0025],
  ])('%s reads as %d (letters after a number are ignored; E as e)', (text, value) => {
    expect(readSpiceNumber(text)).toBe(value);
  });
});

describe('plausibility at the ends of a typical range', () => {
  test('the ends themselves are inside', () => {
    expect(plausibilityNote(10, 'W', { max: 10 })).toBeNull();
    expect(plausibilityNote(1e-6, 'A', { min: 1e-6 })).toBeNull();
    expect(plausibilityNote(10.01, 'W', { min: 1e-3, max: 10 })).toBe('10.01 W is far above the usual for this field (up to 10 W)');
    expect(plausibilityNote(0.99e-6, 'A', { min: 1e-6, max: 1 })).toBe('990 nA is far below the usual for this field (from 1 µA)');
  });

  test('typicalRangeOf reads only numbers from an object', () => {
    expect(typicalRangeOf(undefined)).toBeUndefined();
    expect(typicalRangeOf({ 'x-typical': 5 })).toBeUndefined();
    expect(typicalRangeOf({ 'x-typical': null })).toBeUndefined();
    expect(typicalRangeOf({ 'x-typical': { min: 'a', max: 3 } })).toEqual({ min: undefined, max: 3 });
    expect(typicalRangeOf({ 'x-typical': { min: 1, max: '3' } })).toEqual({ min: 1, max: undefined });
  });
});

describe('parseQuantity at its edges', () => {
  test.each([
    ['47k5', undefined, 47500],
    ['4k75', undefined, 4750],
    ['-4k7', undefined, -4700],
    ['.25', undefined, 0.25],
    ['4R7', 'Ω', 4.7],
  ])('%s reads as %d (IEC 60062 style marks for the decimal point)', (text, unit, value) => {
    expect(parseQuantity(text, unit)).toEqual({ ok: true, value });
  });

  test('-0 reads as 0, not negative zero', () => {
    const result = parseQuantity('-0');
    expect(result.ok && Object.is(result.value, 0)).toBe(true);
  });

  test.each([['x5'], ['x4k7'], ['4kx7'], ['4R7']])('%s is refused without a unit that gives it a meaning', (text) => {
    expect(parseQuantity(text).ok).toBe(false);
  });

  test('messages: a second prefix, examples in the field\u2019s unit, a plain number wanted', () => {
    expect(parseQuantity('4k7k', 'Ω')).toEqual({ ok: false, message: 'has a second prefix "k"' });
    expect(parseQuantity('abc', 'dB')).toEqual({ ok: false, message: '"abc" is not a number (examples: 40, 2.5e1, 40 dB)' });
    expect(parseQuantity('abc', '1')).toEqual({ ok: false, message: '"abc" is not a number (examples: 40, 2.5e1, 0.04)' });
    expect(parseQuantity('5 V', '1')).toEqual({ ok: false, message: 'has an unexpected unit "V": expected a plain number' });
  });
});

describe('the spellings the forms accept', () => {
  // [SI] SI Brochure 9th ed., table 7 for the symbols; "u" and Greek "μ" for micro, "K" for kilo
  // and SPICE's "meg" are common practice (a choice of this product, listed here in full).
  test('prefix spellings, longest first', () => {
    expect(PREFIX_SPELLINGS.map((p) => `${p.spelling}:${p.prefix.exponent}:${p.anyCase}`).sort()).toEqual(
      ['f:-15', 'p:-12', 'n:-9', 'µ:-6', 'u:-6', 'μ:-6', 'm:-3', 'k:3', 'K:3', 'M:6', 'G:9', 'T:12']
        .map((s) => `${s}:false`)
        .concat('meg:6:true')
        .sort(),
    );
    expect(PREFIX_SPELLINGS[0].spelling).toBe('meg');
    expect(SI_PREFIXES.every((p) => p.anyCaseAliases === undefined || p.symbol === 'M')).toBe(true);
  });

  // [SI] unit symbols (SI Brochure 9th ed., tables 2 and 4; the electronvolt table 8; dB and % as IEC 60027-3 / common
  // practice); other spellings are this product's choice.
  test('unit symbols: canonical, printed, aliases and whether a prefix is allowed', () => {
    expect(UNIT_SYMBOLS.map((u) => [u.symbol, u.printed, [...u.aliases], u.takesPrefix])).toEqual([
      ['V', 'V', [], true],
      ['A', 'A', [], true],
      ['\u03a9', '\u03a9', ['\u2126', 'ohm', 'ohms', 'Ohm', 'Ohms'], true],
      ['W', 'W', [], true],
      ['Hz', 'Hz', ['hz'], true],
      ['F', 'F', [], true],
      ['S', 'S', [], true],
      ['s', 's', [], true],
      ['eV', 'eV', [], true],
      ['dB', 'dB', ['db'], false],
      ['%', '%', [], false],
      ['°C', '°C', ['℃', 'degC'], false],
      ['V/V', 'V/V', [], false],
      ['A/A', 'A/A', [], false],
      ['V/√Hz', 'V/√Hz', ['V/rtHz', 'V/sqrtHz', 'V/sqrt(Hz)', 'V/√(Hz)', 'V/Hz^0.5'], true],
      ['V/°C', 'V/°C', ['V/℃', 'V/degC', 'V/C', 'V/K'], true],
      ['V/s', 'V/s', [], true],
      ['ppm/°C', 'ppm/°C', ['ppm/℃', 'ppm/degC', 'ppm/C', 'ppm/K'], false],
      ['1', '', [], false],
    ]);
    // A rate per millisecond, microsecond or nanosecond is 1e3, 1e6 or 1e9 per second [SI]
    expect(unitSymbolFor('V/s').scaledSpellings?.map((s) => [s.spelling, s.exponent])).toEqual([
      ['V/ms', 3],
      ['V/µs', 6],
      ['V/μs', 6],
      ['V/us', 6],
      ['V/ns', 9],
    ]);
    // U+2126 OHM SIGN is canonically equivalent to U+03A9 GREEK CAPITAL LETTER OMEGA (Unicode NFC)
    expect('\u2126'.normalize('NFC')).toBe('\u03a9');
    expect(unitSymbolFor('\u2126').symbol).toBe('\u03a9');
    expect(unitSymbolFor('ohms').printed).toBe('Ω');
    expect(parseQuantity('4.7 k\u2126', '\u03a9')).toEqual({ ok: true, value: 4700 });
  });

  test.each([
    ['4.7 ohms', 'Ω', 4.7],
    ['10 hz', 'Hz', 10],
    ['3 db', 'dB', 3],
    ['25 ℃', '°C', 25],
    ['25 degC', '°C', 25],
  ])('%s in a %s field reads as %d', (text, unit, value) => {
    expect(parseQuantity(text, unit)).toEqual({ ok: true, value });
  });

  test.each([['5k', '%'], ['5m', 'dB'], ['2k', 'V/V'], ['2k', '°C']])('%s in a %s field is refused: no prefix', (text, unit) => {
    expect(parseQuantity(text, unit).ok).toBe(false);
  });
});
