/**
 * What limits the rejection at a frequency, from the whole solved circuit, and the tail's own
 * impedance there.
 *
 * Every element of the small-signal circuit (each resistor, each transistor's conductances, each
 * of its junction and diffusion capacitances, the wiring and load capacitors) is an admittance
 * Y_e stamped between its nodes; the stage is (Σ Y_e)·x = drive, as small-signal.ts solves it.
 * The common-mode leak is the ratio L = A_cm / A_signal (the reciprocal of the rejection) at the
 * output the rejection is read on. An element's part in it is the logarithmic sensitivity
 *
 *   S_e = Re(∂ ln L / ∂ ln Y_e)
 *
 * (raise the element's admittance 1 % and the rejection falls S_e·0.0869 dB), computed for every
 * element at once with one adjoint solve: ∂T/∂ln Y_e = −λᵀ·(Y_e·v), λ from Aᵀ·λ = w [Bode
 * sensitivity; the adjoint network, as SPICE's .sens does it]. Scaling every admittance of the
 * circuit leaves every voltage ratio unchanged, so the S_e of all elements add up to 0: the
 * elements whose growth lets more common mode through (S_e > 0: the tail's conductance, the
 * capacitances that bypass it, the pair's feed-through) balance those that hold it back (the
 * pair's own transconductance). The limits are the groups with S > 0, each share its S over
 * their sum (so the shares add up to 100 %). For one tail admittance Y = G + jωC they are
 * Re(G/Y) and Re(jωC/Y): the split of |Y|² into G² and (ωC)², 50 % each at the corner ωC = G.
 *
 * Beside each capacitive group: the rejection with that group removed (its capacitances zeroed,
 * the circuit solved again), what a designer would win by getting rid of it.
 */
import { DRIVE_NODES_BEHIND_SOURCE, INPUT_NODES, TAIL_NODE } from './circuit';
import { solveComplex, type ComplexVector } from './complex-solve';
import { chargeParametersOf, transistorCapacitances } from './junction-charges';
import { cardOf, resolvedParameters } from './bjt-parameters';
import { junctionVoltages, type IndexedCircuit, type IndexedTransistor, type NodeRef } from './node-system';
import type { BjtEval } from './device';
import type { SolvedCircuit } from './analyze';
import type { OutputKind } from './types';
import { readOutput, type OutputWeights } from './frequency-response';
import type { Complex, SmallSignalStage } from './small-signal';

/** The parts a designer can act on, each a group of the circuit's elements. */
export const REJECTION_LIMIT_PARTS = [
  'tail-resistance',
  'tail-base-collector',
  'tail-collector-substrate',
  'tail-base-emitter',
  'tail-wiring',
  'pair-base-emitter',
  'pair-base-collector',
  'pair-collector-substrate',
  'load',
  'pair',
] as const;
export type RejectionLimitPart = (typeof REJECTION_LIMIT_PARTS)[number];

/** One element of a part with its value at the operating point. */
export interface RejectionLimitElement {
  /** The circuit's name for it: a transistor (Q4), a capacitor (CT, CL1), a resistor (RC1), or "tail" for the tail's output resistance. */
  name: string;
  capacitanceF?: number;
  resistanceOhm?: number;
}

export interface RejectionLimit {
  part: RejectionLimitPart;
  elements: RejectionLimitElement[];
  /** Its share of what lets the common mode through, per cent (the limits' shares add up to 100). */
  sharePercent: number;
  /** Re(∂ ln(A_cm/A_signal)/∂ ln Y): the rejection falls this × 0.0869 dB per 1 % more of the part's admittance. */
  sensitivity: number;
  /** The rejection with the part's capacitances removed (its resistances kept), dB; null for a part with no capacitance. */
  rejectionWithoutDb: number | null;
}

/** What limits the rejection at one frequency. */
export interface RejectionLimits {
  frequencyHz: number;
  /** The output the rejection is read on: c1 alone, or c1 − c2 with every mismatch at its worst-case extreme. */
  output: OutputKind;
  /** The condition the circuit was solved at (the one that governs the spec's rejection). */
  conditionLabel: string;
  /** The rejection of that circuit at that frequency, dB. */
  rejectionDb: number;
  /** Parts with S > 0, largest share first; each names the elements that carry it (at least 5 % of the part). */
  limits: RejectionLimit[];
  /**
   * Capacitive parts with S < 0: their current cancels part of the common mode (the pair's CJC
   * feeding the input's common mode to the collector against the tail's capacitive current, say),
   * so growing them raises the rejection and removing them lowers it. `sharePercent` is their
   * S over the limits' sum (negative). The pair's own conductances, which always hold the common
   * mode back, are not listed.
   */
  offsetting: RejectionLimit[];
}

