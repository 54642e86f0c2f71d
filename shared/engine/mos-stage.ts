/**
 * The MOS input stage (ENGINE-CONTRACT.md, "Families", `device.family` "nmos" / "pmos"): a
 * source-coupled pair of level-1 MOSFETs (mos-device.ts) with drain loads and one of the MOS
 * tails, as a circuit of the engine's node solver, and `analyze`'s figures for it. The bipolar
 * stage's circuit names are kept where the small-signal solver reads them (outputs `c1`, `c2`,
 * tail node `t`, inputs `in1`, `in2`); the elements carry the MOS names (M1…M8, RD1, RD2).
 * A "pmos" stage is the mirror image of the "nmos" one (circuit.ts, mirroredCircuit), every
 * device with the PMOS card's own model at the temperature (ngspice's threshold equations are
 * not symmetric between the polarities, mos-device.ts).
 */
import { COLLECTOR_NODES, GROUND, INPUT_NODES, RAIL_NODES, TAIL_NODE, mirroredCircuit, type CircuitElement, type MosfetElement, type StageCircuit } from './circuit';
import { NOMINAL_TEMPERATURE_C } from './constants';
import { mosModel, type MosFamily, type MosModel } from './mos-device';
import { resolvedMosParameters, type MosModelCard } from './mos-parameters';
import { mosfetCurrentsA, nodeVoltage } from './node-system';
import { solveOperatingPoint, type OperatingPoint } from './operating-point';
import { smallSignalStage, type SmallSignalStage } from './small-signal';
import { cmrrCornerHzOf, currentIntoElementsA, lowFrequencyFigures } from './analyze';
import { InputError } from './errors';
import { readOutput } from './frequency-response';
import type { AnalyzeResult, RailRejection } from './types';

/** A MOSFET's channel size, m. */
export interface MosSize {
  widthM: number;
  lengthM: number;
}

/** The MOS tails of the contract, each with its fields (sizes in metres). */
export type MosTailDesign =
  | { topology: 'resistor'; resistanceOhm: number }
  | ({ topology: 'simple-mirror'; referenceResistanceOhm: number; referenceWidthM: number; referenceLengthM: number } & MosSize)
  | ({ topology: 'cascode'; referenceResistanceOhm: number; referenceWidthM: number; referenceLengthM: number; cascodeWidthM: number; cascodeLengthM: number } & MosSize)
  | ({
      topology: 'wide-swing-cascode';
      referenceResistanceOhm: number;
      referenceWidthM: number;
      referenceLengthM: number;
      cascodeWidthM: number;
      cascodeLengthM: number;
      biasResistanceOhm: number;
      biasWidthM: number;
      biasLengthM: number;
    } & MosSize)
  | ({
      topology: 'regulated-cascode';
      referenceResistanceOhm: number;
      referenceWidthM: number;
      referenceLengthM: number;
      cascodeWidthM: number;
      cascodeLengthM: number;
      boosterResistanceOhm: number;
      boosterWidthM: number;
      boosterLengthM: number;
    } & MosSize);

export type MosTailTopology = MosTailDesign['topology'];

/** The tails a MOS stage has, in the contract's order. */
export const MOS_TAIL_TOPOLOGIES: readonly MosTailTopology[] = ['resistor', 'simple-mirror', 'cascode', 'wide-swing-cascode', 'regulated-cascode'];

/** An `analyze` design of the "nmos" or "pmos" family (the contract's MOS fields). */
export interface MosDesign {
  device: { family: MosFamily; model: MosModelCard };
  supply: { positiveV: number; negativeV: number };
  drainResistanceOhm: number;
  /** ε: RD2 = RD1·(1 + ε). */
  drainMismatch?: number;
  pairSourceResistanceOhm?: number;
  pair: MosSize;
  /** M1's and M2's bodies at their own sources instead of the rail. */
  pairBodyTiedToSource?: boolean;
  /** δ: M2's VTO = VTO + δ ("nmos"), VTO − δ ("pmos"), V. */
  pairThresholdMismatchV?: number;
  /** δβ: M2's KP = KP·(1 + δβ). */
  pairBetaMismatch?: number;
  tail: MosTailDesign;
  inputCommonModeV?: number;
  temperatureC?: number;
  tailCapacitanceF?: number;
}

