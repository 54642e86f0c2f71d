/**
 * Complex arithmetic written out, and determinants by Laplace expansion: the independent side of
 * the solver tests (Cramer's rule, x_k = det(A_k)/det(A)), kept apart from the engine's own
 * elimination. Matrices are row-major arrays of n × n entries.
 */
export type C = { re: number; im: number };

export const mul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
export const sub = (a: C, b: C): C => ({ re: a.re - b.re, im: a.im - b.im });
export const add = (a: C, b: C): C => ({ re: a.re + b.re, im: a.im + b.im });
export const abs = (a: C) => Math.hypot(a.re, a.im);

/** Determinant of an n × n complex matrix by Laplace expansion along the first row. */
export function det(m: C[], n: number): C {
  if (n === 1) return m[0];
  let sum: C = { re: 0, im: 0 };
  for (let col = 0; col < n; col += 1) {
    const minor = m.filter((_, i) => i >= n && i % n !== col);
    const term = mul(m[col], det(minor, n - 1));
    sum = col % 2 === 0 ? add(sum, term) : sub(sum, term);
  }
  return sum;
}

/** x = A⁻¹·b by Cramer's rule. */
export function cramer(m: C[], b: C[], n: number): C[] {
  const whole = det(m, n);
  return b.map((_, k) => div(det(m.map((x, i) => (i % n === k ? b[Math.floor(i / n)] : x)), n), whole));
}
