/**
 * Mismatch-limited rejection of the differential output. A perfectly matched pair rejects
 * common mode completely between its collectors; the load mismatch ε (RC2 = RC1·(1+ε)) and the
 * pair's IS mismatch δ (δ = exp(ΔVBE/VT) − 1) set the limit [SS]. Exact solves of the stage at
 * ±ε, ±δ and (ε, δ) (every operating-point shift included: the Early effect on the shifted
 * collector voltages makes the response curve, DOMAIN.md) give a second-order model, and the
 * worst case and the Monte Carlo follow without further solves:
 *   Adcm(ε, δ) = Sε·ε + Sεε·ε² + Sδ·δ + Sδδ·δ² + Sεδ·ε·δ,  Ad(ε, δ) = Ad0 + Aε·ε + Aδ·δ
 * (complex, at one frequency), CMRR = |Ad| / |Adcm|. tests/unit/engine/mismatch.test.ts holds
 * the model against full solves.
 */
import { solveCircuit, transfersAt, type SolvedCircuit } from './analyze';
import { magnitude, type Complex } from './small-signal';
import { gaussianSource } from './random';

/** Steps the model is fitted at: about the 1σ–3σ mismatch of 1 % parts and a 0.5 mV VBE spread. */
const LOAD_STEP = 0.01;
const IS_STEP = 0.02;
/** Histogram bins of the Monte Carlo rejection (the top bin also holds the top 1 %). */
const HISTOGRAM_BINS = 30;
/** The statistical reading of a tolerance: Gaussian with 3σ = tolerance (common practice). */
const SIGMAS_PER_TOLERANCE = 3;

/** The second-order mismatch model at one frequency. */
export interface MismatchSensitivity {
  frequencyHz: number;
  thermalVoltageV: number;
  /** Differential gain of the matched stage, and its first-order change with ε and δ. */
  differentialGain: Complex;
  differentialGainPerLoad: Complex;
  differentialGainPerIs: Complex;
  /** ∂Adcm/∂ε and ∂Adcm/∂δ (first order). */
  perLoadMismatch: Complex;
  perIsMismatch: Complex;
  /** Second-order coefficients: ε², δ² and ε·δ. */
  loadSquared: Complex;
  isSquared: Complex;
  loadTimesIs: Complex;
}

export interface MonteCarloResult {
  samples: number;
  seed: number;
  requiredDb: number;
  yieldPercent: number;
  percentilesDb: { p1: number; p5: number; p50: number; p95: number };
  /** Equal bins from the lowest sample to the 99th percentile; the top bin also counts every sample above it. */
  histogram: { binEdgesDb: number[]; counts: number[] };
}

/** The stage solved matched and at +ε and +δ: enough for a first-order model (screening). */
export interface ScreeningStages {
  matched: SolvedCircuit;
  loadPlus: SolvedCircuit;
  isPlus: SolvedCircuit;
}

/** The stage solved at every fitting point of the second-order model. */
export interface MismatchStages extends ScreeningStages {
  loadMinus: SolvedCircuit;
  isMinus: SolvedCircuit;
  both: SolvedCircuit;
}

function solveMismatched(matched: SolvedCircuit, loadMismatch: number, isMismatch: number): SolvedCircuit {
  return solveCircuit({ ...matched.design, collectorMismatch: loadMismatch, pairSaturationCurrentMismatch: isMismatch }, matched);
}

/** The two solves of the first-order model (warm-started from the matched solution). */
export function screeningStages(matched: SolvedCircuit): ScreeningStages {
  return { matched, loadPlus: solveMismatched(matched, LOAD_STEP, 0), isPlus: solveMismatched(matched, 0, IS_STEP) };
}

/** Completes screening stages (or starts from a matched solution) to the second-order model's five solves. */
export function mismatchStages(from: SolvedCircuit | ScreeningStages): MismatchStages {
  const screening = 'loadPlus' in from ? from : screeningStages(from);
  const { matched } = screening;
  return {
    ...screening,
    loadMinus: solveMismatched(matched, -LOAD_STEP, 0),
    isMinus: solveMismatched(matched, 0, -IS_STEP),
    both: solveMismatched(matched, LOAD_STEP, IS_STEP),
  };
}

