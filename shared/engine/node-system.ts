/**
 * Nodal analysis of a stage circuit: index the free nodes, stamp resistors and transistors
 * (linearised at junction voltages) into the node conductance matrix. Shared by the DC
 * operating-point solve (Newton) and the small-signal solve (the Jacobian at the solution).
 */
import { isMosfet, isTransistor, type StageCircuit, type TransistorElement } from './circuit';
import { GMIN_S } from './constants';
import type { BjtEval, DeviceModel, OhmicResistances } from './device';
import type { MosEval, MosModel } from './mos-device';
import { zeros } from './linear-solve';

/** A node reference: index ≥ 0 is a free node, index < 0 is fixed node −index − 1. */
export type NodeRef = number;

export interface IndexedResistor {
  name: string;
  a: NodeRef;
  b: NodeRef;
  conductanceS: number;
  tail: boolean;
  /**
   * Set on the GMIN from an internal collector to the substrate: part of ngspice's junction
   * model, not a resistor, so it carries no thermal noise [SPICE] ngspice bjtnoise.c.
   */
  noiseless?: true;
}

export interface IndexedTransistor {
  name: string;
  /** External terminals: the circuit's nodes. */
  c: NodeRef;
  b: NodeRef;
  e: NodeRef;
  /**
   * Internal nodes c', b', e' where the junctions sit, behind RC, RB, RE (ngspice's colPrime,
   * basePrime, emitPrime); the external node itself when that resistance is 0 [SPICE].
   */
  ci: NodeRef;
  bi: NodeRef;
  ei: NodeRef;
  /** Substrate terminal (the negative rail in every stage). */
  s: NodeRef;
  /**
   * The node the substrate junction (its GMIN, its capacitance CJS) meets: the internal collector
   * of an NPN (vertical), the internal base of a PNP (lateral), as ngspice places it by default
   * for each type (BJTsubs) [SPICE]; measured on both ngspice builds with a PNP card's CJS.
   */
  sc: NodeRef;
  /** +1 for an NPN, −1 for a PNP: the model sees polarity × each junction voltage and gives polarity × each current [SPICE]. */
  polarity: 1 | -1;
  area: number;
  tail: boolean;
  /** The transistor's own model where it differs from the stage's (a mismatched BF or VAF). */
  model?: DeviceModel;
}

export interface IndexedMosfet {
  name: string;
  d: NodeRef;
  g: NodeRef;
  s: NodeRef;
  /** Body (bulk) terminal. */
  b: NodeRef;
  /** +1 for an NMOS, −1 for a PMOS (the model's own `polarity`). */
  polarity: 1 | -1;
  widthM: number;
  lengthM: number;
  tail: boolean;
  /** Its level-1 model at the stage's temperature. */
  model: MosModel;
}

export interface IndexedCapacitor {
  name: string;
  a: NodeRef;
  b: NodeRef;
  capacitanceF: number;
}

export interface IndexedCircuit {
  freeNodes: string[];
  fixedNodes: string[];
  fixedV: number[];
  resistors: IndexedResistor[];
  transistors: IndexedTransistor[];
  /** MOSFETs of the circuit (none in a bipolar stage). */
  mosfets: IndexedMosfet[];
  /** Capacitors of the circuit (tail, load): open at DC, part of the small-signal solve. */
  capacitors: IndexedCapacitor[];
  /** For each free node that is a transistor's internal node, its external terminal (else undefined). */
  terminalOf: (NodeRef | undefined)[];
  nodeRef(name: string): NodeRef;
}

/** No ohmic resistances: every junction at its terminal. */
// Stryker disable next-line ObjectLiteral: equivalent, an absent resistance reads as none (`!(r > 0)` below)
const NO_OHMIC: OhmicResistances = { baseOhm: 0, emitterOhm: 0, collectorOhm: 0 };