/** A coefficient of the voltage at `col` in the current leaving free node `row`. */
interface Entry {
  row: number;
  col: NodeRef;
  value: number;
}

/** One element: its admittance as conductance and capacitance coefficients, and what it is shown as. */
interface Element {
  part: RejectionLimitPart;
  shown: RejectionLimitElement;
  conductance: Entry[];
  capacitance: Entry[];
}

/** The circuit as elements. */
interface CircuitElements {
  ic: IndexedCircuit;
  elements: Element[];
  /** The stage's outputs (small-signal.ts): c1 alone and c1 − c2. */
  outputs: SmallSignalStage['outputs'];
}

function add(entries: Entry[], row: NodeRef, col: NodeRef, value: number): void {
  if (row >= 0 && value !== 0) entries.push({ row, col, value });
}

function twoTerminal(a: NodeRef, b: NodeRef, y: number): Entry[] {
  const entries: Entry[] = [];
  add(entries, a, a, y);
  add(entries, a, b, -y);
  add(entries, b, b, y);
  add(entries, b, a, -y);
  return entries;
}

/** A current y·(v(plus) − v(minus)) leaving `from` and entering `to`. */
function controlled(from: NodeRef, to: NodeRef, plus: NodeRef, minus: NodeRef, y: number): Entry[] {
  const entries: Entry[] = [];
  add(entries, from, plus, y);
  add(entries, from, minus, -y);
  add(entries, to, plus, -y);
  add(entries, to, minus, y);
  return entries;
}

/** A transistor's linearised currents (node-system.ts stampTransistor, without the constant parts). */
function transistorEntries(q: IndexedTransistor, ev: BjtEval): Entry[] {
  const a = ev.dIcDVbeS;
  const b = ev.dIcDVbcS;
  const c = ev.dIbDVbeS;
  const d = ev.dIbDVbcS;
  const entries: Entry[] = [];
  add(entries, q.ci, q.bi, a + b);
  add(entries, q.ci, q.ei, -a);
  add(entries, q.ci, q.ci, -b);
  add(entries, q.bi, q.bi, c + d);
  add(entries, q.bi, q.ei, -c);
  add(entries, q.bi, q.ci, -d);
  add(entries, q.ei, q.bi, -(a + b + c + d));
  add(entries, q.ei, q.ei, a + c);
  add(entries, q.ei, q.ci, b + d);
  return entries;
}

const LOAD_RESISTORS = new Set(['RC1', 'RC2']);
/** An element of a part is named when it carries at least this fraction of the part's sensitivity. */
const ELEMENT_SHOWN_FRACTION = 0.05;

