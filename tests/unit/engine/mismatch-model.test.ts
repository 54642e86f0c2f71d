/**
 * The arithmetic of the second-order mismatch model (shared/engine/mismatch.ts) on coefficients
 * written by hand, so each figure can be worked out on paper from the model's definition:
 *   Adcm(x) = Σ Sᵢ·xᵢ + Σ Sᵢᵢ·xᵢ² + Σ_{i<j} Sᵢⱼ·xᵢ·xⱼ,  Ad(x) = Ad0 + Σ Aᵢ·xᵢ,  CMRR = |Ad|/|Adcm|;
 * the worst case with every term in magnitude and the gain at its lowest; resistor tolerance t
 * read as Gaussian with 3σ = t and the worst-case load pair at ±t, ε = (1 + t)/(1 − t) − 1; the
 * IS mismatch from ΔVBE, δ = exp(ΔVBE/VT) − 1 (DOMAIN.md, "Preferred values and tolerances":
 * ΔIS/IS = ΔVBE/VT to first order). The fit of the model to full solves is mismatch.test.ts.
 */
import { describe, expect, test } from 'vitest';
import type { Complex } from '#shared/engine/small-signal';
import {
  mismatchCmrrDb,
  monteCarloCmrr,
  monteCarloDraws,
  monteCarloSample,
  mismatchSigmas,
  percentile,
  resistorToleranceFraction,
  worstCaseMismatchCmrrDb,
  worstCaseMismatches,
  worstCaseMismatchShares,
  type MismatchSensitivity,
  type MismatchSigmas,
  type MonteCarloDraws,
} from '#shared/engine/mismatch';
import { gaussianSource } from '#shared/engine/random';

const c = (re: number, im = 0): Complex => ({ re, im });
const ZERO = c(0);
const VT_V = 0.025;

/** A hand-written model: order [load, is, beta, early]; cross in (0,1), (0,2), (0,3), (1,2), (1,3), (2,3). */
function model(parts: Partial<MismatchSensitivity>): MismatchSensitivity {
  return {
    frequencyHz: 0,
    thermalVoltageV: VT_V,
    differentialGain: c(-100),
    differentialGainPer: [ZERO, ZERO, ZERO, ZERO],
    linear: [ZERO, ZERO, ZERO, ZERO],
    squared: [ZERO, ZERO, ZERO, ZERO],
    cross: [ZERO, ZERO, ZERO, ZERO, ZERO, ZERO],
    ...parts,
  };
}

const db = (ratio: number) => 20 * Math.log10(ratio);

describe('the CMRR of one set of mismatches', () => {
  test('first-order terms only: |Ad0 + Σ Aᵢxᵢ| / |Σ Sᵢxᵢ|, complex', () => {
    const s = model({
      differentialGain: c(-100, 20),
      differentialGainPer: [c(5), c(-3, 1), c(2), c(0, -4)],
      linear: [c(0.5, 0.1), c(-0.2), c(0.05, 0.3), c(0.01)],
    });
    const x = [0.01, -0.02, 0.03, 0.05] as const;
    const ad = { re: -100 + 5 * 0.01 - 3 * -0.02 + 2 * 0.03, im: 20 + 1 * -0.02 - 4 * 0.05 };
    const cm = { re: 0.5 * 0.01 - 0.2 * -0.02 + 0.05 * 0.03 + 0.01 * 0.05, im: 0.1 * 0.01 + 0.3 * 0.03 };
    expect(mismatchCmrrDb(s, x)).toBeCloseTo(db(Math.hypot(ad.re, ad.im) / Math.hypot(cm.re, cm.im)), 9);
  });

  test('second-order and cross terms: Sᵢᵢ·xᵢ² and Sᵢⱼ·xᵢ·xⱼ in the pair order (0,1) (0,2) (0,3) (1,2) (1,3) (2,3)', () => {
    const s = model({
      squared: [c(2, 1), c(-1), c(0.5), c(0, 3)],
      cross: [c(10), c(0, 20), c(30), c(-40), c(50, 5), c(60)],
    });
    const [a, b, d, e] = [0.01, 0.02, -0.03, 0.04];
    const cm = {
      re: 2 * a * a - b * b + 0.5 * d * d + 10 * a * b + 30 * a * e - 40 * b * d + 50 * b * e + 60 * d * e,
      im: a * a + 3 * e * e + 20 * a * d + 5 * b * e,
    };
    expect(mismatchCmrrDb(s, [a, b, d, e])).toBeCloseTo(db(100 / Math.hypot(cm.re, cm.im)), 9);
  });
});

