/**
 * The stage's DC transfer from its differential input (ENGINE-CONTRACT.md, version 2 "New
 * outputs"): the input offset voltage (the differential DC input that brings v(c1) = v(c2)), the
 * offset current at that input, the offset's drift over ±1 °C, and the linear input range (the
 * largest differential DC amplitude where v(c1,c2) stays within 1 % of differentialGain × input,
 * on the design without mismatches). Each figure comes from operating points of the whole circuit
 * solved at those inputs (stage-solve.ts), the way a `.dc` sweep measures it; the hand formulas
 * sit beside them for the reasons: VOS ≈ VT·(ΔRC/RC + ΔIS/IS), dVOS/dT ≈ VOS/T, and the
 * undegenerated pair's 1 % point at vid ≈ 0.35·VT (Gray, Hurst, Lewis, Meyer, Analysis and
 * Design of Analog Integrated Circuits, the emitter-coupled pair's transfer and offset sections).
 */
import { COLLECTOR_NODES, pairIsMatched } from './circuit';
import { nodeVoltage, terminalCurrentsA } from './node-system';
import { ConvergenceError, type OperatingPoint } from './operating-point';
import { solveStageOperatingPoint, type SolvedOperatingPoint } from './stage-solve';
import type { Design } from './types';

/** v(c1) − v(c2) at an operating point, V. */
export function outputDifferenceV(op: OperatingPoint): number {
  const ic = op.circuit;
  return nodeVoltage(ic, op.voltagesV, ic.nodeRef(COLLECTOR_NODES[0])) - nodeVoltage(ic, op.voltagesV, ic.nodeRef(COLLECTOR_NODES[1]));
}

/** The DC current each drive node sends into the circuit, A (into in1 and in2, or into RS1 and RS2). */
export function driveCurrentsA(solved: SolvedOperatingPoint): [number, number] {
  const { op, driveNodes } = solved;
  const ic = op.circuit;
  const v = op.voltagesV;
  return driveNodes.map((name) => {
    const node = ic.nodeRef(name);
    let totalA = 0;
    for (const r of ic.resistors) {
      const ia = (nodeVoltage(ic, v, r.a) - nodeVoltage(ic, v, r.b)) * r.conductanceS;
      if (r.a === node) totalA += ia;
      if (r.b === node) totalA -= ia;
    }
    ic.transistors.forEach((q, k) => {
      if (q.bi === node) totalA += terminalCurrentsA(q, op.transistors[k]).baseA;
    });
    return totalA;
  }) as [number, number];
}

/**
 * An offset is found when the last secant step moved it less than this, V: far inside the
 * contract's 20 µV, and inside a drift's 0.1 µV/°C over the ±1 °C the drift reads.
 */
const OFFSET_STEP_V = 1e-11;
/** Secant steps at most; the transfer is smooth near its zero, three or four do. */
const OFFSET_MAX_STEPS = 30;

/** The input offset: the differential input, the operating point solved there, and the transfer's slope there (∂v(c1,c2)/∂vid). */
export interface OffsetSolution {
  offsetV: number;
  at: SolvedOperatingPoint;
  slope: number;
}

/**
 * The differential DC input (v(drive1) − v(drive2)) where v(c1) = v(c2): secant steps on the
 * whole circuit's operating point, the first with the slope `gain` (the differential gain,
 * ∂v(c1,c2)/∂vid), each solve warm-started from the last. A design whose two halves are the
 * same circuit has no offset: 0 exactly.
 */
export function inputOffset(design: Design, base: SolvedOperatingPoint, gain: number): OffsetSolution {
  return pairIsMatched(design) ? { offsetV: 0, at: base, slope: gain } : offsetFrom(design, base, 0, gain);
}