/** Every element of a solved circuit, grouped into parts (the charges as small-signal.ts stamps them). */
function circuitElements(solved: SolvedCircuit): CircuitElements {
  const { op, design } = solved;
  const ic = op.circuit;
  const temperatureC = design.temperatureC ?? 27;
  const elements: Element[] = [];
  // the tail's conductances together are its output resistance
  const tail: RejectionLimitElement = { name: 'tail', resistanceOhm: solved.stage.tailOutputResistanceOhm };
  // a pair transistor's own conductances, its ohmic resistances (Q1.RB, …) and substrate leak shown as the transistor
  const pairTransistors = new Map(ic.transistors.filter((q) => !q.tail).map((q): [string, RejectionLimitElement] => [q.name, { name: q.name }]));
  for (const r of ic.resistors) {
    const part: RejectionLimitPart = r.tail ? 'tail-resistance' : LOAD_RESISTORS.has(r.name) ? 'load' : 'pair';
    const owner = pairTransistors.get(r.name.split('.')[0]);
    const shown = part === 'tail-resistance' ? tail : (owner ?? { name: r.name, resistanceOhm: 1 / r.conductanceS });
    elements.push({ part, shown, conductance: twoTerminal(r.a, r.b, r.conductanceS), capacitance: [] });
  }
  ic.transistors.forEach((q, k) => {
    elements.push({ part: q.tail ? 'tail-resistance' : 'pair', shown: q.tail ? tail : pairTransistors.get(q.name)!, conductance: transistorEntries(q, op.transistors[k]), capacitance: [] });
  });
  for (const cap of ic.capacitors) {
    if (cap.capacitanceF === 0) continue;
    const part: RejectionLimitPart = cap.name === 'CT' ? 'tail-wiring' : 'load';
    elements.push({ part, shown: { name: cap.name, capacitanceF: cap.capacitanceF }, conductance: [], capacitance: twoTerminal(cap.a, cap.b, cap.capacitanceF) });
  }
  const charges = chargeParametersOf(ic.transistors, resolvedParameters(cardOf(design.device)), temperatureC);
  const v = op.voltagesV;
  ic.transistors.forEach((q, k) => {
    const own = charges[k];
    if (!own || own.none) return;
    const { bi: b, ci: c, ei: e, s, sc } = q;
    const caps = transistorCapacitances(own, op.transistors[k], junctionVoltages(ic, v, q), q.area);
    const side = q.tail ? 'tail' : 'pair';
    const piece = (part: RejectionLimitPart, capacitance: Entry[], valueF: number) => {
      if (valueF !== 0) elements.push({ part, shown: { name: q.name, capacitanceF: valueF }, conductance: [], capacitance });
    };
    piece(`${side}-base-emitter`, [...twoTerminal(b, e, caps.baseEmitterF), ...controlled(b, e, b, c, caps.baseEmitterPerVbcF)], caps.baseEmitterF);
    piece(`${side}-base-collector`, twoTerminal(b, c, caps.baseCollectorF), caps.baseCollectorF);
    piece(`${side}-collector-substrate`, twoTerminal(sc, s, caps.collectorSubstrateF), caps.collectorSubstrateF);
  });
  return { ic, elements, outputs: solved.stage.outputs };
}

/** The complex node matrix (G + jωC) of the elements `keep` admits. */
function nodeMatrix(ic: IndexedCircuit, elements: readonly Element[], omega: number, keep: (e: Element) => boolean): { re: number[]; im: number[] } {
  const n = ic.freeNodes.length;
  const re = new Array<number>(n * n).fill(0);
  const im = new Array<number>(n * n).fill(0);
  for (const e of elements) {
    if (!keep(e)) continue;
    for (const { row, col, value } of e.conductance) if (col >= 0) re[row * n + col] += value;
    for (const { row, col, value } of e.capacitance) if (col >= 0) im[row * n + col] += omega * value;
  }
  return { re, im };
}

/** The fixed nodes' AC voltages for a drive of (d1, d2) volts on the two drive nodes. */
function fixedDrive(ic: IndexedCircuit, driveNodes: readonly [string, string], d1: number, d2: number): number[] {
  const v = new Array<number>(ic.fixedNodes.length).fill(0);
  v[-ic.nodeRef(driveNodes[0]) - 1] += d1;
  v[-ic.nodeRef(driveNodes[1]) - 1] += d2;
  return v;
}

/** The current each element's fixed-node coefficients drive out of the free nodes, negated: the right-hand side. */
function driveVector(ic: IndexedCircuit, elements: readonly Element[], omega: number, fixedV: readonly number[], keep: (e: Element) => boolean): ComplexVector {
  const n = ic.freeNodes.length;
  const re = new Array<number>(n).fill(0);
  const im = new Array<number>(n).fill(0);
  for (const e of elements) {
    if (!keep(e)) continue;
    for (const { row, col, value } of e.conductance) if (col < 0) re[row] -= value * fixedV[-col - 1];
    for (const { row, col, value } of e.capacitance) if (col < 0) im[row] -= omega * value * fixedV[-col - 1];
  }
  return { re, im };
}

