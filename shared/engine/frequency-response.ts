/**
 * The stage's transfers at any frequency from one reduction per operating point. The AC node
 * equations (G + s·C)·x = −(g + s·c)·d (s = j·2πf; g, c the drive nodes' columns, d the drive)
 * become, with G's factors, (I + s·A)·x = r0 + s·r1, A = G⁻¹·C, r0 = −G⁻¹·g·d, r1 = −G⁻¹·c·d.
 * A has columns only at the nodes a capacitance touches (the set K), so only those k nodes
 * couple over frequency: (I + s·A_KK)·x_K = r0_K + s·r1_K, and an output w reads
 * wᵀx = wᵀr0 + s·wᵀr1 − s·(wᵀA_·K)·x_K. A_KK is brought to upper Hessenberg form once,
 * H = L⁻¹·A_KK·L, by Gaussian elimination with row interchanges as similarity transforms
 * (J. H. Wilkinson, The Algebraic Eigenvalue Problem, 1965, ch. 6; half the work of Householder
 * reflections, Golub and Van Loan, Matrix Computations, 4th ed., §7.4.3), after which each
 * frequency is a Hessenberg solve of (I + s·H)·y = L⁻¹(r0_K + s·r1_K), read as (Lᵀq)ᵀy,
 * O(k²) instead of a dense complex factorisation, O(n³) (A. J. Laub, "Efficient
 * multivariable frequency response computations", IEEE Trans. Automatic Control 26 (1981) 407–408).
 * The algebra is exact: the transfers are those of SPICE's AC analysis [SPICE] ngspice bjtacld.c.
 */
import { sparseLuFactors, sparseLuSolve, zeros, type LuFactors } from './linear-solve';

/** Threshold below which a pivot's magnitude counts as zero: the system is singular. */
const SINGULAR_PIVOT = 1e-300;

/** An output as weights on free nodes, e.g. {c1: 1, c2: −1} for c1 − c2. */
export interface OutputWeights {
  nodes: number[];
  weights: number[];
}

/** One drive's part of the reduced system. */
interface ReducedDrive {
  /** L⁻¹·r0_K and L⁻¹·r1_K. */
  p0: readonly number[];
  p1: readonly number[];
  /** ‖r0_K‖ and ‖r1_K‖ (Euclidean, before the reduction, as every norm of the bound). */
  p0Norm: number;
  p1Norm: number;
}

/** One output's part of the reduced system. */
interface ReducedOutput {
  /** Lᵀ·(wᵀA_·K)ᵀ. */
  q: readonly number[];
  /** ‖(wᵀA_·K)ᵀ‖ (Euclidean, before the reduction). */
  qNorm: number;
  /** ‖A_KKᵀ·q‖ and ‖(A_KKᵀ)²·q‖ (before the reduction), for the remainders of the transfer's series. */
  hqNorm: number;
  h2qNorm: number;
}

/**
 * A transfer's first three Taylor coefficients in s about s = 0, exact (q, p before the
 * reduction, A = A_KK): transfer(s) − transfer(0) = s·first + s²·second + s³·third
 * + s³·qᵀA²(I + s·A)⁻¹(p0 + s·p1)·(−1).
 */
export interface TransferSeries {
  /** wᵀr1 − qᵀp0 */
  first: number;
  /** qᵀA·p0 − qᵀp1 */
  second: number;
  /** qᵀA·p1 */
  third: number;
}

/**
 * The reduced frequency model of a stage: `transfer(d, w, f)` is output w's response to drive d
 * at f. Built once per operating point (`reducedFrequencyModel`); read-only afterwards.
 */
