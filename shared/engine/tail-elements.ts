/**
 * The circuit stamp of each tail topology (the catalogue, topologies.ts): its elements between
 * the tail node `t` and the negative rail, named as the catalogue names its parts, each with a
 * hand-analysis starting guess for the solver.
 */
import { tailRatio, unhandledTopology, type TailDesign } from './topologies';
import type { CircuitElement } from './circuit';

const VP = 'vp';
const VN = 'vn';
const T = 't';

/** Thermal voltage used only for starting guesses (room temperature), V. */
const GUESS_VT_V = 0.0259;

export interface TailGuessContext {
  positiveV: number;
  negativeV: number;
  tailNodeGuessV: number;
  /** One VBE for every junction, V. */
  vbeGuessV: number;
  /**
   * The device's VBE at a collector current (A), when the caller knows the device: each
   * junction is then guessed at its own current (the reference transistors at the reference
   * current), which starts Newton a few millivolts from the solution instead of tens.
   */
  vbeAtV?: (currentA: number) => number;
  /** The device's VT at its temperature, V (the Widlar source's guess); absent: room temperature's. */
  thermalVoltageV?: number;
}

export interface TailElements {
  elements: CircuitElement[];
  initialGuessV: Record<string, number>;
  currentGuessA: number;
}

function resistor(name: string, a: string, b: string, resistanceOhm: number): CircuitElement {
  return { kind: 'resistor', name, nodes: [a, b], resistanceOhm, part: 'tail' };
}

function npn(name: string, collector: string, base: string, emitter: string, area = 1): CircuitElement {
  return { kind: 'npn', name, collector, base, emitter, substrate: VN, area, part: 'tail' };
}

/** A PNP of the tail (its substrate, like every transistor's, at the negative rail). */
function pnp(name: string, collector: string, base: string, emitter: string): CircuitElement {
  return { kind: 'pnp', name, collector, base, emitter, substrate: VN, area: 1, part: 'tail' };
}

/** The PTAT cell's current from I·R = VT·ln(N·I3/I) with I3 = I plus the start-up current, by fixed-point iteration (a guess only). */
function ptatGuessA(areaRatio: number, emitterOhm: number, startupA: number, vtV: number): number {
  let currentA = (vtV * Math.log(areaRatio)) / emitterOhm;
  for (let i = 0; i < 20; i += 1) currentA = (vtV * Math.log((areaRatio * (currentA + startupA)) / currentA)) / emitterOhm;
  return currentA;
}

/** Output current of a Widlar source from I·RE = VT·ln(Iref/I), by fixed-point iteration. */
function widlarGuessA(referenceA: number, emitterOhm: number, vtV = GUESS_VT_V): number {
  // Stryker disable next-line MethodExpression,ArithmeticOperator: equivalent, the iteration below reaches the same current from any start in (0, Iref] when Iref/Iout > e (each step divides the error by ln(Iref/Iout)); the sizing's ratio is 5, and the result is only the solver's guess
  let currentA = Math.min(referenceA, vtV / Math.max(emitterOhm, 1e-9));
  for (let i = 0; i < 30; i += 1) {
    currentA = (vtV * Math.log(referenceA / Math.max(currentA, 1e-15))) / emitterOhm;
    currentA = Math.min(Math.max(currentA, referenceA * 1e-4), referenceA);
  }
  return currentA;
}

/** Fixed-point steps of Iref = (V+ − V− − n·VBE(Iref))/R (each divides the error by about R·Iref/(n·VT)). */
const REFERENCE_GUESS_STEPS = 3;

/**
 * The reference current through `ohm` and `junctions` diode drops from V+ to V−, and the VBE at
 * it: Iref = (V+ − V− − n·VBE)/R with VBE from the context's device when it gives one.
 */
function referenceGuess(ctx: TailGuessContext, junctions: number, ohm: number): { currentA: number; vbeV: number } {
  let vbeV = ctx.vbeGuessV;
  let currentA = Math.max(ctx.positiveV - ctx.negativeV - junctions * vbeV, 0) / ohm;
  if (ctx.vbeAtV) {
    for (let step = 0; step < REFERENCE_GUESS_STEPS && currentA > 0; step += 1) {
      vbeV = ctx.vbeAtV(currentA);
      currentA = Math.max(ctx.positiveV - ctx.negativeV - junctions * vbeV, 0) / ohm;
    }
  }
  return { currentA, vbeV };
}

