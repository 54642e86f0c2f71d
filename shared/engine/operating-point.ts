/**
 * DC operating point of a stage: Newton-Raphson on the node equations with SPICE's junction
 * voltage limiting (pnjlim) [SPICE], from a hand-analysis starting guess; when that does not
 * converge, continuation as SPICE does it [SPICE] (ngspice cktop.c): gmin stepping (a
 * conductance from every node to ground, lowered a decade at a time to none), then source
 * stepping (rails and inputs ramped up from zero, the step widened after each success and
 * narrowed after each failure).
 */
import type { StageCircuit } from './circuit';
import type { BjtEval, DeviceModel } from './device';
import type { MosEval, MosModel } from './mos-device';
import { luFactor, luSolve, zeros } from './linear-solve';
import {
  copyStamp,
  createStamp,
  evaluateMosfets,
  evaluateTransistors,
  indexCircuit,
  junctionVoltages,
  mosfetVoltages,
  nodeVoltage,
  stampConductance,
  stampMosfet,
  stampTransistor,
  type IndexedCircuit,
  type IndexedTransistor,
  type NodeStamp,
} from './node-system';

/** Convergence: every node moved less than this between iterations, V (far tighter than SPICE's 1 µV). */
const VOLTAGE_TOLERANCE_V = 1e-10;
/** Relative part of the voltage tolerance. */
const RELATIVE_TOLERANCE = 1e-11;
/**
 * A step this far below the one before it (a tenth) shows Newton in its quadratic phase, where
 * the next step is about the square of this one over the last (see `newtonSolve`).
 */
const QUADRATIC_CONTRACTION = 0.1;
/**
 * Only a step this small, V, is taken as quadratic (well under VT, where a junction's current
 * is linear in its voltage to 1e-5): after a large first step from a far start, the second is
 * small beside it without the iteration being quadratic yet.
 */
const QUADRATIC_STEP_V = 1e-7;
/** Newton iterations before giving up on one attempt. */
const MAX_ITERATIONS = 150;
/** Gmin stepping: the first shunt conductance from each node to ground, S, and the factor it falls by per step [SPICE]. */
const GMIN_START_S = 1e-2;
const GMIN_FACTOR = 10;
/** Gmin stepping stops at this shunt, then solves with none, S (ngspice's default GMIN). */
const GMIN_END_S = 1e-12;
/** Source stepping: first step (a share of the rails), its growth after a success and cut after a failure, smallest step before giving up. */
const SOURCE_FIRST_STEP = 0.05;
const SOURCE_STEP_GROWTH = 2;
const SOURCE_STEP_CUT = 4;
const SOURCE_MIN_STEP = 1e-4;

export interface OperatingPoint {
  circuit: IndexedCircuit;
  /** Free-node voltages, V. */
  voltagesV: number[];
  /** Each transistor's evaluation at the solution (same order as circuit.transistors). */
  transistors: BjtEval[];
  /** Each MOSFET's evaluation at the solution (same order as circuit.mosfets; empty in a bipolar stage). */
  mosfets: MosEval[];
  iterations: number;
}

/** Raised when the Newton iteration does not converge even with gmin and source stepping. */
export class ConvergenceError extends Error {
  /** JSON paths of the design fields that make the design hard to solve (empty when not known). */
  readonly fields: string[];

  constructor(message: string, fields: string[] = []) {
    super(message);
    this.name = 'ConvergenceError';
    this.fields = fields;
  }
}

/** SPICE's pnjlim: limits a junction's step so exp() stays tame [SPICE]. */
export function limitJunctionV(newV: number, oldV: number, vtV: number, criticalV: number): number {
  if (newV > criticalV && Math.abs(newV - oldV) > 2 * vtV) {
    if (oldV > 0) {
      const arg = 1 + (newV - oldV) / vtV;
      return arg > 0 ? oldV + vtV * Math.log(arg) : criticalV;
    }
    return vtV * Math.log(newV / vtV);
  }
  return newV;
}

/**
 * SPICE's fetlim: limits a step of a MOSFET's gate–source voltage (the model's sign) around its
 * threshold `vtoV`, so Newton does not jump across cut-off and back [SPICE] ngspice devsup.c
 * (DEVfetlim, with its present vtstlo = |vold − vto| + 1).
 */
