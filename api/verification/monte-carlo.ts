/**
 * SPICE Monte Carlo of one option's differential rejection: N circuits with the spec's tolerances
 * (load resistors Gaussian, 3σ = tolerance; the pair's ΔVBE, BF and VAF differences Gaussian
 * with the spec's σ: Q2 gets its own `.model` card), each
 * simulated in ngspice at the spec frequency, at the corner that governs the option's mismatch
 * worst case. The engine's closed-form model is evaluated on the very same samples (the first N
 * of the spec's seeded draws, which the ranking's own Monte Carlo also used), so the two
 * distributions differ only by the model, never by the luck of the draw.
 *
 * The simulated circuit scales RC1 and RC2 by their own draws (the closed form sees only their
 * ratio); the difference that makes is part of what this run shows.
 *
 * Each run also yields its input offset voltage: the same draws at the option's nominal condition
 * (ΔVBE turned into Q2's IS at that condition's thermal voltage), one `.dc` sweep of the
 * differential drive over ±20 mV and the zero of v(c1,c2) interpolated in it
 * (`spiceOffsetInWindowV`). That is the contract's own measure at the cost of one analysis a run;
 * the first-order −v(c1,c2)/Ad from `.op` would take as many analyses (it needs Ad from that run)
 * and drops the transfer's curvature. The offsets' standard deviation and its value at the spec's
 * sigmas are set beside the engine's stored statistical offset when the option carries one.
 */
import { solveStage } from '#shared/engine/analyze';
import { mismatchCmrrDb, mismatchSensitivity, mismatchSigmas, mismatchStages, mismatchedDesign, monteCarloDraws, monteCarloSample, percentile } from '#shared/engine/mismatch';
import type { RecommendOption } from '#shared/engine/recommend';
import type { Design, Spec } from '#shared/engine/types';
import type { NetlistCardSettings } from '#shared/engine/netlist';
import type { MonteCarloOffset, MonteCarloVerificationResult } from '#shared/verification/types';
import { singleFrequencySweep, type SpiceRunner } from './spice-analyses';
import { spiceOffsetInWindowV } from './spice-tradeoffs';
import { acAt } from './verify-option';
import { conditionLabel } from '#shared/text/engine-notes';
import { NOMINAL_TEMPERATURE_C } from '#shared/engine/constants';
import { storedOffsetStatistics } from './stored-offset';

const HISTOGRAM_BINS = 30;
/**
 * Stored per-run rejections are rounded to 0.1 mdB: four decimals are far below the 2 dB the
 * comparison is held to and ngspice's own tolerance, and a 2,000-run result shrinks from about
 * 76 kB to about 37 kB of JSON (statistics and histogram are computed before rounding).
 */
const STORED_DB_PER_UNIT = 1e4;
const stored = (valuesDb: number[]) => valuesDb.map((v) => Math.round(v * STORED_DB_PER_UNIT) / STORED_DB_PER_UNIT);
/** Stored per-run offsets are rounded to 1 nV: far below the contract's 20 µV floor and ngspice's own tolerance. */
const STORED_V_PER_UNIT = 1e9;
/** The spec's offset target is read at this many standard deviations when it names none (ENGINE-CONTRACT.md, `offset.sigmas`). */
const DEFAULT_OFFSET_SIGMAS = 3;

/** The spec's `offset.sigmas` when it sets an offset target, else the contract's default. */
function offsetSigmas(spec: Spec): number {
  const sigmas = (spec as { offset?: { sigmas?: unknown } }).offset?.sigmas;
  return typeof sigmas === 'number' && sigmas > 0 ? sigmas : DEFAULT_OFFSET_SIGMAS;
}

/** Mean, sample standard deviation and the value at `sigmas` standard deviations (sigmas × σ) of the runs' offsets. */
export function offsetStatistics(offsetsV: readonly number[], sigmas: number): MonteCarloOffset['simulated'] {
  const n = offsetsV.length;
  const meanV = n > 0 ? offsetsV.reduce((a, b) => a + b, 0) / n : 0;
  const variance = n > 1 ? offsetsV.reduce((a, v) => a + (v - meanV) ** 2, 0) / (n - 1) : 0;
  const standardDeviationV = Math.sqrt(variance);
  return { meanV, standardDeviationV, atSigmasV: sigmas * standardDeviationV };
}

/** Why an option cannot have a SPICE Monte Carlo, or null when it can. */
export function monteCarloRefusal(spec: Spec, option: RecommendOption | undefined): string | null {
  if (!option) return 'The proposal has no such option.';
  if (spec.gain.output !== 'differential') {
    return 'The spec asks for a single-ended output, whose rejection is set by the tail, not by pair mismatch: the Monte Carlo of mismatch applies to differential outputs.';
  }
  if (!option.design || option.corners.length === 0) return 'The engine could not size or solve this option, so there is nothing to simulate.';
  return null;
}

function statistics(sortedDb: number[], requiredDb: number) {
  const passing = sortedDb.filter((v) => v >= requiredDb).length;
  return {
    yieldPercent: sortedDb.length > 0 ? (100 * passing) / sortedDb.length : 0,
    percentilesDb: {
      p1: percentile(sortedDb, 1),
      p5: percentile(sortedDb, 5),
      p50: percentile(sortedDb, 50),
      p95: percentile(sortedDb, 95),
    },
  };
}

