/**
 * Sizing one tail option from a spec: the hand formulas of DOMAIN.md give the first values,
 * exact solves of the stage (analyze) refine them, and every resistor is snapped to the spec's
 * E-series before the final predictions are made from the snapped values.
 */
import { snapToSeries } from '../units/e-series';
import { solveStage, type StageSolution } from './analyze';
import type { Condition } from './conditions';
import { deviceModel } from './device';
import { unhandledTopology, type TailDesign, type TopologyId } from './topologies';
import type { AnalyzeResult, Design, ResistorSeries, Spec } from './types';

/** Share of the power budget the sizing aims at, leaving room for corners and snapping (design choice). */
export const POWER_USE_FRACTION = 0.8;
/** Largest tail current the sizing picks on its own (common practice: discrete input pairs run µA to a few mA). */
export const MAX_TAIL_CURRENT_A = 2e-3;
/** The Widlar source's reference runs at this multiple of its output current (design choice: VT·ln 5 ≈ 42 mV on RE). */
export const WIDLAR_REFERENCE_RATIO = 5;
/** Degenerated mirror: emitter-resistor drop aimed at, as a share of the room left at the lowest input common mode. */
const DEGENERATION_SHARE_OF_ROOM = 0.5;
/** Degenerated mirror: bounds on that drop, V (common practice: a few VT to about a volt). */
const DEGENERATION_DROP_MIN_V = 0.1;
const DEGENERATION_DROP_MAX_V = 1.0;
/** Room kept between the tail's compliance and the lowest tail-node voltage, V (design choice). */
const COMPLIANCE_ROOM_V = 0.2;
/** Refinement of a resistor against an exact solve: relative tolerance (a tenth of the finest series step) and iteration limit. */
const TUNE_TOLERANCE = 1e-3;
const TUNE_MAX_ITERATIONS = 8;
/** Drop across RC kept for the collector's upward swing, as a multiple of its peak (design choice). */
const SWING_DROP_FACTOR = 1.25;
/** Smallest resistor the sizing writes, ohms (keeps a design solvable when the rails leave no room). */
const MIN_RESISTANCE_OHM = 1;

/** Reference-branch current per ampere of tail current, for the power split. */
export const REFERENCE_RATIO: Record<TopologyId, number> = {
  resistor: 0,
  'simple-mirror': 1,
  'degenerated-mirror': 1,
  widlar: WIDLAR_REFERENCE_RATIO,
  wilson: 1,
  cascode: 1,
};

/**
 * How one value was chosen, as figures (SI, names carry the unit); the sentences are written at
 * the edge (shared/text/engine-notes.ts).
 */
export type SizingStep =
  | { step: 'designer-values' }
  | { step: 'tail-current-fixed'; currentA: number }
  | {
      step: 'tail-current-from-budget';
      currentA: number;
      /** The budget allowed more than the cap, so the cap set the current. */
      capped: boolean;
      capA: number;
      powerUseFraction: number;
      powerBudgetW: number;
      railSpanV: number;
      /** Reference-branch current per ampere of tail current (0: no reference branch). */
      referenceRatio: number;
    }
  | { step: 'resistor-tail'; resistanceOhm: number; series: ResistorSeries }
  | { step: 'mirror-reference'; stackedVbe: 1 | 2; resistanceOhm: number; series: ResistorSeries }
  | { step: 'degeneration-emitters'; dropV: number; resistanceOhm: number }
  | { step: 'degenerated-reference'; resistanceOhm: number; series: ResistorSeries }
  | { step: 'widlar-reference'; referenceRatio: number; resistanceOhm: number }
  | { step: 'widlar-emitter'; resistanceOhm: number; series: ResistorSeries }
  | { step: 'pair-degeneration'; gainDropV: number; neededDropV: number; swingDropFactor: number; resistanceOhm: number; series: ResistorSeries }
  | { step: 'collector'; formula: 'degenerated' | 'differential' | 'single-ended'; exactOhm: number; resistanceOhm: number; series: ResistorSeries };

export interface SizedOption {
  design: Design;
  /** How each value was chosen, in order. */
  steps: SizingStep[];
}

/** The sized values of an option: what sizing chooses and every condition reuses. */
export interface SizedValues {
  tail: TailDesign;
  collectorResistanceOhm: number;
  pairEmitterResistanceOhm: number;
}

