/**
 * Transient solve of a stage circuit whose fixed nodes (the drive) move with time: the full
 * nonlinear node equations f(v) + dq(v)/dt = 0 at every time point, f the resistive currents
 * leaving each node (resistors, every transistor's Gummel-Poon currents: node-system.ts) and q
 * the charges stored on it (the circuit's capacitors, every transistor's depletion and diffusion
 * charges: stored-charge.ts), solved by Newton with SPICE's junction limiting at each point.
 *
 * Integration rule: the second-order backward difference (Gear-2, BDF2) with variable steps,
 * backward Euler for the first step after a breakpoint (the start, a corner of the drive) as
 * SPICE restarts there [SPICE]. Gear-2 rather than the trapezoidal rule: both are second order,
 * but Gear-2 damps the fast modes a step longer than their time constant leaves behind, where the
 * trapezoidal rule lets them alternate from step to step (C. W. Gear, Numerical Initial Value
 * Problems in Ordinary Differential Equations, 1971, cited from memory); the slew rate is read from
 * difference quotients between the points, which such an alternation would corrupt.
 *
 * Step control: a predictor through the last points (quadratic, or linear on the second step
 * after a breakpoint) against the converged solution estimates the local truncation error
 * (Milne's device: LTE ≈ h/(t(n+1) − t(oldest)) · |corrected − predicted|); a step whose error on
 * any node exceeds the tolerance is redone shorter, and the next step grows by
 * (tolerance/error)^(1/3), at most doubling. Steps land exactly on the breakpoints, never
 * stretched to reach one (a breakpoint less than two steps off is reached in two equal halves),
 * and the first step after one is a tenth of the one before, as SPICE restarts [SPICE] (ngspice
 * dctran.c); a step whose Newton solve fails is redone an eighth as long. A run is given up
 * (ConvergenceError) after 16 redone steps in a row at one point, a step under `minStepS` or the
 * time's resolution, or `maxSteps` steps in all.
 */
import type { DeviceModel } from './device';
import { chargeParametersOf, transistorCapacitances, type ChargeParameters } from './junction-charges';
import { createStamp, junctionVoltages, nodeVoltage, stampConductance, stampControlled, stampTransistor, type IndexedCircuit, type NodeRef, type NodeStamp } from './node-system';
import { ConvergenceError, limitJunctionV, newtonStep } from './operating-point';
import { transistorCharges } from './stored-charge';
import type { BjtParameters } from './bjt-parameters';

/** Newton at a time point: converged when no node moved more than this (absolute, V, plus relative) in an unlimited iteration. */
const NEWTON_TOLERANCE_V = 1e-9;
const NEWTON_RELATIVE_TOLERANCE = 1e-9;
/** Only a step this small (V), a tenth or less of the one before, is taken as Newton's quadratic phase. */
const QUADRATIC_STEP_V = 1e-6;
const QUADRATIC_CONTRACTION = 0.1;
/** Newton iterations at one time point before the step is redone shorter. */
const NEWTON_MAX_ITERATIONS = 40;
/** A step whose Newton solve failed is redone this many times shorter. */
const FAILED_STEP_CUT = 8;
/** A step is never grown more than this factor, nor cut below this share of itself after an LTE rejection. */
const STEP_GROWTH_MAX = 2;
const STEP_CUT_MIN = 0.2;
/** Safety factor on the step the truncation error allows. */
const STEP_SAFETY = 0.9;
/** Steps of the whole run before it is given up (ConvergenceError), unless the run sets its own. */
const MAX_STEPS = 20_000;
/**
 * Steps redone in a row at one time point before the run is given up (ConvergenceError): each
 * redo is at least a tenth shorter, and a sound run redoes a step three times at the most (none
 * of the slew-rate runs on 145 varied designs more), so more means the error no longer falls
 * with the step.
 */
const MAX_REJECTIONS = 16;
/** The first step after a breakpoint, a share of the step that reached it. */
const BREAKPOINT_RESTART = 0.1;

/** How a transient run is driven and watched. */
export interface TransientRun {
  /** Writes the fixed nodes' voltages at time t (s) into `fixedV` (the circuit's fixed-node order). */
  fixedVAt(tS: number, fixedV: number[]): void;
  /** Times where the drive's slope changes, s, ascending: steps land on them and restart at first order. */
  breakpointsS: readonly number[];
  /** The longest step allowed from time t, s. */
  maxStepAt(tS: number): number;
  /** The first step, s. */
  firstStepS: number;
  /** The local truncation error allowed on any node per step, V. */
  toleranceV: number;
  /** Called with every accepted point, t = 0 first; returns true to stop the run. */
  onPoint(tS: number, v: readonly number[]): boolean;
  /** The shortest step before the run is given up, s. */
  minStepS: number;
  /** Steps tried (rejected ones included) before the run is given up; 20,000 if unset. */
  maxSteps?: number;
}

