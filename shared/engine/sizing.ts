/**
 * Sizing one tail option from a spec: the hand formulas of DOMAIN.md give the first values,
 * exact solves of the stage (analyze) refine them, and every resistor is snapped to the spec's
 * E-series before the final predictions are made from the snapped values.
 */
import { snapToSeries } from '../units/e-series';
import { formatQuantity } from '../units/format-quantity';
import { differentialBandwidthHzOf, solveCondition, type ConditionResult, type ConditionSolution } from './analyze';
import { currentWindow, pickCurrent, type CurrentBound, type CurrentWindow, type PickedCurrent, type SolvedAtCurrent } from './current-window';
import { inputNoiseVPerRtHz, stageNoise } from './noise';
import { solvedSlewRateVPerS } from './slew-rate';
import { shiftedDesign } from './sign-off-corners';
import type { Condition } from './conditions';
import { deviceModel } from './device';
import { stageFamily } from './circuit';
import { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, NOMINAL_TEMPERATURE_C, ZERO_CELSIUS_K } from './constants';
import { TOPOLOGY_CATALOGUE, unhandledTopology, type TailDesign, type TopologyId } from './topologies';
import type { AnalyzeResult, Design, ResistorSeries, Spec } from './types';

/** Share of the power budget the sizing aims at, leaving room for corners and snapping (design choice). */
export const POWER_USE_FRACTION = 0.8;
/** Largest tail current the sizing picks on its own (common practice: discrete input pairs run µA to a few mA). */
export const MAX_TAIL_CURRENT_A = 2e-3;
/** The Widlar source's reference runs at this multiple of its output current (design choice: VT·ln 5 ≈ 42 mV on RE). */
export const WIDLAR_REFERENCE_RATIO = 5;
/** The PTAT source's emitter-area ratio N (common practice: 8, a unit transistor ringed by eight in layout; VT·ln 8 ≈ 54 mV on RE4). */
export const PTAT_AREA_RATIO = 8;
/** The PTAT source's start-up current, a share of the tail current (design choice: small, as it is not itself PTAT). */
export const PTAT_STARTUP_SHARE = 0.02;
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
/** Largest resistor the sizing writes, ohms: the design schema's upper bound (1 GΩ), so analyze accepts every sized design. */
export const MAX_RESISTANCE_OHM = 1e9;
/** Smallest tail current the sizing works at, A: the spec schema's lower bound for a fixed tail current. */
export const MIN_TAIL_CURRENT_A = 1e-7;

/** Raised when an option cannot be sized within the schema's bounds; the message says why. */
export class SizingError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SizingError';
  }
}

/** Reference-branch current per ampere of tail current, for the power split. */
export const REFERENCE_RATIO: Record<TopologyId, number> = {
  resistor: 0,
  'simple-mirror': 1,
  'degenerated-mirror': 1,
  widlar: WIDLAR_REFERENCE_RATIO,
  wilson: 1,
  cascode: 1,
  // the ΔVBE cell's two branches, each about the tail current (the output area ratio is 1)
  ptat: 2,
};

