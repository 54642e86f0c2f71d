/**
 * Dense complex Gaussian elimination (shared/engine/complex-solve.ts) against Cramer's rule,
 * x_k = det(A_k)/det(A) with determinants by Laplace expansion: a general complex system with
 * two right-hand sides, systems that need a row exchange (a zero or a pure imaginary pivot
 * candidate), entries that are purely real or purely imaginary, and a singular system. Values are
 * invented; every system is built inside its test.
 */
import { describe, expect, test } from 'vitest';
import { solveComplex, type ComplexVector } from '#shared/engine/complex-solve';
import { cramer, type C } from '../../helpers/complex-by-hand';

/** x = A⁻¹·b by Cramer's rule, the system given as its real and imaginary parts. */
function cramerOf(re: number[], im: number[], n: number, b: ComplexVector): C[] {
  return cramer(re.map((x, i) => ({ re: x, im: im[i] })), b.re.map((x, i) => ({ re: x, im: b.im[i] })), n);
}

/** Solves with solveComplex (on copies) and checks every component against Cramer's rule, relative to the solution's size. */
function expectCramer(re: number[], im: number[], n: number, rhs: ComplexVector[], tolerance = 1e-13): void {
  const xs = solveComplex(re.slice(), im.slice(), n, rhs);
  expect(xs).toHaveLength(rhs.length);
  rhs.forEach((b, j) => {
    // the solution has exactly n components
    expect(xs[j].re).toHaveLength(n);
    expect(xs[j].im).toHaveLength(n);
    const expected = cramerOf(re, im, n, b);
    const size = Math.max(...expected.map((z) => Math.hypot(z.re, z.im)));
    expected.forEach((z, k) => {
      expect(Math.abs(xs[j].re[k] - z.re) / size, `rhs ${j} x${k} re`).toBeLessThan(tolerance);
      expect(Math.abs(xs[j].im[k] - z.im) / size, `rhs ${j} x${k} im`).toBeLessThan(tolerance);
    });
  });
}

describe('solveComplex against Cramer’s rule', () => {
  test('a general 4 × 4 complex system with two right-hand sides, the right-hand sides left as they were', () => {
    const re = [4, -1.5, 0.3, 2, 0.7, 5, -2, 1.1, -1, 0.4, 6, -0.8, 2.5, -0.6, 1.2, 3];
    const im = [1, 0.5, -2, 0.25, -0.3, 2, 0.9, -1.4, 0.6, -1.2, -3, 0.2, 1.7, 0.1, -0.5, 4];
    const rhs: ComplexVector[] = [
      { re: [1, -2, 0.5, 3], im: [0, 1, -1, 0.25] },
      { re: [0, 0, 1, 0], im: [-2, 0.5, 0, 1] },
    ];
    expectCramer(re, im, 4, rhs);
    expect(rhs[0]).toEqual({ re: [1, -2, 0.5, 3], im: [0, 1, -1, 0.25] });
    expect(rhs[1]).toEqual({ re: [0, 0, 1, 0], im: [-2, 0.5, 0, 1] });
  });

  test('a zero first pivot: the rows are exchanged (matrix and every right-hand side)', () => {
    const re = [0, 2, 1, 3, 1, -1, 1, 0, 2];
    const im = [0, 1, -1, 0.5, 2, 0, -1, 1, 0.5];
    expectCramer(re, im, 3, [{ re: [1, 2, 3], im: [0, -1, 0.5] }, { re: [-1, 0, 0], im: [0, 0, 2] }]);
  });

  test('a first column whose only non-zero entry is purely imaginary, in the last row: the pivot is sought by |re| + |im| down the whole column', () => {
    const re = [0, 1, 2, 0, 3, -1, 0, 1, 1];
    const im = [0, -1, 0.5, 0, 1, 2, 2, 0, -0.5];
    expectCramer(re, im, 3, [{ re: [1, 0, -1], im: [0.5, 2, 0] }]);
  });

  test('the larger of two candidate pivots is taken: a column of 1 and 10j solves as accurately as Cramer’s rule', () => {
    // without the exchange the small pivot 1e-14 scales the elimination by 1e14 and loses the answer
    const re = [1e-14, 1, 0, 0, 1, 1, 1, 0, 2];
    const im = [0, 0, 1, 10, 0, -1, 0, 3, 0];
    expectCramer(re, im, 3, [{ re: [1, 2, -1], im: [0, 0, 1] }], 1e-12);
  });

  test('entries below a pivot that are purely real or purely imaginary are eliminated, not skipped', () => {
    const re = [3, 1, 0, 2, 0, 1, 0, 1, 4];
    const im = [1, 0, 2, 0, 5, -1, 1.5, 0, 1];
    // row 1 has a real entry under the pivot, row 2 an imaginary one
    expectCramer(re, im, 3, [{ re: [1, 1, 1], im: [0, 0, 0] }]);
  });

  test.each([
    ['real', 1, 0],
    ['imaginary', 0, 1],
  ])('a zero pivot at the second column of a %s 4 × 4 system: the pivot is sought in that column, not beside it', (_, reScale, imScale) => {
    // column 0 is e0·2, so the first step changes nothing; at column 1 the diagonal is 0 and the
    // entries beside the candidates, (1,3) and (2,3), are 0 too: only column 1 itself finds row 3
    const m = [2, 1, 0, 1, 0, 0, 3, 0, 0, 1, 1, 0, 0, 2, 1, 4];
    const re = m.map((x) => x * reScale);
    const im = m.map((x) => x * imScale);
    expectCramer(re, im, 4, [{ re: [1, 2, 3, 4], im: [0, -1, 0, 1] }]);
  });

  test('a 1 × 1 system is a complex division', () => {
    const [x] = solveComplex([3], [4], 1, [{ re: [2], im: [-1] }]);
    // (2 − j)/(3 + 4j) = (2 − j)(3 − 4j)/25 = (2 − 11j)/25
    expect(x.re[0]).toBeCloseTo(2 / 25, 15);
    expect(x.im[0]).toBeCloseTo(-11 / 25, 15);
  });

  test('a singular system (two proportional rows) throws', () => {
    const re = [1, 2, 0, 2, 4, 0, 0, 1, 1];
    const im = [1, 0, 0, 2, 0, 0, 1, 0, 0];
    expect(() => solveComplex(re, im, 3, [{ re: [1, 0, 0], im: [0, 0, 0] }])).toThrow(/singular/);
    expect(() => solveComplex([0, 0, 0, 0], [0, 0, 0, 0], 2, [{ re: [1, 0], im: [0, 0] }])).toThrow(/singular/);
  });
});
