/**
 * The mismatch model behind the differential-output worst case and Monte Carlo: a few exact
 * solves fit a second-order model in the four mismatches (loads, IS, BF, VAF), and the CMRR of
 * any small mismatch follows from it.
 * Checked here against full solves of the mismatched stage (the engine's own exact path, which
 * tests/reference checks against ngspice), so the linearisation is what is under test.
 */
import { describe, expect, test } from 'vitest';
import { analyze, solveStage, transfersAt } from '#shared/engine/analyze';
import {
  mismatchCmrrDb,
  mismatchSensitivity,
  mismatchStages,
  mismatchedDesign,
  monteCarloCmrr,
  monteCarloDraws,
  monteCarloSample,
  percentile,
  worstCaseMismatchCmrrDb,
  worstCaseMismatches,
  worstCaseMismatchShares,
  type MismatchSigmas,
  type MismatchVector,
} from '#shared/engine/mismatch';
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
  'cascode tail, ±12 V, degenerated pair (high Rout: device mismatch shows)': {
    device: { family: 'npn', beta: 172, earlyVoltageV: 54, saturationCurrentA: 7.7e-15 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 8250,
    pairEmitterResistanceOhm: 220,
    tail: { topology: 'cascode', referenceResistanceOhm: 22100 },
    inputCommonModeV: -1.5,
    temperatureC: 63,
  },
};

/** Spreads as a spec gives them: 1 % resistors, 1 mV VBE, 2 % BF, 5 % VAF. */
const SIGMAS: MismatchSigmas = { resistorTolerance: 0.01, vbeSigmaV: 0.001, betaSigma: 0.02, earlyVoltageSigma: 0.05 };

/** [load ε, IS δ, BF b, VAF a]. */
const SINGLE_MISMATCHES: MismatchVector[] = [
  [0.004, 0, 0, 0],
  [0.03, 0, 0, 0],
  [-0.02, 0, 0, 0],
  [0, 0.03, 0, 0],
  [0, -0.012, 0, 0],
  [0, 0, 0.06, 0],
  [0, 0, -0.03, 0],
  [0, 0, 0, 0.15],
  [0, 0, 0, -0.08],
];
const COMBINED_MISMATCHES: MismatchVector[] = [
  [-0.015, 0.012, 0, 0],
  [0.02, -0.04, 0, 0],
  [0.01, 0.01, 0, 0],
  [0.01, -0.02, 0.04, -0.1],
  [-0.006, 0.015, -0.05, 0.12],
  [0, 0.02, 0.03, 0.07],
];

/**
 * CMRR in dB from a full solve of the mismatched stage at a frequency. Driven from ideal sources
 * without emitter degeneration, a beta mismatch alone leaves the collector currents equal
 * (IC = IS·exp(VBE/VT) does not depend on BF), so the rejection is infinite there.
 */
function fullCmrrDb(design: Design, x: MismatchVector, frequencyHz: number): number {
  const t = transfersAt(solveStage(mismatchedDesign(design, x)), frequencyHz);
  return 20 * Math.log10(Math.hypot(t.differentialGain.re, t.differentialGain.im) / Math.hypot(t.differentialCommonModeGain.re, t.differentialCommonModeGain.im));
}