/** Elements and guesses of one tail element. */
export function tailElements(tail: TailDesign, ctx: TailGuessContext): TailElements {
  const { negativeV: vn } = ctx;
  switch (tail.topology) {
    case 'resistor':
      return {
        elements: [resistor('RT', T, VN, tail.resistanceOhm)],
        initialGuessV: {},
        currentGuessA: Math.max(ctx.tailNodeGuessV - vn, 0) / tail.resistanceOhm,
      };
    case 'simple-mirror': {
      const { currentA: refA, vbeV: vbe } = referenceGuess(ctx, 1, tail.referenceResistanceOhm);
      return {
        elements: [resistor('RREF', VP, 'ref', tail.referenceResistanceOhm), npn('Q3', 'ref', 'ref', VN), npn('Q4', T, 'ref', VN)],
        initialGuessV: { ref: vn + vbe },
        currentGuessA: refA,
      };
    }
    case 'degenerated-mirror': {
      const reOhm = tail.emitterResistanceOhm;
      const { currentA: refA, vbeV: vbe } = referenceGuess(ctx, 1, tail.referenceResistanceOhm + reOhm);
      return {
        elements: [
          resistor('RREF', VP, 'ref', tail.referenceResistanceOhm),
          npn('Q3', 'ref', 'ref', 'e3'),
          resistor('RE3', 'e3', VN, reOhm),
          npn('Q4', T, 'ref', 'e4'),
          resistor('RE4', 'e4', VN, reOhm),
        ],
        initialGuessV: { ref: vn + refA * reOhm + vbe, e3: vn + refA * reOhm, e4: vn + refA * reOhm },
        currentGuessA: refA,
      };
    }
    case 'widlar': {
      const reOhm = tail.emitterResistanceOhm;
      const { currentA: refA, vbeV: vbe } = referenceGuess(ctx, 1, tail.referenceResistanceOhm);
      const outA = widlarGuessA(refA, reOhm, ctx.thermalVoltageV);
      return {
        elements: [
          resistor('RREF', VP, 'ref', tail.referenceResistanceOhm),
          npn('Q3', 'ref', 'ref', VN),
          npn('Q4', T, 'ref', 'e4'),
          resistor('RE4', 'e4', VN, reOhm),
        ],
        initialGuessV: { ref: vn + vbe, e4: vn + outA * reOhm },
        currentGuessA: outA,
      };
    }
    case 'wilson': {
      const { currentA: refA, vbeV: vbe } = referenceGuess(ctx, 2, tail.referenceResistanceOhm);
      return {
        elements: [
          resistor('RREF', VP, 'ref', tail.referenceResistanceOhm),
          npn('Q3', 'ref', 'x', VN),
          npn('Q5', T, 'ref', 'x'),
          npn('Q4', 'x', 'x', VN),
        ],
        initialGuessV: { ref: vn + 2 * vbe, x: vn + vbe },
        currentGuessA: refA,
      };
    }
    case 'cascode': {
      const { currentA: refA, vbeV: vbe } = referenceGuess(ctx, 2, tail.referenceResistanceOhm);
      return {
        elements: [
          resistor('RREF', VP, 'ref', tail.referenceResistanceOhm),
          npn('Q5', 'ref', 'ref', 'm3'),
          npn('Q3', 'm3', 'm3', VN),
          npn('Q4', 'm4', 'm3', VN),
          npn('Q6', T, 'ref', 'm4'),
        ],
        initialGuessV: { ref: vn + 2 * vbe, m3: vn + vbe, m4: vn + vbe },
        currentGuessA: refA,
      };
    }
    case 'ptat': {
      // Q3 and Q4 carry about VT·ln(N)/R each (Q3 the start-up current too); the PNP mirror's
      // diode Q8 sits on Q4's collector; Q9 copies Q3's current times its area
      const reOhm = tail.emitterResistanceOhm;
      const areaRatio = tailRatio(tail, 'areaRatio');
      const outputArea = tailRatio(tail, 'outputAreaRatio');
      const vtV = ctx.thermalVoltageV ?? GUESS_VT_V;
      const startupA = Math.max(ctx.positiveV - ctx.negativeV - ctx.vbeGuessV, 0) / tail.startupResistanceOhm;
      const cellA = ptatGuessA(areaRatio, reOhm, startupA, vtV);
      const vbe3V = ctx.vbeAtV ? ctx.vbeAtV(cellA + startupA) : ctx.vbeGuessV;
      const vebV = ctx.vbeAtV ? ctx.vbeAtV(cellA) : ctx.vbeGuessV;
      return {
        elements: [
          pnp('Q7', 'ref', 'p4', VP),
          pnp('Q8', 'p4', 'p4', VP),
          resistor('RSU', VP, 'ref', tail.startupResistanceOhm),
          npn('Q3', 'ref', 'ref', VN),
          npn('Q4', 'p4', 'ref', 'e4', areaRatio),
          resistor('RE4', 'e4', VN, reOhm),
          npn('Q9', T, 'ref', VN, outputArea),
        ],
        initialGuessV: { ref: vn + vbe3V, e4: vn + cellA * reOhm, p4: ctx.positiveV - vebV },
        currentGuessA: outputArea * (cellA + startupA),
      };
    }
    default:
      return unhandledTopology(tail);
  }
}