/** The analyze input of sized values at one condition. */
export function designAt(spec: Spec, condition: Condition, values: SizedValues): Design {
  return {
    device: spec.device,
    supply: spec.supply,
    collectorResistanceOhm: values.collectorResistanceOhm,
    pairEmitterResistanceOhm: values.pairEmitterResistanceOhm,
    tail: values.tail,
    inputCommonModeV: condition.inputCommonModeV,
    temperatureC: condition.temperatureC,
    tailCapacitanceF: spec.tailCapacitanceF,
    ...(spec.loadCapacitanceF ? { loadCapacitanceF: spec.loadCapacitanceF } : {}),
    ...(spec.sourceResistanceOhm ? { sourceResistanceOhm: spec.sourceResistanceOhm } : {}),
  };
}

/** Tail current to size for: the spec's, or the largest the power budget allows after reference branches. */
export function targetTailCurrentA(spec: Spec, topology: TopologyId): Extract<SizingStep, { currentA: number }> {
  if (spec.tailCurrentA !== undefined) return { step: 'tail-current-fixed', currentA: spec.tailCurrentA };
  const spanV = spec.supply.positiveV - spec.supply.negativeV;
  const ratio = REFERENCE_RATIO[topology];
  const budgetA = (POWER_USE_FRACTION * spec.powerBudgetW) / (spanV * (1 + ratio));
  const currentA = Math.min(budgetA, MAX_TAIL_CURRENT_A);
  return {
    step: 'tail-current-from-budget',
    currentA,
    capped: currentA < budgetA,
    capA: MAX_TAIL_CURRENT_A,
    powerUseFraction: POWER_USE_FRACTION,
    powerBudgetW: spec.powerBudgetW,
    railSpanV: spanV,
    referenceRatio: ratio,
  };
}

/**
 * Adjusts one resistance until `measure(result)` meets `target`, assuming the measured figure
 * varies as resistance^exponent (exponent −1 for a current set by the resistor, +1 for a gain).
 */
function tuneResistance(
  make: (resistanceOhm: number) => Design,
  startOhm: number,
  measure: (result: AnalyzeResult) => number,
  target: number,
  exponent: 1 | -1,
): number {
  let rOhm = Math.max(startOhm, MIN_RESISTANCE_OHM);
  let previous: StageSolution | undefined;
  for (let i = 0; i < TUNE_MAX_ITERATIONS; i += 1) {
    previous = solveStage(make(rOhm), previous);
    const value = measure(previous.result);
    if (!(value > 0)) return rOhm;
    const ratio = target / value;
    if (Math.abs(ratio - 1) < TUNE_TOLERANCE) break;
    rOhm = Math.max(rOhm * ratio ** exponent, MIN_RESISTANCE_OHM);
  }
  return rOhm;
}

/** Gain magnitude of the spec's output kind. */
export function outputGain(spec: Spec, result: AnalyzeResult): number {
  return Math.abs(spec.gain.output === 'differential' ? result.differentialGain : result.singleEndedGain);
}

/** Room below the tail node at the lowest input common mode for emitter degeneration, V. */
function degenerationDropV(spec: Spec, vbeV: number): number {
  const roomV = spec.inputCommonMode.minV - vbeV - spec.supply.negativeV - spec.device.vceSatV - COMPLIANCE_ROOM_V;
  return Math.min(Math.max(roomV * DEGENERATION_SHARE_OF_ROOM, DEGENERATION_DROP_MIN_V), DEGENERATION_DROP_MAX_V);
}

