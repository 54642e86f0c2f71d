/**
 * The contract's slew rate (ENGINE-CONTRACT.md, "New outputs"): the largest |d v(c1,c2)/dt|
 * after the differential drive steps from −1 V to +1 V in 1 ns, from a transient solve of the
 * stage's own circuit (transient.ts): every transistor's currents and stored charges, the tail,
 * the loads and the source resistances as the operating point has them.
 *
 * Beside it, the hand figure [GM] (DOMAIN.md, "Slew rate"): a switched pair moves its whole tail
 * current from one collector to the other, so at the start of the swing
 * d(vc1 − vc2)/dt = 2·Itail/CL (a single collector Itail/CL). The solved figure is that limit
 * when the load capacitance dominates; where the device's own capacitances matter, or the
 * output follows the 1 ns edge itself (little or no capacitance: then about |Ad|·2 V/ns), it is
 * what the circuit does instead.
 */
import type { SolvedCircuit } from './analyze';
import { COLLECTOR_NODES } from './circuit';
import { NOMINAL_TEMPERATURE_C } from './constants';
import { nodeVoltage } from './node-system';
import { ConvergenceError, type OperatingPoint } from './operating-point';
import { solveStageOperatingPoint } from './stage-solve';
import { integrateTransient } from './transient';

/** The drive's two states (differential, V) and its edge, s (the contract's). */
export const SLEW_FROM_V = -1;
export const SLEW_TO_V = 1;
export const SLEW_EDGE_S = 1e-9;
/** Steps across the edge at the least, so its corners and the switching within it are resolved. */
const EDGE_POINTS = 20;
/** The first step, a share of the edge (the truncation error grows it from there). */
const FIRST_STEP_SHARE = 1e-3;
/** The shortest step before the run is given up, s. */
const MIN_STEP_S = 1e-20;
/**
 * Local truncation error allowed per step on every node, as a share of the output's swing
 * between the two DC states: 1e-4 keeps the largest difference quotient within 0.3 % of a run
 * with a thousandth of it (measured on ten designs of every kind the reference file holds; 1e-3
 * is 1.2 % off), far inside the contract's 10 %, in about half the points of 1e-5.
 */
const TRUNCATION_SHARE = 1e-4;
/** A floor under that tolerance, V, for a stage whose output hardly moves. */
const TRUNCATION_FLOOR_V = 1e-9;
/**
 * Steps tried before the run is given up (null figure): a sound run takes under 200 (171 the
 * most over every topology, loads of 1 to 100 pF and tail currents from 0.4 to 2.5 times a sized
 * one), so a run five times longer is stuck and is not left to spend more.
 */
const MAX_STEPS = 1000;
/** Settled: the output within this share of its swing from the final DC value… */
const SETTLED_BAND = 0.01;
/** …and held there until this multiple of the time it first got there (the run then stops). */
const SETTLED_HOLD = 1.5;
/**
 * The figure's run stops earlier, once the largest quotient can no longer be beaten: after the
 * edge (the drive then stands still and the circuit relaxes on its own), with v(c1,c2) within
 * this share of its swing from the final DC value (so an overshoot, which a tail capacitance can
 * make several times the swing and which may come back faster than it went, has been
 * recovered)…
 */
const PEAK_PASSED_BAND = 0.1;
/** …the last quotient at most this share of the largest… */
const PEAK_PASSED_SHARE = 0.25;
/**
 * …and falling for this many intervals in a row. What is left is a relaxation over at most a
 * tenth of the swing at a quarter of the peak rate and slowing. On 1,212 designs (every
 * topology, loads 0–100 pF, tail currents 0.4–2.5× a sized one, three device cards and none,
 * with and without a tail capacitance, −40 to 125 °C, saturating pairs) the figure equals the
 * full run's on every one, in about a fifth fewer points (without the band, four of them,
 * overshooting, lost up to a third of the figure).
 */
const PEAK_PASSED_FALLING = 2;

/** The slew rate and how the run went. */
export interface SlewRun {
  /** The largest |Δv(c1,c2)/Δt| between accepted points, V/s. */
  slewRateVPerS: number;
  /** When v(c1,c2) entered the 1 % band for good, s after the edge starts (a run stopped at the peak: the last point). */
  settlingS: number;
  /** Accepted time points. */
  points: number;
  /** Steps tried, rejected ones included. */
  steps: number;
}

