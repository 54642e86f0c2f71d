/**
 * SPICE numbers (shared/units/spice-number.ts): the one reader behind the netlist reader and the
 * `.model` card reader, and the one writer behind the netlist writer.
 *
 * Expected values come from the ngspice User's Manual, section 2.1.2 "Some naming conventions",
 * Table 2.2 "Ngspice scale factors": T = 1e12, G = 1e9, MEG = 1e6, K = 1e3, MIL = 25.4e-6,
 * M = 1e-3, U = 1e-6, N = 1e-9, P = 1e-12, F = 1e-15; "letters immediately following a number
 * that are not scale factors are ignored, and letters immediately following a scale factor are
 * ignored" (so 10, 10V, 10Volts and 10Hz are the same number, and M, MA, MSec, MMhos the same
 * factor). Case does not matter: M is milli in any case.
 */
import { describe, expect, test } from 'vitest';
import { formatSpiceNumber, parseSpiceNumber, readSpiceNumber } from '#shared/units/spice-number';

/** Relative closeness for values whose decimal form is not exact in binary (25.4e-6 × 3). */
function expectClose(actual: number | null | undefined, expected: number) {
  expect(actual).not.toBeNull();
  expect(Math.abs((actual as number) - expected) / Math.abs(expected)).toBeLessThan(1e-12);
}

describe('readSpiceNumber: the scale factors of ngspice manual Table 2.2 "Ngspice scale factors"', () => {
  // One row per factor of the table, in the table's order, each in upper and lower case.
  test.each([
    ['T', 1e12],
    ['G', 1e9],
    ['Meg', 1e6],
    ['K', 1e3],
    ['m', 1e-3],
    ['u', 1e-6],
    ['n', 1e-9],
    ['p', 1e-12],
    ['f', 1e-15],
  ])('2%s is 2 × %d, in either case (ngspice manual, "Scale factors")', (factor, multiplier) => {
    const expected = Number(`2e${Math.round(Math.log10(multiplier))}`);
    expect(readSpiceNumber(`2${factor.toUpperCase()}`)).toBe(expected);
    expect(readSpiceNumber(`2${factor.toLowerCase()}`)).toBe(expected);
  });

  test('mil is 25.4e-6 in either case (ngspice manual, "Scale factors")', () => {
    expectClose(readSpiceNumber('2mil'), 2 * 25.4e-6);
    expectClose(readSpiceNumber('2MIL'), 2 * 25.4e-6);
  });

  test('letters after a number or a factor are ignored (ngspice manual, "Scale factors": 10, 10V, 10Volts, 10Hz; M, MA, MSec, MMhos)', () => {
    for (const text of ['10', '10V', '10Volts', '10Hz']) expect(readSpiceNumber(text)).toBe(10);
    for (const text of ['1M', '1MA', '1MSec', '1MMhos']) expect(readSpiceNumber(text)).toBe(1e-3);
  });
});

describe('readSpiceNumber: SPICE3 numbers', () => {
  test.each([
    ['150', 150],
    ['-44', -44],
    ['3.14159', 3.14159],
    ['.5', 0.5],
    ['5.', 5],
    ['1e-14', 1e-14],
    ['2.65e3', 2650],
    ['1.2f', 1.2e-15],
    ['1.2F', 1.2e-15],
    ['22p', 22e-12],
    ['4.7n', 4.7e-9],
    ['10u', 10e-6],
    ['10m', 10e-3], // milli
    ['10M', 10e-3], // milli too: case does not make mega [SPICE]
    ['10Meg', 10e6],
    ['100meg', 100e6],
    ['10MEG', 10e6],
    ['2.5K', 2500],
    ['2.5k', 2500],
    ['1G', 1e9],
    ['1t', 1e12],
    ['1e3k', 1e6], // exponent and factor both apply
    ['10V', 10], // unit letters ignored
    ['10Volts', 10],
    ['1kHz', 1000],
    ['10pF', 10e-12],
    ['1.2MEGohm', 1.2e6],
    ['5MA', 5e-3], // "M, MA, MSec … all represent the same scale factor" [ngspice manual]
    ['4.7k', 4700],
    ['10uF', 1e-5],
    ['1MEG', 1e6],
    ['1M', 1e-3],
    ['2.2e3', 2200],
    ['-9', -9],
    ['.5p', 0.5e-12],
  ])('%s reads as %d', (text, expected) => {
    expect(readSpiceNumber(text)).toBe(expected);
  });

  test.each([
    ['3mil', 3 * 25.4e-6],
    ['1MIL', 25.4e-6],
    ['0.5mils', 0.5 * 25.4e-6],
  ])('%s reads as %d (MIL = 25.4e-6)', (text, expected) => {
    expectClose(readSpiceNumber(text), expected);
  });

  test.each(['', ' 1', 'abc', 'e3', '.', '-', '4k7', '2m5', '1.2.3', '1e-3*2', '1e999', '{bf}', '1,5', '1µ'])('%j is not a SPICE3 number', (text) => {
    expect(readSpiceNumber(text)).toBeNull();
  });
});

describe('parseSpiceNumber: the netlist reader’s form', () => {
  test('surrounding blanks are allowed; the value is the reader’s', () => {
    expect(parseSpiceNumber(' 4.7k ')).toBe(4700);
    expectClose(parseSpiceNumber('3mil'), 3 * 25.4e-6);
  });

  test.each(['4k7', '', 'abc', '1e999'])('%j is a SyntaxError naming the text', (text) => {
    expect(() => parseSpiceNumber(text)).toThrow(SyntaxError);
    expect(() => parseSpiceNumber(text)).toThrow(`not a SPICE number: "${text}"`);
  });
});

describe('formatSpiceNumber', () => {
  test.each([5100, 1.1e-14, 0.001, -12, 27, 2.2e-11, 1e21, 123456789.125])('%d is written so SPICE reads back the same double', (value) => {
    const text = formatSpiceNumber(value);
    expect(/^[-+]?[\d.]+(e[-+]?\d+)?$/.test(text), `${text} holds no scale factor`).toBe(true);
    expect(readSpiceNumber(text)).toBe(value);
  });

  test.each([Number.NaN, Infinity, -Infinity])('%d is refused', (value) => {
    expect(() => formatSpiceNumber(value)).toThrow(RangeError);
  });
});
