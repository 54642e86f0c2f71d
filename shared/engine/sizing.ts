/**
 * Sizing one tail option from a spec: the hand formulas of DOMAIN.md give the first values,
 * exact solves of the stage (analyze) refine them, and every resistor is snapped to the spec's
 * E-series before the final predictions are made from the snapped values.
 */
import { formatQuantity } from '../units/format-quantity';
import { snapToSeries } from '../units/e-series';
import { solveStage } from './analyze';
import type { Condition } from './conditions';
import { deviceModel } from './device';
import type { AnalyzeResult, Design, Spec, TailDesign, TopologyId } from './types';

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
/** Refinement of a resistor against an exact solve: relative tolerance and iteration limit. */
const TUNE_TOLERANCE = 1e-4;
const TUNE_MAX_ITERATIONS = 8;
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

export interface SizedOption {
  design: Design;
  /** How each value was chosen, one sentence each. */
  notes: string[];
}

const ohms = (r: number) => formatQuantity(r, 'Ohm');
const amps = (i: number) => formatQuantity(i, 'A');

/** The design shell shared by every option at a condition (no tail, no RC yet). */
export function designAt(spec: Spec, condition: Condition, tail: TailDesign, collectorResistanceOhm: number): Design {
  return {
    device: spec.device,
    supply: spec.supply,
    collectorResistanceOhm,
    tail,
    inputCommonModeV: condition.inputCommonModeV,
    temperatureC: condition.temperatureC,
    tailCapacitanceF: spec.tailCapacitanceF,
  };
}

/** Tail current to size for: the spec's, or the largest the power budget allows after reference branches. */
export function targetTailCurrentA(spec: Spec, topology: TopologyId): { currentA: number; note: string } {
  if (spec.tailCurrentA !== undefined) {
    return { currentA: spec.tailCurrentA, note: `Tail current ${amps(spec.tailCurrentA)}, fixed by the spec.` };
  }
  const spanV = spec.supply.positiveV - spec.supply.negativeV;
  const ratio = REFERENCE_RATIO[topology];
  const budgetA = (POWER_USE_FRACTION * spec.powerBudgetW) / (spanV * (1 + ratio));
  const currentA = Math.min(budgetA, MAX_TAIL_CURRENT_A);
  const why = currentA < budgetA ? `capped at ${amps(MAX_TAIL_CURRENT_A)}` : `${POWER_USE_FRACTION * 100} % of the ${formatQuantity(spec.powerBudgetW, 'W')} budget across ${formatQuantity(spanV, 'V')}`;
  const split = ratio > 0 ? `, shared with a reference branch of ${ratio}× the tail current` : '';
  return { currentA, note: `Tail current ${amps(currentA)}: ${why}${split}.` };
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
  for (let i = 0; i < TUNE_MAX_ITERATIONS; i += 1) {
    const value = measure(solveStage(make(rOhm)).result);
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
function sizeTail(spec: Spec, topology: TopologyId, nominal: Condition, tailA: number, rcGuessOhm: number, notes: string[]): TailDesign {
  const series = spec.resistors.series;
  const snap = (r: number) => snapToSeries(Math.max(r, MIN_RESISTANCE_OHM), series);
  const model = deviceModel(spec.device, nominal.temperatureC);
  const vbeV = model.thermalVoltageV * Math.log(tailA / model.saturationCurrentA);
  const { positiveV: vp, negativeV: vn } = spec.supply;
  const tailCurrent = (r: AnalyzeResult) => r.tailCurrentA;
  const withTail = (tail: TailDesign) => designAt(spec, nominal, tail, rcGuessOhm);
  switch (topology) {
    case 'resistor': {
      const start = (nominal.inputCommonModeV - vbeV - vn) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, resistanceOhm: x }), start, tailCurrent, tailA, -1));
      notes.push(`RT ≈ (VICM − VBE − V−)/Itail at the mid input common mode, refined by solving the stage, snapped to ${ohms(r)} (${series}).`);
      return { topology, resistanceOhm: r };
    }
    case 'simple-mirror':
    case 'wilson':
    case 'cascode': {
      const stackedVbe = topology === 'simple-mirror' ? 1 : 2;
      const start = (vp - vn - stackedVbe * vbeV) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: x }), start, tailCurrent, tailA, -1));
      notes.push(`RREF ≈ (V+ − V− − ${stackedVbe === 1 ? 'VBE' : '2·VBE'})/Itail, refined by solving the stage (base currents, Early effect), snapped to ${ohms(r)} (${series}).`);
      return { topology, referenceResistanceOhm: r };
    }
    case 'degenerated-mirror': {
      const dropV = degenerationDropV(spec, vbeV);
      const re = snap(dropV / tailA);
      const start = (vp - vn - vbeV - dropV) / tailA;
      const r = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: x, emitterResistanceOhm: re }), start, tailCurrent, tailA, -1));
      notes.push(`RE for about ${formatQuantity(dropV, 'V')} across each emitter resistor (half the room above compliance at the lowest input common mode, kept within 0.1–1 V), snapped to ${ohms(re)}.`);
      notes.push(`RREF ≈ (V+ − V− − VBE − Itail·RE)/Itail, refined by solving the stage, snapped to ${ohms(r)} (${series}).`);
      return { topology, referenceResistanceOhm: r, emitterResistanceOhm: re };
    }
    case 'widlar': {
      const refA = WIDLAR_REFERENCE_RATIO * tailA;
      const rref = snap((vp - vn - vbeV) / refA);
      const start = (model.thermalVoltageV * Math.log(WIDLAR_REFERENCE_RATIO)) / tailA;
      const re = snap(tuneResistance((x) => withTail({ topology, referenceResistanceOhm: rref, emitterResistanceOhm: x }), start, tailCurrent, tailA, -1));
      notes.push(`RREF for a reference current of ${WIDLAR_REFERENCE_RATIO}× the tail current, (V+ − V− − VBE)/Iref, snapped to ${ohms(rref)}.`);
      notes.push(`RE from Iout·RE = VT·ln(Iref/Iout), refined by solving the stage, snapped to ${ohms(re)} (${series}).`);
      return { topology, referenceResistanceOhm: rref, emitterResistanceOhm: re };
    }
  }
}

/**
 * Sizes one topology for a spec: tail current, tail element, then RC for the gain target
 * (|Ad| = gm·RC = IC·RC/VT: the DC drop across RC sets the gain [SS]), all on the spec's series.
 */
export function sizeTopology(spec: Spec, topology: TopologyId, nominal: Condition): SizedOption {
  const notes: string[] = [];
  const { currentA: tailA, note } = targetTailCurrentA(spec, topology);
  notes.push(note);
  const model = deviceModel(spec.device, nominal.temperatureC);
  const perCollectorGain = spec.gain.output === 'differential' ? spec.gain.target : 2 * spec.gain.target;
  const rcStartOhm = (perCollectorGain * model.thermalVoltageV) / (tailA / 2);
  const tail = sizeTail(spec, topology, nominal, tailA, rcStartOhm, notes);
  const rcExact = tuneResistance((x) => designAt(spec, nominal, tail, x), rcStartOhm, (r) => outputGain(spec, r), spec.gain.target, 1);
  const rc = snapToSeries(rcExact, spec.resistors.series);
  notes.push(
    `RC ≈ ${spec.gain.output === 'differential' ? '|Ad|' : '2·|Ase|'}·VT/IC (the drop across RC sets the gain), refined by solving the stage with the sized tail to ${ohms(rcExact)}, snapped to ${ohms(rc)} (${spec.resistors.series}).`,
  );
  return { design: designAt(spec, nominal, tail, rc), notes };
}