/** Where each stored charge sits: charge q(va − vb…) leaves node `a` into node `b` (as a current dq/dt). */
interface ChargeSet {
  /** Charges at a node-voltage vector, C: the capacitors, then each transistor's qbe, qbc, qsub. */
  values(v: readonly number[]): number[];
}

/**
 * Integrates the circuit from `startV` (its DC solution with the fixed nodes at their t = 0
 * voltages) until `run.onPoint` says stop. `parameters` and `temperatureC`: the device's charge
 * parameters (none: only the circuit's capacitors store charge). Throws ConvergenceError when
 * the step falls below `run.minStepS` or the run exceeds MAX_STEPS.
 */
export function integrateTransient(
  circuit: IndexedCircuit,
  model: DeviceModel,
  parameters: BjtParameters | null,
  temperatureC: number,
  startV: readonly number[],
  run: TransientRun,
): { steps: number; endS: number } {
  const ic: IndexedCircuit = { ...circuit, fixedV: circuit.fixedV.slice() };
  // each transistor's own charges (a PNP's card may differ from the NPN's); none at all: null
  const perTransistor = chargeParametersOf(ic.transistors, parameters, temperatureC).map((c) => (c && !c.none ? c : null));
  const deviceCharges = perTransistor.some((c) => c !== null) ? perTransistor : null;
  const chargeSet = storedCharges(ic, model, deviceCharges);
  const stamp = createStamp(ic);
  run.fixedVAt(0, ic.fixedV);
  // The points since the last breakpoint (at most three kept, oldest first): times, solutions, charges
  const times = [0];
  const states = [startV.slice()];
  const charged = [chargeSet.values(startV)];
  const predicted = new Array<number>(startV.length).fill(0);
  const historyA = new Array<number>(charged[0].length).fill(0);
  const maxSteps = run.maxSteps ?? MAX_STEPS;
  let stepS = run.firstStepS;
  let t = 0;
  if (run.onPoint(0, startV)) return { steps: 0, endS: 0 };
  let breakpoint = 0;
  // steps redone in a row at the current point
  let rejected = 0;
  for (let steps = 1; steps <= maxSteps; steps += 1) {
    if (rejected >= MAX_REJECTIONS) throw new ConvergenceError(`the transient step was redone ${MAX_REJECTIONS} times in a row at t = ${t} s`);
    while (breakpoint < run.breakpointsS.length && run.breakpointsS[breakpoint] <= t) breakpoint += 1;
    const nextBreakS = breakpoint < run.breakpointsS.length ? run.breakpointsS[breakpoint] : Infinity;
    let h = Math.min(stepS, run.maxStepAt(t));
    // Never longer than the step allowed: land on a breakpoint within it, halve the way to one
    // less than two steps off (no sliver step before it). Stretching the step onto a breakpoint
    // just beyond it instead would undo the cut after a rejection there, forever.
    const toBreakS = nextBreakS - t;
    if (toBreakS <= h) h = toBreakS;
    else if (toBreakS < 2 * h) h = toBreakS / 2;
    const tNext = toBreakS === h ? nextBreakS : t + h;
    // (a step below the time's own resolution would not move it)
    if (!(h >= run.minStepS) || !(tNext > t)) throw new ConvergenceError(`the transient step (${h} s) fell below ${run.minStepS} s or the resolution of t = ${t} s`);
    run.fixedVAt(tNext, ic.fixedV);
    const k = times.length;
    predictInto(predicted, times, states, tNext);
    const [a0, a1, a2] = k >= 2 ? gear2(h, t - times[k - 2]) : [1 / h, -1 / h, 0];
    const last = charged[k - 1];
    const before = k >= 2 ? charged[k - 2] : last;
    for (let j = 0; j < historyA.length; j += 1) historyA[j] = a1 * last[j] + a2 * before[j];
    const solved = newtonAt(ic, model, deviceCharges, stamp, states[k - 1], predicted, a0, historyA);
    if (!solved) {
      rejected += 1;
      stepS = h / FAILED_STEP_CUT;
      continue;
    }
    // Milne's device: the truncation error from the predictor's distance (none checked on a first step)
    let errorV = 0;
    if (k >= 2) {
      const ratio = h / (tNext - times[0]);
      for (let j = 0; j < solved.length; j += 1) errorV = Math.max(errorV, ratio * Math.abs(solved[j] - predicted[j]));
    }
    const scale = errorV > 0 ? STEP_SAFETY * Math.cbrt(run.toleranceV / errorV) : STEP_GROWTH_MAX;
    if (errorV > run.toleranceV) {
      rejected += 1;
      stepS = h * Math.max(STEP_CUT_MIN, scale);
      continue;
    }
    rejected = 0;
    t = tNext;
    const q = chargeSet.values(solved);
    if (t === nextBreakS) {
      // a corner of the drive: restart at first order from this point alone, with a step a tenth
      // of the one that reached it, as SPICE does [SPICE] (ngspice dctran.c), so the response's
      // own corner there is resolved before the step grows again
      times.length = 0;
      states.length = 0;
      charged.length = 0;
      stepS = h * BREAKPOINT_RESTART;
    } else {
      if (k === 3) {
        times.shift();
        states.shift();
        charged.shift();
      }
      stepS = h * Math.min(STEP_GROWTH_MAX, scale);
    }
    times.push(t);
    states.push(solved);
    charged.push(q);
    if (run.onPoint(t, solved)) return { steps, endS: t };
  }
  throw new ConvergenceError(`the transient did not finish within ${maxSteps} steps`);
}