/** `analyze`'s figures for a MOS stage (the contract's names; currents as positive magnitudes in the direction the devices conduct). */
export type MosAnalyzeResult = Pick<
  AnalyzeResult,
  | 'tailCurrentA'
  | 'tailNodeVoltageV'
  | 'transconductanceS'
  | 'tailOutputResistanceOhm'
  | 'differentialGain'
  | 'singleEndedGain'
  | 'commonModeGain'
  | 'differentialCommonModeGain'
  | 'cmrrDb'
  | 'cmrrCornerHz'
  | 'inputBiasCurrentA'
  | 'inputOffsetVoltageV'
  | 'offsetDriftVPerC'
  | 'psrrDb'
  | 'powerW'
  | 'warnings'
> & {
  /** M1's drain current and drain voltage (the bipolar pair's collectorCurrentA and collectorVoltageV). */
  drainCurrentA: number;
  drainVoltageV: number;
};

/** The device's polarity: +1 for "nmos", −1 for "pmos". */
function polarityOf(design: MosDesign): 1 | -1 {
  return design.device.family === 'pmos' ? -1 : 1;
}

/**
 * A "pmos" design's "nmos" mirror image for the circuit's shape: rails negated and swapped,
 * the input common mode negated, VTO negated. Only the circuit is taken from it; the devices
 * keep the PMOS card's models (mosModelsOf).
 */
function mirroredMosDesign(design: MosDesign): MosDesign {
  const { positiveV, negativeV } = design.supply;
  const vto = resolvedMosParameters(design.device.model).VTO;
  return {
    ...design,
    device: { family: 'nmos', model: { ...design.device.model, VTO: -vto } },
    supply: { positiveV: -negativeV, negativeV: -positiveV },
    ...(design.inputCommonModeV !== undefined ? { inputCommonModeV: -design.inputCommonModeV } : {}),
  };
}

/** Hand-analysis gate–source voltage of an NMOS at a current: VTO + √(2·I·L/(KP·W)) (square law, no body effect or λ), V: a starting guess only. */
function vgsGuessV(card: MosModelCard, size: MosSize, currentA: number): number {
  const p = resolvedMosParameters(card);
  return p.VTO + Math.sqrt((2 * Math.max(currentA, 0) * size.lengthM) / (p.KP * size.widthM));
}

/** Fixed-point passes of a branch current through a resistor and diode-connected devices (a guess only). */
const GUESS_PASSES = 8;

/** The current through `ohm` from `spanV` less the gate–source drops of `diodes` (each at that current), A: a guess only. */
function branchGuessA(card: MosModelCard, spanV: number, ohm: number, diodes: readonly MosSize[]): number {
  let currentA = Math.max(spanV, 0) / ohm;
  for (let pass = 0; pass < GUESS_PASSES; pass += 1) {
    const drops = diodes.reduce((sum, size) => sum + vgsGuessV(card, size, currentA), 0);
    // halfway steps: the map can overshoot when the drops are steep
    currentA = 0.5 * currentA + 0.5 * (Math.max(spanV - drops, 0) / ohm);
  }
  return currentA;
}

function mosfet(name: string, drain: string, gate: string, source: string, body: string, size: MosSize, part: 'pair' | 'tail'): MosfetElement {
  return { kind: 'nmos', name, drain, gate, source, body, widthM: size.widthM, lengthM: size.lengthM, part };
}

function resistor(name: string, a: string, b: string, resistanceOhm: number, part: 'pair' | 'tail'): CircuitElement {
  return { kind: 'resistor', name, nodes: [a, b], resistanceOhm, part };
}