/** Sizes and snaps the tail element for a target current at the nominal condition. */
function sizeTail(spec: Spec, topology: TopologyId, nominal: Condition, tailA: number, pair: Omit<SizedValues, 'tail'>, steps: SizingStep[]): TailDesign {
  const series = spec.resistors.series;
  const snap = (r: number) => snapToSeries(Math.max(r, MIN_RESISTANCE_OHM), series);
  const model = deviceModel(spec.device, nominal.temperatureC);
  const vbeV = model.thermalVoltageV * Math.log(tailA / model.saturationCurrentA);
  const { positiveV: vp, negativeV: vn } = spec.supply;
  const tailCurrent = (r: AnalyzeResult) => r.tailCurrentA;
  const withTail = (tail: TailDesign) => designAt(spec, nominal, { ...pair, tail });
  switch (topology) {
    case 'resistor': {
      const start = (nominal.inputCommonModeV - vbeV - vn) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, resistanceOhm: x }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'resistor-tail', resistanceOhm: r, series });
      return { topology, resistanceOhm: r };
    }
    case 'simple-mirror':
    case 'wilson':
    case 'cascode': {
      const stackedVbe = topology === 'simple-mirror' ? 1 : 2;
      const start = (vp - vn - stackedVbe * vbeV) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: x }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'mirror-reference', stackedVbe, resistanceOhm: r, series });
      return { topology, referenceResistanceOhm: r };
    }
    case 'degenerated-mirror': {
      const dropV = degenerationDropV(spec, vbeV);
      const re = snap(dropV / tailA);
      const start = (vp - vn - vbeV - dropV) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: x, emitterResistanceOhm: re }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'degeneration-emitters', dropV, resistanceOhm: re }, { step: 'degenerated-reference', resistanceOhm: r, series });
      return { topology, referenceResistanceOhm: r, emitterResistanceOhm: re };
    }
    case 'widlar': {
      const refA = WIDLAR_REFERENCE_RATIO * tailA;
      const rref = snap((vp - vn - vbeV) / refA);
      const start = (model.thermalVoltageV * Math.log(WIDLAR_REFERENCE_RATIO)) / tailA;
      const re = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: rref, emitterResistanceOhm: x }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'widlar-reference', referenceRatio: WIDLAR_REFERENCE_RATIO, resistanceOhm: rref }, { step: 'widlar-emitter', resistanceOhm: re, series });
      return { topology, referenceResistanceOhm: rref, emitterResistanceOhm: re };
    }
    default:
      return unhandledTopology(topology);
  }
}

/**
 * The pair's first values: RC from the gain target (|Ad| = gm·RC = IC·RC/VT: the DC drop across
 * RC sets the gain [SS]); when that drop is too small for the collector's upward swing, a larger
 * drop with emitter degeneration RE in each pair emitter, Ad = RC/(RE + 1/gm) [SS].
 */
function pairStart(spec: Spec, tailA: number, thermalVoltageV: number, steps: SizingStep[]): Omit<SizedValues, 'tail'> {
  const series = spec.resistors.series;
  const perCollectorGain = spec.gain.output === 'differential' ? spec.gain.target : 2 * spec.gain.target;
  const collectorA = tailA / 2;
  const gainDropV = perCollectorGain * thermalVoltageV;
  const neededDropV = SWING_DROP_FACTOR * swingPeakPerCollectorV(spec);
  if (gainDropV >= neededDropV) {
    return { collectorResistanceOhm: gainDropV / collectorA, pairEmitterResistanceOhm: 0 };
  }
  const rcOhm = neededDropV / collectorA;
  const reOhm = snapToSeries(Math.max(rcOhm / perCollectorGain - thermalVoltageV / collectorA, MIN_RESISTANCE_OHM), series);
  steps.push({ step: 'pair-degeneration', gainDropV, neededDropV, swingDropFactor: SWING_DROP_FACTOR, resistanceOhm: reOhm, series });
  return { collectorResistanceOhm: rcOhm, pairEmitterResistanceOhm: reOhm };
}

/** Peak swing on each collector: the whole swing for a single-ended output, half of it for a differential one, V. */
export function swingPeakPerCollectorV(spec: Spec): number {
  return spec.outputSwingVpp / (spec.gain.output === 'differential' ? 4 : 2);
}

/**
 * Sizes one topology for a spec: tail current, the pair's first values, the tail element, then
 * RC refined for the gain target with the sized tail, all on the spec's series.
 */
export function sizeTopology(spec: Spec, topology: TopologyId, nominal: Condition): SizedOption {
  const current = targetTailCurrentA(spec, topology);
  const tailA = current.currentA;
  const steps: SizingStep[] = [current];
  const model = deviceModel(spec.device, nominal.temperatureC);
  const pair = pairStart(spec, tailA, model.thermalVoltageV, steps);
  const tail = sizeTail(spec, topology, nominal, tailA, pair, steps);
  const withRc = (rcOhm: number): SizedValues => ({ tail, collectorResistanceOhm: rcOhm, pairEmitterResistanceOhm: pair.pairEmitterResistanceOhm });
  const rcExact = tuneResistance((x) => designAt(spec, nominal, withRc(x)), pair.collectorResistanceOhm, (r) => outputGain(spec, r), spec.gain.target, 1);
  const rc = snapToSeries(rcExact, spec.resistors.series);
  const formula = pair.pairEmitterResistanceOhm > 0 ? 'degenerated' : spec.gain.output;
  steps.push({ step: 'collector', formula, exactOhm: rcExact, resistanceOhm: rc, series: spec.resistors.series });
  return { design: designAt(spec, nominal, withRc(rc)), steps };
}
