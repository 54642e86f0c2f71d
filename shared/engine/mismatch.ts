/**
 * Mismatch-limited rejection of the differential output. A perfectly matched pair rejects
 * common mode completely between its collectors; four mismatches set the limit [SS]: the load
 * mismatch ε (RC2 = RC1·(1+ε)), the pair's IS mismatch δ (δ = exp(ΔVBE/VT) − 1), its beta
 * mismatch b (BF2 = BF·(1+b)) and its Early-voltage mismatch a (VAF2 = VAF·(1+a)). Exact solves
 * of the stage at ±step of each and at each pair of them (every operating-point shift included:
 * the Early effect on the shifted collector voltages makes the response curve, DOMAIN.md) give a
 * second-order model, and the worst case and the Monte Carlo follow without further solves:
 *   Adcm(x) = Σ Sᵢ·xᵢ + Σ Sᵢᵢ·xᵢ² + Σ_{i<j} Sᵢⱼ·xᵢ·xⱼ,  Ad(x) = Ad0 + Σ Aᵢ·xᵢ
 * (complex, at one frequency), CMRR = |Ad| / |Adcm|. tests/unit/engine/mismatch.test.ts holds
 * the model against full solves.
 *
 * What the model leaves out (thermal gradients across the pair, leakage, source-impedance
 * imbalance, layout) usually limits a real stage somewhere above 100–120 dB (common practice,
 * from memory), so a figure above MODEL_LIMITED_ABOVE_DB is reported as limited only by the model.
 */
import { solveCircuit, transfersAt, type SolvedCircuit } from './analyze';
import { magnitude, type Complex } from './small-signal';
import { gaussianSource } from './random';
import type { Design } from './types';

/** The four mismatches, in the order every array of this module uses. */
export const MISMATCH_KINDS = ['load', 'is', 'beta', 'early'] as const;
export type MismatchKind = (typeof MISMATCH_KINDS)[number];
const COUNT = MISMATCH_KINDS.length;
/**
 * Steps the model is fitted at: about the 1σ–3σ mismatch of 1 % parts, a 0.5 mV VBE spread, and a
 * few per cent of BF and VAF.
 */
export const MISMATCH_STEPS: readonly number[] = [0.01, 0.02, 0.05, 0.05];
const STEPS = MISMATCH_STEPS;
/** Index pairs of the cross terms, in the order of `MismatchSensitivity.cross`. */
const PAIRS: readonly (readonly [number, number])[] = [
  [0, 1],
  [0, 2],
  [0, 3],
  [1, 2],
  [1, 3],
  [2, 3],
];
/** Histogram bins of the Monte Carlo rejection (the top bin also holds the top 1 %). */
const HISTOGRAM_BINS = 30;
/** The statistical reading of a tolerance: Gaussian with 3σ = tolerance (common practice). */
const SIGMAS_PER_TOLERANCE = 3;
/**
 * Above this differential rejection the figure rests only on the mismatches the model includes;
 * effects it leaves out usually set the real figure lower (common practice, from memory), dB.
 */
export const MODEL_LIMITED_ABOVE_DB = 120;

/** One set of mismatches: ε (loads), δ (IS), b (BF), a (VAF), each relative (0 = matched). */
export type MismatchVector = readonly [load: number, is: number, beta: number, early: number];

/** The spread of each mismatch, as the spec gives it. */
export interface MismatchSigmas {
  /** Resistor tolerance as a fraction (1 % -> 0.01): Gaussian with 3σ = tolerance. */
  resistorTolerance: number;
  /** σ of the pair's ΔVBE, V. */
  vbeSigmaV: number;
  /** σ of the pair's relative BF difference. */
  betaSigma: number;
  /** σ of the pair's relative VAF difference. */
  earlyVoltageSigma: number;
}