/** The tail's elements (NMOS, from `t` to the negative rail), its starting guess and its current guess. */
function nmosTail(design: MosDesign, tailNodeGuessV: number): { elements: CircuitElement[]; guessV: Record<string, number>; currentA: number } {
  const { positiveV: vp, negativeV: vn } = design.supply;
  const card = design.device.model;
  const tail = design.tail;
  const VP = RAIL_NODES.positive;
  const VN = RAIL_NODES.negative;
  if (tail.topology === 'resistor') {
    return { elements: [resistor('RT', TAIL_NODE, VN, tail.resistanceOhm, 'tail')], guessV: {}, currentA: Math.max(tailNodeGuessV - vn, 0) / tail.resistanceOhm };
  }
  const reference: MosSize = { widthM: tail.referenceWidthM, lengthM: tail.referenceLengthM };
  const output: MosSize = { widthM: tail.widthM, lengthM: tail.lengthM };
  switch (tail.topology) {
    case 'simple-mirror': {
      const refA = branchGuessA(card, vp - vn, tail.referenceResistanceOhm, [reference]);
      return {
        elements: [resistor('RREF', VP, 'ref', tail.referenceResistanceOhm, 'tail'), mosfet('M3', 'ref', 'ref', VN, VN, reference, 'tail'), mosfet('M4', TAIL_NODE, 'ref', VN, VN, output, 'tail')],
        guessV: { ref: vn + vgsGuessV(card, reference, refA) },
        currentA: (refA * (output.widthM / output.lengthM)) / (reference.widthM / reference.lengthM),
      };
    }
    case 'cascode': {
      const cascode: MosSize = { widthM: tail.cascodeWidthM, lengthM: tail.cascodeLengthM };
      const refA = branchGuessA(card, vp - vn, tail.referenceResistanceOhm, [reference, cascode]);
      const m3V = vn + vgsGuessV(card, reference, refA);
      return {
        elements: [
          resistor('RREF', VP, 'ref', tail.referenceResistanceOhm, 'tail'),
          mosfet('M5', 'ref', 'ref', 'm3', VN, cascode, 'tail'),
          mosfet('M3', 'm3', 'm3', VN, VN, reference, 'tail'),
          mosfet('M4', 'm4', 'm3', VN, VN, output, 'tail'),
          mosfet('M6', TAIL_NODE, 'ref', 'm4', VN, cascode, 'tail'),
        ],
        guessV: { ref: m3V + vgsGuessV(card, cascode, refA), m3: m3V, m4: m3V },
        currentA: (refA * (output.widthM / output.lengthM)) / (reference.widthM / reference.lengthM),
      };
    }
    case 'wide-swing-cascode': {
      const cascode: MosSize = { widthM: tail.cascodeWidthM, lengthM: tail.cascodeLengthM };
      const bias: MosSize = { widthM: tail.biasWidthM, lengthM: tail.biasLengthM };
      const refA = branchGuessA(card, vp - vn, tail.referenceResistanceOhm, [reference]);
      const biasA = branchGuessA(card, vp - vn, tail.biasResistanceOhm, [bias]);
      const rV = vn + vgsGuessV(card, reference, refA);
      const bV = vn + vgsGuessV(card, bias, biasA);
      // the cascodes' sources a gate–source drop below the bias node, above the rail
      const lowV = Math.max(bV - vgsGuessV(card, cascode, refA), vn + 0.05);
      return {
        elements: [
          resistor('RREF', VP, 'r', tail.referenceResistanceOhm, 'tail'),
          mosfet('M5', 'r', 'b', 'm3', VN, cascode, 'tail'),
          mosfet('M3', 'm3', 'r', VN, VN, reference, 'tail'),
          mosfet('M4', 'm4', 'r', VN, VN, output, 'tail'),
          mosfet('M6', TAIL_NODE, 'b', 'm4', VN, cascode, 'tail'),
          resistor('RB', VP, 'b', tail.biasResistanceOhm, 'tail'),
          mosfet('M7', 'b', 'b', VN, VN, bias, 'tail'),
        ],
        guessV: { r: Math.max(rV, lowV + 0.05), b: bV, m3: lowV, m4: lowV },
        currentA: (refA * (output.widthM / output.lengthM)) / (reference.widthM / reference.lengthM),
      };
    }
    case 'regulated-cascode': {
      const cascode: MosSize = { widthM: tail.cascodeWidthM, lengthM: tail.cascodeLengthM };
      const booster: MosSize = { widthM: tail.boosterWidthM, lengthM: tail.boosterLengthM };
      const refA = branchGuessA(card, vp - vn, tail.referenceResistanceOhm, [reference]);
      const outA = (refA * (output.widthM / output.lengthM)) / (reference.widthM / reference.lengthM);
      // y sits at the booster's threshold-and-a-bit; M6's gate a gate–source drop above it
      const boosterA = branchGuessA(card, vp - vn, tail.boosterResistanceOhm, [booster]);
      const yV = vn + vgsGuessV(card, booster, boosterA);
      return {
        elements: [
          resistor('RREF', VP, 'ref', tail.referenceResistanceOhm, 'tail'),
          mosfet('M3', 'ref', 'ref', VN, VN, reference, 'tail'),
          mosfet('M4', 'y', 'ref', VN, VN, output, 'tail'),
          mosfet('M6', TAIL_NODE, 'g6', 'y', VN, cascode, 'tail'),
          mosfet('M8', 'g6', 'y', VN, VN, booster, 'tail'),
          resistor('RBST', VP, 'g6', tail.boosterResistanceOhm, 'tail'),
        ],
        guessV: { ref: vn + vgsGuessV(card, reference, refA), y: yV, g6: Math.min(yV + vgsGuessV(card, cascode, outA), vp) },
        currentA: outA,
      };
    }
  }
}