export interface FrequencyModel {
  /** Nodes coupled over frequency (those a capacitance touches). */
  k: number;
  /** Upper Hessenberg H, row-major k × k. */
  hessenberg: readonly number[];
  /** ‖A_KK‖ (Frobenius, ≥ the 2-norm; before the reduction), for the bound on how far a transfer can move. */
  couplingNorm: number;
  drives: ReducedDrive[];
  outputs: ReducedOutput[];
  /** wᵀr0 and wᵀr1, [drive][output]: the low-frequency transfer and its direct s-term. */
  low: number[][];
  direct: number[][];
  /** Each transfer's Taylor coefficients, [drive][output] (transferMoveBound). */
  series: TransferSeries[][];
}

/** A complex value as real and imaginary parts. */
export interface ComplexPair {
  re: number;
  im: number;
}

/** Σ weights·vector at the output's nodes. */
export function readOutput(vector: readonly number[], output: OutputWeights): number {
  let sum = 0;
  for (let i = 0; i < output.nodes.length; i += 1) sum += output.weights[i] * vector[output.nodes[i]];
  return sum;
}

function norm(vector: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < vector.length; i += 1) sum += vector[i] * vector[i];
  return Math.sqrt(sum);
}

function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < a.length; i += 1) sum += a[i] * b[i];
  return sum;
}

/** Aᵀ·x for a dense A (k × k, row-major). */
function transposeTimes(a: ArrayLike<number>, k: number, x: ArrayLike<number>): number[] {
  const y = zeros(k);
  for (let r = 0; r < k; r += 1) {
    const xr = x[r];
    if (xr === 0) continue;
    for (let c = 0; c < k; c += 1) y[c] += a[r * k + c] * xr;
  }
  return y;
}

/**
 * Reduces A (k × k, row-major, overwritten with H) to upper Hessenberg form by Gaussian
 * elimination as similarity transforms, column by column: the largest entry below the
 * subdiagonal brought up by a row and column interchange, then each row below less a multiple y
 * of the pivot row (A ← E·A) and the pivot column plus y times that row's column (A ← A·E⁻¹)
 * (Wilkinson ch. 6; the EISPACK routine ELMHES). The drives' vectors take each E (they become
 * L⁻¹·p), the outputs' each E⁻ᵀ from the right (qᵀ becomes qᵀ·L).
 */
function toHessenberg(a: number[], k: number, drives: number[][], outputs: number[][]): void {
  for (let m = 1; m < k - 1; m += 1) {
    // the pivot: the largest |a[i][m−1]| for i ≥ m
    let pivot = 0;
    let at = m;
    for (let i = m; i < k; i += 1) {
      if (Math.abs(a[i * k + m - 1]) > Math.abs(pivot)) {
        pivot = a[i * k + m - 1];
        at = i;
      }
    }
    if (at !== m) {
      for (let j = m - 1; j < k; j += 1) {
        const t = a[at * k + j];
        a[at * k + j] = a[m * k + j];
        a[m * k + j] = t;
      }
      for (let j = 0; j < k; j += 1) {
        const t = a[j * k + at];
        a[j * k + at] = a[j * k + m];
        a[j * k + m] = t;
      }
      for (const x of [...drives, ...outputs]) {
        const t = x[at];
        x[at] = x[m];
        x[m] = t;
      }
    }
    if (pivot === 0) continue;
    for (let i = m + 1; i < k; i += 1) {
      const below = a[i * k + m - 1];
      if (below === 0) continue;
      const y = below / pivot;
      a[i * k + m - 1] = 0;
      for (let j = m; j < k; j += 1) a[i * k + j] -= y * a[m * k + j];
      for (let j = 0; j < k; j += 1) a[j * k + m] += y * a[j * k + i];
      for (const x of drives) x[i] -= y * x[m];
      for (const x of outputs) x[m] += y * x[i];
    }
  }
}

/**
 * Builds the reduced model from G's factors, the capacitance matrix C (row-major n × n), the
 * drives' right-hand sides r0 (the low-frequency responses) and their capacitive columns
 * (c·d, length n, or null when no capacitance touches a drive node), and the outputs.
 */