/**
 * How one value was chosen, as figures (SI, names carry the unit); the sentences are written at
 * the edge (shared/text/engine-notes.ts). `handOhm`: the hand formula's value the refinement
 * against exact solves started from, so a reader sees how far base currents and the Early effect
 * moved it.
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
  | {
      step: 'tail-current-window';
      /** Every bound of the window (current-window.ts), hand or calibrated on the solved circuit. */
      bounds: CurrentBound[];
      lower: CurrentBound | null;
      upper: CurrentBound | null;
      empty: boolean;
      /** The current the option is sized at, and what set it. */
      currentA: number;
      setBy: PickedCurrent['setBy'];
    }
  | { step: 'resistor-tail'; handOhm: number; resistanceOhm: number; series: ResistorSeries }
  | { step: 'mirror-reference'; stackedVbe: 1 | 2; handOhm: number; resistanceOhm: number; series: ResistorSeries }
  | { step: 'degeneration-emitters'; dropV: number; resistanceOhm: number }
  | { step: 'degenerated-reference'; handOhm: number; resistanceOhm: number; series: ResistorSeries }
  | { step: 'widlar-reference'; referenceRatio: number; handOhm: number; resistanceOhm: number }
  | { step: 'widlar-emitter'; handOhm: number; resistanceOhm: number; series: ResistorSeries }
  | {
      step: 'ptat-cell';
      /** Q4's emitter area over Q3's. */
      areaRatio: number;
      /** The start-up resistor's current as a share of the tail current, and the resistor. */
      startupShare: number;
      startupOhm: number;
      handOhm: number;
      resistanceOhm: number;
      series: ResistorSeries;
    }
  | { step: 'pair-degeneration'; gainDropV: number; neededDropV: number; swingDropFactor: number; resistanceOhm: number; series: ResistorSeries }
  | {
      step: 'temperature-degeneration';
      /** The gain's half-spread over the spec's temperature range with gm alone (re = VT/IC, IC held), per cent. */
      spreadPercent: number;
      /** The share of the gain tolerance the sizing lets temperature take, per cent of the target. */
      allowedPercent: number;
      temperatureMinC: number;
      temperatureMaxC: number;
      resistanceOhm: number;
      series: ResistorSeries;
    }
  | { step: 'collector'; formula: 'degenerated' | 'differential' | 'single-ended'; handOhm: number; exactOhm: number; resistanceOhm: number; series: ResistorSeries }
  | {
      step: 'collector-short';
      /** Why the gain target is out of reach: RC at the largest value accepted, or the gain peaked (the pair nears saturation) as RC grew. */
      limit: 'largest-resistance' | 'gain-peak';
      targetGain: number;
      reachedGain: number;
      resistanceOhm: number;
    };

export interface SizedOption {
  design: Design;
  /** How each value was chosen, in order. */
  steps: SizingStep[];
  /**
   * The tail-current window and the current picked in it; absent when the spec sets no target that
   * bounds the current. `sizedAtA`: the current the design was sized for (the first pick when the
   * window's second look moved it by under REPICK_TOLERANCE); sizeTopology always gives it, a
   * window described by hand (a note's test) may leave it out.
   */
  window?: { window: CurrentWindow; pick: PickedCurrent; sizedAtA?: number };
}

/** The sized values of an option: what sizing chooses and every condition reuses. */
export interface SizedValues {
  tail: TailDesign;
  collectorResistanceOhm: number;
  pairEmitterResistanceOhm: number;
}

/** The analyze input of sized values at one condition (its rails, current gain and resistors shifted when the condition moves them). */
export function designAt(spec: Spec, condition: Condition, values: SizedValues): Design {
  return shiftedDesign(plainDesignAt(spec, condition, values), condition.shift);
}