/** The "nmos" stage circuit of a design (a "pmos" design is built as its mirror image, mosStageCircuit). */
function nmosStageCircuit(design: MosDesign): StageCircuit {
  const { positiveV, negativeV } = design.supply;
  const card = design.device.model;
  const vicmV = design.inputCommonModeV ?? 0;
  const rdOhm = design.drainResistanceOhm;
  const rsOhm = design.pairSourceResistanceOhm ?? 0;
  const driveNodes = INPUT_NODES;
  const sources = rsOhm > 0 ? ['s1', 's2'] : [TAIL_NODE, TAIL_NODE];
  const bodies = design.pairBodyTiedToSource ? sources : [RAIL_NODES.negative, RAIL_NODES.negative];
  const m2: MosfetElement = mosfet('M2', COLLECTOR_NODES[1], INPUT_NODES[1], sources[1], bodies[1], design.pair, 'pair');
  if (design.pairThresholdMismatchV) m2.thresholdMismatchV = design.pairThresholdMismatchV;
  if (design.pairBetaMismatch) m2.transconductanceScale = 1 + design.pairBetaMismatch;
  const elements: CircuitElement[] = [
    resistor('RD1', RAIL_NODES.positive, COLLECTOR_NODES[0], rdOhm, 'pair'),
    resistor('RD2', RAIL_NODES.positive, COLLECTOR_NODES[1], rdOhm * (1 + (design.drainMismatch ?? 0)), 'pair'),
    mosfet('M1', COLLECTOR_NODES[0], INPUT_NODES[0], sources[0], bodies[0], design.pair, 'pair'),
    m2,
  ];
  if (rsOhm > 0) elements.push(resistor('RSS1', 's1', TAIL_NODE, rsOhm, 'pair'), resistor('RSS2', 's2', TAIL_NODE, rsOhm, 'pair'));
  // The tail node a gate–source drop below the inputs at half the tail current, the tail guessed from there, a few passes
  let tailNodeGuessV = vicmV - vgsGuessV(card, design.pair, 0);
  let tail = nmosTail(design, tailNodeGuessV);
  for (let pass = 0; pass < 3; pass += 1) {
    tailNodeGuessV = Math.max(vicmV - vgsGuessV(card, design.pair, tail.currentA / 2) - (tail.currentA / 2) * rsOhm, negativeV);
    tail = nmosTail(design, tailNodeGuessV);
  }
  elements.push(...tail.elements);
  if ((design.tailCapacitanceF ?? 0) > 0) elements.push({ kind: 'capacitor', name: 'CT', nodes: [TAIL_NODE, GROUND], capacitanceF: design.tailCapacitanceF!, part: 'tail' });
  const drainGuessV = Math.max(positiveV - (tail.currentA / 2) * rdOhm, tailNodeGuessV + 0.1);
  const initialGuessV: Record<string, number> = { c1: drainGuessV, c2: drainGuessV, [TAIL_NODE]: tailNodeGuessV - (tail.currentA / 2) * rsOhm, ...tail.guessV };
  if (rsOhm > 0) {
    initialGuessV.s1 = tailNodeGuessV;
    initialGuessV.s2 = tailNodeGuessV;
  }
  return {
    fixedNodesV: { [GROUND]: 0, [RAIL_NODES.positive]: positiveV, [RAIL_NODES.negative]: negativeV, [driveNodes[0]]: vicmV, [driveNodes[1]]: vicmV },
    driveNodes,
    elements,
    initialGuessV,
  };
}