/** First-order model from screening stages (forward differences, no second-order terms): for ranking corners. */
export function screeningSensitivity(stages: ScreeningStages, frequencyHz: number): MismatchSensitivity {
  const m = transfersAt(stages.matched, frequencyHz);
  const lp = transfersAt(stages.loadPlus, frequencyHz);
  const ip = transfersAt(stages.isPlus, frequencyHz);
  const zero = { re: 0, im: 0 };
  return {
    frequencyHz,
    thermalVoltageV: stages.matched.model.thermalVoltageV,
    differentialGain: m.differentialGain,
    differentialGainPerLoad: combine([[1 / LOAD_STEP, lp.differentialGain], [-1 / LOAD_STEP, m.differentialGain]]),
    differentialGainPerIs: combine([[1 / IS_STEP, ip.differentialGain], [-1 / IS_STEP, m.differentialGain]]),
    perLoadMismatch: combine([[1 / LOAD_STEP, lp.differentialCommonModeGain], [-1 / LOAD_STEP, m.differentialCommonModeGain]]),
    perIsMismatch: combine([[1 / IS_STEP, ip.differentialCommonModeGain], [-1 / IS_STEP, m.differentialCommonModeGain]]),
    loadSquared: zero,
    isSquared: zero,
    loadTimesIs: zero,
  };
}

/** a·x + b·y + c·z for complex x, y, z. */
function combine(terms: [number, Complex][]): Complex {
  let re = 0;
  let im = 0;
  for (const [k, z] of terms) {
    re += k * z.re;
    im += k * z.im;
  }
  return { re, im };
}

/** The model's coefficients at a frequency (central differences; the cross term from the (ε, δ) point). */
export function mismatchSensitivity(stages: MismatchStages, frequencyHz: number): MismatchSensitivity {
  const at = (s: SolvedCircuit) => transfersAt(s, frequencyHz);
  const m = at(stages.matched);
  const lp = at(stages.loadPlus);
  const lm = at(stages.loadMinus);
  const ip = at(stages.isPlus);
  const im = at(stages.isMinus);
  const both = at(stages.both);
  const h = LOAD_STEP;
  const k = IS_STEP;
  const cm = (t: typeof m) => t.differentialCommonModeGain;
  const perLoad = combine([[1 / (2 * h), cm(lp)], [-1 / (2 * h), cm(lm)]]);
  const loadSquared = combine([[1 / (2 * h * h), cm(lp)], [1 / (2 * h * h), cm(lm)], [-1 / (h * h), cm(m)]]);
  const perIs = combine([[1 / (2 * k), cm(ip)], [-1 / (2 * k), cm(im)]]);
  const isSquared = combine([[1 / (2 * k * k), cm(ip)], [1 / (2 * k * k), cm(im)], [-1 / (k * k), cm(m)]]);
  const loadTimesIs = combine([
    [1 / (h * k), cm(both)],
    [-1 / (h * k), cm(m)],
    [-1 / k, perLoad],
    [-h / k, loadSquared],
    [-1 / h, perIs],
    [-k / h, isSquared],
  ]);
  return {
    frequencyHz,
    thermalVoltageV: stages.matched.model.thermalVoltageV,
    differentialGain: m.differentialGain,
    differentialGainPerLoad: combine([[1 / (2 * h), lp.differentialGain], [-1 / (2 * h), lm.differentialGain]]),
    differentialGainPerIs: combine([[1 / (2 * k), ip.differentialGain], [-1 / (2 * k), im.differentialGain]]),
    perLoadMismatch: perLoad,
    perIsMismatch: perIs,
    loadSquared,
    isSquared,
    loadTimesIs,
  };
}

/** Differential CMRR (dB) for one pair of mismatches, from the model. */
export function mismatchCmrrDb(s: MismatchSensitivity, loadMismatch: number, isMismatch: number): number {
  const e = loadMismatch;
  const d = isMismatch;
  const cmRe = s.perLoadMismatch.re * e + s.loadSquared.re * e * e + s.perIsMismatch.re * d + s.isSquared.re * d * d + s.loadTimesIs.re * e * d;
  const cmIm = s.perLoadMismatch.im * e + s.loadSquared.im * e * e + s.perIsMismatch.im * d + s.isSquared.im * d * d + s.loadTimesIs.im * e * d;
  const adRe = s.differentialGain.re + s.differentialGainPerLoad.re * e + s.differentialGainPerIs.re * d;
  const adIm = s.differentialGain.im + s.differentialGainPerLoad.im * e + s.differentialGainPerIs.im * d;
  // squared magnitudes and one log: this runs once per Monte Carlo sample
  return 10 * Math.log10((adRe * adRe + adIm * adIm) / (cmRe * cmRe + cmIm * cmIm));
}

/** The spec's resistor tolerance as a fraction (1 % -> 0.01), as the mismatch formulas take it. */
export function resistorToleranceFraction(spec: { resistors: { tolerancePercent: number } }): number {
  return spec.resistors.tolerancePercent / 100;
}