export function limitGateV(newV: number, oldV: number, vtoV: number): number {
  const vtsthi = Math.abs(2 * (oldV - vtoV)) + 2;
  const vtstlo = Math.abs(oldV - vtoV) + 1;
  const vtox = vtoV + 3.5;
  const delv = newV - oldV;
  if (oldV >= vtoV) {
    if (oldV >= vtox) {
      if (delv <= 0) {
        // going off
        if (newV >= vtox) return -delv > vtstlo ? oldV - vtstlo : newV;
        return Math.max(newV, vtoV + 2);
      }
      // staying on
      return delv >= vtsthi ? oldV + vtsthi : newV;
    }
    // the middle region
    return delv <= 0 ? Math.max(newV, vtoV - 0.5) : Math.min(newV, vtoV + 4);
  }
  // off
  if (delv <= 0) return -delv > vtsthi ? oldV - vtsthi : newV;
  const vtemp = vtoV + 0.5;
  if (newV <= vtemp) return delv > vtstlo ? oldV + vtstlo : newV;
  return vtemp;
}

/** SPICE's limvds: limits a step of a MOSFET's drain–source voltage (the model's sign) [SPICE] ngspice devsup.c (DEVlimvds). */
export function limitDrainV(newV: number, oldV: number): number {
  if (oldV >= 3.5) {
    if (newV > oldV) return Math.min(newV, 3 * oldV + 2);
    return newV < 3.5 ? Math.max(newV, 2) : newV;
  }
  return newV > oldV ? Math.min(newV, 4) : Math.max(newV, -0.5);
}

/** A MOSFET's last limited voltages in the model's sign (×polarity), V: vgs, vds, vbs, and its threshold `von` there. */
interface MosfetState {
  vgsV: number;
  vdsV: number;
  vbsV: number;
  vonV: number;
}

/**
 * One MOSFET's voltages for this iteration, limited as ngspice mos1load.c does [SPICE]: in the
 * model's sign, fetlim on vgs (vgd when the device conducts reversed) around the last threshold,
 * limvds on vds, pnjlim on the forward-biasing bulk junction (vbs, or vbd reversed). Returns the
 * real-polarity voltages and whether any was limited; the state holds the model-sign ones.
 */
function limitedMosfetVoltages(model: MosModel, state: MosfetState, vgsNewReal: number, vdsNewReal: number, vbsNewReal: number): { vgsV: number; vdsV: number; vbsV: number; limited: boolean } {
  const type = model.polarity;
  let vgs = type * vgsNewReal;
  let vds = type * vdsNewReal;
  let vbs = type * vbsNewReal;
  let limited = false;
  // A voltage moves only when its limiter cuts it (a recomputed difference would differ by rounding)
  if (state.vdsV >= 0) {
    const vgsCut = limitGateV(vgs, state.vgsV, state.vonV);
    if (vgsCut !== vgs) {
      // ngspice keeps vgd as it came and moves vds with the cut vgs
      vds = vgsCut - (vgs - vds);
      vgs = vgsCut;
      limited = true;
    }
    const vdsCut = limitDrainV(vds, state.vdsV);
    if (vdsCut !== vds) {
      vds = vdsCut;
      limited = true;
    }
  } else {
    const vgd = vgs - vds;
    const vgdCut = limitGateV(vgd, state.vgsV - state.vdsV, state.vonV);
    if (vgdCut !== vgd) {
      // vgs kept, vds moves with the cut vgd
      vds = vgs - vgdCut;
      limited = true;
    }
    const vdsCut = -limitDrainV(-vds, -state.vdsV);
    if (vdsCut !== vds) {
      vds = vdsCut;
      limited = true;
    }
    // ngspice then sets vgs = vgd + vds: vgs moves with the cut vds, vgd as cut
    if (limited) vgs = vgdCut + vds;
  }
  const vt = model.parameters.thermalVoltageV;
  if (vds >= 0) {
    const vbsCut = limitJunctionV(vbs, state.vbsV, vt, model.criticalVoltageV);
    if (vbsCut !== vbs) {
      vbs = vbsCut;
      limited = true;
    }
  } else {
    const vbd = vbs - vds;
    const vbdCut = limitJunctionV(vbd, state.vbsV - state.vdsV, vt, model.criticalVoltageV);
    if (vbdCut !== vbd) {
      vbs = vbdCut + vds;
      limited = true;
    }
  }
  state.vgsV = vgs;
  state.vdsV = vds;
  state.vbsV = vbs;
  return limited ? { vgsV: type * vgs, vdsV: type * vds, vbsV: type * vbs, limited } : { vgsV: vgsNewReal, vdsV: vdsNewReal, vbsV: vbsNewReal, limited };
}