describe('the worst case', () => {
  test('the extremes: ε = (1 + t)/(1 − t) − 1, δ = exp(3σ/VT) − 1, BF and VAF at 3σ', () => {
    const x = worstCaseMismatches({ resistorTolerance: 0.01, vbeSigmaV: 0.0005, betaSigma: 0.02, earlyVoltageSigma: 0.05 }, VT_V);
    expect(x[0]).toBeCloseTo(1.01 / 0.99 - 1, 14);
    expect(x[1]).toBeCloseTo(Math.exp(0.0015 / 0.025) - 1, 14);
    expect(x[2]).toBeCloseTo(0.06, 14);
    expect(x[3]).toBeCloseTo(0.15, 14);
  });

  test('a gain the mismatches move by more than itself (a pair near saturation at its corner) still gives a finite worst case, below 0 dB', () => {
    const sigmas: MismatchSigmas = { resistorTolerance: 0.01, vbeSigmaV: 0.0005, betaSigma: 0.02, earlyVoltageSigma: 0.05 };
    // measured at a saturating corner of a resistor tail: |Ad| 16 V/V falling 882 V/V per unit load mismatch
    const s = model({ differentialGain: c(-16), differentialGainPer: [c(882), c(6), c(6.2), c(0.03)], linear: [c(200), c(30), c(1), c(0)], squared: [c(0), c(0), c(0), c(0)], cross: [c(0), c(0), c(0), c(0), c(0), c(0)] });
    const worst = worstCaseMismatchCmrrDb(s, sigmas);
    expect(Number.isFinite(worst)).toBe(true);
    expect(worst).toBeLessThan(0);
  });

  test('every term in magnitude, the gain at its lowest; shares per mismatch with each cross term split evenly', () => {
    const sigmas: MismatchSigmas = { resistorTolerance: 0.01, vbeSigmaV: 0.0005, betaSigma: 0.02, earlyVoltageSigma: 0.05 };
    const s = model({
      differentialGain: c(-120, 50),
      differentialGainPer: [c(-3), c(0, 4), c(5), c(0)],
      linear: [c(-0.3, 0.4), c(0.2), c(0, -0.1), c(0.05)],
      squared: [c(1), c(-2), c(0), c(0.5)],
      cross: [c(0, -6), c(0), c(0), c(8), c(0), c(-10)],
    });
    const [x0, x1, x2, x3] = worstCaseMismatches(sigmas, VT_V);
    const terms = [
      0.5 * x0 + 1 * x0 * x0 + (6 * x0 * x1) / 2,
      0.2 * x1 + 2 * x1 * x1 + (6 * x0 * x1) / 2 + (8 * x1 * x2) / 2,
      0.1 * x2 + (8 * x1 * x2) / 2 + (10 * x2 * x3) / 2,
      0.05 * x3 + 0.5 * x3 * x3 + (10 * x2 * x3) / 2,
    ];
    const adcm = terms.reduce((p, q) => p + q, 0);
    // the gain's first-order fall taken in the logarithm: 130·exp(−(3·x0 + 4·x1 + 5·x2)/130)
    const ad = 130 * Math.exp(-(3 * x0 + 4 * x1 + 5 * x2) / 130);
    expect(worstCaseMismatchCmrrDb(s, sigmas)).toBeCloseTo(db(ad / adcm), 9);
    // to first order the plain fall, 130 − 3·x0 − 4·x1 − 5·x2 (within 1e-4 dB here)
    expect(Math.abs(worstCaseMismatchCmrrDb(s, sigmas) - db((130 - 3 * x0 - 4 * x1 - 5 * x2) / adcm))).toBeLessThan(1e-3);
    const shares = worstCaseMismatchShares(s, sigmas);
    expect(shares.load).toBeCloseTo((100 * terms[0]) / adcm, 9);
    expect(shares.is).toBeCloseTo((100 * terms[1]) / adcm, 9);
    expect(shares.beta).toBeCloseTo((100 * terms[2]) / adcm, 9);
    expect(shares.early).toBeCloseTo((100 * terms[3]) / adcm, 9);
  });

  test('no mismatch at all: every share 0 (nothing to divide)', () => {
    const none: MismatchSigmas = { resistorTolerance: 0, vbeSigmaV: 0, betaSigma: 0, earlyVoltageSigma: 0 };
    expect(worstCaseMismatchShares(model({ linear: [c(1), c(1), c(1), c(1)] }), none)).toEqual({ load: 0, is: 0, beta: 0, early: 0 });
  });

  test('the spec\u2019s spreads: the tolerance in per cent as a fraction, the device\u2019s sigmas as given', () => {
    const spec = { resistors: { tolerancePercent: 0.5 }, device: { vbeMismatchSigmaV: 0.0007, betaMismatchSigma: 0.03, earlyVoltageMismatchSigma: 0.08 } };
    expect(resistorToleranceFraction(spec)).toBe(0.005);
    expect(mismatchSigmas(spec)).toEqual({ resistorTolerance: 0.005, vbeSigmaV: 0.0007, betaSigma: 0.03, earlyVoltageSigma: 0.08 });
  });
});