/**
 * Indexes the circuit's nodes: fixed ones from `fixedNodesV`, every other node is free. With
 * ohmic resistances each transistor gets internal nodes (`Q1:c'`, …) joined to its terminals by
 * RC/A, RB/A, RE/A (A its area), and, as ngspice's substrate junction with ISS = 0, GMIN from
 * its internal collector to the substrate at the negative rail [SPICE] ngspice bjtload.c.
 * `ownModels`: models of transistors that differ from the stage's, by name (a mismatched pair
 * transistor's BF or VAF, a PNP's whole card with its own RB, RE, RC). `mosModels`: every
 * MOSFET's model, by name (a MOSFET without one is refused).
 */
export function indexCircuit(
  circuit: StageCircuit,
  ohmic: OhmicResistances = NO_OHMIC,
  ownModels: Readonly<Record<string, DeviceModel>> = {},
  mosModels: Readonly<Record<string, MosModel>> = {},
): IndexedCircuit {
  const fixedNodes = Object.keys(circuit.fixedNodesV);
  const fixedV = fixedNodes.map((n) => circuit.fixedNodesV[n]);
  const table: NodeTable = { refs: new Map(), freeNodes: [], terminalOf: [] };
  fixedNodes.forEach((n, i) => table.refs.set(n, -i - 1));
  const resistors: IndexedResistor[] = [];
  const transistors: IndexedTransistor[] = [];
  const capacitors: IndexedCapacitor[] = [];
  const mosfets: IndexedMosfet[] = [];
  for (const el of circuit.elements) {
    if (el.kind === 'resistor') {
      resistors.push({ name: el.name, a: refOf(table, el.nodes[0]), b: refOf(table, el.nodes[1]), conductanceS: 1 / el.resistanceOhm, tail: el.part === 'tail' });
    } else if (isTransistor(el)) {
      const tail = el.part === 'tail';
      const own = ownModels[el.name];
      // a transistor's own card (a PNP's) brings its own RB, RE, RC
      const resistances = own?.ohmic ?? ohmic;
      const c = refOf(table, el.collector);
      const b = refOf(table, el.base);
      const e = refOf(table, el.emitter);
      const ci = internalNode(table, resistors, el, c, 'c', resistances.collectorOhm);
      const bi = internalNode(table, resistors, el, b, 'b', resistances.baseOhm);
      const ei = internalNode(table, resistors, el, e, 'e', resistances.emitterOhm);
      const s = refOf(table, el.substrate);
      const polarity = el.kind === 'pnp' ? -1 : 1;
      const sc = polarity === 1 ? ci : bi;
      resistors.push({ name: `${el.name}.GSUB`, a: sc, b: s, conductanceS: GMIN_S, tail, noiseless: true });
      transistors.push({ name: el.name, c, b, e, ci, bi, ei, s, sc, polarity, area: el.area, tail, ...(own ? { model: own } : {}) });
    } else if (isMosfet(el)) {
      const model = mosModels[el.name];
      if (!model) throw new Error(`no model for MOSFET ${el.name}`);
      const polarity = el.kind === 'pmos' ? -1 : 1;
      if (model.polarity !== polarity) throw new Error(`MOSFET ${el.name} is ${el.kind.toUpperCase()} but its model is ${model.family.toUpperCase()}`);
      mosfets.push({
        name: el.name,
        d: refOf(table, el.drain),
        g: refOf(table, el.gate),
        s: refOf(table, el.source),
        b: refOf(table, el.body),
        polarity,
        widthM: el.widthM,
        lengthM: el.lengthM,
        tail: el.part === 'tail',
        model,
      });
    } else {
      capacitors.push({ name: el.name, a: refOf(table, el.nodes[0]), b: refOf(table, el.nodes[1]), capacitanceF: el.capacitanceF });
    }
  }
  const { refs, freeNodes } = table;
  return {
    freeNodes,
    fixedNodes,
    fixedV,
    resistors,
    transistors,
    mosfets,
    capacitors,
    terminalOf: freeNodes.map((_, k) => table.terminalOf[k]),
    nodeRef(name) {
      const r = refs.get(name);
      if (r === undefined) throw new Error(`no node ${name}`);
      return r;
    },
  };
}

