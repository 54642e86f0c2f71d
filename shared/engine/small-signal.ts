/**
 * Small-signal analysis of the whole stage at its operating point: the Jacobian of the node
 * equations is the conductance matrix G, every transistor at its own bias (gm, rπ and ro in
 * SPICE's form, GMIN included). The stored charge is the capacitance matrix C: each
 * transistor's junction and diffusion capacitances at its bias (junction-charges.ts, on its
 * internal nodes when the model has RB, RC, RE; the substrate at the negative rail), plus the
 * circuit's capacitors (tail wiring, loads). At a frequency f the responses solve
 * (G + j·2πf·C)·x = −(G_fixed + j·2πf·C_fixed)·drive, as SPICE's AC analysis does
 * [SPICE] ngspice bjtacld.c. At f = 0, or when nothing stores charge, the real low-frequency
 * responses are the answer.
 */
import { COLLECTOR_NODES, TAIL_NODE } from './circuit';
import { solveComplex, type ComplexVector } from './complex-solve';
import { chargeParameters, transistorCapacitances } from './junction-charges';
import type { BjtParameters } from './bjt-parameters';
import { luFactor, luSolve, zeros } from './linear-solve';
import {
  createStamp,
  nodeVoltage,
  stampConductance,
  stampControlled,
  stampTransistor,
  type IndexedCircuit,
  type NodeStamp,
} from './node-system';
import type { OperatingPoint } from './operating-point';

export interface Complex {
  re: number;
  im: number;
}

/** The stage's reactive part: G and C with their drive columns (row-major n × n, columns of length n). */
export interface ReactiveStage {
  n: number;
  conductance: number[];
  capacitance: number[];
  /** Coefficients of the two drive nodes in G and C (currents leaving each free node per volt of drive). */
  conductanceDrive: [number[], number[]];
  capacitanceDrive: [number[], number[]];
}

/** Node responses to the two drives at low frequency, and what the frequency solve needs. */
export interface SmallSignalStage {
  /** Response to v(drive1) = +½, v(drive2) = −½ (differential drive of 1 V), at low frequency. */
  differential: number[];
  /** Response to v(drive1) = v(drive2) = 1 (common-mode drive of 1 V), at low frequency. */
  commonMode: number[];
  /** Index of the tail node and a lookup of free nodes. */
  tailIndex: number;
  index(node: string): number;
  /** Tail output resistance seen from t with t held at its operating point, ohms. */
  tailOutputResistanceOhm: number;
  /** The outputs the contract names: c1 alone and c1 − c2. */
  outputs: { collector1: OutputWeights; betweenCollectors: OutputWeights };
  /** G and C for the frequency solve; null when nothing in the circuit stores charge. */
  reactive: ReactiveStage | null;
}

/** The drive responses at one frequency. */
export interface StageResponses {
  differential: ComplexVector;
  commonMode: ComplexVector;
}

function stampJacobian(op: OperatingPoint, onlyTail: boolean): NodeStamp {
  const ic = op.circuit;
  const stamp = createStamp(ic);
  for (const r of ic.resistors) if (!onlyTail || r.tail) stampConductance(stamp, r.a, r.b, r.conductanceS);
  ic.transistors.forEach((q, i) => {
    if (!onlyTail || q.tail) stampTransistor(stamp, q, op.transistors[i], 0, 0);
  });
  return stamp;
}

/** The drive nodes' columns of a stamp's fixed-node coefficients. */
function driveColumns(ic: IndexedCircuit, stamp: NodeStamp, driveNodes: readonly [string, string]): [number[], number[]] {
  const n = stamp.n;
  const nFixed = ic.fixedNodes.length;
  return driveNodes.map((name) => {
    const k = -ic.nodeRef(name) - 1;
    const column = zeros(n);
    for (let row = 0; row < n; row += 1) column[row] = stamp.fixedColumns[row * nFixed + k];
    return column;
  }) as [number[], number[]];
}

/** Response to AC amplitudes on the two drive nodes (volts): solves G·x = −G_drive·drive. */
function driveResponse(columns: [number[], number[]], factors: ReturnType<typeof luFactor>, drive1V: number, drive2V: number): number[] {
  const n = columns[0].length;
  const rhs = zeros(n);
  for (let row = 0; row < n; row += 1) rhs[row] = -columns[0][row] * drive1V - columns[1][row] * drive2V;
  return luSolve(factors, rhs);
}

/** Tail output resistance: the tail's elements alone, unit current into t, at the operating point. */
function tailOutputResistanceOhm(op: OperatingPoint, tailIndex: number): number {
  const stamper = stampJacobian(op, true);
  const n = stamper.n;
  // Nodes the tail does not touch get a unit diagonal so the system stays regular; they decouple.
  for (let k = 0; k < n; k += 1) {
    let empty = true;
    for (let c = 0; c < n && empty; c += 1) if (stamper.matrix[k * n + c] !== 0) empty = false;
    if (empty) stamper.matrix[k * n + k] = 1;
  }
  const e = zeros(n);
  e[tailIndex] = 1;
  return luSolve(luFactor(stamper.matrix, n, true), e)[tailIndex];
}

/**
 * The capacitance matrix: every transistor's capacitances at its bias [SPICE] ngspice bjtacld.c
 * (CBE between internal base and emitter, CBC between internal base and collector, the
 * forward charge's vbc dependence as a transcapacitance from base to emitter, CCS from the
 * internal collector to the substrate), and the circuit's capacitors. Null when all are zero.
 */
