/**
 * The reduced frequency model (shared/engine/frequency-response.ts) on small node systems built
 * here from their resistors and capacitors, each compared with the direct solve of
 * (G + jωC)·x = −(g + jωc)·d by Cramer's rule (x_i = det(A_i)/det(A), determinants by Laplace
 * expansion): several drives and outputs in one model, nodes that no capacitance couples, five
 * coupled nodes (three Householder steps), and a gyrator whose (I + jωH) is singular at one
 * frequency. The model's own figures are pinned against what they are defined as: H is
 * orthogonally similar to A_KK = (G⁻¹C)_KK, so its Frobenius norm and trace are A_KK's and it is
 * zero below the subdiagonal (Golub and Van Loan, Matrix Computations, 4th ed., §7.4.3); the
 * drives' norms are ‖r0_K‖ and ‖r1_K‖; the bound on a transfer's move lies between the move itself
 * and the Neumann-series bound ω·|wᵀr1| + ω·‖q‖·(‖p0‖ + ω·‖p1‖)/(1 − ω·‖A‖), written out for a one-node network.
 * Every value is invented; every model is built inside its test.
 */
import { describe, expect, test } from 'vitest';
import { readOutput, reducedFrequencyModel, transferMoveBound, transfersAtOmega, type OutputWeights } from '#shared/engine/frequency-response';
import { luFactor, luSolve } from '#shared/engine/linear-solve';
import { abs, add, cramer, det, div, mul, sub, type C } from '../../helpers/complex-by-hand';

const relative = (a: C, b: C) => abs(sub(a, b)) / Math.max(abs(b), 1e-3);


/** Ground and the two sources a drive sets (their voltages are the drive). */
const GROUND = -1;
const SOURCE_A = -2;
const SOURCE_B = -3;

/** A network: free nodes 0…n−1, resistors and capacitors between nodes, ground or a source. */
interface Network {
  n: number;
  resistors: [number, number, number][];
  capacitors: [number, number, number][];
}

/** G or C as a row-major matrix, and each source's column of coefficients (the current its voltage drives out of each node). */
function stamp(n: number, elements: [number, number, number][], admittance: (value: number) => number) {
  const matrix = new Array<number>(n * n).fill(0);
  const sources = [new Array<number>(n).fill(0), new Array<number>(n).fill(0)];
  const put = (row: number, col: number, y: number) => {
    if (row < 0) return;
    if (col >= 0) matrix[row * n + col] += y;
    else if (col !== GROUND) sources[-col - 2][row] += y;
  };
  for (const [a, b, value] of elements) {
    const y = admittance(value);
    put(a, a, y);
    put(a, b, -y);
    put(b, b, y);
    put(b, a, -y);
  }
  return { matrix, sources };
}

/** The node system of a network and a set of drives (each the voltages of sources A and B). */
function system(net: Network, drives: [number, number][]) {
  const g = stamp(net.n, net.resistors, (r) => 1 / r);
  const c = stamp(net.n, net.capacitors, (f) => f);
  const column = (s: { sources: number[][] }, [va, vb]: [number, number]) => s.sources[0].map((x, row) => x * va + s.sources[1][row] * vb);
  return {
    g: g.matrix,
    c: c.matrix,
    gDrives: drives.map((d) => column(g, d)),
    cDrives: drives.map((d) => column(c, d)),
  };
}

/** The reduced model of a network for its drives and outputs (r0 from G's factors, as the stage builds it). */
function modelOf(net: Network, drives: [number, number][], outputs: OutputWeights[]) {
  const s = system(net, drives);
  const factors = luFactor(s.g, net.n);
  const low = s.gDrives.map((gd) => luSolve(factors, gd.map((x) => -x)));
  const capacitive = s.cDrives.map((cd) => (cd.some((x) => x !== 0) ? cd : null));
  return reducedFrequencyModel(factors, s.c, low, capacitive, outputs);
}

/** Output w's response to drive d at ω by Cramer's rule on (G + jωC)·x = −(g + jωc)·d. */
function direct(net: Network, drive: [number, number], output: OutputWeights, omega: number): C {
  const s = system(net, [drive]);
  const a = s.g.map((x, i) => ({ re: x, im: omega * s.c[i] }));
  const b = s.gDrives[0].map((x, row) => ({ re: -x, im: -omega * s.cDrives[0][row] }));
  const x = cramer(a, b, net.n);
  return output.nodes.reduce<C>((sum, node, i) => add(sum, mul({ re: output.weights[i], im: 0 }, x[node])), { re: 0, im: 0 });
}