/** The node table `indexCircuit` builds: every node's reference, the free nodes in order, internal nodes' terminals. */
interface NodeTable {
  refs: Map<string, NodeRef>;
  freeNodes: string[];
  terminalOf: (NodeRef | undefined)[];
}

/** A node's reference, a new free node when it is not in the table yet. */
function refOf(table: NodeTable, name: string): NodeRef {
  let r = table.refs.get(name);
  if (r === undefined) {
    r = table.freeNodes.length;
    table.freeNodes.push(name);
    table.refs.set(name, r);
  }
  return r;
}

/** A transistor's internal node behind an ohmic resistance (`Q1:c'` joined to its terminal by R/A), or the terminal itself when R is 0. */
function internalNode(table: NodeTable, resistors: IndexedResistor[], el: TransistorElement, terminal: NodeRef, suffix: string, resistanceOhm: number): NodeRef {
  if (!(resistanceOhm > 0)) return terminal;
  const node = refOf(table, `${el.name}:${suffix}'`);
  table.terminalOf[node] = terminal;
  resistors.push({ name: `${el.name}.R${suffix.toUpperCase()}`, a: terminal, b: node, conductanceS: el.area / resistanceOhm, tail: el.part === 'tail' });
  return node;
}

/** Voltage of a node given the free-node vector. */
export function nodeVoltage(ic: IndexedCircuit, v: readonly number[], node: NodeRef): number {
  return node >= 0 ? v[node] : ic.fixedV[-node - 1];
}

/**
 * KCL equations Σ (currents leaving a free node) = 0 in linear form J·v = rhs over the free
 * nodes; fixed-node terms move to the right-hand side, and their coefficients are kept in
 * `fixedColumns` (row-major n × fixed) for small-signal drives. Buffers are reused: `copyStamp`.
 */
export interface NodeStamp {
  n: number;
  nFixed: number;
  matrix: number[];
  rhs: number[];
  fixedColumns: number[];
  fixedV: number[];
}

export function createStamp(ic: IndexedCircuit): NodeStamp {
  const n = ic.freeNodes.length;
  const nFixed = ic.fixedNodes.length;
  return { n, nFixed, matrix: zeros(n * n), rhs: zeros(n), fixedColumns: zeros(n * nFixed), fixedV: ic.fixedV };
}

/** Copies one stamp's entries into another of the same circuit. */
export function copyStamp(from: NodeStamp, to: NodeStamp): void {
  for (let i = 0; i < from.matrix.length; i += 1) to.matrix[i] = from.matrix[i];
  for (let i = 0; i < from.rhs.length; i += 1) to.rhs[i] = from.rhs[i];
  for (let i = 0; i < from.fixedColumns.length; i += 1) to.fixedColumns[i] = from.fixedColumns[i];
}

/** Adds coefficient `g` of the voltage at `col` to the current leaving node `row`. */
function addCoefficient(stamp: NodeStamp, row: NodeRef, col: NodeRef, g: number): void {
  if (row < 0) return;
  if (col >= 0) stamp.matrix[row * stamp.n + col] += g;
  else {
    const k = -col - 1;
    stamp.fixedColumns[row * stamp.nFixed + k] += g;
    stamp.rhs[row] -= g * stamp.fixedV[k];
  }
}

/** Adds a controlled current g·(v(plus) − v(minus)) leaving node `from` and entering node `to`. */
export function stampControlled(stamp: NodeStamp, from: NodeRef, to: NodeRef, plus: NodeRef, minus: NodeRef, g: number): void {
  addCoefficient(stamp, from, plus, g);
  addCoefficient(stamp, from, minus, -g);
  addCoefficient(stamp, to, plus, -g);
  addCoefficient(stamp, to, minus, g);
}

