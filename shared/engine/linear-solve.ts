/**
 * Dense LU factorisation with partial pivoting for the small node systems of one stage
 * (a dozen nodes at most). Row-major matrices of size n×n as plain arrays: on this engine's
 * sizes, creating a plain array is about ten times cheaper than a typed one (measured).
 */

/** Threshold below which a pivot counts as zero: the node system is singular. */
const SINGULAR_PIVOT = 1e-300;

export interface LuFactors {
  n: number;
  lu: number[];
  pivot: number[];
}

/**
 * Factorises `matrix` (n×n, row-major), in place when `inPlace` (the caller's matrix is then
 * overwritten), else a copy. Throws when the system is singular.
 */
export function luFactor(matrix: number[], n: number, inPlace = false): LuFactors {
  const lu = inPlace ? matrix : matrix.slice();
  const pivot = zeros(n);
  for (let k = 0; k < n; k += 1) {
    let best = k;
    let bestAbs = Math.abs(lu[k * n + k]);
    for (let r = k + 1; r < n; r += 1) {
      const v = Math.abs(lu[r * n + k]);
      if (v > bestAbs) {
        best = r;
        bestAbs = v;
      }
    }
    if (!(bestAbs > SINGULAR_PIVOT)) throw new Error('singular node system');
    pivot[k] = best;
    if (best !== k) {
      for (let c = 0; c < n; c += 1) {
        const tmp = lu[k * n + c];
        lu[k * n + c] = lu[best * n + c];
        lu[best * n + c] = tmp;
      }
    }
    const diag = lu[k * n + k];
    for (let r = k + 1; r < n; r += 1) {
      const factor = lu[r * n + k] / diag;
      lu[r * n + k] = factor;
      if (factor !== 0) {
        for (let c = k + 1; c < n; c += 1) lu[r * n + c] -= factor * lu[k * n + c];
      }
    }
  }
  return { n, lu, pivot };
}

/** A copy of b with the factorisation's row exchanges applied, in the order they were made. */
function pivoted(rhs: readonly number[], pivot: readonly number[], n: number): number[] {
  const x = rhs.slice();
  for (let k = 0; k < n; k += 1) {
    const p = pivot[k];
    if (p !== k) {
      const tmp = x[k];
      x[k] = x[p];
      x[p] = tmp;
    }
  }
  return x;
}

/** Solves A·x = b with the factors of A; returns a new vector. */
export function luSolve({ n, lu, pivot }: LuFactors, rhs: number[]): number[] {
  const x = pivoted(rhs, pivot, n);
  for (let r = 1; r < n; r += 1) {
    let sum = x[r];
    for (let c = 0; c < r; c += 1) sum -= lu[r * n + c] * x[c];
    x[r] = sum;
  }
  for (let r = n - 1; r >= 0; r -= 1) {
    let sum = x[r];
    for (let c = r + 1; c < n; c += 1) sum -= lu[r * n + c] * x[c];
    x[r] = sum / lu[r * n + r];
  }
  return x;
}

/**
 * LU factors with each row's nonzero entries listed (L left of the diagonal, U right of it), for
 * many solves with one factorisation: a node system's factors are mostly zeros (a 26-node
 * stage's hold about 130 nonzeros of 650), so a solve visits only those.
 */
export interface SparseLuFactors {
  factors: LuFactors;
  /** Row r's entries of L are at lowerCols[lowerStart[r]…lowerStart[r + 1] − 1], of U at upperCols[upperStart[r]…]. */
  lowerStart: number[];
  lowerCols: number[];
  upperStart: number[];
  upperCols: number[];
}

/** Lists the nonzero entries of LU factors (sparseLuSolve). */
export function sparseLuFactors(factors: LuFactors): SparseLuFactors {
  const { n, lu } = factors;
  const lowerStart = zeros(n + 1);
  const upperStart = zeros(n + 1);
  const lowerCols: number[] = [];
  const upperCols: number[] = [];
  for (let r = 0; r < n; r += 1) {
    lowerStart[r] = lowerCols.length;
    upperStart[r] = upperCols.length;
    for (let c = 0; c < r; c += 1) if (lu[r * n + c] !== 0) lowerCols.push(c);
    for (let c = r + 1; c < n; c += 1) if (lu[r * n + c] !== 0) upperCols.push(c);
  }
  lowerStart[n] = lowerCols.length;
  upperStart[n] = upperCols.length;
  return { factors, lowerStart, lowerCols, upperStart, upperCols };
}

/** Solves A·x = b as luSolve does (the same operations in the same order, without the zero terms); returns a new vector. */
export function sparseLuSolve({ factors, lowerStart, lowerCols, upperStart, upperCols }: SparseLuFactors, rhs: readonly number[]): number[] {
  const { n, lu, pivot } = factors;
  const x = pivoted(rhs, pivot, n);
  for (let r = 1; r < n; r += 1) {
    let sum = x[r];
    for (let i = lowerStart[r]; i < lowerStart[r + 1]; i += 1) {
      const c = lowerCols[i];
      sum -= lu[r * n + c] * x[c];
    }
    x[r] = sum;
  }
  for (let r = n - 1; r >= 0; r -= 1) {
    let sum = x[r];
    for (let i = upperStart[r]; i < upperStart[r + 1]; i += 1) {
      const c = upperCols[i];
      sum -= lu[r * n + c] * x[c];
    }
    x[r] = sum / lu[r * n + r];
  }
  return x;
}

/** A vector of n zeros. */
export function zeros(n: number): number[] {
  return new Array<number>(n).fill(0);
}