export function reducedFrequencyModel(
  factors: LuFactors,
  capacitance: readonly number[],
  lowResponses: readonly (readonly number[])[],
  capacitiveDrives: readonly (readonly number[] | null)[],
  outputs: readonly OutputWeights[],
): FrequencyModel {
  const n = factors.n;
  // K: the nodes whose column of C is not empty
  const coupled: number[] = [];
  for (let col = 0; col < n; col += 1) {
    for (let row = 0; row < n; row += 1) {
      if (capacitance[row * n + col] !== 0) {
        coupled.push(col);
        break;
      }
    }
  }
  const k = coupled.length;
  // A's columns at K: G⁻¹·C[:, K]
  // (k + 2 solves with one factorisation: they visit only the factors' nonzero entries)
  const sparse = sparseLuFactors(factors);
  const columns: number[][] = [];
  const c = zeros(n);
  for (const col of coupled) {
    for (let row = 0; row < n; row += 1) c[row] = capacitance[row * n + col];
    columns.push(sparseLuSolve(sparse, c));
  }
  const a = zeros(k * k);
  for (let i = 0; i < k; i += 1) for (let j = 0; j < k; j += 1) a[i * k + j] = columns[j][coupled[i]];
  // r1 = −G⁻¹·(c·d)
  const r1s = capacitiveDrives.map((drive) => (drive ? sparseLuSolve(sparse, drive.map((x) => -x)) : zeros(n)));
  // the vectors at K
  const p0s = lowResponses.map((r0) => coupled.map((node) => r0[node]));
  const p1s = r1s.map((r1) => coupled.map((node) => r1[node]));
  // (wᵀA_·K)ᵀ for each output
  const qs = outputs.map((w) => columns.map((column) => readOutput(column, w)));
  const direct = r1s.map((r1) => outputs.map((w) => readOutput(r1, w)));
  // Before the reduction: the bound's norms, and Aᵀq, (Aᵀ)²q for the series' coefficients and remainders
  const couplingNorm = norm(a);
  const driveNorms = p0s.map((p0, d) => [norm(p0), norm(p1s[d])]);
  const outputNorms = qs.map(norm);
  const hqs = qs.map((q) => transposeTimes(a, k, q));
  const h2qNorms = hqs.map((hq) => norm(transposeTimes(a, k, hq)));
  const series = p0s.map((p0, d) =>
    qs.map((q, w) => ({ first: direct[d][w] - dot(q, p0), second: dot(hqs[w], p0) - dot(q, p1s[d]), third: dot(hqs[w], p1s[d]) })),
  );
  toHessenberg(a, k, [...p0s, ...p1s], qs);
  return {
    k,
    hessenberg: a,
    couplingNorm,
    drives: p0s.map((p0, d) => ({ p0, p1: p1s[d], p0Norm: driveNorms[d][0], p1Norm: driveNorms[d][1] })),
    outputs: qs.map((q, w) => ({ q, qNorm: outputNorms[w], hqNorm: norm(hqs[w]), h2qNorm: h2qNorms[w] })),
    low: lowResponses.map((r0) => outputs.map((w) => readOutput(r0, w))),
    direct,
    series,
  };
}

/** Working arrays of the frequency solve, one set per model size (reused: the solve runs to completion before the next). */
interface Workspace {
  mRe: Float64Array;
  mIm: Float64Array;
  yRe: Float64Array;
  yIm: Float64Array;
}

const workspaces = new Map<number, Workspace>();

function workspace(k: number, drives: number): Workspace {
  const size = k * 1000 + drives;
  let w = workspaces.get(size);
  if (!w) {
    w = { mRe: new Float64Array(k * k), mIm: new Float64Array(k * k), yRe: new Float64Array(drives * k), yIm: new Float64Array(drives * k) };
    workspaces.set(size, w);
  }
  return w;
}

/**
 * Every output's response to every drive at angular frequency ω (rad/s), [drive][output]:
 * (I + jω·H)·y = p0 + jω·p1 by Gaussian elimination on the Hessenberg form (each step pivots
 * between two rows), then wᵀr0 + jω·wᵀr1 − jω·qᵀy. `driveCount`: solve only the first drives
 * (each drive's figures are the same whichever others are solved with it). Throws when the
 * system is singular.
 */
