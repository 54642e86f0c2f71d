/**
 * The circuit every design describes (ENGINE-CONTRACT.md), as data: nodes, elements and the
 * rails. The engine's solvers and the SPICE netlist writer both read this one description, so
 * the simulated circuit is the predicted one by construction.
 */
import type { Design } from './types';
import { tailElements } from './tail-elements';
import { TOPOLOGY_CATALOGUE } from './topologies';
import { cardOf, cardStoresCharge } from './bjt-parameters';

/** Which part of the stage an element belongs to: the pair and its loads, or the tail element. */
export type CircuitPart = 'pair' | 'tail';

export interface ResistorElement {
  kind: 'resistor';
  /** Its SPICE name, starting with the element letter R (the netlist writes it as it is). */
  name: string;
  nodes: [string, string];
  resistanceOhm: number;
  part: CircuitPart;
}

export interface TransistorElement {
  /** NPN, or PNP: the same model with every junction voltage and terminal current reversed [SPICE]. */
  kind: 'npn' | 'pnp';
  /** Its SPICE name, starting with the element letter Q (the netlist writes it as it is). */
  name: string;
  collector: string;
  base: string;
  emitter: string;
  /** Substrate terminal: the negative rail for every transistor of the stage. */
  substrate: string;
  /** Area factor: scales IS (used for the pair's VBE mismatch). */
  area: number;
  /** This transistor's BF and VAF over the stage's device (the pair's beta and Early-voltage mismatch); absent = 1. */
  betaScale?: number;
  earlyVoltageScale?: number;
  part: CircuitPart;
}

export interface CapacitorElement {
  kind: 'capacitor';
  /** Its SPICE name, starting with the element letter C (the netlist writes it as it is). */
  name: string;
  nodes: [string, string];
  capacitanceF: number;
  part: CircuitPart;
}

/**
 * A MOSFET (SPICE level 1, mos-device.ts): drain, gate, source and body terminals, its channel's
 * width and length in metres. Its model at the stage's temperature comes with the circuit's
 * indexing (node-system.ts, by name), so two devices of one card may differ (a mismatched pair).
 */
export interface MosfetElement {
  kind: 'nmos' | 'pmos';
  /** Its SPICE name, starting with the element letter M (the netlist writes it as it is). */
  name: string;
  drain: string;
  gate: string;
  source: string;
  body: string;
  widthM: number;
  lengthM: number;
  /** The pair's threshold mismatch δ, V: this device's VTO is the card's + δ for an NMOS, − δ for a PMOS; absent = 0. */
  thresholdMismatchV?: number;
  /** This device's KP over the card's (the pair's KP mismatch); absent = 1. */
  transconductanceScale?: number;
  part: CircuitPart;
}

export type CircuitElement = ResistorElement | TransistorElement | CapacitorElement | MosfetElement;

/** Whether an element is a MOSFET (either polarity). */
export function isMosfet(element: CircuitElement): element is MosfetElement {
  return element.kind === 'nmos' || element.kind === 'pmos';
}

/** Whether an element is a bipolar transistor (either polarity). */
export function isTransistor(element: CircuitElement): element is TransistorElement {
  return element.kind === 'npn' || element.kind === 'pnp';
}

/** The ground node's name (SPICE's node 0). */
export const GROUND = '0';

/** Node names with a fixed DC voltage: rails and inputs. */
export const RAIL_NODES = { positive: 'vp', negative: 'vn' } as const;
export const INPUT_NODES = ['in1', 'in2'] as const;
/** Where the drive is applied when the design has a source resistance (the far ends of RS1, RS2). */
export const DRIVE_NODES_BEHIND_SOURCE = ['drv1', 'drv2'] as const;
/** The tail node, where the tail element meets the pair. */
export const TAIL_NODE = 't';
/** The collectors (outputs). */
export const COLLECTOR_NODES = ['c1', 'c2'] as const;

