/**
 * The mismatch model behind the differential-output worst case and Monte Carlo: a few exact
 * solves fit a second-order model, and the CMRR of any small mismatch follows from it.
 * Checked here against full solves of the mismatched stage (the engine's own exact path, which
 * tests/reference checks against ngspice), so the linearisation is what is under test.
 */
import { describe, expect, test } from 'vitest';
import { analyze, solveStage, transfersAt } from '#shared/engine/analyze';
import { mismatchCmrrDb, mismatchSensitivity, mismatchStages, monteCarloCmrr, monteCarloDraws, worstCaseMismatchCmrrDb } from '#shared/engine/mismatch';
import { gaussianSource } from '#shared/engine/random';
import type { Design } from '#shared/engine/types';

// Invented demo designs (not from a textbook).
const DESIGNS: Record<string, Design> = {
  'degenerated mirror, ±6 V, 2.2 pF': {
    device: { family: 'npn', beta: 148, earlyVoltageV: 66, saturationCurrentA: 9.4e-15 },
    supply: { positiveV: 6, negativeV: -6 },
    collectorResistanceOhm: 5360,
    tail: { topology: 'degenerated-mirror', referenceResistanceOhm: 10200, emitterResistanceOhm: 560 },
    inputCommonModeV: 0.4,
    temperatureC: 41,
    tailCapacitanceF: 2.2e-12,
  },
  'resistor tail, single 10 V supply': {
    device: { family: 'npn', beta: 205, earlyVoltageV: 88, saturationCurrentA: 1.3e-14 },
    supply: { positiveV: 10, negativeV: 0 },
    collectorResistanceOhm: 7150,
    tail: { topology: 'resistor', resistanceOhm: 3920 },
    inputCommonModeV: 4.1,
    temperatureC: 5,
  },
};

const SINGLE_MISMATCHES: [number, number][] = [
  [0.004, 0],
  [0.03, 0],
  [-0.02, 0],
  [0, 0.03],
  [0, -0.012],
];
const COMBINED_MISMATCHES: [number, number][] = [
  [-0.015, 0.012],
  [0.02, -0.04],
  [0.01, 0.01],
];

/** |v(c1) − v(c2)| per volt of common mode from a full solve, complex, at a frequency. */
function fullDifferentialCommonMode(design: Design, loadMismatch: number, isMismatch: number, frequencyHz: number) {
  const t = transfersAt(solveStage({ ...design, collectorMismatch: loadMismatch, pairSaturationCurrentMismatch: isMismatch }), frequencyHz);
  return { ad: Math.hypot(t.differentialGain.re, t.differentialGain.im), adcm: t.differentialCommonModeGain };
}

describe.each(Object.entries(DESIGNS))('%s', (_name, design) => {
  // solved afresh in each test, so a mutation run knows which tests exercise the solver
  const stagesOf = () => mismatchStages(solveStage(design));

  test.each([...SINGLE_MISMATCHES, ...COMBINED_MISMATCHES])('load ε = %f, IS δ = %f: model CMRR within 0.2 dB of the full solve at DC and at 20 kHz', (loadMismatch, isMismatch) => {
    for (const frequencyHz of [0, 2e4]) {
      const full = fullDifferentialCommonMode(design, loadMismatch, isMismatch, frequencyHz);
      const fullDb = 20 * Math.log10(full.ad / Math.hypot(full.adcm.re, full.adcm.im));
      expect(Math.abs(mismatchCmrrDb(mismatchSensitivity(stagesOf(), frequencyHz), loadMismatch, isMismatch) - fullDb)).toBeLessThan(0.2);
    }
    const dc = analyze({ ...design, collectorMismatch: loadMismatch, pairSaturationCurrentMismatch: isMismatch });
    expect(Math.abs(mismatchCmrrDb(mismatchSensitivity(stagesOf(), 0), loadMismatch, isMismatch) - dc.cmrrDb.differential!)).toBeLessThan(0.2);
  });

  test('the worst case lies below the Monte Carlo 5th percentile (3σ extremes add in magnitude)', () => {
    const s = mismatchSensitivity(stagesOf(), 1000);
    const mc = monteCarloCmrr(s, monteCarloDraws(2000, 5), 0.01, 0.001, 60);
    expect(worstCaseMismatchCmrrDb(s, 0.01, 0.001)).toBeLessThan(mc.percentilesDb.p5);
  });

  test('Monte Carlo yield on sensitivities matches a brute-force Monte Carlo of full solves (same draws) within 3 points', () => {
    const s = mismatchSensitivity(stagesOf(), 0);
    const tolerance = 0.01;
    const sigmaV = 0.0015;
    const samples = 300;
    const seed = 21;
    const medianDb = monteCarloCmrr(s, monteCarloDraws(samples, seed), tolerance, sigmaV, 0).percentilesDb.p50;
    const requiredDb = medianDb - 3; // a threshold that splits the population
    const quick = monteCarloCmrr(s, monteCarloDraws(samples, seed), tolerance, sigmaV, requiredDb);
    // Same generator, same order of draws as monteCarloDraws: r1, r2, ΔVBE per sample.
    const gauss = gaussianSource(seed);
    const thermalVoltageV = stagesOf().matched.model.thermalVoltageV;
    let passing = 0;
    for (let i = 0; i < samples; i += 1) {
      const r1 = 1 + (tolerance / 3) * gauss.next();
      const r2 = 1 + (tolerance / 3) * gauss.next();
      const isMismatch = Math.exp((sigmaV * gauss.next()) / thermalVoltageV) - 1;
      const full = analyze({ ...design, collectorMismatch: r2 / r1 - 1, pairSaturationCurrentMismatch: isMismatch });
      if (full.cmrrDb.differential! >= requiredDb) passing += 1;
    }
    expect(Math.abs(quick.yieldPercent - (100 * passing) / samples)).toBeLessThanOrEqual(3);
  });
});

describe('Monte Carlo bookkeeping', () => {
  const sensitivity = () => mismatchSensitivity(mismatchStages(solveStage(DESIGNS['resistor tail, single 10 V supply'])), 0);
  test('same seed, same result; another seed, another sample', () => {
    const s = sensitivity();
    expect(monteCarloCmrr(s, monteCarloDraws(500, 9), 0.01, 0.001, 70)).toEqual(monteCarloCmrr(s, monteCarloDraws(500, 9), 0.01, 0.001, 70));
    expect(monteCarloCmrr(s, monteCarloDraws(500, 9), 0.01, 0.001, 70).percentilesDb.p50).not.toEqual(monteCarloCmrr(s, monteCarloDraws(500, 10), 0.01, 0.001, 70).percentilesDb.p50);
  });
  test('the histogram counts every sample', () => {
    const mc = monteCarloCmrr(sensitivity(), monteCarloDraws(777, 2), 0.01, 0.001, 70);
    expect(mc.histogram.counts.reduce((a, b) => a + b, 0)).toBe(777);
    expect(mc.histogram.binEdgesDb).toHaveLength(mc.histogram.counts.length + 1);
  });
  test('the Gaussian source has mean ≈ 0 and σ ≈ 1 (20 000 draws, 4σ bounds on the estimates)', () => {
    const g = gaussianSource(123);
    const n = 20000;
    let sum = 0;
    let sumSq = 0;
    for (let i = 0; i < n; i += 1) {
      const x = g.next();
      sum += x;
      sumSq += x * x;
    }
    const mean = sum / n;
    const variance = sumSq / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(variance - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
  });
});