export function transfersAtOmega(model: FrequencyModel, omega: number, driveCount = model.drives.length): ComplexPair[][] {
  const { k, hessenberg: h } = model;
  const nd = driveCount;
  const { mRe, mIm, yRe, yIm } = workspace(k, nd);
  // I + jω·H, and the right-hand sides (drive d at d·k…d·k + k − 1), as real and imaginary parts
  // (only the Hessenberg part: the elimination never reads below the subdiagonal)
  for (let r = 0; r < k; r += 1) {
    for (let i = r * k + (r > 0 ? r - 1 : 0); i < r * k + k; i += 1) {
      mRe[i] = 0;
      mIm[i] = omega * h[i];
    }
    mRe[r * k + r] = 1;
  }
  for (let d = 0; d < nd; d += 1) {
    const { p0, p1 } = model.drives[d];
    for (let i = 0; i < k; i += 1) {
      yRe[d * k + i] = p0[i];
      yIm[d * k + i] = omega * p1[i];
    }
  }
  for (let col = 0; col < k; col += 1) {
    const below = col + 1;
    const pivotRow = col * k;
    const belowRow = below * k;
    if (below < k && Math.abs(mRe[belowRow + col]) + Math.abs(mIm[belowRow + col]) > Math.abs(mRe[pivotRow + col]) + Math.abs(mIm[pivotRow + col])) {
      for (let c = col; c < k; c += 1) {
        let t = mRe[pivotRow + c];
        mRe[pivotRow + c] = mRe[belowRow + c];
        mRe[belowRow + c] = t;
        t = mIm[pivotRow + c];
        mIm[pivotRow + c] = mIm[belowRow + c];
        mIm[belowRow + c] = t;
      }
      for (let d = 0; d < nd; d += 1) {
        let t = yRe[d * k + col];
        yRe[d * k + col] = yRe[d * k + below];
        yRe[d * k + below] = t;
        t = yIm[d * k + col];
        yIm[d * k + col] = yIm[d * k + below];
        yIm[d * k + below] = t;
      }
    }
    const pr = mRe[pivotRow + col];
    const pi = mIm[pivotRow + col];
    if (!(Math.abs(pr) + Math.abs(pi) > SINGULAR_PIVOT)) throw new Error('singular node system');
    if (below === k) break;
    const lr0 = mRe[belowRow + col];
    const li0 = mIm[belowRow + col];
    if (lr0 === 0 && li0 === 0) continue;
    // l = m[below][col] / pivot
    const pp = pr * pr + pi * pi;
    const lr = (lr0 * pr + li0 * pi) / pp;
    const li = (li0 * pr - lr0 * pi) / pp;
    for (let c = below; c < k; c += 1) {
      const ur = mRe[pivotRow + c];
      const ui = mIm[pivotRow + c];
      mRe[belowRow + c] -= lr * ur - li * ui;
      mIm[belowRow + c] -= lr * ui + li * ur;
    }
    for (let d = 0; d < nd; d += 1) {
      const br = yRe[d * k + col];
      const bi = yIm[d * k + col];
      yRe[d * k + below] -= lr * br - li * bi;
      yIm[d * k + below] -= lr * bi + li * br;
    }
  }
  // Back substitution (upper triangular now), two drives at a time: each entry of U is read once per pair
  for (let d = 0; d < nd; d += 2) {
    const base = d * k;
    const pair = d + 1 < nd;
    const base2 = pair ? base + k : base;
    for (let r = k - 1; r >= 0; r -= 1) {
      let sr = yRe[base + r];
      let si = yIm[base + r];
      let tr = yRe[base2 + r];
      let ti = yIm[base2 + r];
      for (let c = r + 1; c < k; c += 1) {
        const ar = mRe[r * k + c];
        const ai = mIm[r * k + c];
        sr -= ar * yRe[base + c] - ai * yIm[base + c];
        si -= ar * yIm[base + c] + ai * yRe[base + c];
        tr -= ar * yRe[base2 + c] - ai * yIm[base2 + c];
        ti -= ar * yIm[base2 + c] + ai * yRe[base2 + c];
      }
      const pr = mRe[r * k + r];
      const pi = mIm[r * k + r];
      const pp = pr * pr + pi * pi;
      yRe[base + r] = (sr * pr + si * pi) / pp;
      yIm[base + r] = (si * pr - sr * pi) / pp;
      if (pair) {
        yRe[base2 + r] = (tr * pr + ti * pi) / pp;
        yIm[base2 + r] = (ti * pr - tr * pi) / pp;
      }
    }
  }
  const result: ComplexPair[][] = [];
  for (let d = 0; d < nd; d += 1) {
    const row: ComplexPair[] = [];
    for (let w = 0; w < model.outputs.length; w += 1) {
      const q = model.outputs[w].q;
      let qyRe = 0;
      let qyIm = 0;
      for (let i = 0; i < k; i += 1) {
        qyRe += q[i] * yRe[d * k + i];
        qyIm += q[i] * yIm[d * k + i];
      }
      // wᵀr0 + jω·wᵀr1 − jω·(qyRe + j·qyIm)
      row.push({ re: model.low[d][w] + omega * qyIm, im: omega * (model.direct[d][w] - qyRe) });
    }
    result.push(row);
  }
  return result;
}

