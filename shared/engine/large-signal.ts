/**
 * The pair's large-signal transfer: the stage solved at DC with a differential input on the bases
 * (in1 = Vicm + v/2, in2 = Vicm − v/2), the same Newton solve as the operating point, so the
 * emitter-coupled pair's tanh law, its emitter degeneration, beta, the Early effect and the tail's
 * finite output resistance are all in it [GM]. The output swing is checked against it: the input
 * that reaches the swing's peak, and how far the output there falls below the small-signal gain
 * times that input (the compression at the peak).
 */
import { stageCircuit, COLLECTOR_NODES, INPUT_NODES } from './circuit';
import { nodeVoltage } from './node-system';
import { solveOperatingPoint, type OperatingPoint } from './operating-point';
import type { SolvedCircuit } from './analyze';

/** Relative accuracy of the input found for the swing's peak. */
const INPUT_TOLERANCE = 1e-6;
/** How far past the linear estimate the search looks before it calls the swing unreachable. */
const MAX_INPUT_FACTOR = 64;
const MAX_ITERATIONS = 60;

/** The output at a differential DC input: v(c1) − v(c2) and v(c1), each as a change from zero input, V. */
export interface LargeSignalOutput {
  differentialV: number;
  collector1V: number;
  op: OperatingPoint;
}

/** Solves the stage with `inputV` between the bases, split about the common mode. */
export function outputAtDifferentialInput(solution: SolvedCircuit, inputV: number, warmStart?: OperatingPoint): LargeSignalOutput {
  const circuit = stageCircuit(solution.design);
  const vicmV = solution.design.inputCommonModeV ?? 0;
  circuit.fixedNodesV[INPUT_NODES[0]] = vicmV + inputV / 2;
  circuit.fixedNodesV[INPUT_NODES[1]] = vicmV - inputV / 2;
  const ownModels = Object.fromEntries(solution.op.circuit.transistors.filter((q) => q.model).map((q) => [q.name, q.model!]));
  // Stryker disable next-line LogicalOperator: equivalent, a warm start saves iterations only; the operating point is the same to the solver's 0.1 nV
  const op = solveOperatingPoint(circuit, solution.model, warmStart ?? solution.op, ownModels);
  const at = (o: OperatingPoint, node: string) => nodeVoltage(o.circuit, o.voltagesV, o.circuit.nodeRef(node));
  const [c1, c2] = COLLECTOR_NODES;
  const differentialV = at(op, c1) - at(op, c2) - (at(solution.op, c1) - at(solution.op, c2));
  return { differentialV, collector1V: at(op, c1) - at(solution.op, c1), op };
}

/** The swing's peak checked against the large-signal transfer. */
export interface SwingCompression {
  /** Differential input that reaches the peak (the larger of the two polarities), V; null when no input reaches it. */
  peakInputV: number | null;
  /** The input the small-signal gain predicts for the peak, V. */
  linearInputV: number;
  /** 1 − peak / (|A|·peak input), per cent; 100 when the output cannot reach the peak. */
  compressionPercent: number;
}

/**
 * The input that makes the output named by `output` reach `peakV` away from its quiescent value
 * (a differential output: v(c1) − v(c2) = ±peak, the pair's transfer being odd; a single-ended
 * one: v(c1) down and up by the peak, the larger input of the two), and the compression there
 * against the small-signal gain `gain` (magnitude, V/V).
 */
export function swingCompression(solution: SolvedCircuit, output: 'differential' | 'single-ended', peakV: number, gain: number): SwingCompression {
  const linearInputV = peakV / gain;
  if (!(peakV > 0)) return { peakInputV: 0, linearInputV: 0, compressionPercent: 0 };
  // a positive input lowers v(c1): the differential output is odd, a single-ended one is checked both ways
  const polarities = output === 'differential' ? [1] : [1, -1];
  let peakInputV: number | null = 0;
  for (const sign of polarities) {
    const outputAt = (v: number, warm?: OperatingPoint) => {
      const o = outputAtDifferentialInput(solution, sign * v, warm);
      return { value: -sign * (output === 'differential' ? o.differentialV : o.collector1V), op: o.op };
    };
    const found = inputForOutput(outputAt, peakV, linearInputV);
    peakInputV = found === null || peakInputV === null ? null : Math.max(peakInputV, found.inputV);
  }
  const compressionPercent = peakInputV === null ? 100 : 100 * (1 - linearInputV / peakInputV);
  return { peakInputV, linearInputV, compressionPercent };
}

type Transfer = (inputV: number, warm?: OperatingPoint) => { value: number; op: OperatingPoint };

/**
 * The input where the monotonic transfer reaches `target`: bracketed by doubling from the linear
 * estimate, then the Illinois variant of regula falsi. Null when no input up to
 * MAX_INPUT_FACTOR times the estimate reaches it.
 */
function inputForOutput(outputAt: Transfer, target: number, linearInputV: number): { inputV: number; op: OperatingPoint } | null {
  let lo = 0;
  let fLo = -target;
  let hi = linearInputV;
  let step = outputAt(hi);
  let fHi = step.value - target;
  let warm = step.op;
  while (fHi < 0) {
    if (hi >= MAX_INPUT_FACTOR * linearInputV) return null;
    lo = hi;
    fLo = fHi;
    hi *= 2;
    step = outputAt(hi, warm);
    fHi = step.value - target;
    warm = step.op;
  }
  let side = 0;
  for (let i = 0; i < MAX_ITERATIONS; i += 1) {
    const x = (lo * fHi - hi * fLo) / (fHi - fLo);
    step = outputAt(x, warm);
    const fx = step.value - target;
    warm = step.op;
    if (Math.abs(fx) <= INPUT_TOLERANCE * target || hi - lo <= INPUT_TOLERANCE * hi) return { inputV: x, op: warm };
    // Stryker disable ConditionalExpression,EqualityOperator,AssignmentOperator,UnaryOperator: equivalent, the Illinois halving only speeds the bracket's convergence; every variant returns the same root to INPUT_TOLERANCE
    if (fx < 0) {
      lo = x;
      fLo = fx;
      if (side === -1) fHi /= 2;
      side = -1;
    } else {
      hi = x;
      fHi = fx;
      if (side === 1) fLo /= 2;
      side = 1;
    }
    // Stryker restore all
  }
  return { inputV: (lo + hi) / 2, op: warm };
}