/**
 * Gear-2 with variable steps: dq/dt(n+1) ≈ a0·q(n+1) + a1·q(n) + a2·q(n−1), h the step, hp the
 * one before, ω = h/hp: a0 = (1 + 2ω)/((1 + ω)·h), a1 = −(1 + ω)/h, a2 = ω²/((1 + ω)·h)
 * (the derivative of the quadratic through the three points at t(n+1); Gear 1971, cited from memory).
 */
export function gear2(hS: number, previousS: number): [number, number, number] {
  const w = hS / previousS;
  return [(1 + 2 * w) / ((1 + w) * hS), -(1 + w) / hS, (w * w) / ((1 + w) * hS)];
}

/** The polynomial through the kept points (constant, linear or quadratic) at time t, per node, written into `out`. */
function predictInto(out: number[], times: readonly number[], states: readonly number[][], tS: number): void {
  const k = times.length;
  if (k === 1) {
    for (let node = 0; node < out.length; node += 1) out[node] = states[0][node];
    return;
  }
  // Lagrange weights of the kept points at tS
  const w0 = lagrange(times, 0, tS);
  const w1 = lagrange(times, 1, tS);
  const w2 = k === 3 ? lagrange(times, 2, tS) : 0;
  const s2 = states[k === 3 ? 2 : 1];
  for (let node = 0; node < out.length; node += 1) out[node] = w0 * states[0][node] + w1 * states[1][node] + w2 * s2[node];
}

/** The Lagrange weight of point i among `times` at tS. */
function lagrange(times: readonly number[], i: number, tS: number): number {
  let w = 1;
  for (let j = 0; j < times.length; j += 1) if (j !== i) w *= (tS - times[j]) / (times[i] - times[j]);
  return w;
}

/**
 * The circuit's stored charges: its capacitors, and three per transistor when any stores charge
 * (zeros for one whose card does not), each transistor's in its model's frame (a PNP's with the
 * polarity its junction voltages have there: stampCharge turns them round).
 */
function storedCharges(ic: IndexedCircuit, model: DeviceModel, charges: (ChargeParameters | null)[] | null): ChargeSet {
  return {
    values(v) {
      const out = ic.capacitors.map((cap) => cap.capacitanceF * (nodeVoltage(ic, v, cap.a) - nodeVoltage(ic, v, cap.b)));
      if (!charges) return out;
      ic.transistors.forEach((q, i) => {
        const own = charges[i];
        if (!own) {
          out.push(0, 0, 0);
          return;
        }
        const bias = junctionVoltages(ic, v, q);
        const held = transistorCharges(own, (q.model ?? model).evaluate(bias.vbeV, bias.vbcV, q.area), bias, q.area);
        out.push(held.baseEmitterC, held.baseCollectorC, held.substrateC);
      });
      return out;
    },
  };
}

/**
 * Stamps a charge's current a0·q + history leaving `a` into `b`, linearised at the controlling
 * voltages: a0·g·(x − x0) for x = v(a) − v(b) (g = ∂q/∂x at x0), plus a0·g2·(x2 − x2₀) for a
 * second controlling pair when `g2F` ≠ 0 (positional, so Newton's inner loop allocates nothing).
 * `polarity` −1: q, the history and x0, x2₀ are in a PNP's model frame (its voltages and charges
 * turned round): the current is then −(a0·q + history + a0·g·(−x − x0)), whose conductances are
 * the same and whose constant part changes sign [SPICE] (ngspice bjtload.c, by the model's type).
 */
