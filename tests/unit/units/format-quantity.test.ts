import { describe, expect, test } from 'vitest';
import { formatQuantity } from '#shared/units/format-quantity';

describe('formatQuantity: engineering notation', () => {
  // Prefixes [SI]; 3 significant digits and trailing zeros trimmed are this project's choice
  test.each([
    [4700, 'Ω', 3, '4.7 kΩ'],
    [4700, 'Ohm', 3, '4.7 kΩ'],
    [120e-6, 'A', 3, '120 µA'],
    [-12, 'V', 3, '−12 V'],
    [0, 'V', 3, '0 V'],
    [1, 'A', 3, '1 A'],
    [2e-12, 'F', 3, '2 pF'],
    [1e-15, 'F', 3, '1 fF'],
    [1e12, 'Hz', 3, '1 THz'],
    [22e3, 'Ω', 3, '22 kΩ'],
    [8.2e3, 'Ω', 3, '8.2 kΩ'],
    [1.234567e6, 'Ω', 3, '1.23 MΩ'],
    [1.234567e6, 'Ω', 5, '1.2346 MΩ'],
    [0.0271, 'W', 3, '27.1 mW'],
    [999.4, 'V', 3, '999 V'],
    [999.9, 'V', 3, '1 kV'], // rounding carries into the next prefix
    [0.99996, 'A', 4, '1 A'],
    [470, 'Ω', 2, '470 Ω'],
    [1e-20, 'A', 3, '1e-20 A'], // below femto: exponent form
    [2.5e15, 'V', 3, '2.5e15 V'], // above tera
    [4700, '', 3, '4.7 k'],
  ])('%d %s (%i digits) is "%s"', (value, unit, digits, expected) => {
    expect(formatQuantity(value, unit, digits)).toBe(expected);
  });

  // No prefix for dB, %, °C and ratios (common practice: nobody writes "kdB")
  test.each([
    [86.27, 'dB', '86.3 dB'],
    [120.4, 'dB', '120 dB'],
    [99, '%', '99 %'],
    [-55, '°C', '−55 °C'],
    [177.7, 'V/V', '178 V/V'],
    [0.01, '1', '0.01'],
    [2000, '1', '2000'],
    [1234567, '1', '1.23e6'],
    [1e-20, '1', '1e-20'],
  ])('%d %s is "%s" (no prefix)', (value, unit, expected) => {
    expect(formatQuantity(value, unit)).toBe(expected);
  });

  test('defaults to 3 significant digits', () => {
    expect(formatQuantity(1 / 3, 'V')).toBe('333 mV');
  });

  test.each([
    [Infinity, 'Ω', '∞ Ω'],
    [-Infinity, 'V', '−∞ V'],
    [NaN, 'A', 'NaN A'],
  ])('%d %s is "%s" (not silently a number)', (value, unit, expected) => {
    expect(formatQuantity(value, unit)).toBe(expected);
  });
});
