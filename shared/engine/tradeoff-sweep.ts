/**
 * The trade-off sweep (issue "the whole decision the tail current sets"): one topology sized at
 * each of a list of tail currents, as the sizing would size it had the spec fixed that current,
 * and each sized design's figures at the spec's nominal condition: gain of the spec's output,
 * power, single-ended rejection at the spec frequency, and the trade-off figures as the rules
 * define them (tradeoff-figures.ts: noise at the spec's frequency, bias current, bandwidth, supply
 * rejection for the spec's output, linear input range, slew rate, statistical offset and drift).
 * A reader moves a what-if current and sees what each figure does; the ranking's checks take the
 * worst corner, these figures are nominal. A current that cannot be sized or solved gives that
 * point its message, never an exception for the whole sweep.
 */
import { singleEndedCmrrDbAt, solveCondition } from './analyze';
import { nominalCondition } from './conditions';
import { firstNonFinitePath } from './finite';
import { mismatchSigmas, monteCarloDraws } from './mismatch';
import { MIN_TAIL_CURRENT_A, outputGain, sizeTopology } from './sizing';
import { driftSensitivitiesVPerC, offsetStatistics, tradeoffAtCondition } from './tradeoff-figures';
import type { Spec, TopologyId } from './types';
import { formatQuantity } from '../units/format-quantity';

/** Most currents one sweep takes (the route's limit too): each point is a sizing and a solve. */
export const TRADEOFF_SWEEP_MAX_POINTS = 40;
/** Largest tail current a sweep sizes at, A: the spec schema's upper bound for a fixed tail current. */
export const TRADEOFF_SWEEP_MAX_CURRENT_A = 0.1;

/** One solved point: SI figures at nominal conditions; null where the spec sets no target for the figure or the figure has none. */
export interface TradeoffSweepFigures {
  /** The current asked for, A. */
  tailCurrentA: number;
  /** The current the sized design draws, A (the resistors are on the spec's series, so it differs a little). */
  solvedTailCurrentA: number;
  /** Gain magnitude of the spec's output, V/V. */
  gain: number;
  powerW: number;
  /** Single-ended common-mode rejection at the spec frequency, dB. */
  cmrrAtFrequencyDb: number;
  /** Input-referred noise at the spec's noise frequency, V/√Hz (null without a noise target). */
  noiseVPerRtHz: number | null;
  inputBiasCurrentA: number;
  /** Differential bandwidth, Hz (null: above the corner search's top). */
  bandwidthHz: number | null;
  /** Slew rate of the differential output into the load, V/s (null without a slew-rate target). */
  slewRateVPerS: number | null;
  /** Supply rejection from each rail for the spec's output, dB (a differential output's: its mismatch worst case). */
  psrrPositiveDb: number;
  psrrNegativeDb: number;
  /** Differential input where the transfer departs 1 % from linear, V (null: linear past twice the rails' span). */
  linearInputRangeV: number | null;
  /** Statistical input offset at the spec's sigmas, V (null without an offset target). */
  offsetAtSigmasV: number | null;
  /** Its drift at the spec's sigmas, V/°C (null without a drift target). */
  offsetDriftAtSigmasVPerC: number | null;
}

/** A point of the sweep: its figures, or why it has none. */
export type TradeoffSweepPoint = ({ ok: true } & TradeoffSweepFigures) | { ok: false; tailCurrentA: number; error: string };

/**
 * The spec as the sizing sees it at a fixed current: the current fixed, and the targets that only
 * move the current (noise, slew rate, bandwidth, bias current) left out, since a fixed current
 * ignores them (sizing.ts, pickCurrent) and the window they would set is not needed here. The
 * design is the same as with them; only the window's calibration solve is saved.
 */
function sizingSpecAt(spec: Spec, tailCurrentA: number): Spec {
  const { noise: _noise, slewRateMinVPerS: _slew, bandwidthMinHz: _bandwidth, inputBiasCurrentMaxA: _bias, ...rest } = spec;
  return { ...rest, tailCurrentA };
}