/** The second-order mismatch model at one frequency; arrays in MISMATCH_KINDS order. */
export interface MismatchSensitivity {
  frequencyHz: number;
  thermalVoltageV: number;
  /** Differential gain of the matched stage, and its first-order change with each mismatch. */
  differentialGain: Complex;
  differentialGainPer: Complex[];
  /** ∂Adcm/∂xᵢ (first order). */
  linear: Complex[];
  /** Second-order coefficients: xᵢ², and xᵢ·xⱼ for i < j (load·is, load·beta, load·early, is·beta, is·early, beta·early). */
  squared: Complex[];
  cross: Complex[];
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

/** The stage solved matched and at +step of each mismatch: enough for a first-order model (screening). */
export interface ScreeningStages {
  matched: SolvedCircuit;
  plus: SolvedCircuit[];
}

/** The stage solved at every fitting point of the second-order model. */
export interface MismatchStages extends ScreeningStages {
  minus: SolvedCircuit[];
  /** At +step of both mismatches of each pair, in PAIRS order. */
  pairs: SolvedCircuit[];
}

/** The design with the given mismatches (the four mismatch fields set, others kept). */
export function mismatchedDesign(design: Design, x: MismatchVector): Design {
  return { ...design, collectorMismatch: x[0], pairSaturationCurrentMismatch: x[1], pairBetaMismatch: x[2], pairEarlyVoltageMismatch: x[3] };
}

/** The fitting point: `scale` steps of mismatch i (and one step of j when given), the others 0. */
function unitStep(i: number, scale: number, j = -1): MismatchVector {
  const at = (k: number) => (k === i ? scale * STEPS[k] : k === j ? STEPS[k] : 0);
  return [at(0), at(1), at(2), at(3)];
}

function solveMismatched(matched: SolvedCircuit, x: MismatchVector): SolvedCircuit {
  return solveCircuit(mismatchedDesign(matched.design, x), matched);
}

/** The solves of the first-order model, one per mismatch (warm-started from the matched solution). */
export function screeningStages(matched: SolvedCircuit): ScreeningStages {
  return { matched, plus: MISMATCH_KINDS.map((_, i) => solveMismatched(matched, unitStep(i, 1))) };
}

/** Completes screening stages (or starts from a matched solution) to the second-order model's solves. */
export function mismatchStages(from: SolvedCircuit | ScreeningStages): MismatchStages {
  const screening = 'plus' in from ? from : screeningStages(from);
  const { matched } = screening;
  return {
    ...screening,
    minus: MISMATCH_KINDS.map((_, i) => solveMismatched(matched, unitStep(i, -1))),
    pairs: PAIRS.map(([i, j]) => solveMismatched(matched, unitStep(i, 1, j))),
  };
}

const ZERO: Complex = { re: 0, im: 0 };

/** First-order model from screening stages (forward differences, no second-order terms): for ranking corners. */
export function screeningSensitivity(stages: ScreeningStages, frequencyHz: number): MismatchSensitivity {
  const m = transfersAt(stages.matched, frequencyHz);
  const plus = stages.plus.map((s) => transfersAt(s, frequencyHz));
  return {
    frequencyHz,
    thermalVoltageV: stages.matched.model.thermalVoltageV,
    differentialGain: m.differentialGain,
    differentialGainPer: plus.map((p, i) => combine([[1 / STEPS[i], p.differentialGain], [-1 / STEPS[i], m.differentialGain]])),
    linear: plus.map((p, i) => combine([[1 / STEPS[i], p.differentialCommonModeGain], [-1 / STEPS[i], m.differentialCommonModeGain]])),
    squared: MISMATCH_KINDS.map(() => ZERO),
    cross: PAIRS.map(() => ZERO),
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

/** The model's coefficients at a frequency (central differences; each cross term from its (xᵢ, xⱼ) point). */
export function mismatchSensitivity(stages: MismatchStages, frequencyHz: number): MismatchSensitivity {
  const at = (s: SolvedCircuit) => transfersAt(s, frequencyHz);
  const m = at(stages.matched);
  const plus = stages.plus.map(at);
  const minus = stages.minus.map(at);
  const both = stages.pairs.map(at);
  const cm0 = m.differentialCommonModeGain;
  const linear = MISMATCH_KINDS.map((_, i) => combine([[1 / (2 * STEPS[i]), plus[i].differentialCommonModeGain], [-1 / (2 * STEPS[i]), minus[i].differentialCommonModeGain]]));
  const squared = MISMATCH_KINDS.map((_, i) => {
    const h2 = STEPS[i] * STEPS[i];
    return combine([[1 / (2 * h2), plus[i].differentialCommonModeGain], [1 / (2 * h2), minus[i].differentialCommonModeGain], [-1 / h2, cm0]]);
  });
  const cross = PAIRS.map(([i, j], p) => {
    const h = STEPS[i];
    const k = STEPS[j];
    return combine([
      [1 / (h * k), both[p].differentialCommonModeGain],
      [-1 / (h * k), cm0],
      [-1 / k, linear[i]],
      [-h / k, squared[i]],
      [-1 / h, linear[j]],
      [-k / h, squared[j]],
    ]);
  });
  return {
    frequencyHz,
    thermalVoltageV: stages.matched.model.thermalVoltageV,
    differentialGain: m.differentialGain,
    differentialGainPer: MISMATCH_KINDS.map((_, i) => combine([[1 / (2 * STEPS[i]), plus[i].differentialGain], [-1 / (2 * STEPS[i]), minus[i].differentialGain]])),
    linear,
    squared,
    cross,
  };
}

/** Differential CMRR (dB) for one set of mismatches, from the model. */
export function mismatchCmrrDb(s: MismatchSensitivity, x: MismatchVector): number {
  let cmRe = 0;
  let cmIm = 0;
  let adRe = s.differentialGain.re;
  let adIm = s.differentialGain.im;
  for (let i = 0; i < COUNT; i += 1) {
    const xi = x[i];
    cmRe += (s.linear[i].re + s.squared[i].re * xi) * xi;
    cmIm += (s.linear[i].im + s.squared[i].im * xi) * xi;
    adRe += s.differentialGainPer[i].re * xi;
    adIm += s.differentialGainPer[i].im * xi;
  }
  for (let p = 0; p < PAIRS.length; p += 1) {
    const xx = x[PAIRS[p][0]] * x[PAIRS[p][1]];
    cmRe += s.cross[p].re * xx;
    cmIm += s.cross[p].im * xx;
  }
  // squared magnitudes and one log: this runs once per Monte Carlo sample
  return 10 * Math.log10((adRe * adRe + adIm * adIm) / (cmRe * cmRe + cmIm * cmIm));
}

/** The spec's resistor tolerance as a fraction (1 % -> 0.01), as the mismatch formulas take it. */
export function resistorToleranceFraction(spec: { resistors: { tolerancePercent: number } }): number {
  return spec.resistors.tolerancePercent / 100;
}

/** The spec's mismatch spreads. */
export function mismatchSigmas(spec: { resistors: { tolerancePercent: number }; device: { vbeMismatchSigmaV: number; betaMismatchSigma: number; earlyVoltageMismatchSigma: number } }): MismatchSigmas {
  return {
    resistorTolerance: resistorToleranceFraction(spec),
    vbeSigmaV: spec.device.vbeMismatchSigmaV,
    betaSigma: spec.device.betaMismatchSigma,
    earlyVoltageSigma: spec.device.earlyVoltageMismatchSigma,
  };
}

/**
 * The worst-case mismatches: both load resistors at opposite tolerance extremes,
 * ε = (1+t)/(1−t) − 1, the VBE mismatch at 3σ, δ = exp(3σ/VT) − 1, and BF and VAF at 3σ.
 */
export function worstCaseMismatches(sigmas: MismatchSigmas, thermalVoltageV: number): MismatchVector {
  const t = sigmas.resistorTolerance;
  return [(1 + t) / (1 - t) - 1, Math.exp((SIGMAS_PER_TOLERANCE * sigmas.vbeSigmaV) / thermalVoltageV) - 1, SIGMAS_PER_TOLERANCE * sigmas.betaSigma, SIGMAS_PER_TOLERANCE * sigmas.earlyVoltageSigma];
}

/** Each term of the worst-case |Adcm| (every term in magnitude), per mismatch; a cross term is split evenly between its two. */
function worstCaseTerms(s: MismatchSensitivity, x: MismatchVector): number[] {
  const terms = MISMATCH_KINDS.map((_, i) => magnitude(s.linear[i]) * x[i] + magnitude(s.squared[i]) * x[i] * x[i]);
  PAIRS.forEach(([i, j], p) => {
    const half = (magnitude(s.cross[p]) * x[i] * x[j]) / 2;
    terms[i] += half;
    terms[j] += half;
  });
  return terms;
}

/**
 * Worst case: every mismatch at its worst-case extreme (worstCaseMismatches), every term of the
 * model adding in magnitude and the differential gain at its lowest: |Ad|·exp(−Σ|∂Ad/∂x|·x/|Ad|),
 * the first-order fall |Ad| − Σ|∂Ad/∂x|·x taken in the logarithm, so it stays positive where the
 * mismatches move the gain by more than itself (a pair near saturation at its corner, where
 * the linear fall went below zero and the figure was lost): the same to first order elsewhere.
 */
export function worstCaseMismatchCmrrDb(s: MismatchSensitivity, sigmas: MismatchSigmas): number {
  const x = worstCaseMismatches(sigmas, s.thermalVoltageV);
  const adcm = worstCaseTerms(s, x).reduce((a, b) => a + b, 0);
  const nominal = magnitude(s.differentialGain);
  const fall = MISMATCH_KINDS.reduce((sum, _, i) => sum + magnitude(s.differentialGainPer[i]) * x[i], 0);
  const ad = nominal * Math.exp(-fall / nominal);
  return 20 * Math.log10(ad / adcm);
}

/** Each mismatch's share of the worst-case differential common-mode gain, per cent (they add to 100). */
export type MismatchShares = Record<MismatchKind, number>;

export function worstCaseMismatchShares(s: MismatchSensitivity, sigmas: MismatchSigmas): MismatchShares {
  const terms = worstCaseTerms(s, worstCaseMismatches(sigmas, s.thermalVoltageV));
  const total = terms.reduce((a, b) => a + b, 0);
  const share = (i: number) => (total > 0 ? (100 * terms[i]) / total : 0);
  return { load: share(0), is: share(1), beta: share(2), early: share(3) };
}

/** The p-th percentile of ascending values (nearest rank). */
export function percentile(sorted: ArrayLike<number>, p: number): number {
  const i = Math.min(sorted.length - 1, Math.max(0, Math.round((p / 100) * (sorted.length - 1))));
  return sorted[i];
}

/**
 * Standard-normal draws for a Monte Carlo, shared by every option: three per sample (load 1,
 * load 2, ΔVBE), then, after all of those, two per sample (BF, VAF), so the first three of a
 * sample do not move when the device's draws were added.
 */
export interface MonteCarloDraws {
  samples: number;
  seed: number;
  normals: Float64Array;
  deviceNormals: Float64Array;
}

/** Draws once per spec, so every option sees the same samples (common random numbers). */
export function monteCarloDraws(samples: number, seed: number): MonteCarloDraws {
  const gauss = gaussianSource(seed);
  const normals = new Float64Array(3 * samples);
  for (let i = 0; i < normals.length; i += 1) normals[i] = gauss.next();
  const deviceNormals = new Float64Array(2 * samples);
  for (let i = 0; i < deviceNormals.length; i += 1) deviceNormals[i] = gauss.next();
  return { samples, seed, normals, deviceNormals };
}

/** One Monte Carlo sample's parts: each load resistor's scale (1 = nominal) and the four mismatches. */
export interface MonteCarloSample {
  load1Scale: number;
  load2Scale: number;
  /** [ε = R2/R1 − 1, δ = exp(ΔVBE/VT) − 1, b = BF2/BF − 1, a = VAF2/VAF − 1]. */
  mismatches: MismatchVector;
}

/**
 * Sample `i` of `draws`: loads Gaussian with 3σ = tolerance, ΔVBE Gaussian with σ = `vbeSigmaV`,
 * the relative BF and VAF differences Gaussian with their σ. The closed-form Monte Carlo and
 * the SPICE one read the same samples from here.
 */
export function monteCarloSample(draws: MonteCarloDraws, i: number, sigmas: MismatchSigmas, thermalVoltageV: number): MonteCarloSample {
  const resistorSigma = sigmas.resistorTolerance / SIGMAS_PER_TOLERANCE;
  const mismatches: [number, number, number, number] = [0, 0, 0, 0];
  sampleMismatchesInto(draws, i, sigmas, thermalVoltageV, mismatches);
  return { load1Scale: 1 + resistorSigma * draws.normals[3 * i], load2Scale: 1 + resistorSigma * draws.normals[3 * i + 1], mismatches };
}

/** Sample i's four mismatches (monteCarloSample's `mismatches`) written into `into`: a loop over every sample allocates nothing. */
export function sampleMismatchesInto(draws: MonteCarloDraws, i: number, sigmas: MismatchSigmas, thermalVoltageV: number, into: number[]): void {
  const resistorSigma = sigmas.resistorTolerance / SIGMAS_PER_TOLERANCE;
  const load1Scale = 1 + resistorSigma * draws.normals[3 * i];
  const load2Scale = 1 + resistorSigma * draws.normals[3 * i + 1];
  into[0] = load2Scale / load1Scale - 1;
  into[1] = Math.exp((sigmas.vbeSigmaV * draws.normals[3 * i + 2]) / thermalVoltageV) - 1;
  into[2] = sigmas.betaSigma * draws.deviceNormals[2 * i];
  into[3] = sigmas.earlyVoltageSigma * draws.deviceNormals[2 * i + 1];
}

/**
 * Seeded Monte Carlo of the differential CMRR: each load resistor Gaussian with 3σ = tolerance,
 * the pair's ΔVBE, BF and VAF differences Gaussian with the spec's σ; yield = share of samples
 * at or above `requiredDb`.
 */
export function monteCarloCmrr(s: MismatchSensitivity, draws: MonteCarloDraws, sigmas: MismatchSigmas, requiredDb: number): MonteCarloResult {
  const { samples, normals, deviceNormals } = draws;
  const values = new Float64Array(samples);
  let passing = 0;
  // mismatchCmrrDb and monteCarloSample written out with the model's coefficients in locals
  // (the same operations in the same order: the same figures); this loop runs 2000 times an option
  const [l0, l1, l2, l3] = s.linear;
  const [q0, q1, q2, q3] = s.squared;
  const [g0, g1, g2, g3] = s.differentialGainPer;
  const [c01, c02, c03, c12, c13, c23] = s.cross;
  const resistorSigma = sigmas.resistorTolerance / SIGMAS_PER_TOLERANCE;
  const { vbeSigmaV, betaSigma, earlyVoltageSigma } = sigmas;
  const vt = s.thermalVoltageV;
  for (let i = 0; i < samples; i += 1) {
    const load1Scale = 1 + resistorSigma * normals[3 * i];
    const load2Scale = 1 + resistorSigma * normals[3 * i + 1];
    const x0 = load2Scale / load1Scale - 1;
    const x1 = Math.exp((vbeSigmaV * normals[3 * i + 2]) / vt) - 1;
    const x2 = betaSigma * deviceNormals[2 * i];
    const x3 = earlyVoltageSigma * deviceNormals[2 * i + 1];
    let cmRe = 0;
    let cmIm = 0;
    let adRe = s.differentialGain.re;
    let adIm = s.differentialGain.im;
    cmRe += (l0.re + q0.re * x0) * x0;
    cmIm += (l0.im + q0.im * x0) * x0;
    adRe += g0.re * x0;
    adIm += g0.im * x0;
    cmRe += (l1.re + q1.re * x1) * x1;
    cmIm += (l1.im + q1.im * x1) * x1;
    adRe += g1.re * x1;
    adIm += g1.im * x1;
    cmRe += (l2.re + q2.re * x2) * x2;
    cmIm += (l2.im + q2.im * x2) * x2;
    adRe += g2.re * x2;
    adIm += g2.im * x2;
    cmRe += (l3.re + q3.re * x3) * x3;
    cmIm += (l3.im + q3.im * x3) * x3;
    adRe += g3.re * x3;
    adIm += g3.im * x3;
    // the cross terms in PAIRS order
    let xx = x0 * x1;
    cmRe += c01.re * xx;
    cmIm += c01.im * xx;
    xx = x0 * x2;
    cmRe += c02.re * xx;
    cmIm += c02.im * xx;
    xx = x0 * x3;
    cmRe += c03.re * xx;
    cmIm += c03.im * xx;
    xx = x1 * x2;
    cmRe += c12.re * xx;
    cmIm += c12.im * xx;
    xx = x1 * x3;
    cmRe += c13.re * xx;
    cmIm += c13.im * xx;
    xx = x2 * x3;
    cmRe += c23.re * xx;
    cmIm += c23.im * xx;
    const db = 10 * Math.log10((adRe * adRe + adIm * adIm) / (cmRe * cmRe + cmIm * cmIm));
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
