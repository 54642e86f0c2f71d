/**
 * Dense complex linear solve (Gaussian elimination with partial pivoting) for the small-signal
 * node system at one frequency, (G + jωC)·x = b: real and imaginary parts in separate row-major
 * arrays, several right-hand sides at once. Sizes are a stage's nodes (a dozen or two).
 */

/** Threshold below which a pivot's magnitude counts as zero: the system is singular. */
const SINGULAR_PIVOT = 1e-300;

/** A complex vector as two arrays. */
export interface ComplexVector {
  re: number[];
  im: number[];
}

/**
 * Solves (aRe + j·aIm)·x = rhs for every right-hand side. The matrices are overwritten; the
 * right-hand sides are copied. Throws when the system is singular.
 */
export function solveComplex(aRe: number[], aIm: number[], n: number, rhs: readonly ComplexVector[]): ComplexVector[] {
  const xs = rhs.map((b) => ({ re: b.re.slice(), im: b.im.slice() }));
  for (let k = 0; k < n; k += 1) {
    let best = k;
    let bestAbs = Math.abs(aRe[k * n + k]) + Math.abs(aIm[k * n + k]);
    for (let r = k + 1; r < n; r += 1) {
      const v = Math.abs(aRe[r * n + k]) + Math.abs(aIm[r * n + k]);
      if (v > bestAbs) {
        best = r;
        bestAbs = v;
      }
    }
    if (!(bestAbs > SINGULAR_PIVOT)) throw new Error('singular node system');
    if (best !== k) {
      for (let c = k; c < n; c += 1) {
        const i = k * n + c;
        const j = best * n + c;
        let t = aRe[i];
        aRe[i] = aRe[j];
        aRe[j] = t;
        t = aIm[i];
        aIm[i] = aIm[j];
        aIm[j] = t;
      }
      for (const x of xs) {
        let t = x.re[k];
        x.re[k] = x.re[best];
        x.re[best] = t;
        t = x.im[k];
        x.im[k] = x.im[best];
        x.im[best] = t;
      }
    }
    // 1/pivot
    const pr = aRe[k * n + k];
    const pi = aIm[k * n + k];
    const d = pr * pr + pi * pi;
    const ir = pr / d;
    const ii = -pi / d;
    for (let r = k + 1; r < n; r += 1) {
      const lr0 = aRe[r * n + k];
      const li0 = aIm[r * n + k];
      if (lr0 === 0 && li0 === 0) continue;
      const lr = lr0 * ir - li0 * ii;
      const li = lr0 * ii + li0 * ir;
      for (let c = k + 1; c < n; c += 1) {
        const ur = aRe[k * n + c];
        const ui = aIm[k * n + c];
        aRe[r * n + c] -= lr * ur - li * ui;
        aIm[r * n + c] -= lr * ui + li * ur;
      }
      for (const x of xs) {
        const br = x.re[k];
        const bi = x.im[k];
        x.re[r] -= lr * br - li * bi;
        x.im[r] -= lr * bi + li * br;
      }
    }
  }
  for (const x of xs) {
    for (let r = n - 1; r >= 0; r -= 1) {
      let sr = x.re[r];
      let si = x.im[r];
      for (let c = r + 1; c < n; c += 1) {
        const ar = aRe[r * n + c];
        const ai = aIm[r * n + c];
        sr -= ar * x.re[c] - ai * x.im[c];
        si -= ar * x.im[c] + ai * x.re[c];
      }
      const pr = aRe[r * n + r];
      const pi = aIm[r * n + r];
      const d = pr * pr + pi * pi;
      x.re[r] = (sr * pr + si * pi) / d;
      x.im[r] = (si * pr - sr * pi) / d;
    }
  }
  return xs;
}