describe.each(Object.entries(DESIGNS))('%s', (_name, design) => {
  // solved afresh in each test, so a mutation run knows which tests exercise the solver
  const stagesOf = () => mismatchStages(solveStage(design));

  test.each([...SINGLE_MISMATCHES, ...COMBINED_MISMATCHES])('mismatches %o: model CMRR within 0.2 dB of the full solve at DC and at 20 kHz', (...x) => {
    const mismatches = x as unknown as MismatchVector;
    const agrees = (modelDb: number, fullDb: number) => (fullDb === Infinity ? modelDb > 200 : Math.abs(modelDb - fullDb) < 0.2);
    for (const frequencyHz of [0, 2e4]) {
      const modelDb = mismatchCmrrDb(mismatchSensitivity(stagesOf(), frequencyHz), mismatches);
      const fullDb = fullCmrrDb(design, mismatches, frequencyHz);
      expect(agrees(modelDb, fullDb), `model ${modelDb} dB, full solve ${fullDb} dB at ${frequencyHz} Hz`).toBe(true);
    }
    const dc = analyze(mismatchedDesign(design, mismatches));
    const modelDb = mismatchCmrrDb(mismatchSensitivity(stagesOf(), 0), mismatches);
    expect(agrees(modelDb, dc.cmrrDb.differential ?? Infinity), `model ${modelDb} dB, analyze ${dc.cmrrDb.differential} dB`).toBe(true);
  });

  test('the Monte Carlo\'s unrolled loop gives, sample by sample, the model\'s figure for that sample\'s mismatches: the same yield, percentiles and histogram', () => {
    const s = mismatchSensitivity(stagesOf(), 1000);
    const draws = monteCarloDraws(500, 11);
    const sigmas = { ...SIGMAS, betaSigma: 0.03, earlyVoltageSigma: 0.06 };
    const values = Float64Array.from({ length: 500 }, (_, i) => mismatchCmrrDb(s, monteCarloSample(draws, i, sigmas, s.thermalVoltageV).mismatches)).sort();
    // required at the samples' median: about half pass
    const requiredDb = percentile(values, 50);
    const mc = monteCarloCmrr(s, draws, sigmas, requiredDb);
    expect(mc.yieldPercent).toBe((100 * values.filter((v) => v >= requiredDb).length) / 500);
    expect(mc.yieldPercent).toBeGreaterThan(0);
    expect(mc.yieldPercent).toBeLessThan(100);
    for (const p of [1, 5, 50, 95] as const) expect(mc.percentilesDb[`p${p}`], `p${p}`).toBeCloseTo(percentile(values, p), 9);
    expect(mc.histogram.binEdgesDb[0]).toBeCloseTo(values[0], 9);
    expect(mc.histogram.counts.reduce((a, b) => a + b, 0)).toBe(500);
  });

  test('the worst case lies below the Monte Carlo 5th percentile (3σ extremes add in magnitude)', () => {
    const s = mismatchSensitivity(stagesOf(), 1000);
    const mc = monteCarloCmrr(s, monteCarloDraws(2000, 5), SIGMAS, 60);
    expect(worstCaseMismatchCmrrDb(s, SIGMAS)).toBeLessThan(mc.percentilesDb.p5);
  });

  test('the worst case lies at or below every full solve at the extremes of the four mismatches (16 sign combinations), within 3 dB of the lowest', () => {
    const s = mismatchSensitivity(stagesOf(), 1000);
    const extremes = worstCaseMismatches(SIGMAS, s.thermalVoltageV);
    let lowestDb = Infinity;
    for (let signs = 0; signs < 16; signs += 1) {
      const x = extremes.map((v, i) => ((signs >> i) & 1 ? -v : v)) as unknown as MismatchVector;
      lowestDb = Math.min(lowestDb, fullCmrrDb(design, x, 1000));
    }
    const worstDb = worstCaseMismatchCmrrDb(s, SIGMAS);
    expect(worstDb).toBeLessThanOrEqual(lowestDb + 0.05);
    expect(lowestDb - worstDb).toBeLessThan(3);
  });

  test('the shares of the worst case add to 100 % and name the mismatches that set it', () => {
    const shares = worstCaseMismatchShares(mismatchSensitivity(stagesOf(), 1000), SIGMAS);
    expect(shares.load + shares.is + shares.beta + shares.early).toBeCloseTo(100, 6);
    for (const share of Object.values(shares)) expect(share).toBeGreaterThanOrEqual(0);
  });

  test('Monte Carlo yield on sensitivities matches a brute-force Monte Carlo of full solves (same draws) within 3 points', () => {
    const s = mismatchSensitivity(stagesOf(), 0);
    const sigmas: MismatchSigmas = { resistorTolerance: 0.01, vbeSigmaV: 0.0015, betaSigma: 0.03, earlyVoltageSigma: 0.06 };
    const samples = 300;
    const seed = 21;
    const medianDb = monteCarloCmrr(s, monteCarloDraws(samples, seed), sigmas, 0).percentilesDb.p50;
    const requiredDb = medianDb - 3; // a threshold that splits the population
    const quick = monteCarloCmrr(s, monteCarloDraws(samples, seed), sigmas, requiredDb);
    // Same generator, same order of draws as monteCarloDraws: r1, r2, ΔVBE per sample, then BF, VAF per sample.
    const gauss = gaussianSource(seed);
    const firstThree = Array.from({ length: samples }, () => [gauss.next(), gauss.next(), gauss.next()]);
    const lastTwo = Array.from({ length: samples }, () => [gauss.next(), gauss.next()]);
    const thermalVoltageV = stagesOf().matched.model.thermalVoltageV;
    let passing = 0;
    for (let i = 0; i < samples; i += 1) {
      const r1 = 1 + (sigmas.resistorTolerance / 3) * firstThree[i][0];
      const r2 = 1 + (sigmas.resistorTolerance / 3) * firstThree[i][1];
      const isMismatch = Math.exp((sigmas.vbeSigmaV * firstThree[i][2]) / thermalVoltageV) - 1;
      const full = analyze(mismatchedDesign(design, [r2 / r1 - 1, isMismatch, sigmas.betaSigma * lastTwo[i][0], sigmas.earlyVoltageSigma * lastTwo[i][1]]));
      if (full.cmrrDb.differential! >= requiredDb) passing += 1;
    }
    expect(Math.abs(quick.yieldPercent - (100 * passing) / samples)).toBeLessThanOrEqual(3);
  });
});

describe('Monte Carlo bookkeeping', () => {
  const sensitivity = () => mismatchSensitivity(mismatchStages(solveStage(DESIGNS['resistor tail, single 10 V supply'])), 0);
  test('same seed, same result; another seed, another sample', () => {
    const s = sensitivity();
    expect(monteCarloCmrr(s, monteCarloDraws(500, 9), SIGMAS, 70)).toEqual(monteCarloCmrr(s, monteCarloDraws(500, 9), SIGMAS, 70));
    expect(monteCarloCmrr(s, monteCarloDraws(500, 9), SIGMAS, 70).percentilesDb.p50).not.toEqual(monteCarloCmrr(s, monteCarloDraws(500, 10), SIGMAS, 70).percentilesDb.p50);
  });
  test('the histogram counts every sample', () => {
    const mc = monteCarloCmrr(sensitivity(), monteCarloDraws(777, 2), SIGMAS, 70);
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
