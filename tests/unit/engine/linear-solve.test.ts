/**
 * The dense LU solver of the node systems (shared/engine/linear-solve.ts) on systems whose
 * solutions are known exactly: integer systems solved by hand (Cramer's rule), one that needs row
 * exchanges (a zero on the diagonal), a permutation matrix, and singular systems, which Gaussian
 * elimination with partial pivoting must refuse (Golub & Van Loan, Matrix Computations, §3.4).
 */
import { describe, expect, test } from 'vitest';
import { luFactor, luSolve, zeros } from '#shared/engine/linear-solve';

const solve = (a: number[], n: number, b: number[]) => luSolve(luFactor(a, n), b);

describe('solving', () => {
  test('a 3×3 integer system: 2x + y − z = 8, −3x − y + 2z = −11, −2x + y + 2z = −3 has x = 2, y = 3, z = −1', () => {
    const x = solve([2, 1, -1, -3, -1, 2, -2, 1, 2], 3, [8, -11, -3]);
    expect(x[0]).toBeCloseTo(2, 12);
    expect(x[1]).toBeCloseTo(3, 12);
    expect(x[2]).toBeCloseTo(-1, 12);
  });

  test('a zero on the diagonal needs a row exchange: [[0, 1], [1, 0]]·x = [5, 7] gives x = [7, 5]', () => {
    expect(solve([0, 1, 1, 0], 2, [5, 7])).toEqual([7, 5]);
  });

  test('a 4×4 cyclic permutation is solved exactly', () => {
    // rows pick x2, x3, x4, x1: the answer is the right-hand side rotated
    const p = [0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 1, 0, 0, 0];
    expect(solve(p, 4, [10, 20, 30, 40])).toEqual([40, 10, 20, 30]);
  });

  test('partial pivoting picks the largest pivot: a tiny leading entry does not ruin the answer', () => {
    // [[1e-20, 1], [1, 1]]·x = [1, 2]: x ≈ [1, 1]; without a row exchange 1 − 1e20 swamps it (Golub & Van Loan §3.3)
    const x = solve([1e-20, 1, 1, 1], 2, [1, 2]);
    expect(x[0]).toBeCloseTo(1, 12);
    expect(x[1]).toBeCloseTo(1, 12);
  });

  test('a lower-triangular system, [[4, 0, 0], [2, 5, 0], [1, 3, 6]], solves as forward substitution gives it', () => {
    // forward substitution by hand: x1 = 8/4 = 2, x2 = (19 − 4)/5 = 3, x3 = (29 − 2 − 9)/6 = 3
    const x = solve([4, 0, 0, 2, 5, 0, 1, 3, 6], 3, [8, 19, 29]);
    expect(x.map((v) => Math.round(v * 1e12) / 1e12)).toEqual([2, 3, 3]);
  });

  test('one factorisation serves several right-hand sides, and leaves them as they were', () => {
    const factors = luFactor([3, 1, 1, 2], 2);
    const b1 = [9, 8];
    const b2 = [1, 0];
    // 3x + y = 9, x + 2y = 8: x = 2, y = 3; 3x + y = 1, x + 2y = 0: x = 0.4, y = −0.2
    expect(luSolve(factors, b1).map((v) => Math.round(v * 1e12) / 1e12)).toEqual([2, 3]);
    expect(luSolve(factors, b2).map((v) => Math.round(v * 1e12) / 1e12)).toEqual([0.4, -0.2]);
    expect(b1).toEqual([9, 8]);
    expect(b2).toEqual([1, 0]);
  });
});

describe('the matrix itself', () => {
  test('is kept unless factorised in place, and overwritten when it is', () => {
    const a = [0, 1, 1, 0];
    luFactor(a, 2);
    expect(a).toEqual([0, 1, 1, 0]);
    const factors = luFactor(a, 2, true);
    expect(factors.lu).toBe(a);
    expect(a).not.toEqual([0, 1, 1, 0]);
  });
});

describe('singular systems are refused', () => {
  test.each([
    ['two equal rows', [1, 2, 1, 2], 2],
    ['a zero column', [0, 1, 0, 2], 2],
    ['a second column twice the first', [4, 8, 1, 2, 4, 3, 1, 2, 5], 3],
    ['all zeros', [0], 1],
  ])('%s', (_, a, n) => {
    expect(() => luFactor(a as number[], n as number)).toThrow('singular node system');
  });

  test('a pivot as small as 1e-250 still counts: only a zero pivot (below 1e-300) is singular', () => {
    expect(solve([1e-250], 1, [2e-250])[0]).toBeCloseTo(2, 12);
  });
});

test('zeros(n) is n zeros', () => {
  expect(zeros(3)).toEqual([0, 0, 0]);
  expect(zeros(0)).toEqual([]);
});