export interface StageCircuit {
  /** Nodes held at a fixed DC voltage by ideal sources (ground included). */
  fixedNodesV: Record<string, number>;
  /** The two fixed nodes the input drive is applied to: in1, in2, or the far ends of the source resistors. */
  driveNodes: readonly [string, string];
  elements: CircuitElement[];
  /** A starting guess for the free nodes' voltages (V), from hand analysis. */
  initialGuessV: Record<string, number>;
}

/** Rough VBE used only for starting guesses when the caller has none, V. */
const GUESS_VBE_V = 0.65;
/** Passes of the pair's VBE guess and the tail current guess, each from the other (with a device's VBE). */
const PAIR_GUESS_PASSES = 2;

/**
 * Builds the stage circuit of a design: the pair, its loads and the tail element.
 * `vbeGuessV`, `vbeAtV` (the device's VBE at a current) and `thermalVoltageV` (its VT), when
 * known, only shape the solver's starting guess.
 */
export function stageCircuit(design: Design, vbeGuessV = GUESS_VBE_V, vbeAtV?: (currentA: number) => number, thermalVoltageV?: number): StageCircuit {
  if (stageFamily(design) === 'pnp') {
    const needs = TOPOLOGY_CATALOGUE[design.tail.topology].needsDevice;
    // its second device is the stage's own type mirrored: a PNP stage has no NPN card to give it
    if (needs) throw new RangeError(`the ${TOPOLOGY_CATALOGUE[design.tail.topology].name} tail needs an NPN stage (device.family "npn"): its ${needs.toUpperCase()} mirror would be the stage's own type`);
    return mirroredCircuit(npnStageCircuit(mirroredDesign(design), vbeGuessV, vbeAtV, thermalVoltageV));
  }
  return npnStageCircuit(design, vbeGuessV, vbeAtV, thermalVoltageV);
}

/** The transistor type of a stage's pair and tail (`device.family`; absent reads as "npn"). */
export function stageFamily(design: Pick<Design, 'device'>): 'npn' | 'pnp' {
  return design.device.family === 'pnp' ? 'pnp' : 'npn';
}

/**
 * +1 for an NPN stage, −1 for a PNP one: the sign that turns a current into or out of a node of
 * the solved circuit into the direction the stage's transistors conduct (the contract reports a
 * PNP stage's currents as positive magnitudes).
 */
export function stagePolarity(design: Pick<Design, 'device'>): 1 | -1 {
  return stageFamily(design) === 'pnp' ? -1 : 1;
}

/**
 * The rail the stage's loads and reference resistors hang from (the positive one for an NPN
 * stage) and the rail its tail returns to (the negative one), by node name: a PNP stage swaps them.
 */
export function stageRails(design: Pick<Design, 'device'>): { load: string; tail: string } {
  return stageFamily(design) === 'pnp' ? { load: RAIL_NODES.negative, tail: RAIL_NODES.positive } : { load: RAIL_NODES.positive, tail: RAIL_NODES.negative };
}

/**
 * A PNP stage's NPN mirror image: rails negated and swapped, the input common mode negated, the
 * device read as an NPN (the same parameters: the model is polarity-free, node-system.ts).
 */
export function mirroredDesign(design: Design): Design {
  const { positiveV, negativeV } = design.supply;
  return {
    ...design,
    device: { ...design.device, family: 'npn' },
    supply: { positiveV: -negativeV, negativeV: -positiveV },
    ...(design.inputCommonModeV !== undefined ? { inputCommonModeV: -design.inputCommonModeV } : {}),
  };
}

/** A node of a stage circuit in its mirror image: the rails swap names, every other node keeps its own. */
function mirroredNode(name: string): string {
  if (name === RAIL_NODES.positive) return RAIL_NODES.negative;
  if (name === RAIL_NODES.negative) return RAIL_NODES.positive;
  return name;
}

/** Negated voltages under the mirrored node names. */
function mirroredVoltages(voltagesV: Record<string, number>): Record<string, number> {
  return Object.fromEntries(Object.entries(voltagesV).map(([name, valueV]) => [mirroredNode(name), valueV === 0 ? 0 : -valueV]));
}