/** The stage circuit of a MOS design: the "nmos" one, or for "pmos" the mirror image of its "nmos" counterpart (every body at the positive rail, or at its source). */
export function mosStageCircuit(design: MosDesign): StageCircuit {
  return design.device.family === 'pmos' ? mirroredCircuit(nmosStageCircuit(mirroredMosDesign(design))) : nmosStageCircuit(design);
}

/**
 * Every MOSFET's model at the design's temperature, by name: the card's, and a mismatched M2's
 * own card (VTO + type·δ, KP·(1 + δβ)).
 */
export function mosModelsOf(design: MosDesign, circuit: StageCircuit): Record<string, MosModel> {
  const family = design.device.family;
  const temperatureC = design.temperatureC ?? NOMINAL_TEMPERATURE_C;
  const stageModel = mosModel(design.device.model, family, temperatureC);
  const type = polarityOf(design);
  const models: Record<string, MosModel> = {};
  for (const el of circuit.elements) {
    if (el.kind !== 'nmos' && el.kind !== 'pmos') continue;
    if (el.thresholdMismatchV === undefined && el.transconductanceScale === undefined) {
      models[el.name] = stageModel;
      continue;
    }
    models[el.name] = mosModel(mosfetOwnCard(design.device.model, el, type), family, temperatureC);
  }
  return models;
}

/** A mismatched device's card: VTO + type·δ, KP·(1 + δβ) (the netlist writes the same). */
export function mosfetOwnCard(card: MosModelCard, el: MosfetElement, type: 1 | -1): MosModelCard {
  const p = resolvedMosParameters(card);
  return { ...card, VTO: p.VTO + type * (el.thresholdMismatchV ?? 0), KP: p.KP * (el.transconductanceScale ?? 1) };
}

/** A solved MOS stage: its circuit, operating point and small-signal stage. */
export interface MosSolution {
  design: MosDesign;
  circuit: StageCircuit;
  op: OperatingPoint;
  stage: SmallSignalStage;
}

/** Solves a MOS design's operating point and small-signal stage. */
export function solveMosStage(design: MosDesign): MosSolution {
  const circuit = mosStageCircuit(design);
  const op = solveOperatingPoint(circuit, null, undefined, undefined, mosModelsOf(design, circuit));
  return { design, circuit, op, stage: smallSignalStage(op, circuit.driveNodes) };
}

