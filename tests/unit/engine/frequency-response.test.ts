/**
 * The reduced frequency model (shared/engine/frequency-response.ts) against circuits whose
 * responses are known in closed form or by Cramer's rule: an RC ladder's transfer
 * H(s) = 1/(1 + s·(R1C1 + R1C2 + R2C2) + s²·R1R2C1C2), a node fed through a parallel RC (the
 * drive's own capacitive column), a four-node network with a node no capacitance touches
 * (solved directly with complex determinants), and the bound on how far a transfer can move.
 */
import { describe, expect, test } from 'vitest';
import { reducedFrequencyModel, transferMoveBound, transfersAtOmega } from '#shared/engine/frequency-response';
import { luFactor, luSolve } from '#shared/engine/linear-solve';
import { abs, det, div, sub, type C } from '../../helpers/complex-by-hand';


/** The model of a node system: G and C (row-major), the drive's columns g and c, one output node. */
function modelOf(n: number, g: number[], c: number[], gDrive: number[], cDrive: number[] | null, outputNode: number) {
  const factors = luFactor(g, n);
  const low = luSolve(factors, gDrive.map((x) => -x));
  return reducedFrequencyModel(factors, c, [low], [cDrive], [{ nodes: [outputNode], weights: [1] }]);
}

/**
 * The error of a transfer against the expected one, relative to max(|expected|, |H(0)|·1e-3): the
 * reduced form reads a response far below its low-frequency value as H(0) plus a correction, so
 * its error there is absolute, a few ulp of |H(0)| (here H(0) is about 1).
 */
const relative = (a: C, b: C) => abs(sub(a, b)) / Math.max(abs(b), 1e-3);

describe('transfers', () => {
  test('a two-section RC ladder matches 1/(1 + s(R1C1 + R1C2 + R2C2) + s²R1R2C1C2) from 1 Hz to 1 GHz', () => {
    const [r1, r2, c1, c2] = [1e3, 4.7e3, 10e-9, 2.2e-9];
    const g = [1 / r1 + 1 / r2, -1 / r2, -1 / r2, 1 / r2];
    const model = modelOf(2, g, [c1, 0, 0, c2], [-1 / r1, 0], null, 1);
    for (let f = 1; f <= 1e9; f *= 10 ** 0.25) {
      const w = 2 * Math.PI * f;
      const expected = div({ re: 1, im: 0 }, { re: 1 - w * w * r1 * r2 * c1 * c2, im: w * (r1 * c1 + r1 * c2 + r2 * c2) });
      expect(relative(transfersAtOmega(model, w)[0][0], expected), `${f} Hz`).toBeLessThan(1e-12);
    }
  });

  test('a node fed through R1 ∥ C1 with R2 ∥ C2 to ground: (G1 + sC1)/(G1 + G2 + s(C1 + C2)), the drive carrying charge itself', () => {
    const [r1, r2, c1, c2] = [10e3, 2.2e3, 1e-12, 47e-12];
    const model = modelOf(1, [1 / r1 + 1 / r2], [c1 + c2], [-1 / r1], [-c1], 0);
    for (let f = 10; f <= 1e10; f *= 10) {
      const w = 2 * Math.PI * f;
      const expected = div({ re: 1 / r1, im: w * c1 }, { re: 1 / r1 + 1 / r2, im: w * (c1 + c2) });
      expect(relative(transfersAtOmega(model, w)[0][0], expected), `${f} Hz`).toBeLessThan(1e-12);
    }
  });

  test('four nodes, one with no capacitance, coupling capacitors between the others: the direct complex solve by Cramer’s rule', () => {
    // a ladder drive –1k– n0 –2.2k– n1 –3.3k– n2 –1.5k– n3 –4.7k– ground; capacitors n0–0 10 pF, n2–0 5 pF,
    // n3–0 3 pF, n0–n2 2 pF, n2–n3 1 pF (n1 has none): three coupled nodes, so the Hessenberg reduction has work
    const r = [1e3, 2.2e3, 3.3e3, 1.5e3, 4.7e3].map((x) => 1 / x);
    const g = [r[0] + r[1], -r[1], 0, 0, -r[1], r[1] + r[2], -r[2], 0, 0, -r[2], r[2] + r[3], -r[3], 0, 0, -r[3], r[3] + r[4]];
    const cap = [12e-12, 0, -2e-12, 0, 0, 0, 0, 0, -2e-12, 0, 8e-12, -1e-12, 0, 0, -1e-12, 4e-12];
    const model = modelOf(4, g, cap, [-r[0], 0, 0, 0], null, 3);
    expect(model.k).toBe(3);
    for (let f = 1e3; f <= 1e10; f *= 10) {
      const w = 2 * Math.PI * f;
      const a = g.map((x, i) => ({ re: x, im: w * cap[i] }));
      const b: C[] = [{ re: r[0], im: 0 }, { re: 0, im: 0 }, { re: 0, im: 0 }, { re: 0, im: 0 }];
      // Cramer: x3 = det(A with column 3 replaced by b) / det(A)
      const replaced = a.map((x, i) => (i % 4 === 3 ? b[Math.floor(i / 4)] : x));
      const expected = div(det(replaced, 4), det(a, 4));
      expect(relative(transfersAtOmega(model, w)[0][0], expected), `${f} Hz`).toBeLessThan(1e-12);
    }
  });
});

describe('the bound on a transfer’s move', () => {
  test('it is never below the actual move |H(jω) − H(0)| of the RC ladder, and tends to it at low frequency', () => {
    const [r1, r2, c1, c2] = [1e3, 4.7e3, 10e-9, 2.2e-9];
    const model = modelOf(2, [1 / r1 + 1 / r2, -1 / r2, -1 / r2, 1 / r2], [c1, 0, 0, c2], [-1 / r1, 0], null, 1);
    let checked = 0;
    for (let f = 1; f <= 1e6; f *= 10 ** 0.25) {
      const w = 2 * Math.PI * f;
      const bound = transferMoveBound(model, 0, 0, w);
      if (!Number.isFinite(bound)) continue;
      const move = abs(sub(transfersAtOmega(model, w)[0][0], { re: 1, im: 0 }));
      expect(bound, `${f} Hz`).toBeGreaterThanOrEqual(move);
      checked += 1;
    }
    expect(checked).toBeGreaterThan(10);
    // below the corners the move is ω·(R1C1 + R1C2 + R2C2) to first order; the bound is within a small factor of it
    const w = 2 * Math.PI;
    expect(transferMoveBound(model, 0, 0, w) / (w * (r1 * c1 + r1 * c2 + r2 * c2))).toBeLessThan(3);
  });
});