/**
 * The mirror image of an NPN stage circuit (every voltage negated): the rails' names swapped, every
 * NPN a PNP (and a PNP an NPN), fixed voltages and the starting guess negated; every substrate stays
 * at the most negative rail, `vn` [SPICE: the substrate is tied to the lowest potential; common practice].
 */
export function mirroredCircuit(circuit: StageCircuit): StageCircuit {
  const elements = circuit.elements.map((el): CircuitElement => {
    if (isTransistor(el)) {
      return { ...el, kind: el.kind === 'npn' ? 'pnp' : 'npn', collector: mirroredNode(el.collector), base: mirroredNode(el.base), emitter: mirroredNode(el.emitter), substrate: RAIL_NODES.negative };
    }
    if (isMosfet(el)) {
      return { ...el, kind: el.kind === 'nmos' ? 'pmos' : 'nmos', drain: mirroredNode(el.drain), gate: mirroredNode(el.gate), source: mirroredNode(el.source), body: mirroredNode(el.body) };
    }
    const nodes: [string, string] = [mirroredNode(el.nodes[0]), mirroredNode(el.nodes[1])];
    return el.kind === 'resistor' ? { ...el, nodes } : { ...el, nodes };
  });
  return { fixedNodesV: mirroredVoltages(circuit.fixedNodesV), driveNodes: circuit.driveNodes, elements, initialGuessV: mirroredVoltages(circuit.initialGuessV) };
}

