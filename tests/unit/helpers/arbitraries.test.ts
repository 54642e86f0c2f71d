/**
 * The shared arbitraries spread their draws as they claim, checked on draws made the way a
 * property makes them (fc.assert, fixed seed, so the check is repeatable). Pearson's chi-square
 * goodness-of-fit test: the statistic over k equally likely buckets is compared with the
 * chi-square distribution's 0.1 % upper critical value for k − 1 degrees of freedom (NIST/SEMATECH
 * e-Handbook of Statistical Methods, 1.3.6.7.4: 9 df 27.877, 23 df 49.728, 39 df 72.055).
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { logUniform, logUniformDraw, uniformBetween, uniformFraction } from '../../helpers/arbitraries';

const CHI_SQUARE_0_1_PERCENT: Record<number, number> = { 9: 27.877, 23: 49.728, 39: 72.055 };

/** Draws `n` values through fc.assert, as a property would receive them. */
function drawn<T>(arbitrary: fc.Arbitrary<T>, n: number): T[] {
  const values: T[] = [];
  fc.assert(
    fc.property(arbitrary, (value) => {
      values.push(value);
    }),
    { numRuns: n, seed: 20261204 },
  );
  return values;
}

/** Pearson's statistic of bucket indices against `k` equally likely buckets. */
function chiSquare(indices: number[], k: number): number {
  const counts = new Array<number>(k).fill(0);
  for (const i of indices) counts[i] += 1;
  const expected = indices.length / k;
  return counts.reduce((sum, count) => sum + (count - expected) ** 2 / expected, 0);
}

describe('uniform draws', () => {
  test('uniformFraction fills ten equal buckets of [0, 1) evenly (chi-square, 9 df)', () => {
    const values = drawn(uniformFraction(), 2000);
    expect(values.filter((u) => !(u >= 0 && u < 1))).toEqual([]);
    expect(chiSquare(values.map((u) => Math.floor(u * 10)), 10)).toBeLessThan(CHI_SQUARE_0_1_PERCENT[9]);
  });

  test('uniformBetween(−0.05, 0.05) fills ten equal buckets evenly, not crowded at 0 (chi-square, 9 df)', () => {
    const values = drawn(uniformBetween(-0.05, 0.05), 2000);
    expect(values.filter((x) => !(x >= -0.05 && x < 0.05))).toEqual([]);
    expect(chiSquare(values.map((x) => Math.min(9, Math.floor((x + 0.05) * 100))), 10)).toBeLessThan(CHI_SQUARE_0_1_PERCENT[9]);
    // uniform: about 2 % of draws within 0.001 of 0 (fc.double over this range gives most of them)
    expect(values.filter((x) => Math.abs(x) < 0.001).length / values.length).toBeLessThan(0.05);
  });

  test.each([
    [1, 1],
    [2, -2],
    [Number.NaN, 1],
  ])('uniformBetween(%d, %d) is refused', (min, max) => {
    expect(() => uniformBetween(min, max)).toThrow(RangeError);
  });
});

describe('log-uniform draws: a decade and a mantissa', () => {
  const draws = drawn(logUniformDraw(-9, 15), 4800);

  test('every decade of 10^−9 ... 10^15 equally likely (24 buckets, chi-square, 23 df)', () => {
    expect(new Set(draws.map((d) => d.decade)).size).toBe(24);
    expect(chiSquare(draws.map((d) => d.decade + 9), 24)).toBeLessThan(CHI_SQUARE_0_1_PERCENT[23]);
  });

  test('log10 of the mantissa uniform over [0, 1) (ten buckets, chi-square, 9 df), mantissas across [1, 10)', () => {
    expect(draws.filter(({ mantissa }) => !(mantissa >= 1 && mantissa < 10))).toEqual([]);
    expect(chiSquare(draws.map((d) => Math.floor(Math.log10(d.mantissa) * 10)), 10)).toBeLessThan(CHI_SQUARE_0_1_PERCENT[9]);
    const mantissas = draws.map((d) => d.mantissa);
    expect(Math.min(...mantissas)).toBeLessThan(1.01);
    expect(Math.max(...mantissas)).toBeGreaterThan(9.9);
    // log-uniform: log10(2) ≈ 30.1 % of mantissas in [1, 2)
    expect(Math.abs(mantissas.filter((m) => m < 2).length / mantissas.length - Math.log10(2))).toBeLessThan(0.03);
  });

  test('the value is mantissa · 10^decade, inside the decade', () => {
    const off = draws.filter(({ value, mantissa, decade }) => !(Math.abs(value / (mantissa * 10 ** decade) - 1) < 1e-12 && value >= 10 ** decade * (1 - 1e-12) && value < 10 ** (decade + 1)));
    expect(off).toEqual([]);
  });

  test('logUniform values, read back as log10, fill forty buckets evenly (chi-square, 39 df)', () => {
    const values = drawn(logUniform(-20, 20), 4000);
    expect(chiSquare(values.map((v) => Math.min(39, Math.floor(Math.log10(v) + 20))), 40)).toBeLessThan(CHI_SQUARE_0_1_PERCENT[39]);
  });

  test('the check has teeth: 10 ** fc.double(−9, 15) fails it (its draws crowd around 1)', () => {
    const values = drawn(
      fc.double({ min: -9, max: 15, noNaN: true }).map((x) => 10 ** x),
      4800,
    );
    const decades = values.map((v) => Math.min(23, Math.max(0, Math.floor(Math.log10(v)) + 9)));
    expect(chiSquare(decades, 24)).toBeGreaterThan(CHI_SQUARE_0_1_PERCENT[23]);
  });

  test.each([
    [0, 0],
    [3, 1],
    [0.5, 2],
  ])('logUniform(%d, %d) is refused', (min, max) => {
    expect(() => logUniform(min, max)).toThrow(RangeError);
  });
});