/** The bipolar model of a transistor: its own, else the stage's (a circuit with transistors always has one). */
function modelOf(q: IndexedTransistor, model: DeviceModel | null): DeviceModel {
  const own = q.model ?? model;
  if (!own) throw new Error(`no device model for transistor ${q.name}`);
  return own;
}

/** One Newton update: the next node voltages, the largest move, and whether every move is within tolerance. */
export interface NewtonStep {
  next: number[];
  largestMoveV: number;
  within: boolean;
}

/**
 * Solves a stamped linear system for the next iterate from `v`: null when the matrix is singular
 * or a voltage comes out non-finite; `within` when no node moved more than `absoluteV` plus
 * `relative` of its new value. Shared by the operating point's and the transient's Newton.
 */
export function newtonStep(stamp: NodeStamp, v: readonly number[], absoluteV: number, relative: number): NewtonStep | null {
  const n = stamp.n;
  let next: number[];
  try {
    next = luSolve(luFactor(stamp.matrix, n, true), stamp.rhs);
  } catch {
    return null;
  }
  let within = true;
  let largestMoveV = 0;
  for (let k = 0; k < n; k += 1) {
    if (!Number.isFinite(next[k])) return null;
    const moved = Math.abs(next[k] - v[k]);
    if (moved > absoluteV + relative * Math.abs(next[k])) within = false;
    if (moved > largestMoveV) largestMoveV = moved;
  }
  return { next, largestMoveV, within };
}

/**
 * Newton from `start`; `shuntS` is a conductance from every free node to ground (gmin stepping).
 * A junction starts no further forward than the critical voltage, so a far-off guess is limited
 * from there rather than evaluated where exp() overflows.
 */