function plainDesignAt(spec: Spec, condition: Condition, values: SizedValues): Design {
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
  if (!(currentA >= MIN_TAIL_CURRENT_A)) {
    throw new SizingError(
      `cannot be sized: ${POWER_USE_FRACTION * 100} % of the ${formatQuantity(spec.powerBudgetW, 'W')} power budget across ${formatQuantity(spanV, 'V')}` +
        `${ratio > 0 ? `, shared with a reference branch of ${ratio}× the tail current,` : ''} leaves ${formatQuantity(currentA, 'A')} of tail current,` +
        ` below the ${formatQuantity(MIN_TAIL_CURRENT_A, 'A')} the sizing works at (the smallest tail current a spec may fix); raise the power budget`,
    );
  }
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

/** A tuned resistance, and whether the measured figure reached its target. */
interface Tuned {
  rOhm: number;
  reached: boolean;
  /** The figure at `rOhm`. */
  value: number;
  /** Why it stopped short: the resistance bound, or the figure turned away from the target as the resistance moved. */
  limit?: 'largest-resistance' | 'gain-peak';
}

/**
 * Adjusts one resistance until `measure(result)` meets `target`, assuming the measured figure
 * varies as resistance^exponent (exponent −1 for a current set by the resistor, +1 for a gain),
 * within [MIN_RESISTANCE_OHM, MAX_RESISTANCE_OHM]. When the figure cannot reach the target
 * (the bound is hit, or a step moves it further away), the closest value seen is kept.
 */
function tuneResistance(
  make: (resistanceOhm: number) => Design,
  startOhm: number,
  measure: (result: ConditionResult) => number,
  target: number,
  exponent: 1 | -1,
): Tuned {
  const bounded = (r: number) => Math.min(Math.max(r, MIN_RESISTANCE_OHM), MAX_RESISTANCE_OHM);
  let rOhm = bounded(startOhm);
  let previous: ConditionSolution | undefined;
  let best: Tuned | undefined;
  let last: Tuned | undefined;
  const distance = (t: Tuned) => Math.abs(Math.log(t.value / target));
  for (let i = 0; i < TUNE_MAX_ITERATIONS; i += 1) {
    previous = solveCondition(make(rOhm), previous);
    const value = measure(previous.result);
    if (!(value > 0)) return best ?? { rOhm, reached: false, value };
    const ratio = target / value;
    const here: Tuned = { rOhm, reached: Math.abs(ratio - 1) < TUNE_TOLERANCE, value };
    // The figure moved against the assumed power law (a gain falling as RC grows: the pair nears saturation)
    const turned = last !== undefined && (here.value - last.value) * (here.rOhm - last.rOhm) * exponent < 0;
    if (turned && best) return { ...best, limit: 'gain-peak' };
    if (!best || distance(here) < distance(best)) best = here;
    last = here;
    if (here.reached) return here;
    const next = bounded(rOhm * ratio ** exponent);
    if (next === rOhm) return { ...here, limit: 'largest-resistance' };
    rOhm = next;
  }
  return best as Tuned;
}

/** Gain magnitude of the spec's output kind. */
export function outputGain(spec: Spec, result: Pick<AnalyzeResult, 'differentialGain' | 'singleEndedGain'>): number {
  return Math.abs(spec.gain.output === 'differential' ? result.differentialGain : result.singleEndedGain);
}

/**
 * Room between the tail node and the tail's rail for emitter degeneration, V: below it at the
 * lowest input common mode (NPN), above it at the highest (a PNP stage, the mirror image).
 */
function degenerationDropV(spec: Spec, vbeV: number): number {
  const roomV =
    stageFamily(spec) === 'pnp'
      ? spec.supply.positiveV - spec.inputCommonMode.maxV - vbeV - spec.device.vceSatV - COMPLIANCE_ROOM_V
      : spec.inputCommonMode.minV - vbeV - spec.supply.negativeV - spec.device.vceSatV - COMPLIANCE_ROOM_V;
  return Math.min(Math.max(roomV * DEGENERATION_SHARE_OF_ROOM, DEGENERATION_DROP_MIN_V), DEGENERATION_DROP_MAX_V);
}

/** Sizes and snaps the tail element for a target current at the nominal condition. */
function sizeTail(spec: Spec, topology: TopologyId, nominal: Condition, tailA: number, pair: Omit<SizedValues, 'tail'>, steps: SizingStep[]): TailDesign {
  const series = spec.resistors.series;
  const snap = (r: number | Tuned) => snapWithin(typeof r === 'number' ? r : r.rOhm, series);
  const model = deviceModel(spec.device, nominal.temperatureC);
  const vbeV = model.thermalVoltageV * Math.log(tailA / model.saturationCurrentA);
  const { positiveV: vp, negativeV: vn } = spec.supply;
  const tailCurrent = (r: ConditionResult) => r.tailCurrentA;
  const withTail = (tail: TailDesign) => designAt(spec, nominal, { ...pair, tail });
  switch (topology) {
    case 'resistor': {
      // the tail node a VBE below the inputs (a PNP stage: a VEB above), the resistor to the tail's rail
      const start = (stageFamily(spec) === 'pnp' ? vp - nominal.inputCommonModeV - vbeV : nominal.inputCommonModeV - vbeV - vn) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, resistanceOhm: x }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'resistor-tail', handOhm: start, resistanceOhm: r, series });
      return { topology, resistanceOhm: r };
    }
    case 'simple-mirror':
    case 'wilson':
    case 'cascode': {
      const stackedVbe = topology === 'simple-mirror' ? 1 : 2;
      const start = (vp - vn - stackedVbe * vbeV) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: x }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'mirror-reference', stackedVbe, handOhm: start, resistanceOhm: r, series });
      return { topology, referenceResistanceOhm: r };
    }
    case 'degenerated-mirror': {
      const dropV = degenerationDropV(spec, vbeV);
      const re = snap(dropV / tailA);
      const start = (vp - vn - vbeV - dropV) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: x, emitterResistanceOhm: re }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'degeneration-emitters', dropV, resistanceOhm: re }, { step: 'degenerated-reference', handOhm: start, resistanceOhm: r, series });
      return { topology, referenceResistanceOhm: r, emitterResistanceOhm: re };
    }
    case 'widlar': {
      const refA = WIDLAR_REFERENCE_RATIO * tailA;
      // Q3 carries the reference current, so its VBE is VT·ln(Iref/IS), VT·ln(ratio) above the output's
      const rrefHand = (vp - vn - model.thermalVoltageV * Math.log(refA / model.saturationCurrentA)) / refA;
      const rref = snap(rrefHand);
      const start = (model.thermalVoltageV * Math.log(WIDLAR_REFERENCE_RATIO)) / tailA;
      const re = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: rref, emitterResistanceOhm: x }), start, tailCurrent, tailA, -1));
      steps.push({ step: 'widlar-reference', referenceRatio: WIDLAR_REFERENCE_RATIO, handOhm: rrefHand, resistanceOhm: rref }, { step: 'widlar-emitter', handOhm: start, resistanceOhm: re, series });
      return { topology, referenceResistanceOhm: rref, emitterResistanceOhm: re };
    }
    case 'ptat': {
      // Each branch of the cell carries the tail current (Q9 is Q3's size): I·RE4 = VT·ln(N) at
      // the nominal temperature, so the current, and with it gm, rises as T [GM]
      const startupOhm = snap((vp - vn - vbeV) / (PTAT_STARTUP_SHARE * tailA));
      const start = (model.thermalVoltageV * Math.log(PTAT_AREA_RATIO)) / tailA;
      const withRe = (x: number) => withTail({ topology, emitterResistanceOhm: x, startupResistanceOhm: startupOhm, areaRatio: PTAT_AREA_RATIO });
      const re = snap(tuneResistance(withRe, start, tailCurrent, tailA, -1));
      steps.push({ step: 'ptat-cell', areaRatio: PTAT_AREA_RATIO, startupShare: PTAT_STARTUP_SHARE, startupOhm, handOhm: start, resistanceOhm: re, series });
      return { topology, emitterResistanceOhm: re, startupResistanceOhm: startupOhm, areaRatio: PTAT_AREA_RATIO };
    }
    default:
      return unhandledTopology(topology);
  }
}

