/**
 * Textbook limits of each tail's output resistance, kept beside the exact node solution for
 * explanations and sanity checks (DOMAIN.md, "Tail elements"). Each uses the output
 * transistor's own operating point with SPICE's small-signal forms ro = (VAF + VCB)/IC,
 * rπ = BF·(1 + VCB/VAF)/gm [SPICE]; the formulas themselves are [GM].
 */
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
  const earlyFactor = Number.isFinite(earlyVoltageV) ? 1 + q.vcbV / earlyVoltageV : 1;
  return {
    roOhm: Number.isFinite(earlyVoltageV) ? (earlyVoltageV + q.vcbV) / q.collectorCurrentA : Infinity,
    gmS,
    rpiOhm: (beta * earlyFactor) / gmS,
  };
}

function parallelOhm(aOhm: number, bOhm: number): number {
  return (aOhm * bOhm) / (aOhm + bOhm);
}

/** The closed-form output resistance of a tail at its operating point. */
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
  switch (tail.topology) {
    case 'resistor':
      return { valueOhm: tail.resistanceOhm, formula: 'R' };
    case 'simple-mirror':
      return { valueOhm: finite(byName('Q4').roOhm), formula: 'ro' };
    case 'degenerated-mirror':
    case 'widlar': {
      const q4 = byName('Q4');
      return {
        valueOhm: finite(q4.roOhm * (1 + q4.gmS * parallelOhm(tail.emitterResistanceOhm, q4.rpiOhm))),
        formula: 'ro·(1 + gm·(RE ∥ rπ))',
      };
    }
    case 'wilson':
      return { valueOhm: finite((beta * byName('Q5').roOhm) / 2), formula: 'β·ro/2' };
    case 'cascode':
      return { valueOhm: finite((beta * byName('Q6').roOhm) / 2), formula: 'β·ro/2' };
  }
}