/**
 * Worst case: both load resistors at opposite tolerance extremes, ε = (1+t)/(1−t) − 1, and the
 * VBE mismatch at 3σ, δ = exp(3σ/VT) − 1, every term of the model adding in magnitude and the
 * differential gain at its lowest.
 */
export function worstCaseMismatchCmrrDb(s: MismatchSensitivity, resistorTolerance: number, vbeSigmaV: number): number {
  const e = (1 + resistorTolerance) / (1 - resistorTolerance) - 1;
  const d = Math.exp((SIGMAS_PER_TOLERANCE * vbeSigmaV) / s.thermalVoltageV) - 1;
  const adcm = magnitude(s.perLoadMismatch) * e + magnitude(s.loadSquared) * e * e + magnitude(s.perIsMismatch) * d + magnitude(s.isSquared) * d * d + magnitude(s.loadTimesIs) * e * d;
  const ad = magnitude(s.differentialGain) - magnitude(s.differentialGainPerLoad) * e - magnitude(s.differentialGainPerIs) * d;
  return 20 * Math.log10(ad / adcm);
}

/** The p-th percentile of ascending values (nearest rank). */
export function percentile(sorted: ArrayLike<number>, p: number): number {
  const i = Math.min(sorted.length - 1, Math.max(0, Math.round((p / 100) * (sorted.length - 1))));
  return sorted[i];
}

/** Standard-normal draws for a Monte Carlo, three per sample (load 1, load 2, ΔVBE), shared by every option. */
export interface MonteCarloDraws {
  samples: number;
  seed: number;
  normals: Float64Array;
}

/** Draws once per spec, so every option sees the same samples (common random numbers). */
export function monteCarloDraws(samples: number, seed: number): MonteCarloDraws {
  const gauss = gaussianSource(seed);
  const normals = new Float64Array(3 * samples);
  for (let i = 0; i < normals.length; i += 1) normals[i] = gauss.next();
  return { samples, seed, normals };
}

/** One Monte Carlo sample's parts: each load resistor's scale (1 = nominal), their ratio mismatch ε and the pair's IS mismatch δ. */
export interface MonteCarloSample {
  load1Scale: number;
  load2Scale: number;
  /** ε = R2/R1 − 1. */
  loadMismatch: number;
  /** δ = exp(ΔVBE/VT) − 1. */
  isMismatch: number;
}

/**
 * Sample `i` of `draws`: loads Gaussian with 3σ = tolerance, ΔVBE Gaussian with σ = `vbeSigmaV`.
 * The closed-form Monte Carlo and the SPICE one read the same samples from here.
 */
export function monteCarloSample(draws: MonteCarloDraws, i: number, resistorTolerance: number, vbeSigmaV: number, thermalVoltageV: number): MonteCarloSample {
  const resistorSigma = resistorTolerance / SIGMAS_PER_TOLERANCE;
  const load1Scale = 1 + resistorSigma * draws.normals[3 * i];
  const load2Scale = 1 + resistorSigma * draws.normals[3 * i + 1];
  return { load1Scale, load2Scale, loadMismatch: load2Scale / load1Scale - 1, isMismatch: Math.exp((vbeSigmaV * draws.normals[3 * i + 2]) / thermalVoltageV) - 1 };
}

/**
 * Seeded Monte Carlo of the differential CMRR: each load resistor Gaussian with 3σ = tolerance,
 * the pair's ΔVBE Gaussian with the spec's σ; yield = share of samples at or above `requiredDb`.
 */
export function monteCarloCmrr(
  s: MismatchSensitivity,
  draws: MonteCarloDraws,
  resistorTolerance: number,
  vbeSigmaV: number,
  requiredDb: number,
): MonteCarloResult {
  const { samples } = draws;
  const values = new Float64Array(samples);
  let passing = 0;
  for (let i = 0; i < samples; i += 1) {
    const draw = monteCarloSample(draws, i, resistorTolerance, vbeSigmaV, s.thermalVoltageV);
    const db = mismatchCmrrDb(s, draw.loadMismatch, draw.isMismatch);
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
    seed: draws.seed,
    requiredDb,
    yieldPercent: (100 * passing) / samples,
    percentilesDb: { p1: percentile(values, 1), p5: percentile(values, 5), p50: percentile(values, 50), p95: percentile(values, 95) },
    histogram: { binEdgesDb: Array.from({ length: HISTOGRAM_BINS + 1 }, (_, i) => lowDb + i * widthDb), counts },
  };
}