/** Stamps a conductance between two nodes. */
export function stampConductance(stamp: NodeStamp, a: NodeRef, b: NodeRef, g: number): void {
  addCoefficient(stamp, a, a, g);
  addCoefficient(stamp, a, b, -g);
  addCoefficient(stamp, b, b, g);
  addCoefficient(stamp, b, a, -g);
}

/**
 * Stamps a transistor linearised at junction voltages (vbe0, vbc0, the model's: polarity × the
 * node differences) with evaluation `ev`: ic = ic0 + A·(vbe − vbe0) + B·(vbc − vbc0), ib
 * likewise, ie = −ic − ib. For a PNP the currents into the terminals are −ic, −ib and the model's
 * voltages −(vb − ve), −(vb − vc): the conductances are the NPN's, only the constant parts change
 * sign [SPICE] (ngspice bjtload.c multiplies them by the model's type).
 */
export function stampTransistor(stamp: NodeStamp, q: IndexedTransistor, ev: BjtEval, vbe0V: number, vbc0V: number): void {
  const a = ev.dIcDVbeS;
  const b = ev.dIcDVbcS;
  const c = ev.dIbDVbeS;
  const d = ev.dIbDVbcS;
  const icEqA = q.polarity * (ev.icA - a * vbe0V - b * vbc0V);
  const ibEqA = q.polarity * (ev.ibA - c * vbe0V - d * vbc0V);
  const qc = q.ci;
  const qb = q.bi;
  const qe = q.ei;
  // collector row: ic = A·(vb − ve) + B·(vb − vc) + icEq
  addCoefficient(stamp, qc, qb, a + b);
  addCoefficient(stamp, qc, qe, -a);
  addCoefficient(stamp, qc, qc, -b);
  if (qc >= 0) stamp.rhs[qc] -= icEqA;
  // base row
  addCoefficient(stamp, qb, qb, c + d);
  addCoefficient(stamp, qb, qe, -c);
  addCoefficient(stamp, qb, qc, -d);
  if (qb >= 0) stamp.rhs[qb] -= ibEqA;
  // emitter row: ie = −(ic + ib)
  addCoefficient(stamp, qe, qb, -(a + b + c + d));
  addCoefficient(stamp, qe, qe, a + c);
  addCoefficient(stamp, qe, qc, b + d);
  if (qe >= 0) stamp.rhs[qe] += icEqA + ibEqA;
}

/**
 * Junction voltages of a transistor as its model sees them (at its internal nodes, times its
 * polarity) at a node-voltage vector, and its substrate junction's vsub = v(substrate) − v(the
 * node it meets), which ngspice takes with the sign of type × BJTsubs, +1 for either default [SPICE].
 */
export function junctionVoltages(ic: IndexedCircuit, v: readonly number[], q: IndexedTransistor): { vbeV: number; vbcV: number; vsubV: number } {
  const vb = nodeVoltage(ic, v, q.bi);
  return {
    vbeV: q.polarity * (vb - nodeVoltage(ic, v, q.ei)),
    vbcV: q.polarity * (vb - nodeVoltage(ic, v, q.ci)),
    vsubV: nodeVoltage(ic, v, q.s) - nodeVoltage(ic, v, q.sc),
  };
}

/** The DC currents into a transistor's internal collector, base and emitter from its evaluation, A (polarity applied). */
export function terminalCurrentsA(q: IndexedTransistor, ev: BjtEval): { collectorA: number; baseA: number; emitterA: number } {
  const collectorA = q.polarity * ev.icA;
  const baseA = q.polarity * ev.ibA;
  return { collectorA, baseA, emitterA: -(collectorA + baseA) };
}

