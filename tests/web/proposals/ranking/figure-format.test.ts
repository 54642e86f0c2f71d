import { describe, expect, test } from 'vitest';
import { mixHex } from '../../../../web/src/lib/colour-mix';
import { formatDb, formatDeviationPercent, formatFigure, formatMargin, formatPercent, formatSignificant, formatTargetDb } from '../../../../web/src/lib/figure-format';

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

describe('mixHex', () => {
  test.each([
    ['#000000', '#ffffff', 0.5, '#808080'],
    ['#2f5d50', '#2f5d50', 0.3, '#2f5d50'],
    ['#102030', '#ffffff', 0, '#102030'],
    ['oklch(0.5 0.1 120)', '#ffffff', 0.5, 'oklch(0.5 0.1 120)'],
  ])('mixHex(%s, %s, %d) is %s', (a, b, t, expected) => expect(mixHex(a, b, t)).toBe(expected));
});