/** Frequencies from 1 Hz to 10 GHz, four per decade, as angular frequencies. */
const omegas = () => Array.from({ length: 41 }, (_, i) => 2 * Math.PI * 10 ** (i / 4));

describe('several drives and outputs in one model', () => {
  test('a two-node network fed from two sources, one through a capacitor: each [drive][output] is its own Cramer solution', () => {
    // A –1k– n0 –2.2k– n1 –3.3k– B; n0–0 4.7k ∥ 10 nF; n1–0 1 nF; B–n1 470 pF (the second drive carries charge)
    const net: Network = {
      n: 2,
      resistors: [[SOURCE_A, 0, 1e3], [0, 1, 2.2e3], [1, SOURCE_B, 3.3e3], [0, GROUND, 4.7e3]],
      capacitors: [[0, GROUND, 10e-9], [1, GROUND, 1e-9], [SOURCE_B, 1, 470e-12]],
    };
    const drives: [number, number][] = [[1, 0], [0, 1], [0.5, -0.5]];
    const outputs: OutputWeights[] = [{ nodes: [1], weights: [1] }, { nodes: [0, 1], weights: [1, -1] }];
    const model = modelOf(net, drives, outputs);
    expect(model.k).toBe(2);
    for (const omega of omegas()) {
      const t = transfersAtOmega(model, omega);
      expect(t).toHaveLength(3);
      drives.forEach((d, di) => {
        expect(t[di]).toHaveLength(2);
        outputs.forEach((w, wi) => expect(relative(t[di][wi], direct(net, d, w, omega)), `drive ${di} output ${wi} at ω ${omega}`).toBeLessThan(1e-9));
      });
    }
  });

  test('at ω = 0 each transfer is the low-frequency one, the output read from r0 (readOutput: Σ weight·voltage)', () => {
    const net: Network = {
      n: 2,
      resistors: [[SOURCE_A, 0, 1e3], [0, 1, 2.2e3], [1, SOURCE_B, 3.3e3], [0, GROUND, 4.7e3]],
      capacitors: [[0, GROUND, 10e-9], [0, 1, 1e-9]],
    };
    const outputs: OutputWeights[] = [{ nodes: [0], weights: [1] }, { nodes: [0, 1], weights: [2, -3] }];
    const model = modelOf(net, [[1, 0], [0, 1]], outputs);
    const t = transfersAtOmega(model, 0);
    for (const [di, d] of ([[1, 0], [0, 1]] as [number, number][]).entries()) {
      for (const [wi, w] of outputs.entries()) {
        const expected = direct(net, d, w, 0);
        expect(relative(t[di][wi], expected)).toBeLessThan(1e-12);
        expect(Math.abs(t[di][wi].im)).toBe(0);
        expect(Math.abs(model.low[di][wi] - expected.re)).toBeLessThan(1e-12);
      }
    }
    expect(readOutput([0.25, -0.5, 4], { nodes: [2, 0, 1], weights: [1, 2, -3] })).toBe(4 + 0.5 + 1.5);
  });
});

describe('nodes no capacitance couples to another', () => {
  test('four RC nodes each fed from the source alone: A is diagonal, nothing to reflect, and an output over all four is the sum of their single poles', () => {
    // node i: A –R_i– n_i, n_i –Rg_i– 0, n_i –C_i– 0; the transfer to n_i is (Ri⁻¹)/(Ri⁻¹ + Rg_i⁻¹ + jωC_i)
    const r = [1e3, 2.2e3, 4.7e3, 10e3];
    const rg = [3.3e3, 1e3, 6.8e3, 2.2e3];
    const cap = [1e-9, 47e-12, 220e-12, 3.3e-9];
    const weights = [1, -2, 0.5, 3];
    const net: Network = {
      n: 4,
      resistors: [...r.map((x, i): [number, number, number] => [SOURCE_A, i, x]), ...rg.map((x, i): [number, number, number] => [i, GROUND, x])],
      capacitors: cap.map((x, i): [number, number, number] => [i, GROUND, x]),
    };
    const output = { nodes: [0, 1, 2, 3], weights };
    const model = modelOf(net, [[1, 0]], [output]);
    expect(model.k).toBe(4);
    for (const omega of omegas()) {
      const expected = r.reduce<C>(
        (sum, ri, i) => add(sum, mul({ re: weights[i], im: 0 }, div({ re: 1 / ri, im: 0 }, { re: 1 / ri + 1 / rg[i], im: omega * cap[i] }))),
        { re: 0, im: 0 },
      );
      expect(relative(transfersAtOmega(model, omega)[0][0], expected), `ω ${omega}`).toBeLessThan(1e-12);
    }
  });
});