/** Evaluates every transistor at its junction voltages. */
export function evaluateTransistors(ic: IndexedCircuit, model: DeviceModel, v: number[]): BjtEval[] {
  return ic.transistors.map((q) => {
    const { vbeV, vbcV } = junctionVoltages(ic, v, q);
    return (q.model ?? model).evaluate(vbeV, vbcV, q.area);
  });
}

/** A MOSFET's terminal voltages vgs, vds, vbs (node differences, real polarity) at a node-voltage vector, V. */
export function mosfetVoltages(ic: IndexedCircuit, v: readonly number[], m: IndexedMosfet): { vgsV: number; vdsV: number; vbsV: number } {
  const vs = nodeVoltage(ic, v, m.s);
  return { vgsV: nodeVoltage(ic, v, m.g) - vs, vdsV: nodeVoltage(ic, v, m.d) - vs, vbsV: nodeVoltage(ic, v, m.b) - vs };
}

/**
 * Stamps a MOSFET linearised at terminal voltages vgs0, vds0, vbs0 (real polarity) with
 * evaluation `ev` there, as ngspice mos1load.c loads it [SPICE]: the channel current from drain
 * to source, id = id0 + ∂id/∂vgs·Δvgs + ∂id/∂vds·Δvds + ∂id/∂vbs·Δvbs, and each bulk junction,
 * from the body to the drain (its voltage vbd = vbs − vds) and to the source (vbs), as a
 * conductance with its constant part. The derivatives are the model's terminal ones (the
 * reversed device's included), the same for either polarity; only the currents carry its sign.
 */
export function stampMosfet(stamp: NodeStamp, m: IndexedMosfet, ev: MosEval, vgs0V: number, vds0V: number, vbs0V: number): void {
  const { d, g, s, b } = m;
  // channel: current into the drain terminal, out of the source terminal
  stampControlled(stamp, d, s, g, s, ev.dChannelDVgsS);
  stampControlled(stamp, d, s, d, s, ev.dChannelDVdsS);
  stampControlled(stamp, d, s, b, s, ev.dChannelDVbsS);
  const channelEqA = ev.channelA - ev.dChannelDVgsS * vgs0V - ev.dChannelDVdsS * vds0V - ev.dChannelDVbsS * vbs0V;
  if (d >= 0) stamp.rhs[d] -= channelEqA;
  if (s >= 0) stamp.rhs[s] += channelEqA;
  // bulk junctions: current from the body into the drain and into the source
  const vbd0V = vbs0V - vds0V;
  stampControlled(stamp, b, d, b, d, ev.bulkDrainS);
  const bulkDrainEqA = ev.bulkDrainA - ev.bulkDrainS * vbd0V;
  if (b >= 0) stamp.rhs[b] -= bulkDrainEqA;
  if (d >= 0) stamp.rhs[d] += bulkDrainEqA;
  stampControlled(stamp, b, s, b, s, ev.bulkSourceS);
  const bulkSourceEqA = ev.bulkSourceA - ev.bulkSourceS * vbs0V;
  if (b >= 0) stamp.rhs[b] -= bulkSourceEqA;
  if (s >= 0) stamp.rhs[s] += bulkSourceEqA;
}

/** The DC currents into a MOSFET's drain, gate, source and body from its evaluation, A. */
export function mosfetCurrentsA(ev: MosEval): { drainA: number; gateA: number; sourceA: number; bodyA: number } {
  return { drainA: ev.channelA - ev.bulkDrainA, gateA: 0, sourceA: -ev.channelA - ev.bulkSourceA, bodyA: ev.bulkDrainA + ev.bulkSourceA };
}

/** Evaluates every MOSFET at its terminal voltages. */
export function evaluateMosfets(ic: IndexedCircuit, v: readonly number[]): MosEval[] {
  return ic.mosfets.map((m) => {
    const { vgsV, vdsV, vbsV } = mosfetVoltages(ic, v, m);
    return m.model.evaluate(vgsV, vdsV, vbsV, m.widthM, m.lengthM);
  });
}