function newtonSolve(ic: IndexedCircuit, model: DeviceModel | null, start: number[], shuntS = 0): { v: number[]; iterations: number } | null {
  const n = ic.freeNodes.length;
  let v: number[] = start.slice();
  const nq = ic.transistors.length;
  const vbeOld = zeros(nq);
  const vbcOld = zeros(nq);
  ic.transistors.forEach((q, i) => {
    const j = junctionVoltages(ic, v, q);
    const own = modelOf(q, model);
    vbeOld[i] = Math.min(j.vbeV, own.criticalVoltageV);
    vbcOld[i] = Math.min(j.vbcV, own.criticalVoltageV);
  });
  // A MOSFET starts from its voltages at the start (a bulk junction no further forward than its critical voltage), its threshold there
  const mosStates: MosfetState[] = ic.mosfets.map((m) => {
    const { vgsV, vdsV, vbsV } = mosfetVoltages(ic, v, m);
    const type = m.polarity;
    const vds = type * vdsV;
    const vbs = vds >= 0 ? Math.min(type * vbsV, m.model.criticalVoltageV) : Math.min(type * vbsV - vds, m.model.criticalVoltageV) + vds;
    const vonV = type * m.model.evaluate(vgsV, vdsV, type * vbs, m.widthM, m.lengthM).thresholdV;
    return { vgsV: type * vgsV, vdsV: vds, vbsV: vbs, vonV };
  });
  // The linear part (resistors, the gmin-stepping shunt) is the same every iteration: stamped once, copied in
  const linear = createStamp(ic);
  for (const r of ic.resistors) stampConductance(linear, r.a, r.b, r.conductanceS);
  if (shuntS > 0) for (let k = 0; k < n; k += 1) linear.matrix[k * n + k] += shuntS;
  const stamp = createStamp(ic);
  // the largest node step of the last iteration, V (NaN: none yet or limited)
  let lastStepV = NaN;
  for (let iter = 1; iter <= MAX_ITERATIONS; iter += 1) {
    copyStamp(linear, stamp);
    let limited = false;
    for (let i = 0; i < nq; i += 1) {
      const q = ic.transistors[i];
      const own = modelOf(q, model);
      // the model's junction voltages: polarity × the node differences (junctionVoltages, inline: the innermost loop)
      const vb = nodeVoltage(ic, v, q.bi);
      const vbeNewV = q.polarity * (vb - nodeVoltage(ic, v, q.ei));
      const vbcNewV = q.polarity * (vb - nodeVoltage(ic, v, q.ci));
      const vbeV = limitJunctionV(vbeNewV, vbeOld[i], own.thermalVoltageV, own.criticalVoltageV);
      const vbcV = limitJunctionV(vbcNewV, vbcOld[i], own.thermalVoltageV, own.criticalVoltageV);
      if (vbeV !== vbeNewV || vbcV !== vbcNewV) limited = true;
      vbeOld[i] = vbeV;
      vbcOld[i] = vbcV;
      stampTransistor(stamp, q, own.evaluate(vbeV, vbcV, q.area), vbeV, vbcV);
    }
    for (let i = 0; i < ic.mosfets.length; i += 1) {
      const m = ic.mosfets[i];
      const state = mosStates[i];
      const raw = mosfetVoltages(ic, v, m);
      const lim = limitedMosfetVoltages(m.model, state, raw.vgsV, raw.vdsV, raw.vbsV);
      if (lim.limited) limited = true;
      const ev = m.model.evaluate(lim.vgsV, lim.vdsV, lim.vbsV, m.widthM, m.lengthM);
      state.vonV = m.polarity * ev.thresholdV;
      stampMosfet(stamp, m, ev, lim.vgsV, lim.vdsV, lim.vbsV);
    }
    const step = newtonStep(stamp, v, VOLTAGE_TOLERANCE_V, RELATIVE_TOLERANCE);
    if (!step) return null;
    const converged = !limited && step.within;
    const stepV = step.largestMoveV;
    v = step.next;
    if (converged && iter > 1) return { v, iterations: iter };
    // Newton converges quadratically near a solution: the step after δ_i is about C·δ_i², and
    // C ≈ δ_i/δ_{i−1}² from the last two steps, so the next is about δ_i·(δ_i/δ_{i−1})² (J. E.
    // Dennis and R. B. Schnabel, Numerical Methods for Unconstrained Optimization and Nonlinear
    // Equations, 1983, ch. 5, the chapter cited from memory). When an unlimited step under
    // QUADRATIC_STEP_V fell by a tenth or more and that estimate is under the tolerance, the
    // solution is already as close as the confirming step would show: that iteration is saved.
    if (!limited && stepV <= QUADRATIC_STEP_V && stepV <= QUADRATIC_CONTRACTION * lastStepV && stepV * (stepV / lastStepV) ** 2 <= VOLTAGE_TOLERANCE_V) {
      return { v, iterations: iter };
    }
    lastStepV = limited ? NaN : stepV;
  }
  return null;
}

/** Scales a circuit's fixed voltages by `fraction` (source stepping). */
function scaledCircuit(ic: IndexedCircuit, fraction: number): IndexedCircuit {
  return { ...ic, fixedV: ic.fixedV.map((x) => x * fraction) };
}

/** A converged solution: free-node voltages, V, and the Newton iterations spent. */
export type Solved = { v: number[]; iterations: number };

/** Gmin stepping [SPICE]: solve with a large shunt, then lower it a decade at a time from the last solution, then without. */
export function gminStepping(ic: IndexedCircuit, model: DeviceModel | null, start: number[]): Solved | null {
  let v = start;
  let iterations = 0;
  for (let shuntS = GMIN_START_S; shuntS >= GMIN_END_S; shuntS /= GMIN_FACTOR) {
    const step = newtonSolve(ic, model, v, shuntS);
    if (!step) return null;
    v = step.v;
    iterations += step.iterations;
  }
  const last = newtonSolve(ic, model, v);
  return last && { v: last.v, iterations: iterations + last.iterations };
}