/** The NPN stage circuit of a design (stageCircuit for the "npn" family). */
function npnStageCircuit(design: Design, vbeGuessV: number, vbeAtV?: (currentA: number) => number, thermalVoltageV?: number): StageCircuit {
  const { positiveV, negativeV } = design.supply;
  const vicmV = design.inputCommonModeV ?? 0;
  const rcOhm = design.collectorResistanceOhm;
  const mismatch = design.collectorMismatch ?? 0;
  const reOhm = design.pairEmitterResistanceOhm ?? 0;
  const pairArea2 = 1 + (design.pairSaturationCurrentMismatch ?? 0);
  const betaScale2 = 1 + (design.pairBetaMismatch ?? 0);
  const earlyVoltageScale2 = 1 + (design.pairEarlyVoltageMismatch ?? 0);
  const pair2Scales = { ...(betaScale2 !== 1 ? { betaScale: betaScale2 } : {}), ...(earlyVoltageScale2 !== 1 ? { earlyVoltageScale: earlyVoltageScale2 } : {}) };
  let tailNodeGuessV = vicmV - vbeGuessV;
  const emitterNodes = reOhm > 0 ? ['e1', 'e2'] : [TAIL_NODE, TAIL_NODE];
  const sourceOhm = design.sourceResistanceOhm ?? 0;
  const driveNodes = sourceOhm > 0 ? DRIVE_NODES_BEHIND_SOURCE : INPUT_NODES;

  const elements: CircuitElement[] = [
    { kind: 'resistor', name: 'RC1', nodes: [RAIL_NODES.positive, 'c1'], resistanceOhm: rcOhm, part: 'pair' },
    { kind: 'resistor', name: 'RC2', nodes: [RAIL_NODES.positive, 'c2'], resistanceOhm: rcOhm * (1 + mismatch), part: 'pair' },
    { kind: 'npn', name: 'Q1', collector: 'c1', base: 'in1', emitter: emitterNodes[0], substrate: RAIL_NODES.negative, area: 1, part: 'pair' },
    { kind: 'npn', name: 'Q2', collector: 'c2', base: 'in2', emitter: emitterNodes[1], substrate: RAIL_NODES.negative, area: pairArea2, ...pair2Scales, part: 'pair' },
  ];
  if (sourceOhm > 0) {
    elements.push(
      { kind: 'resistor', name: 'RS1', nodes: [driveNodes[0], INPUT_NODES[0]], resistanceOhm: sourceOhm, part: 'pair' },
      { kind: 'resistor', name: 'RS2', nodes: [driveNodes[1], INPUT_NODES[1]], resistanceOhm: sourceOhm, part: 'pair' },
    );
  }
  if (reOhm > 0) {
    elements.push(
      { kind: 'resistor', name: 'RE1', nodes: ['e1', TAIL_NODE], resistanceOhm: reOhm, part: 'pair' },
      { kind: 'resistor', name: 'RE2', nodes: ['e2', TAIL_NODE], resistanceOhm: reOhm, part: 'pair' },
    );
  }
  let tail = tailElements(design.tail, { positiveV, negativeV, tailNodeGuessV, vbeGuessV, vbeAtV, thermalVoltageV });
  if (vbeAtV) {
    // The pair's VBE at half the tail current; the tail guessed again from there (a resistor
    // tail's current follows the tail node), twice
    for (let pass = 0; pass < PAIR_GUESS_PASSES; pass += 1) {
      tailNodeGuessV = vicmV - vbeAtV(tail.currentGuessA / 2);
      tail = tailElements(design.tail, { positiveV, negativeV, tailNodeGuessV, vbeGuessV, vbeAtV, thermalVoltageV });
    }
  }
  elements.push(...tail.elements);

  const tailCapacitanceF = design.tailCapacitanceF ?? 0;
  if (tailCapacitanceF > 0) {
    elements.push({ kind: 'capacitor', name: 'CT', nodes: [TAIL_NODE, GROUND], capacitanceF: tailCapacitanceF, part: 'tail' });
  }

  const loadCapacitanceF = design.loadCapacitanceF ?? 0;
  if (loadCapacitanceF > 0) {
    elements.push(
      { kind: 'capacitor', name: 'CL1', nodes: [COLLECTOR_NODES[0], GROUND], capacitanceF: loadCapacitanceF, part: 'pair' },
      { kind: 'capacitor', name: 'CL2', nodes: [COLLECTOR_NODES[1], GROUND], capacitanceF: loadCapacitanceF, part: 'pair' },
    );
  }

  const tailCurrentGuessA = tail.currentGuessA;
  const collectorGuessV = Math.max(positiveV - (tailCurrentGuessA / 2) * rcOhm, tailNodeGuessV + 0.3);
  const initialGuessV: Record<string, number> = {
    c1: collectorGuessV,
    c2: collectorGuessV,
    [TAIL_NODE]: tailNodeGuessV,
    ...tail.initialGuessV,
  };
  if (sourceOhm > 0) {
    initialGuessV[INPUT_NODES[0]] = vicmV;
    initialGuessV[INPUT_NODES[1]] = vicmV;
  }
  if (reOhm > 0) {
    initialGuessV.e1 = tailNodeGuessV;
    initialGuessV.e2 = tailNodeGuessV;
    initialGuessV[TAIL_NODE] = tailNodeGuessV - (tailCurrentGuessA / 2) * reOhm;
  }
  return {
    fixedNodesV: {
      [GROUND]: 0,
      [RAIL_NODES.positive]: positiveV,
      [RAIL_NODES.negative]: negativeV,
      [driveNodes[0]]: vicmV,
      [driveNodes[1]]: vicmV,
    },
    driveNodes,
    elements,
    initialGuessV,
  };
}

/**
 * Whether a design's two halves are the same circuit: no collector, IS, BF or VAF mismatch. Then
 * a common-mode drive moves both collectors alike and the differential common-mode gain is zero
 * exactly (the contract's "perfectly matched pair"), whatever rounding leaves in a solved figure.
 */
export function pairIsMatched(design: Design): boolean {
  return !design.collectorMismatch && !design.pairSaturationCurrentMismatch && !design.pairBetaMismatch && !design.pairEarlyVoltageMismatch;
}

/**
 * Whether anything in a design's circuit stores charge: the tail wiring or load capacitance, or
 * the device's own capacitances (CJE, CJC, CJS, TF, TR). Only then do its gains and rejection
 * move with frequency (and have a corner to look for).
 */
export function designStoresCharge(design: Design): boolean {
  return (design.tailCapacitanceF ?? 0) > 0 || (design.loadCapacitanceF ?? 0) > 0 || cardStoresCharge(cardOf(design.device));
}