function stampCharge(
  stamp: NodeStamp,
  a: NodeRef,
  b: NodeRef,
  a0: number,
  qC: number,
  historyA: number,
  gF: number,
  x0V: number,
  plus2: NodeRef = a,
  minus2: NodeRef = b,
  g2F = 0,
  x20V = 0,
  polarity: 1 | -1 = 1,
): void {
  let constantA = a0 * qC + historyA;
  if (gF !== 0) {
    stampControlled(stamp, a, b, a, b, a0 * gF);
    constantA -= a0 * gF * x0V;
  }
  if (g2F !== 0) {
    stampControlled(stamp, a, b, plus2, minus2, a0 * g2F);
    constantA -= a0 * g2F * x20V;
  }
  constantA *= polarity;
  if (a >= 0) stamp.rhs[a] -= constantA;
  if (b >= 0) stamp.rhs[b] += constantA;
}

/**
 * Newton at one time point: from the predicted voltages, junctions limited from their values at
 * the last accepted point. `a0`: the rule's coefficient of the new charge; `historyA`: each
 * charge's history current. Null when it does not converge.
 */
function newtonAt(
  ic: IndexedCircuit,
  model: DeviceModel,
  charges: (ChargeParameters | null)[] | null,
  stamp: NodeStamp,
  lastV: readonly number[],
  startV: number[],
  a0: number,
  historyA: readonly number[],
): number[] | null {
  const vbeOld: number[] = [];
  const vbcOld: number[] = [];
  for (const q of ic.transistors) {
    const { vbeV, vbcV } = junctionVoltages(ic, lastV as number[], q);
    vbeOld.push(vbeV);
    vbcOld.push(vbcV);
  }
  let v = startV;
  // the largest node step of the last iteration, V (NaN: none yet, or limited)
  let lastStepV = NaN;
  for (let iter = 1; iter <= NEWTON_MAX_ITERATIONS; iter += 1) {
    stamp.matrix.fill(0);
    stamp.rhs.fill(0);
    for (const r of ic.resistors) stampConductance(stamp, r.a, r.b, r.conductanceS);
    for (let j = 0; j < ic.capacitors.length; j += 1) {
      const cap = ic.capacitors[j];
      stampCharge(stamp, cap.a, cap.b, a0, 0, historyA[j], cap.capacitanceF, 0);
    }
    let limited = false;
    ic.transistors.forEach((q, i) => {
      const own = q.model ?? model;
      const raw = junctionVoltages(ic, v, q);
      const vbeV = limitJunctionV(raw.vbeV, vbeOld[i], own.thermalVoltageV, own.criticalVoltageV);
      const vbcV = limitJunctionV(raw.vbcV, vbcOld[i], own.thermalVoltageV, own.criticalVoltageV);
      if (vbeV !== raw.vbeV || vbcV !== raw.vbcV) limited = true;
      vbeOld[i] = vbeV;
      vbcOld[i] = vbcV;
      const ev = own.evaluate(vbeV, vbcV, q.area);
      stampTransistor(stamp, q, ev, vbeV, vbcV);
      const ownCharges = charges?.[i];
      if (!ownCharges) return;
      const vsubV = nodeVoltage(ic, v, q.s) - nodeVoltage(ic, v, q.sc);
      const bias = { vbeV, vbcV, vsubV };
      const held = transistorCharges(ownCharges, ev, bias, q.area);
      const caps = transistorCapacitances(ownCharges, ev, bias, q.area);
      const at = ic.capacitors.length + 3 * i;
      stampCharge(stamp, q.bi, q.ei, a0, held.baseEmitterC, historyA[at], caps.baseEmitterF, vbeV, q.bi, q.ci, caps.baseEmitterPerVbcF, vbcV, q.polarity);
      stampCharge(stamp, q.bi, q.ci, a0, held.baseCollectorC, historyA[at + 1], caps.baseCollectorF, vbcV, q.bi, q.ci, 0, 0, q.polarity);
      // the substrate junction takes its sign from type × BJTsubs, +1 for either default [SPICE]: not turned round
      stampCharge(stamp, q.s, q.sc, a0, held.substrateC, historyA[at + 2], caps.collectorSubstrateF, vsubV);
    });
    const step = newtonStep(stamp, v, NEWTON_TOLERANCE_V, NEWTON_RELATIVE_TOLERANCE);
    if (!step) return null;
    const stepV = step.largestMoveV;
    v = step.next;
    if (!limited && step.within) return v;
    // Quadratic convergence: the next step would be about stepV·(stepV/lastStepV)², as in the
    // operating point's Newton (operating-point.ts); when that is under the tolerance the
    // confirming iteration is saved
    if (!limited && stepV <= QUADRATIC_STEP_V && stepV <= QUADRATIC_CONTRACTION * lastStepV && stepV * (stepV / lastStepV) ** 2 <= NEWTON_TOLERANCE_V) return v;
    lastStepV = limited ? NaN : stepV;
  }
  return null;
}