/**
 * Share of the gain tolerance the temperature's own swing of gm may take before the sizing
 * degenerates the pair for it (design choice: 80 %). Degeneration is not free: with RC raised to
 * keep the gain, a load mismatch moves the differential output (RE + re)/re times as much, so the
 * differential rejection falls by that ratio; the sizing uses it only where gm alone would take
 * most of the tolerance, and the checks at the sign-off corners judge the rest.
 */
export const TEMPERATURE_SHARE_OF_TOLERANCE = 0.8;

/**
 * Pair emitter degeneration that holds the gain over the spec's temperature range: with the tail
 * current held, re = VT/IC grows with T, and a resistor-loaded gain RC/(RE + re) moves by a half
 * spread of (re(Tmax) − re(Tmin)) / (2·(RE + re(T0))) [GM]. RE is the least that keeps it within
 * TEMPERATURE_SHARE_OF_TOLERANCE of the tolerance; 0 when gm alone already does.
 */
function temperatureDegeneration(spec: Spec, collectorA: number): { reOhm: number; spreadPercent: number; allowedPercent: number } {
  const kelvin = (c: number) => c + ZERO_CELSIUS_K;
  const re = (c: number) => (BOLTZMANN_J_PER_K * kelvin(c)) / (ELEMENTARY_CHARGE_C * collectorA);
  const { min, max } = spec.temperatureC;
  const nominalC = Math.min(Math.max(NOMINAL_TEMPERATURE_C, min), max);
  const swingOhm = re(max) - re(min);
  const spreadPercent = (swingOhm / (2 * re(nominalC))) * 100;
  const allowedPercent = TEMPERATURE_SHARE_OF_TOLERANCE * spec.gain.tolerancePercent;
  const reOhm = Math.max(swingOhm / (2 * (allowedPercent / 100)) - re(nominalC), 0);
  return { reOhm, spreadPercent, allowedPercent };
}

/**
 * The pair's first values: RC from the gain target (|Ad| = gm·RC = IC·RC/VT: the DC drop across
 * RC sets the gain [SS]); when that drop is too small for the collector's upward swing, a larger
 * drop with emitter degeneration RE in each pair emitter, Ad = RC/(RE + 1/gm) [SS]; and when gm
 * alone would move the gain over the temperature range by more than 80 % of its tolerance, at
 * least the RE that holds it there (temperatureDegeneration), RC raised to keep the gain.
 */