/** The offset by secant steps from an operating point `start` solved at the input `fromV`. */
function offsetFrom(design: Design, start: SolvedOperatingPoint, fromV: number, gain: number): OffsetSolution {
  let x0 = fromV;
  let f0 = outputDifferenceV(start.op);
  let at = start;
  let x1 = x0 - f0 / gain;
  for (let step = 0; step < OFFSET_MAX_STEPS; step += 1) {
    at = solveStageOperatingPoint(design, at.op, x1);
    const f1 = outputDifferenceV(at.op);
    // a secant through the last two solves (their slope is the transfer's there); the gain when they coincide
    const slope = f1 !== f0 && x1 !== x0 ? (f1 - f0) / (x1 - x0) : gain;
    const next = x1 - f1 / slope;
    if (f1 === 0 || Math.abs(next - x1) < OFFSET_STEP_V) return { offsetV: x1, at, slope };
    x0 = x1;
    f0 = f1;
    x1 = next;
  }
  throw new Error(`the input offset search did not settle in ${OFFSET_MAX_STEPS} steps`);
}

/**
 * The contract's drift, (offset at T + 1 °C − offset at T − 1 °C)/2 in V/°C, from the output at
 * the offset input: at T ± 1 °C the output there is v±, and each offset lies v±/slope from it
 * (one Newton step on a transfer that is straight to a few parts per million over the
 * microvolts the offset moves), so the drift is −(v+ − v−)/(2·slope). 0 for a matched pair.
 */
export function offsetDriftVPerC(design: Design, offset: OffsetSolution): number {
  if (pairIsMatched(design)) return 0;
  const temperatureC = design.temperatureC ?? 27;
  const outputAt = (deltaC: number): number => outputDifferenceV(solveStageOperatingPoint({ ...design, temperatureC: temperatureC + deltaC }, offset.at.op, offset.offsetV).op);
  return -(outputAt(1) - outputAt(-1)) / (2 * offset.slope);
}

/** The design with its pair mismatches set to zero: the contract's linear-range circuit. */
export function withoutMismatch(design: Design): Design {
  return { ...design, collectorMismatch: 0, pairSaturationCurrentMismatch: 0, pairBetaMismatch: 0, pairEarlyVoltageMismatch: 0 };
}

/** How far v(c1,c2) may depart from differentialGain × input inside the linear range (1 %). */
export const LINEAR_RANGE_ERROR = 0.01;
/** Relative accuracy of the linear range: far inside the contract's 5 %. */
const LINEAR_RANGE_TOLERANCE = 1e-3;
/** Bisection and interpolation steps at most. */
const LINEAR_RANGE_MAX_STEPS = 60;
/**
 * Before the 1 % point is bracketed, each solve jumps to where the error would reach 1 % if it
 * grew as the input squared (the pair's first distortion term: tanh(x) = x − x³/3 + …, a
 * relative error ∝ x²), aimed this share past it so that the jump lands across the point…
 */
const LINEAR_RANGE_OVERSHOOT = 0.01;
/** …and by at most this factor either way (a jump of two doublings at most: every solve stays warm-started from a nearby one). */
const LINEAR_RANGE_LARGEST_JUMP = 4;

/**
 * The contract's linear input range, V: on the design without mismatches (`symmetric`, solved
 * at zero input as `base` with differential gain `gain`), the smallest amplitude where
 * |v(c1,c2) − gain·vid| reaches 1 % of |gain·vid|. The design is symmetric, so both signs give
 * the same amplitude and one is searched. From `hintV` (the figure at a nearby condition, when
 * the caller has one) or else from 0.2·VT (inside the 1 % point of any pair), each solve
 * warm-started from the nearest one before it, the amplitude jumps by the error's square law
 * (LINEAR_RANGE_OVERSHOOT) until the 1 % point is bracketed, up to twice the rails' span; then
 * false position with bisection safeguards (the Illinois method) narrows the bracket to a
 * thousandth. Null when the transfer stays within 1 % up to that span, or when an operating
 * point on the way cannot be solved (ConvergenceError).
 */