function histogram(simulated: number[], predicted: number[]) {
  const all = [...simulated, ...predicted].filter(Number.isFinite).sort((a, b) => a - b);
  const low = all[0] ?? 0;
  const high = percentile(all, 99);
  const width = Math.max(high - low, 1e-9) / HISTOGRAM_BINS;
  const count = (values: number[]) => {
    const counts = new Array<number>(HISTOGRAM_BINS).fill(0);
    for (const v of values) if (Number.isFinite(v)) counts[Math.min(HISTOGRAM_BINS - 1, Math.max(0, Math.floor((v - low) / width)))] += 1;
    return counts;
  };
  return { binEdgesDb: Array.from({ length: HISTOGRAM_BINS + 1 }, (_, i) => low + i * width), simulatedCounts: count(simulated), predictedCounts: count(predicted) };
}

export interface MonteCarloSlicing {
  /** Runs per slice. */
  sliceRuns: number;
  /** Called after every full slice but the last (the queue runs other people's short jobs there); a throw ends the run. */
  betweenSlices: () => Promise<void>;
}

/**
 * Runs the Monte Carlo. Memory stays small whatever N: each run keeps two numbers (the simulated
 * and the predicted rejection); ngspice's vectors are read and dropped per run. `onProgress` is
 * awaited before each run, and a throw from it (a withdrawn job, a closing server) ends the run
 * between two analyses.
 */
export async function runMonteCarlo(
  run: SpiceRunner,
  spec: Spec,
  option: RecommendOption,
  runs: number,
  simulator: string,
  onProgress: (done: number, step: string) => Promise<void> | void,
  slicing?: MonteCarloSlicing,
  card: NetlistCardSettings = {},
): Promise<MonteCarloVerificationResult> {
  const t0 = performance.now();
  const design = option.design as Design;
  const f = spec.cmrr.atFrequencyHz;
  const governing = option.corners.reduce((a, b) => ((b.cmrrDifferentialWorstCaseDb ?? Infinity) < (a.cmrrDifferentialWorstCaseDb ?? Infinity) ? b : a));
  const cornerDesign: Design = { ...design, inputCommonModeV: governing.inputCommonModeV, temperatureC: governing.temperatureC };
  const sensitivity = mismatchSensitivity(mismatchStages(solveStage(cornerDesign)), f);
  const draws = monteCarloDraws(runs, spec.monteCarlo.seed);
  const simulatedDb: number[] = [];
  const predictedDb: number[] = [];
  let failedRuns = 0;
  // The offset at the nominal condition: ΔVBE drawn there becomes Q2's IS at that condition's VT.
  const nominalThermalVoltageV = mismatchSensitivity(mismatchStages(solveStage(design)), f).thermalVoltageV;
  const offsetsV: number[] = [];
  let failedOffsets = 0;
  for (let i = 0; i < runs; i += 1) {
    if (slicing && i > 0 && i % slicing.sliceRuns === 0) await slicing.betweenSlices();
    const sample = monteCarloSample(draws, i, mismatchSigmas(spec), sensitivity.thermalVoltageV);
    predictedDb.push(mismatchCmrrDb(sensitivity, sample.mismatches));
    await onProgress(i, `Run ${i + 1} of ${runs}: rejection at ${governing.label}, offset at nominal`);
    try {
      const ac = await acAt(
        run,
        { ...mismatchedDesign(cornerDesign, sample.mismatches), collectorResistanceOhm: design.collectorResistanceOhm * sample.load1Scale },
        singleFrequencySweep(f),
        card,
      );
      const db = ac.figuresAt(0).cmrrDifferentialDb;
      if (db === null || !Number.isFinite(db)) failedRuns += 1;
      else simulatedDb.push(db);
    } catch {
      failedRuns += 1;
    }
    try {
      const atNominal = monteCarloSample(draws, i, mismatchSigmas(spec), nominalThermalVoltageV);
      const offsetV = await spiceOffsetInWindowV(
        run,
        { ...mismatchedDesign(design, atNominal.mismatches), collectorResistanceOhm: design.collectorResistanceOhm * atNominal.load1Scale },
        card,
      );
      if (Number.isFinite(offsetV)) offsetsV.push(offsetV);
      else failedOffsets += 1;
    } catch {
      failedOffsets += 1;
    }
  }
  await onProgress(runs, 'Statistics');
  simulatedDb.sort((a, b) => a - b);
  predictedDb.sort((a, b) => a - b);
  const requiredDb = spec.cmrr.minDb;
  offsetsV.sort((a, b) => a - b);
  const sigmas = offsetSigmas(spec);
  const engineOffset = storedOffsetStatistics(option, sigmas);
  const offset: MonteCarloOffset = {
    condition: conditionLabel(design.inputCommonModeV ?? 0, design.temperatureC ?? NOMINAL_TEMPERATURE_C),
    sigmas,
    failedRuns: failedOffsets,
    simulatedV: offsetsV.map((v) => Math.round(v * STORED_V_PER_UNIT) / STORED_V_PER_UNIT),
    simulated: offsetStatistics(offsetsV, sigmas),
    predicted: engineOffset,
    predictedAbsent: engineOffset ? null : 'The engine version that made this proposal stores no statistical offset for this option: the SPICE distribution is shown alone.',
  };
  return {
    simulator,
    topology: option.topology,
    figure: 'cmrr-differential',
    condition: governing.label,
    runs,
    seed: spec.monteCarlo.seed,
    requiredDb,
    failedRuns,
    simulatedDb: stored(simulatedDb),
    simulated: statistics(simulatedDb, requiredDb),
    predictedDb: stored(predictedDb),
    predicted: statistics(predictedDb, requiredDb),
    histogram: histogram(simulatedDb, predictedDb),
    offset,
    elapsedMs: performance.now() - t0,
  };
}