/** The element's current out of each free node, Y_e·v, for node voltages x and fixed voltages fixedV. */
function elementCurrents(e: Element, n: number, omega: number, x: ComplexVector, fixedV: readonly number[]): ComplexVector {
  const re = new Array<number>(n).fill(0);
  const im = new Array<number>(n).fill(0);
  const voltage = (col: NodeRef): [number, number] => (col >= 0 ? [x.re[col], x.im[col]] : [fixedV[-col - 1], 0]);
  for (const { row, col, value } of e.conductance) {
    const [vr, vi] = voltage(col);
    re[row] += value * vr;
    im[row] += value * vi;
  }
  for (const { row, col, value } of e.capacitance) {
    const [vr, vi] = voltage(col);
    // jωC·v
    re[row] -= omega * value * vi;
    im[row] += omega * value * vr;
  }
  return { re, im };
}

type C = Complex;
const over = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
/** The output's value in a complex node vector. */
const dot = (w: OutputWeights, x: ComplexVector): C => ({ re: readOutput(x.re, w), im: readOutput(x.im, w) });

/** Signal and common-mode transfers to the output with the elements `keep` admits. */
function transfers(parts: CircuitElements, omega: number, output: OutputKind, keep: (e: Element) => boolean) {
  const { ic, elements } = parts;
  const n = ic.freeNodes.length;
  const driveNodes = driveNodeNames(ic);
  const signalV = fixedDrive(ic, driveNodes, 0.5, -0.5);
  const commonV = fixedDrive(ic, driveNodes, 1, 1);
  const m = nodeMatrix(ic, elements, omega, keep);
  const [signal, common] = solveComplex(m.re.slice(), m.im.slice(), n, [driveVector(ic, elements, omega, signalV, keep), driveVector(ic, elements, omega, commonV, keep)]);
  // the stage's own output weights: c1, or c1 − c2
  const w = output === 'differential' ? parts.outputs.betweenCollectors : parts.outputs.collector1;
  return { matrix: m, signal, common, signalV, commonV, w, signalGain: dot(w, signal), commonGain: dot(w, common) };
}

/** The two fixed nodes the drive is applied to (in1/in2, or the far ends of the source resistors). */
function driveNodeNames(ic: IndexedCircuit): readonly [string, string] {
  return ic.fixedNodes.includes(DRIVE_NODES_BEHIND_SOURCE[0]) ? DRIVE_NODES_BEHIND_SOURCE : INPUT_NODES;
}

const rejectionDb = (signal: C, common: C): number => 20 * Math.log10(Math.hypot(signal.re, signal.im) / Math.hypot(common.re, common.im));

/**
 * What limits the rejection of a solved circuit at `frequencyHz` on `output` (c1 alone, or
 * c1 − c2: give a mismatched circuit for the latter, a matched pair has no differential common
 * mode). `conditionLabel` names the condition it was solved at.
 */