export function linearInputRangeV(symmetric: Design, base: SolvedOperatingPoint, gain: number, hintV: number | null = null): number | null {
  try {
    return searchLinearRangeV(symmetric, base, gain, hintV);
  } catch (error) {
    // an operating point at a large input the solver cannot reach leaves the figure unknown, not the analysis failed
    if (error instanceof ConvergenceError) return null;
    throw error;
  }
}

/** The next amplitude while the 1 % point is not yet bracketed: the square law's estimate from (x, its excess), just past it, within the largest jump. */
function squareLawJump(x: number, excess: number): number {
  const ratio = Math.sqrt(LINEAR_RANGE_ERROR / (LINEAR_RANGE_ERROR + excess)) * (excess < 0 ? 1 + LINEAR_RANGE_OVERSHOOT : 1 - LINEAR_RANGE_OVERSHOOT);
  // Stryker disable next-line ConditionalExpression: a NaN ratio (no error at all to scale) takes the largest jump up, as the clamp does for an infinite one
  const safe = ratio > 0 ? ratio : LINEAR_RANGE_LARGEST_JUMP;
  return x * Math.min(Math.max(safe, 1 / LINEAR_RANGE_LARGEST_JUMP), LINEAR_RANGE_LARGEST_JUMP);
}

function searchLinearRangeV(symmetric: Design, base: SolvedOperatingPoint, gain: number, hintV: number | null): number | null {
  const excess = (at: SolvedOperatingPoint, vid: number) => Math.abs(outputDifferenceV(at.op) - gain * vid) / Math.abs(gain * vid) - LINEAR_RANGE_ERROR;
  const spanV = 2 * (symmetric.supply.positiveV - symmetric.supply.negativeV);
  // the bracket: below, the largest amplitude known within 1 % (0: the base); above, the least known past it (null: none yet)
  let low = 0;
  let lowExcess = -LINEAR_RANGE_ERROR;
  let lowAt = base;
  let high: { x: number; excess: number; at: SolvedOperatingPoint } | null = null;
  let x = hintV !== null && hintV > 0 && Number.isFinite(hintV) ? Math.min(hintV, spanV) : 0.2 * base.model.thermalVoltageV;
  for (;;) {
    // warm-started from the nearest solve: the last one below, or the last above while coming down
    const at = solveStageOperatingPoint(symmetric, (high ? high.at : lowAt).op, x);
    const e = excess(at, x);
    if (e < 0) {
      low = x;
      lowExcess = e;
      lowAt = at;
      if (high) break;
      if (x > spanV) return null;
    } else {
      high = { x, excess: e, at };
      if (low > 0) break;
    }
    x = squareLawJump(x, e);
  }
  return illinois(symmetric, excess, low, lowExcess, lowAt, high.x, high.excess);
}

/** Illinois: false position, halving the kept end's value when the same end stays twice, until the bracket is a thousandth of its top. */
function illinois(
  symmetric: Design,
  excess: (at: SolvedOperatingPoint, vid: number) => number,
  lowStart: number,
  lowExcessStart: number,
  lowAtStart: SolvedOperatingPoint,
  highStart: number,
  highExcessStart: number,
): number {
  let [low, lowExcess, lowAt, high, highExcess] = [lowStart, lowExcessStart, lowAtStart, highStart, highExcessStart];
  let side = 0;
  for (let step = 0; step < LINEAR_RANGE_MAX_STEPS && high - low > LINEAR_RANGE_TOLERANCE * high; step += 1) {
    const x = (low * highExcess - high * lowExcess) / (highExcess - lowExcess);
    const at = solveStageOperatingPoint(symmetric, lowAt.op, x);
    const e = excess(at, x);
    if (e < 0) {
      low = x;
      lowExcess = e;
      lowAt = at;
      if (side === -1) highExcess /= 2;
      side = -1;
    } else {
      high = x;
      highExcess = e;
      if (side === 1) lowExcess /= 2;
      side = 1;
    }
  }
  return (low * highExcess - high * lowExcess) / (highExcess - lowExcess);
}
