import { describe, expect, test } from 'vitest';
import { validateSpec } from '#shared/validate';
import { designFieldLabel, fieldTitle, specFieldLabel } from '#shared/validation/field-labels';
import { fractionToPercent, upgradeSpecDocument } from '#shared/validation/spec-upgrade';
import { MINIMAL_SPEC, printed } from './schema-fixtures';

// A resistor tolerance written the older way, as a fraction: 0.01 is ±1 %. In IEEE 754 doubles
// 0.07 × 100 is 7.000000000000001 and 0.29 × 100 is 28.999999999999996 (the nearest doubles to
// 0.07 and 0.29 are not exact), so the conversion must drop that noise to give 7 and 29.
describe('upgradeSpecDocument', () => {
  test.each([
    [0.01, 1],
    [0.07, 7],
    [0.29, 29],
    [0.005, 0.5],
  ])('tolerance %d becomes tolerancePercent %d, the fraction removed', (fraction, percent) => {
    const document = { resistors: { series: 'E24', tolerance: fraction } };
    expect(upgradeSpecDocument(document)).toEqual([]);
    expect(document).toEqual({ resistors: { series: 'E24', tolerancePercent: percent } });
    expect(0.07 * 100).not.toBe(7); // the binary noise the conversion removes [IEEE 754]
  });

  test('both forms saying the same value are accepted as one', () => {
    const document = { resistors: { tolerance: 0.05, tolerancePercent: 5 } };
    expect(upgradeSpecDocument(document)).toEqual([]);
    expect(document).toEqual({ resistors: { tolerancePercent: 5 } });
  });

  test('both forms disagreeing: an issue naming both, the document left as it was', () => {
    const document = { resistors: { tolerance: 0.01, tolerancePercent: 5 } };
    expect(upgradeSpecDocument(document)).toEqual([
      { path: '/resistors/tolerance', message: 'says ±1 % while the resistor tolerance says ±5 %: give it once, in per cent' },
    ]);
    expect(document).toEqual({ resistors: { tolerance: 0.01, tolerancePercent: 5 } });
  });

  test.each([['1 %'], [Number.NaN], [Number.POSITIVE_INFINITY], [null]])('a tolerance of %j is refused, asking for per cent', (value) => {
    const document = { resistors: { tolerance: value } };
    expect(upgradeSpecDocument(document)).toEqual([
      { path: '/resistors/tolerance', message: 'must be a number, a fraction (0.01 for ±1 %); better give the resistor tolerance in per cent' },
    ]);
    expect(document.resistors).toHaveProperty('tolerance');
  });

  test.each([[null], [[]], ['spec'], [{}], [{ resistors: [] }], [{ resistors: { tolerancePercent: 1 } }]])('%j has nothing to upgrade', (document) => {
    const before = structuredClone(document);
    expect(upgradeSpecDocument(document)).toEqual([]);
    expect(document).toEqual(before);
  });

  test('validateSpec reads the older form and reports a clash at the older field', () => {
    const upgraded = validateSpec({ ...MINIMAL_SPEC, resistors: { series: 'E24', tolerance: 0.05 } });
    expect(upgraded.ok && upgraded.value.resistors).toEqual({ series: 'E24', tolerancePercent: 5, tempcoPpmPerC: 100 });
    expect(printed(validateSpec({ ...MINIMAL_SPEC, resistors: { tolerance: 'x' } }))).toEqual([
      '/resistors/tolerance: must be a number, a fraction (0.01 for ±1 %); better give the resistor tolerance in per cent',
    ]);
  });

  test('fractionToPercent keeps twelve significant digits', () => {
    expect(fractionToPercent(0.123456789012345)).toBe(12.3456789012);
  });
});

describe('field labels', () => {
  test('a titled field reads in running text; a title starting with an acronym keeps it', () => {
    expect(specFieldLabel('/supply/positiveV')).toBe('the positive rail');
    expect(specFieldLabel('/device/vbeOnV')).toBe('the VBE at 1 mA');
    expect(designFieldLabel('/supply/negativeV')).toBe('the negative rail');
  });

  test('an untitled or unknown field falls back to the pointer\u2019s last word', () => {
    expect(specFieldLabel('/nowhere/deeper')).toBe('deeper');
    expect(designFieldLabel('/nowhere/deeper')).toBe('deeper');
    expect(fieldTitle({ properties: { a: {} } }, '/a/b/c')).toBeUndefined();
  });
});

describe('cross-field rules at their edges', () => {
  test('an equal lowest and highest temperature is a valid range (one temperature)', () => {
    expect(printed(validateSpec({ ...MINIMAL_SPEC, temperatureC: { min: 25, max: 25 } }))).toEqual([]);
  });
});