export function rejectionLimits(solved: SolvedCircuit, frequencyHz: number, output: OutputKind, conditionLabel: string): RejectionLimits {
  const parts = circuitElements(solved);
  const { ic, elements } = parts;
  const n = ic.freeNodes.length;
  const omega = 2 * Math.PI * frequencyHz;
  const all = () => true;
  const t = transfers(parts, omega, output, all);
  // The adjoint: Aᵀ·λ = w, so that ∂(w·x) = −λᵀ·∂A·x for any change of the elements
  const transposedRe = new Array<number>(n * n);
  const transposedIm = new Array<number>(n * n);
  for (let r = 0; r < n; r += 1) {
    for (let c = 0; c < n; c += 1) {
      transposedRe[c * n + r] = t.matrix.re[r * n + c];
      transposedIm[c * n + r] = t.matrix.im[r * n + c];
    }
  }
  const wVector = { re: new Array<number>(n).fill(0), im: new Array<number>(n).fill(0) };
  t.w.nodes.forEach((node, i) => (wVector.re[node] += t.w.weights[i]));
  const [lambda] = solveComplex(transposedRe, transposedIm, n, [wVector]);
  const sensitivityOf = (current: ComplexVector): C => {
    let re = 0;
    let im = 0;
    for (let k = 0; k < n; k += 1) {
      re -= lambda.re[k] * current.re[k] - lambda.im[k] * current.im[k];
      im -= lambda.re[k] * current.im[k] + lambda.im[k] * current.re[k];
    }
    return { re, im };
  };
  // each part's sensitivity, and each shown element's within it
  const byPart = new Map<RejectionLimitPart, { sensitivity: number; byElement: Map<RejectionLimitElement, number> }>();
  for (const e of elements) {
    // ∂ ln(A_cm/A_signal) = ∂A_cm/A_cm − ∂A_signal/A_signal, per relative change of the element's admittance
    const dCommon = over(sensitivityOf(elementCurrents(e, n, omega, t.common, t.commonV)), t.commonGain);
    const dSignal = over(sensitivityOf(elementCurrents(e, n, omega, t.signal, t.signalV)), t.signalGain);
    const s = dCommon.re - dSignal.re;
    const entry = byPart.get(e.part) ?? { sensitivity: 0, byElement: new Map<RejectionLimitElement, number>() };
    entry.sensitivity += s;
    entry.byElement.set(e.shown, (entry.byElement.get(e.shown) ?? 0) + s);
    byPart.set(e.part, entry);
  }
  const baseDb = rejectionDb(t.signalGain, t.commonGain);
  const limiting = REJECTION_LIMIT_PARTS.filter((part) => (byPart.get(part)?.sensitivity ?? 0) > 0);
  const total = limiting.reduce((sum, part) => sum + byPart.get(part)!.sensitivity, 0);
  const offsettingParts = REJECTION_LIMIT_PARTS.filter((part) => part !== 'pair' && (byPart.get(part)?.sensitivity ?? 0) < 0 && elements.some((e) => e.part === part && e.capacitance.length > 0));
  const described = (part: RejectionLimitPart): RejectionLimit => {
    const { sensitivity, byElement } = byPart.get(part)!;
    const hasCapacitance = elements.some((e) => e.part === part && e.capacitance.length > 0);
    let withoutDb: number | null = null;
    if (hasCapacitance && omega > 0) {
      // the part's capacitances removed, its conductances kept
      const without = transfers(parts, omega, output, (e) => !(e.part === part && e.conductance.length === 0));
      withoutDb = rejectionDb(without.signalGain, without.commonGain);
    }
    // the elements that carry the part (at least ELEMENT_SHOWN_FRACTION of it), largest first
    const shownElements = [...byElement.entries()]
      .filter(([, s]) => s / sensitivity >= ELEMENT_SHOWN_FRACTION)
      .sort((a, b) => Math.abs(b[1]) - Math.abs(a[1]))
      .map(([element]) => element);
    return { part, elements: shownElements, sharePercent: (100 * sensitivity) / total, sensitivity, rejectionWithoutDb: withoutDb };
  };
  const limits = limiting.map(described).sort((a, b) => b.sharePercent - a.sharePercent);
  const offsetting = offsettingParts.map(described).sort((a, b) => a.sharePercent - b.sharePercent);
  return { frequencyHz, output, conditionLabel, rejectionDb: baseDb, limits, offsetting };
}

/**
 * The tail's own impedance at a frequency, ohms: its elements alone (resistors, transistors with
 * their junction and diffusion capacitances, the wiring capacitance), a unit AC current into the
 * tail node. At 0 Hz it is the tail output resistance.
 */
export function tailImpedanceOhm(solved: SolvedCircuit, frequencyHz: number): number {
  const parts = circuitElements(solved);
  const { ic, elements } = parts;
  const n = ic.freeNodes.length;
  const tailParts = new Set<RejectionLimitPart>(['tail-resistance', 'tail-base-collector', 'tail-collector-substrate', 'tail-base-emitter', 'tail-wiring']);
  // nothing in the tail stores charge: its impedance is its output resistance at every frequency
  if (!elements.some((e) => tailParts.has(e.part) && e.capacitance.length > 0)) return solved.stage.tailOutputResistanceOhm;
  const m = nodeMatrix(ic, elements, 2 * Math.PI * frequencyHz, (e) => tailParts.has(e.part));
  // Nodes the tail does not touch get a unit diagonal so the system stays regular; they decouple.
  for (let k = 0; k < n; k += 1) {
    let empty = true;
    for (let c = 0; c < n && empty; c += 1) if (m.re[k * n + c] !== 0 || m.im[k * n + c] !== 0) empty = false;
    if (empty) m.re[k * n + k] = 1;
  }
  const unit = { re: new Array<number>(n).fill(0), im: new Array<number>(n).fill(0) };
  const tail = ic.nodeRef(TAIL_NODE);
  unit.re[tail] = 1;
  const [z] = solveComplex(m.re, m.im, n, [unit]);
  return Math.hypot(z.re[tail], z.im[tail]);
}