function capacitanceStamp(op: OperatingPoint, parameters: BjtParameters | null, temperatureC: number): NodeStamp | null {
  const ic = op.circuit;
  const stamp = createStamp(ic);
  let any = false;
  for (const cap of ic.capacitors) {
    if (cap.capacitanceF === 0) continue;
    stampConductance(stamp, cap.a, cap.b, cap.capacitanceF);
    any = true;
  }
  const charges = parameters ? chargeParameters(parameters, temperatureC) : null;
  if (parameters && charges && !charges.none) {
    const v = op.voltagesV;
    ic.transistors.forEach((q, k) => {
      // the junctions sit on the internal nodes (behind RB, RC, RE), the substrate at the negative rail
      const { bi: b, ci: c, ei: e, s } = q;
      const vb = nodeVoltage(ic, v, b);
      const vc = nodeVoltage(ic, v, c);
      // the transport terms of the device's own evaluation at the solution (the transistor's own model when it has one)
      const bias = { ...op.transistors[k], vbeV: vb - nodeVoltage(ic, v, e), vbcV: vb - vc, vsubV: nodeVoltage(ic, v, s) - vc };
      const caps = transistorCapacitances(charges, bias, q.area);
      if (caps.baseEmitterF !== 0) stampConductance(stamp, b, e, caps.baseEmitterF);
      if (caps.baseCollectorF !== 0) stampConductance(stamp, b, c, caps.baseCollectorF);
      if (caps.collectorSubstrateF !== 0) stampConductance(stamp, c, s, caps.collectorSubstrateF);
      // d(qbe)/d(vbc): a current jω·C·vbc leaving the internal base into the internal emitter
      if (caps.baseEmitterPerVbcF !== 0) stampControlled(stamp, b, e, b, c, caps.baseEmitterPerVbcF);
      any = true;
    });
  }
  return any ? stamp : null;
}

/**
 * Builds the small-signal responses of a stage at its operating point. `parameters`: the
 * device's full parameter set (resolvedParameters(cardOf(device))), for its stored charge;
 * `driveNodes`: where the drive is applied (StageCircuit.driveNodes).
 */
export function smallSignalStage(
  op: OperatingPoint,
  driveNodes: readonly [string, string],
  parameters: BjtParameters | null = null,
  temperatureC = 27,
): SmallSignalStage {
  const ic = op.circuit;
  const stamper = stampJacobian(op, false);
  const n = stamper.n;
  const gDrive = driveColumns(ic, stamper, driveNodes);
  const cStamp = capacitanceStamp(op, parameters, temperatureC);
  const reactive: ReactiveStage | null = cStamp
    ? { n, conductance: stamper.matrix.slice(), capacitance: cStamp.matrix, conductanceDrive: gDrive, capacitanceDrive: driveColumns(ic, cStamp, driveNodes) }
    : null;
  const factors = luFactor(stamper.matrix, n, true);
  const tailIndex = ic.nodeRef(TAIL_NODE);
  const c1 = ic.nodeRef(COLLECTOR_NODES[0]);
  const c2 = ic.nodeRef(COLLECTOR_NODES[1]);
  return {
    outputs: { collector1: { nodes: [c1], weights: [1] }, betweenCollectors: { nodes: [c1, c2], weights: [1, -1] } },
    differential: driveResponse(gDrive, factors, 0.5, -0.5),
    commonMode: driveResponse(gDrive, factors, 1, 1),
    tailIndex,
    index: (node) => ic.nodeRef(node),
    tailOutputResistanceOhm: tailOutputResistanceOhm(op, tailIndex),
    reactive,
  };
}

/** An output as weights on collector-side free nodes, e.g. {c1: 1, c2: −1} for c1 − c2. */
export interface OutputWeights {
  nodes: number[];
  weights: number[];
}

/** Resolves named output weights to node indexes once. */
export function outputWeights(stage: SmallSignalStage, weights: Record<string, number>): OutputWeights {
  const names = Object.keys(weights);
  return { nodes: names.map((n) => stage.index(n)), weights: names.map((n) => weights[n]) };
}

/** The differential and common-mode responses at a frequency (Hz): one complex factorisation for both. */
export function responsesAt(stage: SmallSignalStage, frequencyHz: number): StageResponses {
  const reactive = stage.reactive;
  if (!reactive || frequencyHz === 0) {
    const n = stage.differential.length;
    return { differential: { re: stage.differential, im: zeros(n) }, commonMode: { re: stage.commonMode, im: zeros(n) } };
  }
  const { n, conductance, capacitance, conductanceDrive: g, capacitanceDrive: c } = reactive;
  const omega = 2 * Math.PI * frequencyHz;
  const aRe = conductance.slice();
  const aIm = new Array<number>(n * n);
  for (let k = 0; k < n * n; k += 1) aIm[k] = omega * capacitance[k];
  const drive = (d1: number, d2: number): ComplexVector => {
    const re = zeros(n);
    const im = zeros(n);
    for (let row = 0; row < n; row += 1) {
      re[row] = -(g[0][row] * d1 + g[1][row] * d2);
      im[row] = -omega * (c[0][row] * d1 + c[1][row] * d2);
    }
    return { re, im };
  };
  const [differential, commonMode] = solveComplex(aRe, aIm, n, [drive(0.5, -0.5), drive(1, 1)]);
  return { differential, commonMode };
}

/** A transfer to an output from a response. */
export function transferOf(response: ComplexVector, output: OutputWeights): Complex {
  let re = 0;
  let im = 0;
  for (let k = 0; k < output.nodes.length; k += 1) {
    re += output.weights[k] * response.re[output.nodes[k]];
    im += output.weights[k] * response.im[output.nodes[k]];
  }
  return { re, im };
}

/** Magnitude of a complex number. */
export function magnitude(z: Complex): number {
  return Math.hypot(z.re, z.im);
}
