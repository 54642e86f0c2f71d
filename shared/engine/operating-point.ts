/**
 * DC operating point of a stage: Newton-Raphson on the node equations with SPICE's junction
 * voltage limiting (pnjlim) [SPICE], from a hand-analysis starting guess; when that does not
 * converge, source stepping (rails and inputs ramped from 10 % to 100 %).
 */
import type { StageCircuit } from './circuit';
import type { BjtEval, DeviceModel } from './device';
import { luFactor, luSolve, zeros } from './linear-solve';
import {
  createStamp,
  evaluateTransistors,
  indexCircuit,
  junctionVoltages,
  resetStamp,
  stampConductance,
  stampTransistor,
  type IndexedCircuit,
} from './node-system';

/** Convergence: every node moved less than this between iterations, V (far tighter than SPICE's 1 µV). */
const VOLTAGE_TOLERANCE_V = 1e-10;
/** Relative part of the voltage tolerance. */
const RELATIVE_TOLERANCE = 1e-11;
/** Newton iterations before giving up on one attempt. */
const MAX_ITERATIONS = 150;
/** Source-stepping fractions tried when the direct attempt fails. */
const SOURCE_STEPS = [0.1, 0.25, 0.4, 0.55, 0.7, 0.85, 1];

export interface OperatingPoint {
  circuit: IndexedCircuit;
  /** Free-node voltages, V. */
  voltagesV: number[];
  /** Each transistor's evaluation at the solution (same order as circuit.transistors). */
  transistors: BjtEval[];
  iterations: number;
}

/** Raised when the Newton iteration does not converge even with source stepping. */
export class ConvergenceError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConvergenceError';
  }
}

/** SPICE's pnjlim: limits a junction's step so exp() stays tame [SPICE]. */
function limitJunctionV(newV: number, oldV: number, vtV: number, criticalV: number): number {
  if (newV > criticalV && Math.abs(newV - oldV) > 2 * vtV) {
    if (oldV > 0) {
      const arg = 1 + (newV - oldV) / vtV;
      return arg > 0 ? oldV + vtV * Math.log(arg) : criticalV;
    }
    return vtV * Math.log(newV / vtV);
  }
  return newV;
}

function newtonSolve(ic: IndexedCircuit, model: DeviceModel, start: number[]): { v: number[]; iterations: number } | null {
  const n = ic.freeNodes.length;
  let v: number[] = start.slice();
  const nq = ic.transistors.length;
  const vbeOld = zeros(nq);
  const vbcOld = zeros(nq);
  ic.transistors.forEach((q, i) => {
    const j = junctionVoltages(ic, v, q);
    vbeOld[i] = j.vbeV;
    vbcOld[i] = j.vbcV;
  });
  const stamp = createStamp(ic);
  for (let iter = 1; iter <= MAX_ITERATIONS; iter += 1) {
    resetStamp(stamp);
    for (const r of ic.resistors) stampConductance(stamp, r.a, r.b, r.conductanceS);
    let limited = false;
    for (let i = 0; i < nq; i += 1) {
      const q = ic.transistors[i];
      const j = junctionVoltages(ic, v, q);
      const vbeV = limitJunctionV(j.vbeV, vbeOld[i], model.thermalVoltageV, model.criticalVoltageV);
      const vbcV = limitJunctionV(j.vbcV, vbcOld[i], model.thermalVoltageV, model.criticalVoltageV);
      if (vbeV !== j.vbeV || vbcV !== j.vbcV) limited = true;
      vbeOld[i] = vbeV;
      vbcOld[i] = vbcV;
      stampTransistor(stamp, q, model.evaluate(vbeV, vbcV, q.area, q.betaFactor), vbeV, vbcV);
    }
    let next: number[];
    try {
      next = luSolve(luFactor(stamp.matrix, n, true), stamp.rhs);
    } catch {
      return null;
    }
    let converged = !limited;
    for (let k = 0; k < n; k += 1) {
      if (!Number.isFinite(next[k])) return null;
      if (Math.abs(next[k] - v[k]) > VOLTAGE_TOLERANCE_V + RELATIVE_TOLERANCE * Math.abs(next[k])) converged = false;
    }
    v = next;
    if (converged && iter > 1) return { v, iterations: iter };
  }
  return null;
}

/** Scales a circuit's fixed voltages by `fraction` (source stepping). */
function scaledCircuit(ic: IndexedCircuit, fraction: number): IndexedCircuit {
  return { ...ic, fixedV: ic.fixedV.map((x) => x * fraction) };
}

/**
 * Solves the DC operating point of a stage circuit with a device model. `warmStart`, the
 * solution of a nearby circuit with the same nodes, rails, inputs and temperature (a small
 * mismatch, a resistor being tuned), replaces the hand-analysis guess and saves iterations; for
 * another bias or temperature the hand guess converges faster.
 */
export function solveOperatingPoint(circuit: StageCircuit, model: DeviceModel, warmStart?: OperatingPoint): OperatingPoint {
  const ic = indexCircuit(circuit, model.ohmic);
  const handGuess = ic.freeNodes.map((name) => circuit.initialGuessV[name] ?? 0);
  const sameNodes = warmStart !== undefined && warmStart.circuit.freeNodes.join() === ic.freeNodes.join();
  // A warm start that fails (its bias was too far away) falls back to the hand guess.
  const starts = sameNodes ? [warmStart.voltagesV.slice(), handGuess] : [handGuess];
  let solved: { v: number[]; iterations: number } | null = null;
  let iterations = 0;
  for (const start of starts) {
    solved = newtonSolve(ic, model, start);
    iterations += solved?.iterations ?? MAX_ITERATIONS;
    if (solved) break;
  }
  if (!solved) {
    let v: number[] = handGuess.map((x) => x * SOURCE_STEPS[0]);
    for (const fraction of SOURCE_STEPS) {
      const step = newtonSolve(scaledCircuit(ic, fraction), model, v);
      if (!step) throw new ConvergenceError(`the operating point did not converge (source stepping stalled at ${Math.round(fraction * 100)} % of the rails)`);
      v = step.v;
      iterations += step.iterations;
    }
    solved = { v, iterations };
  }
  return { circuit: ic, voltagesV: solved.v, transistors: evaluateTransistors(ic, model, solved.v), iterations };
}