/** v(c1) − v(c2) of a solution, V, the collectors' node references resolved once. */
function outputReader(op: OperatingPoint): (v: readonly number[]) => number {
  const ic = op.circuit;
  const c1 = ic.nodeRef(COLLECTOR_NODES[0]);
  const c2 = ic.nodeRef(COLLECTOR_NODES[1]);
  return (v) => nodeVoltage(ic, v as number[], c1) - nodeVoltage(ic, v as number[], c2);
}

/**
 * Runs the contract's step on a solved stage: the DC solutions at −1 V and +1 V, then the
 * transient from the first with the drive ramping to +1 V over 1 ns; the figure is the largest
 * difference quotient between accepted points, as SPICE's measure takes it. The run stops once
 * the peak is passed for good (PEAK_PASSED_BAND), or with `untilSettled` only once v(c1,c2) has
 * settled within 1 % of its value at the second state (then `settlingS` is that time; the figure
 * is the same).
 */
export function slewRun(solved: SolvedCircuit, options: { untilSettled?: boolean } = {}): SlewRun {
  const untilSettled = options.untilSettled ?? false;
  // both DC states warm-started from the design's own operating point (the same circuit, drive moved)
  const { op: start, driveNodes } = solveStageOperatingPoint(solved.design, solved.op, SLEW_FROM_V);
  const final = solveStageOperatingPoint(solved.design, solved.op, SLEW_TO_V).op;
  const ic = start.circuit;
  const outputOf = outputReader(start);
  const startOutV = outputOf(start.voltagesV);
  const finalOutV = outputReader(final)(final.voltagesV);
  const swingV = Math.abs(finalOutV - startOutV);
  const drive = driveNodes.map((name) => -ic.nodeRef(name) - 1);
  const vicmV = solved.design.inputCommonModeV ?? 0;
  let largestVPerS = 0;
  let lastS = 0;
  let lastOutV = startOutV;
  let settledAtS: number | null = null;
  let points = 0;
  // the last difference quotient, and how many intervals in a row it has fallen
  let lastQuotient = Infinity;
  let falling = 0;
  const { steps } = integrateTransient(ic, solved.model, solved.model.parameters, solved.design.temperatureC ?? NOMINAL_TEMPERATURE_C, start.voltagesV, {
    fixedVAt(tS, fixedV) {
      const driveV = SLEW_FROM_V + (SLEW_TO_V - SLEW_FROM_V) * Math.min(Math.max(tS / SLEW_EDGE_S, 0), 1);
      fixedV[drive[0]] = vicmV + driveV / 2;
      fixedV[drive[1]] = vicmV - driveV / 2;
    },
    breakpointsS: [SLEW_EDGE_S],
    maxStepAt: (tS) => (tS < SLEW_EDGE_S ? SLEW_EDGE_S / EDGE_POINTS : Infinity),
    firstStepS: SLEW_EDGE_S * FIRST_STEP_SHARE,
    minStepS: MIN_STEP_S,
    maxSteps: MAX_STEPS,
    toleranceV: TRUNCATION_SHARE * swingV + TRUNCATION_FLOOR_V,
    onPoint(tS, v) {
      points += 1;
      const outV = outputOf(v);
      const quotient = tS > lastS ? Math.abs(outV - lastOutV) / (tS - lastS) : 0;
      largestVPerS = Math.max(largestVPerS, quotient);
      falling = quotient < lastQuotient ? falling + 1 : 0;
      lastQuotient = quotient;
      lastS = tS;
      lastOutV = outV;
      if (Math.abs(outV - finalOutV) > SETTLED_BAND * swingV) settledAtS = null;
      else settledAtS ??= tS;
      // past the peak for good (see PEAK_PASSED_BAND): the figure is final
      if (!untilSettled && tS >= SLEW_EDGE_S && Math.abs(outV - finalOutV) <= PEAK_PASSED_BAND * swingV && quotient <= PEAK_PASSED_SHARE * largestVPerS && falling >= PEAK_PASSED_FALLING) return true;
      return tS >= SLEW_EDGE_S && settledAtS !== null && tS >= SETTLED_HOLD * settledAtS;
    },
  });
  return { slewRateVPerS: largestVPerS, settlingS: settledAtS ?? lastS, points, steps };
}

/**
 * The contract's `slewRateVPerS` of a solved stage, V/s (slewRun's figure); null when the two DC
 * states or the transient between them do not converge (ConvergenceError), the contract's "no
 * figure" rather than a failed analysis.
 */
export function solvedSlewRateVPerS(solved: SolvedCircuit): number | null {
  try {
    return slewRun(solved).slewRateVPerS;
  } catch (error) {
    if (error instanceof ConvergenceError) return null;
    throw error;
  }
}
