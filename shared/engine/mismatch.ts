/**
 * Mismatch-limited rejection of the differential output. A perfectly matched pair rejects
 * common mode completely between its collectors; the load mismatch ε (RC2 = RC1·(1+ε)) and the
 * pair's IS mismatch δ (δ = exp(ΔVBE/VT) − 1) set the limit [SS]. The differential common-mode
 * gain is linear in small mismatches, so two exact solves (one per mismatch, each with every
 * operating-point shift, Early effect included) give its sensitivities, and the worst case and
 * the Monte Carlo follow without further solves:
 *   Adcm(ε, δ) = ε·Sε + δ·Sδ (complex, at the spec frequency),  CMRR = |Ad| / |Adcm|.
 */
import { solveStage, transfersAt, type StageSolution } from './analyze';
import type { Complex } from './small-signal';
import { gaussianSource } from './random';
import type { Design } from './types';

/** Mismatch used to measure the sensitivities (small enough to stay linear). */
const SENSITIVITY_STEP = 1e-3;
/** Histogram bins of the Monte Carlo rejection. */
const HISTOGRAM_BINS = 30;
/** The statistical reading of a tolerance: Gaussian with 3σ = tolerance (common practice). */
const SIGMAS_PER_TOLERANCE = 3;

export interface MismatchSensitivity {
  frequencyHz: number;
  thermalVoltageV: number;
  /** Differential gain magnitude at the frequency, V/V. */
  differentialGainMagnitude: number;
  /** ∂Adcm/∂ε and ∂Adcm/∂δ at the frequency. */
  perLoadMismatch: Complex;
  perIsMismatch: Complex;
}

export interface MonteCarloResult {
  samples: number;
  seed: number;
  requiredDb: number;
  yieldPercent: number;
  percentilesDb: { p1: number; p5: number; p50: number; p95: number };
  histogram: { binEdgesDb: number[]; counts: number[] };
}

function scaled(z: Complex, k: number): Complex {
  return { re: z.re * k, im: z.im * k };
}

/** The stage solved once with a small load mismatch and once with a small IS mismatch. */
export interface MismatchStages {
  load: StageSolution;
  is: StageSolution;
}

/** Solves the two mismatched stages the sensitivities are read from (frequency-independent). */
export function mismatchStages(design: Design): MismatchStages {
  return {
    load: solveStage({ ...design, collectorMismatch: SENSITIVITY_STEP, pairSaturationCurrentMismatch: 0 }),
    is: solveStage({ ...design, collectorMismatch: 0, pairSaturationCurrentMismatch: SENSITIVITY_STEP }),
  };
}

/** Sensitivities of the differential common-mode gain to the two mismatches at a frequency. */
export function mismatchSensitivity({ load, is }: MismatchStages, frequencyHz: number): MismatchSensitivity {
  const loadT = transfersAt(load, frequencyHz);
  const isT = transfersAt(is, frequencyHz);
  return {
    frequencyHz,
    thermalVoltageV: load.model.thermalVoltageV,
    differentialGainMagnitude: Math.hypot(loadT.differentialGain.re, loadT.differentialGain.im),
    perLoadMismatch: scaled(loadT.differentialCommonModeGain, 1 / SENSITIVITY_STEP),
    perIsMismatch: scaled(isT.differentialCommonModeGain, 1 / SENSITIVITY_STEP),
  };
}

/** Differential CMRR (dB) for one pair of mismatches. */
export function mismatchCmrrDb(s: MismatchSensitivity, loadMismatch: number, isMismatch: number): number {
  const re = s.perLoadMismatch.re * loadMismatch + s.perIsMismatch.re * isMismatch;
  const im = s.perLoadMismatch.im * loadMismatch + s.perIsMismatch.im * isMismatch;
  // sqrt rather than Math.hypot: this runs once per Monte Carlo sample and hypot is several times slower
  return 20 * Math.log10(s.differentialGainMagnitude / Math.sqrt(re * re + im * im));
}

/**
 * Worst case: both load resistors at opposite tolerance extremes, ε = (1+t)/(1−t) − 1, and the
 * VBE mismatch at 3σ, δ = exp(3σ/VT) − 1, with the two contributions adding in magnitude.
 */
export function worstCaseMismatchCmrrDb(s: MismatchSensitivity, resistorTolerance: number, vbeSigmaV: number): number {
  const loadWorst = (1 + resistorTolerance) / (1 - resistorTolerance) - 1;
  const isWorst = Math.exp((SIGMAS_PER_TOLERANCE * vbeSigmaV) / s.thermalVoltageV) - 1;
  const perLoad = Math.hypot(s.perLoadMismatch.re, s.perLoadMismatch.im);
  const perIs = Math.hypot(s.perIsMismatch.re, s.perIsMismatch.im);
  return 20 * Math.log10(s.differentialGainMagnitude / (perLoad * loadWorst + perIs * isWorst));
}

function percentile(sorted: Float64Array, p: number): number {
  const i = Math.min(sorted.length - 1, Math.max(0, Math.round((p / 100) * (sorted.length - 1))));
  return sorted[i];
}

/**
 * Seeded Monte Carlo of the differential CMRR: each load resistor Gaussian with 3σ = tolerance,
 * the pair's ΔVBE Gaussian with the spec's σ; yield = share of samples at or above `requiredDb`.
 */
export function monteCarloCmrr(
  s: MismatchSensitivity,
  resistorTolerance: number,
  vbeSigmaV: number,
  requiredDb: number,
  samples: number,
  seed: number,
): MonteCarloResult {
  const gauss = gaussianSource(seed);
  const resistorSigma = resistorTolerance / SIGMAS_PER_TOLERANCE;
  const values = new Float64Array(samples);
  let passing = 0;
  for (let i = 0; i < samples; i += 1) {
    const r1 = 1 + resistorSigma * gauss.next();
    const r2 = 1 + resistorSigma * gauss.next();
    const isMismatch = Math.exp((vbeSigmaV * gauss.next()) / s.thermalVoltageV) - 1;
    const db = mismatchCmrrDb(s, r2 / r1 - 1, isMismatch);
    values[i] = Number.isFinite(db) ? db : Number.MAX_VALUE;
    if (db >= requiredDb) passing += 1;
  }
  values.sort();
  const lowDb = values[0];
  const highDb = percentile(values, 99);
  const widthDb = Math.max(highDb - lowDb, 1e-9) / HISTOGRAM_BINS;
  const counts = new Array<number>(HISTOGRAM_BINS).fill(0);
  for (const v of values) counts[Math.min(HISTOGRAM_BINS - 1, Math.floor((v - lowDb) / widthDb))] += 1;
  return {
    samples,
    seed,
    requiredDb,
    yieldPercent: (100 * passing) / samples,
    percentilesDb: { p1: percentile(values, 1), p5: percentile(values, 5), p50: percentile(values, 50), p95: percentile(values, 95) },
    histogram: { binEdgesDb: Array.from({ length: HISTOGRAM_BINS + 1 }, (_, i) => lowDb + i * widthDb), counts },
  };
}