function pairStart(spec: Spec, tailA: number, thermalVoltageV: number, steps: SizingStep[], forTemperature = true): Omit<SizedValues, 'tail'> {
  const series = spec.resistors.series;
  const perCollectorGain = spec.gain.output === 'differential' ? spec.gain.target : 2 * spec.gain.target;
  const collectorA = tailA / 2;
  const gainDropV = perCollectorGain * thermalVoltageV;
  const neededDropV = SWING_DROP_FACTOR * swingPeakPerCollectorV(spec);
  const temperature = temperatureDegeneration(spec, collectorA);
  let reOhm = 0;
  let rcOhm = gainDropV / collectorA;
  if (gainDropV < neededDropV) {
    rcOhm = neededDropV / collectorA;
    reOhm = snapWithin(rcOhm / perCollectorGain - thermalVoltageV / collectorA, series);
    steps.push({ step: 'pair-degeneration', gainDropV, neededDropV, swingDropFactor: SWING_DROP_FACTOR, resistanceOhm: reOhm, series });
  }
  if (forTemperature && temperature.reOhm > reOhm) {
    reOhm = snapWithin(temperature.reOhm, series);
    rcOhm = perCollectorGain * (reOhm + thermalVoltageV / collectorA);
    steps.push({
      step: 'temperature-degeneration',
      spreadPercent: temperature.spreadPercent,
      allowedPercent: temperature.allowedPercent,
      temperatureMinC: spec.temperatureC.min,
      temperatureMaxC: spec.temperatureC.max,
      resistanceOhm: reOhm,
      series,
    });
  }
  return { collectorResistanceOhm: rcOhm, pairEmitterResistanceOhm: reOhm };
}

/** The series member nearest a resistance, kept within [MIN_RESISTANCE_OHM, MAX_RESISTANCE_OHM] (both on every series). */
function snapWithin(valueOhm: number, series: ResistorSeries): number {
  return snapToSeries(Math.min(Math.max(valueOhm, MIN_RESISTANCE_OHM), MAX_RESISTANCE_OHM), series);
}

/** Peak swing on each collector: the whole swing for a single-ended output, half of it for a differential one, V. */
export function swingPeakPerCollectorV(spec: Spec): number {
  return spec.outputSwingVpp / (spec.gain.output === 'differential' ? 4 : 2);
}

/** Whether the spec sets a target that bounds the tail current (noise, slew rate, bandwidth, input bias current). */
export function specBoundsCurrent(spec: Spec): boolean {
  return (
    (spec.noise?.maxVPerRtHz !== undefined && spec.noise.atFrequencyHz !== undefined) ||
    spec.slewRateMinVPerS !== undefined ||
    spec.bandwidthMinHz !== undefined ||
    spec.inputBiasCurrentMaxA !== undefined
  );
}

/** A current picked this close to the last (relative) needs no second sizing. */
const REPICK_TOLERANCE = 0.02;

/**
 * Sizes one topology for a spec: the tail current (the policy's share of the power budget, moved
 * into the window the spec's targets set when it sets any: current-window.ts), the pair's first
 * values, the tail element, then RC refined for the gain target with the sized tail, all on the
 * spec's series. With a window, the option is solved once sized and the window recomputed from
 * its figures; a current that moves by more than 2 % is sized again.
 */
export function sizeTopology(spec: Spec, topology: TopologyId, nominal: Condition): SizedOption {
  const preferred = targetTailCurrentA(spec, topology);
  if (!specBoundsCurrent(spec)) return sizedAt(spec, topology, nominal, preferred.currentA, [preferred]);
  const ratio = REFERENCE_RATIO[topology];
  const handWindow = currentWindow(spec, ratio);
  const handPick = pickCurrent(handWindow, preferred.currentA, spec.tailCurrentA);
  let sized = sizedAt(spec, topology, nominal, handPick.currentA, []);
  let sizedAtA = handPick.currentA;
  const window = currentWindow(spec, ratio, solvedAtCurrent(spec, sized.design));
  const pick = pickCurrent(window, preferred.currentA, spec.tailCurrentA);
  if (Math.abs(pick.currentA / handPick.currentA - 1) > REPICK_TOLERANCE) {
    sized = sizedAt(spec, topology, nominal, pick.currentA, []);
    sizedAtA = pick.currentA;
  }
  const step: SizingStep = { step: 'tail-current-window', bounds: window.bounds, lower: window.lower, upper: window.upper, empty: window.empty, currentA: pick.currentA, setBy: pick.setBy };
  return { design: sized.design, steps: [preferred, step, ...sized.steps], window: { window, pick, sizedAtA } };
}

