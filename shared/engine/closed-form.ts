/**
 * Textbook limits of each tail's output resistance, kept beside the exact node solution for
 * explanations and sanity checks (DOMAIN.md, "Tail elements"); which limit a topology has, and
 * of which transistor, is in its catalogue entry (topologies.ts). Each uses the output
 * transistor's own operating point with SPICE's small-signal forms ro = (VAF + VCB)/IC,
 * rπ = BF·(1 + VCB/VAF)/gm [SPICE]; the formulas themselves are [GM].
 */
import { TOPOLOGY_CATALOGUE, tailValueOhm, unhandledTopology, type RoutLimit } from './topologies';
import type { TailDesign, TransistorOperatingPoint } from './types';

export interface ClosedFormRout {
  valueOhm: number | null;
  formula: string;
}

interface SmallSignalParams {
  roOhm: number;
  gmS: number;
  rpiOhm: number;
}

function smallSignalOf(q: TransistorOperatingPoint, beta: number, earlyVoltageV: number, thermalVoltageV: number): SmallSignalParams {
  const gmS = q.collectorCurrentA / thermalVoltageV;
  // Stryker disable next-line ConditionalExpression: equivalent, with VAF infinite 1 + VCB/VAF is 1 and (VAF + VCB)/IC infinite all the same
  const earlyFactor = Number.isFinite(earlyVoltageV) ? 1 + q.vcbV / earlyVoltageV : 1;
  return {
    // Stryker disable next-line ConditionalExpression: equivalent, as above
    roOhm: Number.isFinite(earlyVoltageV) ? (earlyVoltageV + q.vcbV) / q.collectorCurrentA : Infinity,
    gmS,
    rpiOhm: (beta * earlyFactor) / gmS,
  };
}

function parallelOhm(aOhm: number, bOhm: number): number {
  return (aOhm * bOhm) / (aOhm + bOhm);
}

/** How each textbook limit reads in a reason and in the docs. */
export const ROUT_FORMULAS: Record<RoutLimit['form'], string> = {
  resistor: 'R',
  ro: 'ro',
  'degenerated-ro': 'ro·(1 + gm·(RE ∥ rπ))',
  'beta-ro-half': 'β·ro/2',
};

/** The closed-form output resistance of a tail at its operating point (the limit its catalogue entry names). */
export function closedFormTailRout(
  tail: TailDesign,
  transistors: TransistorOperatingPoint[],
  beta: number,
  earlyVoltageV: number,
  thermalVoltageV: number,
): ClosedFormRout {
  const byName = (name: string) => {
    const q = transistors.find((t) => t.name === name);
    if (!q) throw new Error(`no transistor ${name}`);
    return smallSignalOf(q, beta, earlyVoltageV, thermalVoltageV);
  };
  const finite = (x: number) => (Number.isFinite(x) ? x : null);
  const limit = TOPOLOGY_CATALOGUE[tail.topology].routLimit;
  const formula = ROUT_FORMULAS[limit.form];
  switch (limit.form) {
    case 'resistor':
      return { valueOhm: tailValueOhm(tail, limit.field), formula };
    case 'ro':
      return { valueOhm: finite(byName(limit.transistor).roOhm), formula };
    case 'degenerated-ro': {
      const q = byName(limit.transistor);
      return { valueOhm: finite(q.roOhm * (1 + q.gmS * parallelOhm(tailValueOhm(tail, limit.emitterField), q.rpiOhm))), formula };
    }
    case 'beta-ro-half':
      return { valueOhm: finite((beta * byName(limit.transistor).roOhm) / 2), formula };
    // Stryker disable next-line ConditionalExpression: the exhaustive switch's guard, unreachable for a well-typed limit
    default:
      return unhandledTopology(limit);
  }
}