/** Plain sentences for devices out of saturation: a pair or tail device in the linear (triode) region or cut off. */
function regionWarnings(op: OperatingPoint): string[] {
  const warnings: string[] = [];
  op.circuit.mosfets.forEach((m, i) => {
    const ev = op.mosfets[i];
    if (ev.region === 'linear') {
      warnings.push(`${m.name} is in the linear (triode) region at this operating point: its drain–source voltage is below its saturation voltage of ${Math.abs(ev.saturationVoltageV).toPrecision(3)} V, so it no longer acts as a current source or amplifier.`);
    } else if (ev.region === 'cut-off') {
      warnings.push(`${m.name} is cut off at this operating point: its gate–source voltage is below its threshold of ${Math.abs(ev.thresholdV).toPrecision(3)} V.`);
    }
  });
  return warnings;
}

/** Whether a MOS design's two halves are the same circuit (no drain, threshold or KP mismatch). */
export function mosPairIsMatched(design: MosDesign): boolean {
  return !design.drainMismatch && !design.pairThresholdMismatchV && !design.pairBetaMismatch;
}

/** Secant steps of the offset search at most, and the input step below which it has converged, V. */
const OFFSET_MAX_STEPS = 40;
const OFFSET_TOLERANCE_V = 1e-11;

/** The operating point with a differential DC input: in1 at vicm + x/2, in2 at vicm − x/2 (warm-started). */
function solvedWithInput(design: MosDesign, circuit: StageCircuit, models: Record<string, MosModel>, inputV: number, warmStart?: OperatingPoint): OperatingPoint {
  const vicmV = design.inputCommonModeV ?? 0;
  const fixedNodesV = { ...circuit.fixedNodesV, [INPUT_NODES[0]]: vicmV + inputV / 2, [INPUT_NODES[1]]: vicmV - inputV / 2 };
  return solveOperatingPoint({ ...circuit, fixedNodesV }, null, warmStart, undefined, models);
}

/** v(c1) − v(c2) of a solved operating point, V. */
function outputV(op: OperatingPoint): number {
  const ic = op.circuit;
  return nodeVoltage(ic, op.voltagesV, ic.nodeRef(COLLECTOR_NODES[0])) - nodeVoltage(ic, op.voltagesV, ic.nodeRef(COLLECTOR_NODES[1]));
}

/**
 * The input offset voltage (ENGINE-CONTRACT.md `inputOffsetVoltageV`): the differential DC input
 * at which v(c1) = v(c2), by secant steps on operating points of the whole circuit from the
 * first guess −v(c1,c2)/Ad, to 10 pV.
 */
export function mosInputOffsetV(design: MosDesign, op: OperatingPoint, differentialGain: number): number {
  const circuit = mosStageCircuit(design);
  const models = mosModelsOf(design, circuit);
  let x0 = 0;
  let f0 = outputV(op);
  let x1 = -f0 / differentialGain;
  let last = solvedWithInput(design, circuit, models, x1, op);
  for (let step = 0; step < OFFSET_MAX_STEPS; step += 1) {
    const f1 = outputV(last);
    if (f1 === 0 || f1 === f0) return x1;
    const x2 = x1 - (f1 * (x1 - x0)) / (f1 - f0);
    x0 = x1;
    f0 = f1;
    x1 = x2;
    if (Math.abs(x1 - x0) <= OFFSET_TOLERANCE_V) return x1;
    last = solvedWithInput(design, circuit, models, x1, last);
  }
  return x1;
}