/** Five nodes, every one coupled: A –1k– n0, a resistor ladder with cross resistors, capacitors between every neighbour and to ground, B feeding n4 through 5.6k ∥ 2 pF. */
function fiveNodes(): Network {
  return {
    n: 5,
    resistors: [
      [SOURCE_A, 0, 1e3], [0, 1, 2.2e3], [1, 2, 3.3e3], [2, 3, 1.5e3], [3, 4, 4.7e3], [4, GROUND, 6.8e3],
      [0, 2, 10e3], [1, 3, 8.2e3], [2, GROUND, 12e3], [SOURCE_B, 4, 5.6e3],
    ],
    capacitors: [
      [0, GROUND, 12e-12], [1, GROUND, 3e-12], [2, GROUND, 8e-12], [3, GROUND, 1.5e-12], [4, GROUND, 22e-12],
      [0, 1, 2e-12], [1, 2, 1e-12], [2, 3, 4.7e-12], [3, 4, 0.5e-12], [0, 3, 0.8e-12], [SOURCE_B, 4, 2e-12],
    ],
  };
}

describe('five coupled nodes (three Householder reflections)', () => {
  test('the transfers of two drives to two outputs match Cramer’s rule from 1 Hz to 10 GHz', () => {
    const net = fiveNodes();
    const drives: [number, number][] = [[0.5, -0.5], [1, 1]];
    const outputs: OutputWeights[] = [{ nodes: [3], weights: [1] }, { nodes: [3, 1], weights: [1, -1] }];
    const model = modelOf(net, drives, outputs);
    expect(model.k).toBe(5);
    for (const omega of omegas()) {
      const t = transfersAtOmega(model, omega);
      drives.forEach((d, di) => outputs.forEach((w, wi) => expect(relative(t[di][wi], direct(net, d, w, omega)), `drive ${di} output ${wi} at ω ${omega}`).toBeLessThan(1e-10)));
    }
  });

  test('solving only the first drive gives its transfers (Cramer’s rule) and no other drive’s', () => {
    const net = fiveNodes();
    const drives: [number, number][] = [[0.5, -0.5], [1, 1]];
    const outputs: OutputWeights[] = [{ nodes: [3], weights: [1] }, { nodes: [3, 1], weights: [1, -1] }];
    const model = modelOf(net, drives, outputs);
    for (const omega of omegas()) {
      const t = transfersAtOmega(model, omega, 1);
      expect(t).toHaveLength(1);
      outputs.forEach((w, wi) => expect(relative(t[0][wi], direct(net, drives[0], w, omega)), `output ${wi} at ω ${omega}`).toBeLessThan(1e-10));
    }
  });

  test('H is upper Hessenberg and similar to A_KK (its trace and determinant); the bound’s norms are those of A_KK, r0_K, r1_K and wᵀA; the transformed drive and output keep qᵀp', () => {
    const net = fiveNodes();
    const output: OutputWeights = { nodes: [3, 1], weights: [1, -1] };
    const model = modelOf(net, [[1, 0.5]], [output]);
    const n = net.n;
    const s = system(net, [[1, 0.5]]);
    // A = G⁻¹·C and r0, r1 by Cramer's rule on the real G, column by column
    const gc = s.g.map((x) => ({ re: x, im: 0 }));
    const solve = (b: number[]) => cramer(gc, b.map((x) => ({ re: x, im: 0 })), n).map((z) => z.re);
    const columns = Array.from({ length: n }, (_, col) => solve(Array.from({ length: n }, (_, row) => s.c[row * n + col])));
    const a = (i: number, j: number) => columns[j][i];
    const r0 = solve(s.gDrives[0].map((x) => -x));
    const r1 = solve(s.cDrives[0].map((x) => -x));
    const norm = (v: number[]) => Math.hypot(...v);
    let frobenius = 0;
    let trace = 0;
    for (let i = 0; i < n; i += 1) {
      trace += a(i, i);
      for (let j = 0; j < n; j += 1) frobenius += a(i, j) ** 2;
    }
    const h = model.hessenberg;
    expect(h).toHaveLength(n * n);
    for (let i = 0; i < n; i += 1) for (let j = 0; j < i - 1; j += 1) expect(h[i * n + j], `H[${i}][${j}]`).toBe(0);
    // the subdiagonal is not empty: the reduction left a coupled system
    expect(Math.abs(h[n + 0])).toBeGreaterThan(0);
    const hTrace = [0, 1, 2, 3, 4].reduce((sum, i) => sum + h[i * n + i], 0);
    expect(Math.abs(hTrace / trace - 1)).toBeLessThan(1e-12);
    // a similarity keeps the determinant (Cramer's expansion of both, by hand)
    const real = (m: ArrayLike<number>) => Array.from(m, (x) => ({ re: x, im: 0 }));
    const aMatrix = Array.from({ length: n * n }, (_, i) => a(Math.floor(i / n), i % n));
    expect(Math.abs(det(real(h), n).re / det(real(aMatrix), n).re - 1)).toBeLessThan(1e-10);
    expect(Math.abs(model.couplingNorm / Math.sqrt(frobenius) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(model.drives[0].p0Norm / norm(r0) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(model.drives[0].p1Norm / norm(r1) - 1)).toBeLessThan(1e-12);
    const wA = columns.map((column) => column[3] - column[1]);
    expect(Math.abs(model.outputs[0].qNorm / norm(wA) - 1)).toBeLessThan(1e-12);
    // (Lᵀq)ᵀ(L⁻¹p) = qᵀp: the low-frequency slope qᵀr0 read through the reduced vectors
    const dotOf = (x: ArrayLike<number>, y: ArrayLike<number>) => Array.from(x).reduce((sum, xi, i) => sum + xi * y[i], 0);
    expect(Math.abs(dotOf(model.outputs[0].q, model.drives[0].p0) / dotOf(wA, r0) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(dotOf(model.outputs[0].q, model.drives[0].p1) / dotOf(wA, r1) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(model.low[0][0] - (r0[3] - r0[1]))).toBeLessThan(1e-12 * norm(r0));
    expect(Math.abs(model.direct[0][0] - (r1[3] - r1[1]))).toBeLessThan(1e-12 * norm(r1));
  });
});

describe('a singular (I + jωH)', () => {
  test('a gyrator loaded by two capacitors: H has eigenvalues ±j·C/g, so at ω = g/C the system is singular and the solve says so', () => {
    // G = [[0, g], [−g, 0]] (a gyrator of transconductance g), C = C·I: A = G⁻¹C = (C/g)·[[0, −1], [1, 0]],
    // det(I + jωA) = 1 − (ωC/g)², zero at ω = g/C. Below it, x = (I + jωA)⁻¹·r0 by the 2 × 2 inverse.
    const g = 1e-3;
    const cap = 1e-9;
    const factors = luFactor([0, g, -g, 0], 2);
    const r0 = [1, 0];
    const model = reducedFrequencyModel(factors, [cap, 0, 0, cap], [r0], [null], [{ nodes: [0], weights: [1] }, { nodes: [1], weights: [1] }]);
    expect(() => transfersAtOmega(model, g / cap)).toThrow(/singular/);
    const omega = (0.5 * g) / cap;
    const x = (omega * cap) / g;
    // (I + jωA) = [[1, −jx], [jx, 1]], inverse [[1, jx], [−jx, 1]]/(1 − x²)
    const t = transfersAtOmega(model, omega);
    expect(relative(t[0][0], { re: 1 / (1 - x * x), im: 0 })).toBeLessThan(1e-12);
    expect(relative(t[0][1], { re: 0, im: -x / (1 - x * x) })).toBeLessThan(1e-12);
  });
});

describe('row exchanges in the frequency solve', () => {
  test('the gyrator above ω = g/C: the subdiagonal jωC/g outgrows the diagonal 1, the rows are exchanged, and two drives (one with a capacitive feed) still match the 2 × 2 inverse', () => {
    // (I + jωA) = [[1, −jx], [jx, 1]], x = ωC/g; its inverse [[1, jx], [−jx, 1]]/(1 − x²); the response
    // to a drive is (I + jωA)⁻¹·(r0 + jω·r1), r1 = −G⁻¹·c for the drive's capacitive column c
    const g = 1e-3;
    const cap = 1e-9;
    const factors = luFactor([0, g, -g, 0], 2);
    // G⁻¹ = [[0, −1/g], [1/g, 0]]: c = (−2 nF, 1 nF) gives r1 = (c1/g, −c0/g) = (1e-6, 2e-6)
    const r1 = [1e-6, 2e-6];
    const drives = [
      { r0: [1, 0], r1: [0, 0], c: null },
      { r0: [0.5, -2], r1, c: [-2e-9, 1e-9] },
    ];
    const model = reducedFrequencyModel(factors, [cap, 0, 0, cap], drives.map((d) => d.r0), drives.map((d) => d.c), [{ nodes: [0], weights: [1] }, { nodes: [1, 0], weights: [1, -3] }]);
    for (const x of [1.5, 2, 10, 1e3]) {
      const omega = (x * g) / cap;
      const t = transfersAtOmega(model, omega);
      drives.forEach((d, di) => {
        const b0 = { re: d.r0[0], im: omega * d.r1[0] };
        const b1 = { re: d.r0[1], im: omega * d.r1[1] };
        const scale = { re: 1 / (1 - x * x), im: 0 };
        const v0 = mul(scale, add(b0, mul({ re: 0, im: x }, b1)));
        const v1 = mul(scale, add(mul({ re: 0, im: -x }, b0), b1));
        expect(relative(t[di][0], v0), `drive ${di} at x = ${x}`).toBeLessThan(1e-12);
        expect(relative(t[di][1], sub(v1, mul({ re: 3, im: 0 }, v0))), `drive ${di} at x = ${x}`).toBeLessThan(1e-12);
      });
    }
  });
});

describe('a row exchange past the first column', () => {
  test('an RC node beside a gyrator pair: the exchange happens at column 1 and moves both drives’ right-hand sides', () => {
    // G = diag(g0) ⊕ [[0, g], [−g, 0]], C = c·I: A = diag(c/g0) ⊕ (c/g)·[[0, −1], [1, 0]], already Hessenberg.
    // Node 0 answers r0/(1 + jωc/g0) (+ its r1 term); nodes 1, 2 as the gyrator's 2 × 2 inverse, x = ωc/g.
    const [g0, g, cap] = [2e-3, 1e-3, 1e-9];
    const factors = luFactor([g0, 0, 0, 0, 0, g, 0, -g, 0], 3);
    // drive 1's capacitive column (−1 nF, −2 nF, 1 nF): r1 = −G⁻¹·c = (0.5e-6, 1e-6, 2e-6)
    const drives = [
      { r0: [1, 1, 0], r1: [0, 0, 0], c: null },
      { r0: [-0.5, 0.5, -2], r1: [0.5e-6, 1e-6, 2e-6], c: [-1e-9, -2e-9, 1e-9] },
    ];
    const outputs: OutputWeights[] = [0, 1, 2].map((node) => ({ nodes: [node], weights: [1] }));
    const model = reducedFrequencyModel(factors, [cap, 0, 0, 0, cap, 0, 0, 0, cap], drives.map((d) => d.r0), drives.map((d) => d.c), outputs);
    expect(model.k).toBe(3);
    for (const x of [0.5, 1.5, 4, 100]) {
      const omega = (x * g) / cap;
      const t = transfersAtOmega(model, omega);
      drives.forEach((d, di) => {
        const b = d.r0.map((r, i) => ({ re: r, im: omega * d.r1[i] }));
        const v0 = div(b[0], { re: 1, im: (omega * cap) / g0 });
        const scale = { re: 1 / (1 - x * x), im: 0 };
        const v1 = mul(scale, add(b[1], mul({ re: 0, im: x }, b[2])));
        const v2 = mul(scale, add(mul({ re: 0, im: -x }, b[1]), b[2]));
        [v0, v1, v2].forEach((v, node) => expect(relative(t[di][node], v), `drive ${di} node ${node} at x = ${x}`).toBeLessThan(1e-12));
      });
    }
  });
});

describe('a first column with only its subdiagonal entry', () => {
  // two separate two-node ladders fed from A: A –1k– n0 –2.2k– n1 –3.3k– 0 and A –4.7k– n2 –1k– n3 –2.2k– 0,
  // each node with a capacitor to ground, n0–n1 coupled by cc. A = G⁻¹C is block diagonal, so the
  // first reflection acts on x = (A10, 0, 0) alone and the second finds nothing below the
  // subdiagonal. A10 ∝ G2·C0 − G1·cc: positive without cc, negative with a large one.
  test.each([
    ['positive', 0],
    ['negative', 10e-12],
  ])('A10 %s (cc = %s F): the transfers to every node match Cramer’s rule', (_, cc) => {
    const net: Network = {
      n: 4,
      resistors: [[SOURCE_A, 0, 1e3], [0, 1, 2.2e3], [1, GROUND, 3.3e3], [SOURCE_A, 2, 4.7e3], [2, 3, 1e3], [3, GROUND, 2.2e3]],
      capacitors: [[0, GROUND, 1e-12], [1, GROUND, 2e-12], [2, GROUND, 3e-12], [3, GROUND, 1.5e-12], ...(cc ? [[0, 1, cc] as [number, number, number]] : [])],
    };
    const outputs: OutputWeights[] = [0, 1, 2, 3].map((node) => ({ nodes: [node], weights: [1] }));
    const model = modelOf(net, [[1, 0]], outputs);
    expect(model.k).toBe(4);
    for (const omega of omegas()) {
      const t = transfersAtOmega(model, omega);
      outputs.forEach((w, wi) => expect(relative(t[0][wi], direct(net, [1, 0], w, omega)), `n${wi} at ω ${omega}`).toBeLessThan(1e-11));
    }
  });
});

describe('no capacitance at all', () => {
  test('an empty C couples no node (k = 0): every transfer is its low-frequency value at every frequency', () => {
    // one node fed through 1k, 3.3k to ground: 3.3/4.3
    const gS = 1 / 1e3 + 1 / 3.3e3;
    const model = reducedFrequencyModel(luFactor([gS], 1), [0], [[1 / 1e3 / gS]], [null], [{ nodes: [0], weights: [1] }]);
    expect(model.k).toBe(0);
    expect(model.hessenberg).toHaveLength(0);
    for (const omega of [0, 1, 1e6, 1e12]) {
      const [[t]] = transfersAtOmega(model, omega);
      expect(t.re).toBeCloseTo(3.3 / 4.3, 14);
      expect(Math.abs(t.im)).toBe(0);
    }
  });
});

describe('the move bound at the edge of the Neumann series', () => {
  test('exactly at ω·‖A‖ = 1 the bound is infinite, even for an output the capacitance does not reach', () => {
    // two uncoupled nodes, G = diag(1, 2) S, C = diag(0.5, 0) F: A = 0.5 s, so ω = 2 puts ω·‖A‖ at 1 exactly;
    // node 1 sees no capacitance (q = 0) and no capacitive drive
    const model = reducedFrequencyModel(luFactor([1, 0, 0, 2], 2), [0.5, 0, 0, 0], [[1, 0.25]], [null], [{ nodes: [1], weights: [1] }]);
    expect(model.couplingNorm).toBe(0.5);
    expect(model.outputs[0].qNorm).toBe(0);
    expect(transferMoveBound(model, 0, 0, 2)).toBe(Infinity);
    // below it, nothing moves that output: the bound is 0
    expect(transferMoveBound(model, 0, 0, 1)).toBe(0);
  });
});

describe('the bound on a transfer’s move, written out for one node', () => {
  test('a node fed through R1 ∥ C1 with R2 ∥ C2 to ground: H = C/G, and the bound is at most the Neumann-series formula and at least the move; infinite once ω·C/G passes 1', () => {
    // one node: G = G1 + G2, C = C1 + C2, r0 = G1/G, r1 = C1/G, H = C/G, q = wᵀA = C/G
    const [r1, r2, c1, c2] = [10e3, 2.2e3, 1e-12, 47e-12];
    const gS = 1 / r1 + 1 / r2;
    const cF = c1 + c2;
    const factors = luFactor([gS], 1);
    const model = reducedFrequencyModel(factors, [cF], [[1 / r1 / gS]], [[-c1]], [{ nodes: [0], weights: [1] }]);
    const h = cF / gS;
    expect(model.k).toBe(1);
    expect(Math.abs(model.hessenberg[0] / h - 1)).toBeLessThan(1e-14);
    expect(Math.abs(model.couplingNorm / h - 1)).toBeLessThan(1e-14);
    expect(Math.abs(model.drives[0].p0Norm / (1 / r1 / gS) - 1)).toBeLessThan(1e-14);
    expect(Math.abs(model.drives[0].p1Norm / (c1 / gS) - 1)).toBeLessThan(1e-14);
    expect(Math.abs(model.direct[0][0] / (c1 / gS) - 1)).toBeLessThan(1e-14);
    expect(Math.abs(model.outputs[0].qNorm / h - 1)).toBeLessThan(1e-14);
    for (const fraction of [1e-3, 0.1, 0.5, 0.9]) {
      const omega = fraction / h;
      const bound = omega * (c1 / gS) + (omega * h * (1 / r1 / gS + omega * (c1 / gS))) / (1 - omega * h);
      // the bound is the smaller of this and a series bound: never above it
      expect(transferMoveBound(model, 0, 0, omega), `ω·H = ${fraction}`).toBeLessThanOrEqual(bound * (1 + 1e-12));
      // and it is a bound: the actual move |H(jω) − H(0)| from the closed form (G1 + jωC1)/(G + jωC)
      const actual = div({ re: 1 / r1, im: omega * c1 }, { re: gS, im: omega * cF });
      expect(transferMoveBound(model, 0, 0, omega)).toBeGreaterThanOrEqual(abs(sub(actual, { re: 1 / r1 / gS, im: 0 })));
    }
    expect(transferMoveBound(model, 0, 0, 1.5 / h)).toBe(Infinity);
    expect(transferMoveBound(model, 0, 0, 2 / h)).toBe(Infinity);
  });

  test('each drive and output has its own bound, between its move and its Neumann-series formula; the drive with no capacitive feed has no direct term', () => {
    // the same node, a second drive fed through R3 = 4.7 kΩ only (r0 = G3/G, r1 = 0), a second output 2·v
    const [r1, r2, r3, c1, c2] = [10e3, 2.2e3, 4.7e3, 1e-12, 47e-12];
    const gS = 1 / r1 + 1 / r2 + 1 / r3;
    const cF = c1 + c2;
    const model = reducedFrequencyModel(luFactor([gS], 1), [cF], [[1 / r1 / gS], [1 / r3 / gS]], [[-c1], null], [{ nodes: [0], weights: [1] }, { nodes: [0], weights: [2] }]);
    const h = cF / gS;
    const omega = 0.2 / h;
    const bound = (p0: number, p1: number, q: number, wr1: number) => omega * Math.abs(wr1) + (omega * q * (p0 + omega * p1)) / (1 - omega * h);
    // the actual moves from the closed forms (G1 + jωC1)/(G + jωC) and G3/(G + jωC), output 1 twice output 0
    const denominator = { re: gS, im: omega * cF };
    const move0 = abs(sub(div({ re: 1 / r1, im: omega * c1 }, denominator), { re: 1 / r1 / gS, im: 0 }));
    const move1 = abs(sub(div({ re: 1 / r3, im: 0 }, denominator), { re: 1 / r3 / gS, im: 0 }));
    const cases: [number, number, number, number][] = [
      [0, 0, bound(1 / r1 / gS, c1 / gS, h, c1 / gS), move0],
      [0, 1, bound(1 / r1 / gS, c1 / gS, 2 * h, (2 * c1) / gS), 2 * move0],
      [1, 0, bound(1 / r3 / gS, 0, h, 0), move1],
      [1, 1, bound(1 / r3 / gS, 0, 2 * h, 0), 2 * move1],
    ];
    for (const [d, w, neumann, move] of cases) {
      const b = transferMoveBound(model, d, w, omega);
      expect(b, `drive ${d} output ${w}`).toBeLessThanOrEqual(neumann * (1 + 1e-12));
      expect(b, `drive ${d} output ${w}`).toBeGreaterThanOrEqual(move * (1 - 1e-12));
    }
    expect(model.drives[1].p1Norm).toBe(0);
    expect(model.direct[1]).toEqual([0, 0]);
  });
});