describe('percentiles: nearest rank on index p/100·(n − 1)', () => {
  test.each([
    [0, 10],
    [1, 10],
    [24, 20], // index 0.96 rounds to 1
    [50, 30],
    [62.5, 40], // index 2.5 rounds up to 3
    [99, 50],
    [100, 50],
  ])('p%d of 10, 20, 30, 40, 50 is %d', (p, expected) => {
    expect(percentile([10, 20, 30, 40, 50], p)).toBe(expected);
  });

  test('out-of-range percentiles stay at the ends', () => {
    expect(percentile([1, 2, 3], -5)).toBe(1);
    expect(percentile([1, 2, 3], 150)).toBe(3);
  });
});

describe('Monte Carlo samples', () => {
  test('the draws: three per sample first (load 1, load 2, ΔVBE), then two per sample (BF, VAF), one seeded stream', () => {
    const draws = monteCarloDraws(4, 77);
    const g = gaussianSource(77);
    const stream = Array.from({ length: 20 }, () => g.next());
    expect(draws.samples).toBe(4);
    expect(Array.from(draws.normals)).toEqual(stream.slice(0, 12));
    expect(Array.from(draws.deviceNormals)).toEqual(stream.slice(12, 20));
  });

  test('sample i: loads 1 + (t/3)·z, ε = R2/R1 − 1, δ = exp(σ·z/VT) − 1, b = σ_BF·z, a = σ_VAF·z', () => {
    const draws: MonteCarloDraws = { samples: 2, seed: 0, normals: new Float64Array([9, 9, 9, 1.5, -0.6, 2]), deviceNormals: new Float64Array([9, 9, -1.2, 0.7]) };
    const sigmas: MismatchSigmas = { resistorTolerance: 0.03, vbeSigmaV: 0.001, betaSigma: 0.02, earlyVoltageSigma: 0.05 };
    const sample = monteCarloSample(draws, 1, sigmas, VT_V);
    expect(sample.load1Scale).toBeCloseTo(1 + 0.01 * 1.5, 14);
    expect(sample.load2Scale).toBeCloseTo(1 - 0.01 * 0.6, 14);
    expect(sample.mismatches[0]).toBeCloseTo(0.994 / 1.015 - 1, 14);
    expect(sample.mismatches[1]).toBeCloseTo(Math.exp(0.002 / 0.025) - 1, 14);
    expect(sample.mismatches[2]).toBeCloseTo(-0.024, 14);
    expect(sample.mismatches[3]).toBeCloseTo(0.035, 14);
  });

  test('load mismatch alone: each sample\u2019s CMRR is |Ad|/(|S|·|ε|); yield counts samples at or above the requirement; percentiles and histogram from the sorted values', () => {
    const s = model({ linear: [c(0.5), ZERO, ZERO, ZERO] });
    // six samples, ε from the loads only: load 1 at 1, load 2 at 1 + (t/3)·z2
    const z2 = [0.1, -0.25, 0.4, -0.7, 1.3, 3.0];
    const normals = new Float64Array(z2.flatMap((z) => [0, z, 0]));
    const draws: MonteCarloDraws = { samples: 6, seed: 0, normals, deviceNormals: new Float64Array(12) };
    const sigmas: MismatchSigmas = { resistorTolerance: 0.03, vbeSigmaV: 0, betaSigma: 0, earlyVoltageSigma: 0 };
    const byHand = z2.map((z) => db(100 / (0.5 * Math.abs(0.01 * z)))).sort((p, q) => p - q);
    // the requirement exactly the fourth-lowest sample's figure (z = 0.4, the third sample): it and the two above pass
    const required = mismatchCmrrDb(s, monteCarloSample(draws, 2, sigmas, VT_V).mismatches);
    expect(required).toBeCloseTo(byHand[3], 9);
    const mc = monteCarloCmrr(s, draws, sigmas, required);
    expect(mc.yieldPercent).toBeCloseTo(50, 12);
    expect(mc.samples).toBe(6);
    expect(mc.requiredDb).toBe(required);
    // p1 → index round(0.05) = 0, p5 → round(0.25) = 0, p50 → round(2.5) = 3, p95 → round(4.75) = 5
    expect(mc.percentilesDb.p1).toBeCloseTo(byHand[0], 9);
    expect(mc.percentilesDb.p5).toBeCloseTo(byHand[0], 9);
    expect(mc.percentilesDb.p50).toBeCloseTo(byHand[3], 9);
    expect(mc.percentilesDb.p95).toBeCloseTo(byHand[5], 9);
    // 30 equal bins from the lowest to the 99th percentile (index round(4.95) = 5, the highest)
    const width = (byHand[5] - byHand[0]) / 30;
    expect(mc.histogram.binEdgesDb).toHaveLength(31);
    expect(mc.histogram.binEdgesDb[0]).toBeCloseTo(byHand[0], 9);
    expect(mc.histogram.binEdgesDb[1] - mc.histogram.binEdgesDb[0]).toBeCloseTo(width, 9);
    expect(mc.histogram.binEdgesDb[30]).toBeCloseTo(byHand[5], 9);
    const expectedCounts = new Array<number>(30).fill(0);
    for (const v of byHand) expectedCounts[Math.min(29, Math.floor((v - byHand[0]) / width))] += 1;
    expect(mc.histogram.counts).toEqual(expectedCounts);
  });

  test('a perfectly matched sample (infinite rejection) passes any requirement and sorts above every other', () => {
    const s = model({ linear: [c(0.5), ZERO, ZERO, ZERO] });
    const draws: MonteCarloDraws = { samples: 3, seed: 0, normals: new Float64Array([0, 0, 0, 0, 1, 0, 0, -1, 0]), deviceNormals: new Float64Array(6) };
    const mc = monteCarloCmrr(s, draws, { resistorTolerance: 0.03, vbeSigmaV: 0, betaSigma: 0, earlyVoltageSigma: 0 }, 200);
    expect(mc.yieldPercent).toBeCloseTo(100 / 3, 12);
    expect(mc.percentilesDb.p1).toBeCloseTo(db(100 / (0.5 * 0.01)), 6);
    expect(Number.isFinite(mc.percentilesDb.p95)).toBe(true);
    expect(mc.histogram.counts.reduce((p, q) => p + q, 0)).toBe(3);
  });
});