/** The offset's drift (ENGINE-CONTRACT.md `offsetDriftVPerC`): (offset at T + 1 °C − offset at T − 1 °C)/2. */
export function mosOffsetDriftVPerC(design: MosDesign): number {
  const temperatureC = design.temperatureC ?? NOMINAL_TEMPERATURE_C;
  const at = (t: number) => {
    const shifted = { ...design, temperatureC: t };
    const { op, stage } = solveMosStage(shifted);
    return mosInputOffsetV(shifted, op, stage.low.differentialGain.re);
  };
  return (at(temperatureC + 1) - at(temperatureC - 1)) / 2;
}

/**
 * Supply rejection from each rail at low frequency (ENGINE-CONTRACT.md `psrrDb`): the
 * single-ended (differential) gain over the gain from the rail's small-signal voltage to v(c1)
 * (v(c1,c2)); a matched pair moves both drains alike, so its differential figure is null.
 */
function supplyRejectionDb(stage: SmallSignalStage, matched: boolean): MosAnalyzeResult['psrrDb'] {
  const { collector1, betweenCollectors } = stage.outputs;
  const db = (gain: number, leak: number): number | null => (leak === 0 ? null : 20 * Math.log10(Math.abs(gain / leak)));
  const rail = (response: number[]): RailRejection => ({
    singleEnded: db(stage.low.singleEndedGain.re, readOutput(response, collector1)) ?? Number.POSITIVE_INFINITY,
    differential: matched ? null : db(stage.low.differentialGain.re, readOutput(response, betweenCollectors)),
  });
  return { positive: rail(stage.supply.positive), negative: rail(stage.supply.negative) };
}

/** `analyze` for a MOS design: the contract's figures at DC and low frequency, the CMRR corner, power and warnings. */
export function analyzeMos(design: MosDesign): MosAnalyzeResult {
  const { op, stage } = solveMosStage(design);
  const ic = op.circuit;
  const v = op.voltagesV;
  const polarity = polarityOf(design);
  const m1 = op.mosfets[ic.mosfets.findIndex((m) => m.name === 'M1')];
  const m2 = op.mosfets[ic.mosfets.findIndex((m) => m.name === 'M2')];
  // level 1 has no subthreshold current: a cut-off pair has no gain at all, and no rejection to report
  if (m1.region === 'cut-off' || m2.region === 'cut-off') {
    throw new InputError('/inputCommonModeV', `the pair is cut off at this operating point (${m1.region === 'cut-off' ? 'M1' : 'M2'}'s gate–source voltage is below its threshold of ${Math.abs((m1.region === 'cut-off' ? m1 : m2).thresholdV).toPrecision(3)} V), so it has no gain to report: move the input common mode ${polarity === 1 ? 'up' : 'down'} or give the tail more room`);
  }
  const low = stage.low;
  const matched = mosPairIsMatched(design);
  const positiveA = currentIntoElementsA(op, RAIL_NODES.positive, false);
  const negativeA = currentIntoElementsA(op, RAIL_NODES.negative, false);
  return {
    tailCurrentA: polarity * currentIntoElementsA(op, TAIL_NODE, true),
    drainCurrentA: polarity * mosfetCurrentsA(m1).drainA,
    drainVoltageV: nodeVoltage(ic, v, ic.nodeRef(COLLECTOR_NODES[0])),
    tailNodeVoltageV: nodeVoltage(ic, v, ic.nodeRef(TAIL_NODE)),
    transconductanceS: m1.gmS,
    tailOutputResistanceOhm: stage.tailOutputResistanceOhm,
    ...lowFrequencyFigures(stage, matched),
    cmrrCornerHz: (design.tailCapacitanceF ?? 0) > 0 ? cmrrCornerHzOf(stage) : null,
    inputBiasCurrentA: 0,
    inputOffsetVoltageV: matched ? 0 : mosInputOffsetV(design, op, low.differentialGain.re),
    offsetDriftVPerC: matched ? 0 : mosOffsetDriftVPerC(design),
    psrrDb: supplyRejectionDb(stage, matched),
    powerW: design.supply.positiveV * positiveA + design.supply.negativeV * negativeA,
    warnings: regionWarnings(op),
  };
}