/** The figures of a sized design at nominal that calibrate the window: noise at the spec's frequency, slew rate, bandwidth and bias current, at its solved tail current. */
function solvedAtCurrent(spec: Spec, design: Design): SolvedAtCurrent {
  const solved = solveCondition(design);
  const noise = spec.noise?.atFrequencyHz !== undefined ? inputNoiseVPerRtHz(stageNoise(solved.op, solved.model, design.temperatureC ?? 27), solved.stage, spec.noise.atFrequencyHz) : null;
  return {
    currentA: solved.result.tailCurrentA,
    noiseVPerRtHz: noise,
    slewRateVPerS: spec.slewRateMinVPerS !== undefined ? solvedSlewRateVPerS(solved) : null,
    bandwidthHz: spec.bandwidthMinHz !== undefined ? differentialBandwidthHzOf(solved.stage) : null,
    inputBiasCurrentA: solved.result.inputBiasCurrentA,
  };
}

/**
 * Sizes the pair and the tail for a tail current (A), the steps so far before the sizing's own.
 * A pair degenerated for temperature whose gain target then lies out of reach (RC at its largest,
 * or the gain peaking) is sized again without that degeneration: the gain comes first.
 */
function sizedAt(spec: Spec, topology: TopologyId, nominal: Condition, tailA: number, steps: SizingStep[]): SizedOption {
  // a PTAT tail holds gm over temperature itself: no pair degeneration for it
  const forTemperature = TOPOLOGY_CATALOGUE[topology]?.currentLaw !== 'ptat';
  const first = sizedPairAt(spec, topology, nominal, tailA, [...steps], forTemperature);
  const chosen = first.reached || !first.steps.some((s) => s.step === 'temperature-degeneration') ? first : sizedPairAt(spec, topology, nominal, tailA, [...steps], false);
  return { design: chosen.design, steps: chosen.steps };
}

function sizedPairAt(spec: Spec, topology: TopologyId, nominal: Condition, tailA: number, steps: SizingStep[], forTemperature: boolean): SizedOption & { reached: boolean } {
  const model = deviceModel(spec.device, nominal.temperatureC);
  const pair = pairStart(spec, tailA, model.thermalVoltageV, steps, forTemperature);
  const tail = sizeTail(spec, topology, nominal, tailA, pair, steps);
  const withRc = (rcOhm: number): SizedValues => ({ tail, collectorResistanceOhm: rcOhm, pairEmitterResistanceOhm: pair.pairEmitterResistanceOhm });
  const tuned = tuneResistance((x) => designAt(spec, nominal, withRc(x)), pair.collectorResistanceOhm, (r) => outputGain(spec, r), spec.gain.target, 1);
  const rc = snapWithin(tuned.rOhm, spec.resistors.series);
  const formula = pair.pairEmitterResistanceOhm > 0 ? 'degenerated' : spec.gain.output;
  steps.push({ step: 'collector', formula, handOhm: pair.collectorResistanceOhm, exactOhm: tuned.rOhm, resistanceOhm: rc, series: spec.resistors.series });
  if (!tuned.reached) {
    steps.push({ step: 'collector-short', limit: tuned.limit ?? 'gain-peak', targetGain: spec.gain.target, reachedGain: tuned.value, resistanceOhm: tuned.rOhm });
  }
  return { design: withNoiseFrequency(spec, designAt(spec, nominal, withRc(rc))), steps, reached: tuned.reached };
}

/**
 * The sized design with the spec's noise frequency as its `frequenciesHz`, so its prediction
 * carries the input noise there (`ac[0].inputNoiseVPerRtHz`) beside the other figures.
 */
function withNoiseFrequency(spec: Spec, design: Design): Design {
  const frequencyHz = spec.noise?.maxVPerRtHz !== undefined ? spec.noise.atFrequencyHz : undefined;
  return frequencyHz === undefined ? design : { ...design, frequenciesHz: [frequencyHz] };
}