/**
 * The spec with every trade-off figure asked for, so tradeoffAtCondition computes bias current,
 * bandwidth, supply rejection and linear range whatever the spec sets (their limits are not read);
 * noise, slew rate and the offsets only where the spec asks for them.
 */
function everyFigureSpec(spec: Spec): Spec {
  return { ...spec, inputBiasCurrentMaxA: 1, bandwidthMinHz: 1, psrrMinDb: { positive: 0, negative: 0 }, linearInputRangeMinV: 0 };
}

function pointAt(spec: Spec, topology: TopologyId, tailCurrentA: number, draws: ReturnType<typeof monteCarloDraws> | null): TradeoffSweepFigures {
  if (!(tailCurrentA >= MIN_TAIL_CURRENT_A && tailCurrentA <= TRADEOFF_SWEEP_MAX_CURRENT_A)) {
    throw new Error(`a tail current of ${Number.isFinite(tailCurrentA) ? formatQuantity(tailCurrentA, 'A') : String(tailCurrentA)} is outside what the sizing works at (${formatQuantity(MIN_TAIL_CURRENT_A, 'A')} to ${formatQuantity(TRADEOFF_SWEEP_MAX_CURRENT_A, 'A')})`);
  }
  const nominal = nominalCondition(spec);
  const { design } = sizeTopology(sizingSpecAt(spec, tailCurrentA), topology, nominal);
  const solution = solveCondition(design);
  const sigmas = mismatchSigmas(spec);
  const figures = tradeoffAtCondition(everyFigureSpec(spec), nominal.label, solution, null, sigmas);
  const sigmaCount = spec.offset?.sigmas ?? 3;
  const vt = solution.model.thermalVoltageV;
  const offset = spec.offset?.maxV !== undefined && figures.offsetPerMismatchV && draws ? offsetStatistics(figures.offsetPerMismatchV, draws, sigmas, vt, sigmaCount).atSigmas : null;
  const drift = spec.offset?.driftMaxVPerC !== undefined && draws ? offsetStatistics(driftSensitivitiesVPerC(solution), draws, sigmas, vt, sigmaCount).atSigmas : null;
  return {
    tailCurrentA,
    solvedTailCurrentA: solution.result.tailCurrentA,
    gain: outputGain(spec, solution.result),
    powerW: solution.result.powerW,
    cmrrAtFrequencyDb: singleEndedCmrrDbAt(solution, spec.cmrr.atFrequencyHz),
    noiseVPerRtHz: figures.noiseVPerRtHz,
    inputBiasCurrentA: solution.result.inputBiasCurrentA,
    bandwidthHz: figures.bandwidthHz,
    // the transient's own failure counts as no slew at all, as in the check
    slewRateVPerS: figures.slewRateVPerS,
    psrrPositiveDb: figures.psrrPositiveDb!,
    psrrNegativeDb: figures.psrrNegativeDb!,
    linearInputRangeV: figures.linearInputRangeV,
    offsetAtSigmasV: offset,
    offsetDriftAtSigmasVPerC: drift,
  };
}

/**
 * Sizes `topology` for `spec` at each tail current (A, in the order given) and returns each
 * design's nominal figures. `spec` must have passed the schema (defaults applied). A point whose
 * current is out of range, whose sizing or solve fails, or whose figures are not finite carries
 * the message instead (an unsolvable point among solvable ones is expected near a window's edge).
 */
export function tradeoffSweep(spec: Spec, topology: TopologyId, tailCurrentsA: readonly number[]): TradeoffSweepPoint[] {
  const draws = spec.offset?.maxV !== undefined || spec.offset?.driftMaxVPerC !== undefined ? monteCarloDraws(spec.monteCarlo.samples, spec.monteCarlo.seed) : null;
  return tailCurrentsA.map((tailCurrentA) => {
    try {
      const figures = pointAt(spec, topology, tailCurrentA, draws);
      const unreachable = firstNonFinitePath(figures);
      if (unreachable) throw new Error(`the figure at ${unreachable} could not be computed at this current (not a finite number)`);
      return { ok: true as const, ...figures };
    } catch (error) {
      return { ok: false as const, tailCurrentA, error: error instanceof Error ? error.message : String(error) };
    }
  });
}
