/**
 * Small-signal analysis of the whole stage at its operating point: the Jacobian of the node
 * equations is the conductance matrix G, every transistor at its own bias (gm, rπ and ro in
 * SPICE's form, GMIN included). The stored charge is the capacitance matrix C: each
 * transistor's junction and diffusion capacitances at its bias (junction-charges.ts, on its
 * internal nodes when the model has RB, RC, RE; the substrate at the negative rail), plus the
 * circuit's capacitors (tail wiring, loads). At a frequency f the responses solve
 * (G + j·2πf·C)·x = −(G_fixed + j·2πf·C_fixed)·drive, as SPICE's AC analysis does
 * [SPICE] ngspice bjtacld.c, through a reduction made once per operating point
 * (frequency-response.ts). At f = 0, or when nothing stores charge, the real low-frequency
 * responses are the answer.
 */
import { COLLECTOR_NODES, RAIL_NODES, TAIL_NODE } from './circuit';
import { readOutput, reducedFrequencyModel, transfersAtOmega, type FrequencyModel, type OutputWeights } from './frequency-response';
import { chargeParametersOf, transistorCapacitances } from './junction-charges';
import type { BjtParameters } from './bjt-parameters';
import { luFactor, luSolve, zeros } from './linear-solve';
import {
  createStamp,
  junctionVoltages,
  stampConductance,
  stampControlled,
  stampMosfet,
  stampTransistor,
  type IndexedCircuit,
  type NodeStamp,
} from './node-system';
import type { OperatingPoint } from './operating-point';

export interface Complex {
  re: number;
  im: number;
}

export type { OutputWeights } from './frequency-response';

/** The contract's four transfers at one frequency: differential drive to c1 − c2 and to c1, common-mode drive to c1 and to c1 − c2. */
export interface StageTransfers {
  differentialGain: Complex;
  singleEndedGain: Complex;
  commonModeGain: Complex;
  differentialCommonModeGain: Complex;
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
  /** The transfers at f = 0 (real). */
  low: StageTransfers;
  /** Node responses to 1 V on each rail (the other rail and the drives held), at low frequency: supply rejection. */
  supply: { positive: number[]; negative: number[] };
  /** The two drive nodes (fixed nodes), where the differential drive puts +½ and −½. */
  driveNodes: readonly [string, string];
  /**
   * The reduced model the transfers at any frequency come from (drives: differential, common
   * mode; outputs: c1, c1 − c2); null when nothing in the circuit stores charge.
   */
  frequency: FrequencyModel | null;
  /**
   * The transfers already solved, by frequency (Hz). The stage is never changed after it is
   * built, so a frequency's transfers stay what they were: the corner searches' grid points and
   * the `ac` entries or a rejection read twice at one frequency are solved once.
   */
  solvedAt: Map<number, StageTransfers>;
}

/** Where each transfer sits in the reduced model: its drive (0 differential, 1 common mode) and output (0 c1, 1 c1 − c2). */
export const TRANSFER_PARTS: Readonly<Record<keyof StageTransfers, { drive: number; output: number }>> = {
  differentialGain: { drive: 0, output: 1 },
  singleEndedGain: { drive: 0, output: 0 },
  commonModeGain: { drive: 1, output: 0 },
  differentialCommonModeGain: { drive: 1, output: 1 },
};

/** The two drives, in the order of the reduced model: differential (+½, −½) and common mode (1, 1), V. */
const DRIVES: readonly (readonly [number, number])[] = [
  [0.5, -0.5],
  [1, 1],
];