/** Rounding allowance of the series bound, relative to the size of the terms that cancel in its coefficients (64 ulp). */
const SERIES_ROUNDING = 64 * Number.EPSILON;

/**
 * An upper bound on |transfer(ω) − transfer(0)| for drive d and output w, the smaller of two,
 * every norm taken before the reduction (A = A_KK, q = (wᵀA_·K)ᵀ, p = r_K).
 * With ‖s·A‖ < 1, ‖(I + s·A)⁻¹‖ ≤ 1/(1 − |s|·‖A‖) (Neumann series), so
 *   |s·wᵀr1 − s·qᵀx_K| ≤ ω·|wᵀr1| + ω·‖q‖·(‖p0‖ + ω·‖p1‖)/(1 − ω·‖A‖);
 * and, from the series' first three terms (TransferSeries) taken exactly,
 *   |transfer(ω) − transfer(0)| ≤ |jω·first − ω²·second − jω³·third| + ω³·‖(Aᵀ)²q‖·(‖p0‖ + ω·‖p1‖)/(1 − ω·‖A‖),
 * plus SERIES_ROUNDING times the terms whose cancellation gives the coefficients. The second is
 * far tighter at low frequency, where the first term alone nearly is the move (a common-mode
 * gain that is a small difference of large node responses, say). Infinity where the series
 * does not converge (ω·‖A‖ ≥ 1).
 */
export function transferMoveBound(model: FrequencyModel, drive: number, output: number, omega: number): number {
  const shrink = 1 - omega * model.couplingNorm;
  if (!(shrink > 0)) return Infinity;
  const { p0Norm, p1Norm } = model.drives[drive];
  const { qNorm, hqNorm, h2qNorm } = model.outputs[output];
  const direct = Math.abs(model.direct[drive][output]);
  const feed = (p0Norm + omega * p1Norm) / shrink;
  const neumann = omega * direct + omega * qNorm * feed;
  const { first, second, third } = model.series[drive][output];
  const w2 = omega * omega;
  const w3 = w2 * omega;
  const series =
    Math.hypot(w2 * second, omega * first - w3 * third) +
    w3 * h2qNorm * feed +
    SERIES_ROUNDING * (omega * (direct + qNorm * p0Norm) + w2 * (hqNorm * p0Norm + qNorm * p1Norm) + w3 * hqNorm * p1Norm);
  return Math.min(neumann, series);
}
