/**
 * Small-signal analysis of the whole stage at its operating point: the Jacobian of the node
 * equations is the conductance matrix, every transistor at its own bias (gm, rπ and ro in
 * SPICE's form, GMIN included). The only reactive element is the tail capacitance Ct from the
 * tail node to ground; adding an admittance y at one node changes any transfer bilinearly
 * (Sherman–Morrison), so one factorisation gives every transfer at every frequency:
 *   H(y) = H0 − y·x[t]·z[out] / (1 + y·z[t]),  z = G⁻¹·e_t,  y = j·2π·f·Ct.
 */
import { COLLECTOR_NODES, INPUT_NODES, TAIL_NODE } from './circuit';
import { luFactor, luSolve, zeros } from './linear-solve';
import { createStamp, stampConductance, stampTransistor, type IndexedCircuit, type NodeStamp } from './node-system';
import type { OperatingPoint } from './operating-point';

export interface Complex {
  re: number;
  im: number;
}

/** Node responses to the two drives and to a unit current injected at the tail node. */
export interface SmallSignalStage {
  /** Response to v(in1) = +½, v(in2) = −½ (differential drive of 1 V). */
  differential: number[];
  /** Response to v(in1) = v(in2) = 1 (common-mode drive of 1 V). */
  commonMode: number[];
  /** Response to 1 A injected into the tail node: z = G⁻¹·e_t. */
  tailInjection: number[];
  /** Index of the tail node and a lookup of free nodes. */
  tailIndex: number;
  index(node: string): number;
  /** Tail output resistance seen from t with t held at its operating point, ohms. */
  tailOutputResistanceOhm: number;
  /** The outputs the contract names: c1 alone and c1 − c2. */
  outputs: { collector1: OutputWeights; betweenCollectors: OutputWeights };
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

/** Response to AC amplitudes on the two inputs (volts): solves G·x = −G_fixed·drive. */
function driveResponse(ic: IndexedCircuit, stamper: NodeStamp, factors: ReturnType<typeof luFactor>, in1V: number, in2V: number): number[] {
  const n = stamper.n;
  const nFixed = ic.fixedNodes.length;
  const k1 = -ic.nodeRef(INPUT_NODES[0]) - 1;
  const k2 = -ic.nodeRef(INPUT_NODES[1]) - 1;
  const rhs = zeros(n);
  for (let row = 0; row < n; row += 1) {
    rhs[row] = -stamper.fixedColumns[row * nFixed + k1] * in1V - stamper.fixedColumns[row * nFixed + k2] * in2V;
  }
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

/** Builds the small-signal responses of a stage at its operating point. */
export function smallSignalStage(op: OperatingPoint): SmallSignalStage {
  const ic = op.circuit;
  const stamper = stampJacobian(op, false);
  const factors = luFactor(stamper.matrix, stamper.n);
  const tailIndex = ic.nodeRef(TAIL_NODE);
  const unit = zeros(stamper.n);
  unit[tailIndex] = 1;
  const c1 = ic.nodeRef(COLLECTOR_NODES[0]);
  const c2 = ic.nodeRef(COLLECTOR_NODES[1]);
  return {
    outputs: { collector1: { nodes: [c1], weights: [1] }, betweenCollectors: { nodes: [c1, c2], weights: [1, -1] } },
    differential: driveResponse(ic, stamper, factors, 0.5, -0.5),
    commonMode: driveResponse(ic, stamper, factors, 1, 1),
    tailInjection: luSolve(factors, unit),
    tailIndex,
    index: (node) => ic.nodeRef(node),
    tailOutputResistanceOhm: tailOutputResistanceOhm(op, tailIndex),
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

/**
 * A transfer to an output from a drive response, at the tail admittance y = j·ω·Ct
 * (ωCt given as `omegaCtS`).
 */
export function transferAt(stage: SmallSignalStage, response: number[], output: OutputWeights, omegaCtS: number): Complex {
  let h0 = 0;
  let zOut = 0;
  for (let k = 0; k < output.nodes.length; k += 1) {
    const i = output.nodes[k];
    h0 += output.weights[k] * response[i];
    zOut += output.weights[k] * stage.tailInjection[i];
  }
  if (omegaCtS === 0) return { re: h0, im: 0 };
  // H = h0 − jw·p/(1 + jw·u), p = x[t]·z[out], u = z[t]
  const p = response[stage.tailIndex] * zOut;
  const u = stage.tailInjection[stage.tailIndex];
  const denom = 1 + omegaCtS * omegaCtS * u * u;
  return { re: h0 - (omegaCtS * omegaCtS * p * u) / denom, im: -(omegaCtS * p) / denom };
}

/** Magnitude of a complex number. */
export function magnitude(z: Complex): number {
  return Math.hypot(z.re, z.im);
}