/**
 * Source stepping [SPICE]: every fixed voltage from zero (all nodes at 0 V) up to its value; the
 * step doubles after a solved point and is cut to a quarter after a failed one. Returns the
 * solution, or the share of the rails reached when the step became too small.
 */
export function sourceStepping(ic: IndexedCircuit, model: DeviceModel | null): Solved | { stalledAt: number } {
  let v = zeros(ic.freeNodes.length);
  let iterations = 0;
  let fraction = 0;
  let step = SOURCE_FIRST_STEP;
  while (fraction < 1) {
    const next = Math.min(1, fraction + step);
    const solved = newtonSolve(scaledCircuit(ic, next), model, v);
    if (solved) {
      v = solved.v;
      iterations += solved.iterations;
      fraction = next;
      step *= SOURCE_STEP_GROWTH;
    } else {
      step /= SOURCE_STEP_CUT;
      if (step < SOURCE_MIN_STEP) return { stalledAt: fraction };
    }
  }
  return { v, iterations };
}

/** Every node voltage of a stage lies between its lowest and highest fixed voltage: a guess outside is brought inside. */
function guessWithinRails(ic: IndexedCircuit, guess: number[]): number[] {
  const low = Math.min(...ic.fixedV);
  const high = Math.max(...ic.fixedV);
  return guess.map((x) => Math.min(Math.max(x, low), high));
}

/**
 * Solves the DC operating point of a stage circuit with a device model. `warmStart`, the
 * solution of a nearby circuit with the same nodes, rails, inputs and temperature (a small
 * mismatch, a resistor being tuned), replaces the hand-analysis guess and saves iterations; for
 * another bias or temperature the hand guess converges faster. `ownModels`: the models of
 * transistors that differ from the stage's (a pair transistor with its own BF or VAF), by name.
 * `model` is null for a stage of MOSFETs alone; `mosModels`: each MOSFET's model, by name.
 */
export function solveOperatingPoint(
  circuit: StageCircuit,
  model: DeviceModel | null,
  warmStart?: OperatingPoint,
  ownModels?: Readonly<Record<string, DeviceModel>>,
  mosModels?: Readonly<Record<string, MosModel>>,
): OperatingPoint {
  const ic = indexCircuit(circuit, model?.ohmic, ownModels, mosModels);
  const rawGuess = ic.freeNodes.map((name) => circuit.initialGuessV[name] ?? 0);
  // An internal node (behind RB, RE or RC) starts at its terminal's guess: the drop is small
  ic.terminalOf.forEach((terminal, k) => {
    if (terminal !== undefined) rawGuess[k] = terminal >= 0 ? rawGuess[terminal] : ic.fixedV[-terminal - 1];
  });
  const handGuess = guessWithinRails(ic, rawGuess);
  const sameNodes = warmStart !== undefined && warmStart.circuit.freeNodes.join() === ic.freeNodes.join();
  // A warm start that fails (its bias was too far away) falls back to the hand guess.
  const starts = sameNodes ? [warmStart.voltagesV.slice(), handGuess] : [handGuess];
  let solved: Solved | null = null;
  let iterations = 0;
  for (const start of starts) {
    solved = newtonSolve(ic, model, start);
    iterations += solved?.iterations ?? MAX_ITERATIONS;
    if (solved) break;
  }
  if (!solved) {
    const continued = gminStepping(ic, model, handGuess) ?? sourceStepping(ic, model);
    if ('stalledAt' in continued) {
      throw new ConvergenceError(
        `the operating point did not converge (gmin stepping failed, source stepping stalled at ${(continued.stalledAt * 100).toPrecision(3)} % of the rails)`,
      );
    }
    iterations += continued.iterations;
    solved = { v: continued.v, iterations };
  }
  return { circuit: ic, voltagesV: solved.v, transistors: model ? evaluateTransistors(ic, model, solved.v) : [], mosfets: evaluateMosfets(ic, solved.v), iterations };
}