/** The conductance matrix G of the stage at its operating point (the Jacobian of its node equations); `onlyTail`: the tail's elements alone. */
export function stampJacobian(op: OperatingPoint, onlyTail: boolean): NodeStamp {
  const ic = op.circuit;
  const stamp = createStamp(ic);
  for (const r of ic.resistors) if (!onlyTail || r.tail) stampConductance(stamp, r.a, r.b, r.conductanceS);
  ic.transistors.forEach((q, i) => {
    if (!onlyTail || q.tail) stampTransistor(stamp, q, op.transistors[i], 0, 0);
  });
  ic.mosfets.forEach((m, i) => {
    if (!onlyTail || m.tail) stampMosfet(stamp, m, op.mosfets[i], 0, 0, 0);
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
 * substrate junction's node to the substrate), and the circuit's capacitors. Null when all are zero.
 */
export function capacitanceStamp(op: OperatingPoint, parameters: BjtParameters | null, temperatureC: number): NodeStamp | null {
  const ic = op.circuit;
  const stamp = createStamp(ic);
  let any = false;
  for (const cap of ic.capacitors) {
    if (cap.capacitanceF === 0) continue;
    stampConductance(stamp, cap.a, cap.b, cap.capacitanceF);
    any = true;
  }
  const charges = chargeParametersOf(ic.transistors, parameters, temperatureC);
  const v = op.voltagesV;
  for (let k = 0; k < ic.transistors.length; k += 1) {
    const q = ic.transistors[k];
    const own = charges[k];
    if (!own || own.none) continue;
    // the junctions sit on the internal nodes (behind RB, RC, RE), the substrate junction on `sc`
    const { bi: b, ci: c, ei: e, s, sc } = q;
    // the transport terms of the device's own evaluation at the solution (the transistor's own model when it has one)
    const caps = transistorCapacitances(own, op.transistors[k], junctionVoltages(ic, v, q), q.area);
    if (caps.baseEmitterF !== 0) stampConductance(stamp, b, e, caps.baseEmitterF);
    if (caps.baseCollectorF !== 0) stampConductance(stamp, b, c, caps.baseCollectorF);
    if (caps.collectorSubstrateF !== 0) stampConductance(stamp, sc, s, caps.collectorSubstrateF);
    // d(qbe)/d(vbc): a current jω·C·vbc leaving the internal base into the internal emitter
    if (caps.baseEmitterPerVbcF !== 0) stampControlled(stamp, b, e, b, c, caps.baseEmitterPerVbcF);
    any = true;
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
  const factors = luFactor(stamper.matrix, n, true);
  const tailIndex = ic.nodeRef(TAIL_NODE);
  const c1 = ic.nodeRef(COLLECTOR_NODES[0]);
  const c2 = ic.nodeRef(COLLECTOR_NODES[1]);
  const outputs = { collector1: { nodes: [c1], weights: [1] }, betweenCollectors: { nodes: [c1, c2], weights: [1, -1] } };
  const differential = driveResponse(gDrive, factors, 0.5, -0.5);
  const commonMode = driveResponse(gDrive, factors, 1, 1);
  const railColumns = driveColumns(ic, stamper, [RAIL_NODES.positive, RAIL_NODES.negative]);
  const supply = { positive: driveResponse(railColumns, factors, 1, 0), negative: driveResponse(railColumns, factors, 0, 1) };
  // The reduced frequency model, built when a figure first reads it (many solves read only the
  // low-frequency responses: an offset's screening, a sweep's gain): the factors it reads are
  // the Jacobian's, never changed after this
  let frequency: FrequencyModel | null | undefined;
  const frequencyModel = (): FrequencyModel | null => {
    const cStamp = capacitanceStamp(op, parameters, temperatureC);
    if (!cStamp) return null;
    const cDrive = driveColumns(ic, cStamp, driveNodes);
    const capacitiveDrives = DRIVES.map(([d1, d2]) => {
      const column = cDrive[0].map((x, row) => x * d1 + cDrive[1][row] * d2);
      return column.some((x) => x !== 0) ? column : null;
    });
    return reducedFrequencyModel(factors, cStamp.matrix, [differential, commonMode], capacitiveDrives, [outputs.collector1, outputs.betweenCollectors]);
  };
  return {
    outputs,
    differential,
    commonMode,
    tailIndex,
    index: ic.nodeRef,
    tailOutputResistanceOhm: tailOutputResistanceOhm(op, tailIndex),
    low: {
      differentialGain: { re: readOutput(differential, outputs.betweenCollectors), im: 0 },
      singleEndedGain: { re: readOutput(differential, outputs.collector1), im: 0 },
      commonModeGain: { re: readOutput(commonMode, outputs.collector1), im: 0 },
      differentialCommonModeGain: { re: readOutput(commonMode, outputs.betweenCollectors), im: 0 },
    },
    supply,
    driveNodes,
    get frequency() {
      if (frequency === undefined) frequency = frequencyModel();
      return frequency;
    },
    solvedAt: new Map(),
  };
}

/**
 * The small-signal current (A) flowing from node `node` into the circuit's elements, for a
 * response `x` of the free nodes and the fixed nodes' own small-signal values `fixed(ref)` (the
 * drives, 0 for a held node): every resistor's g·Δv and every transistor's linearised terminal
 * currents, ic = ∂IC/∂VBE·vbe + ∂IC/∂VBC·vbc and ib likewise at its internal nodes, at low
 * frequency. The same bookkeeping as the DC currents (KCL), on the Jacobian's terms.
 */
export function smallSignalCurrentIntoA(op: OperatingPoint, node: number, x: readonly number[], fixed: (ref: number) => number): number {
  const ic = op.circuit;
  const at = (ref: number) => (ref >= 0 ? x[ref] : fixed(ref));
  let totalA = 0;
  for (const r of ic.resistors) {
    const ia = (at(r.a) - at(r.b)) * r.conductanceS;
    if (r.a === node) totalA += ia;
    if (r.b === node) totalA -= ia;
  }
  ic.transistors.forEach((q, k) => {
    if (q.ci !== node && q.bi !== node && q.ei !== node) return;
    const ev = op.transistors[k];
    const vbe = at(q.bi) - at(q.ei);
    const vbc = at(q.bi) - at(q.ci);
    const icA = ev.dIcDVbeS * vbe + ev.dIcDVbcS * vbc;
    const ibA = ev.dIbDVbeS * vbe + ev.dIbDVbcS * vbc;
    if (q.ci === node) totalA += icA;
    if (q.bi === node) totalA += ibA;
    if (q.ei === node) totalA -= icA + ibA;
  });
  ic.mosfets.forEach((m, k) => {
    if (m.d !== node && m.s !== node && m.b !== node) return;
    const ev = op.mosfets[k];
    const vgs = at(m.g) - at(m.s);
    const vds = at(m.d) - at(m.s);
    const vbs = at(m.b) - at(m.s);
    const channelA = ev.dChannelDVgsS * vgs + ev.dChannelDVdsS * vds + ev.dChannelDVbsS * vbs;
    const bulkDrainA = ev.bulkDrainS * (vbs - vds);
    const bulkSourceA = ev.bulkSourceS * vbs;
    if (m.d === node) totalA += channelA - bulkDrainA;
    if (m.s === node) totalA -= channelA + bulkSourceA;
    if (m.b === node) totalA += bulkDrainA + bulkSourceA;
  });
  return totalA;
}

/** Resolves named output weights to node indexes once. */
export function outputWeights(stage: SmallSignalStage, weights: Record<string, number>): OutputWeights {
  const names = Object.keys(weights);
  return { nodes: names.map((n) => stage.index(n)), weights: names.map((n) => weights[n]) };
}

/** The four transfers at a frequency (Hz): the low-frequency ones at f = 0 or when nothing stores charge. */
export function stageTransfersAt(stage: SmallSignalStage, frequencyHz: number): StageTransfers {
  if (!stage.frequency || frequencyHz === 0) return stage.low;
  const solved = stage.solvedAt.get(frequencyHz);
  if (solved) return solved;
  const t = transfersAtOmega(stage.frequency, 2 * Math.PI * frequencyHz, stage.frequency.drives.length);
  const { differentialGain, singleEndedGain, commonModeGain, differentialCommonModeGain } = TRANSFER_PARTS;
  const transfers: StageTransfers = {
    differentialGain: t[differentialGain.drive][differentialGain.output],
    singleEndedGain: t[singleEndedGain.drive][singleEndedGain.output],
    commonModeGain: t[commonModeGain.drive][commonModeGain.output],
    differentialCommonModeGain: t[differentialCommonModeGain.drive][differentialCommonModeGain.output],
  };
  stage.solvedAt.set(frequencyHz, transfers);
  return transfers;
}

/** Magnitude of a complex number. */
export function magnitude(z: Complex): number {
  return Math.hypot(z.re, z.im);
}
