/**
 * What limits the rejection at a frequency (shared/engine/rejection-limits.ts), against hand
 * analysis of the simplest case, a resistor tail R with a wiring capacitance C and devices that
 * store no charge: the tail node's admittance is Y = 1/R + jωC, the common-mode gain of a pair
 * with ideal base drive is proportional to Y/(2·gm + Y) ≈ Y/(2·gm) (the pair's gm far above |Y|)
 * [GM] (Gray & Meyer, "Analysis and Design of Analog Integrated Circuits", the emitter-coupled
 * pair's common-mode half circuit), so the rejection's logarithmic sensitivity to R's conductance
 * is Re((1/R)/Y) = 1/(1 + (ωRC)²) and to C's is (ωRC)²/(1 + (ωRC)²): half each at the corner
 * ωRC = 1. Removing C leaves Rout alone: the rejection rises by 10·log10(1 + (ωRC)²) dB. The tail
 * impedance is |R ∥ 1/(jωC)| = R/√(1 + (ωRC)²). Each test solves its own design.
 */
import { describe, expect, test } from 'vitest';
import { solveStage } from '#shared/engine/analyze';
import { rejectionLimits, tailImpedanceOhm } from '#shared/engine/rejection-limits';
import type { Design } from '#shared/engine/types';

const R_OHM = 22000;
const C_F = 10e-12;

/** An invented resistor-tail stage: three-parameter device, no Early effect, a 10 pF wiring capacitance. */
function resistorTail(extra: Partial<Design> = {}): Design {
  return {
    device: { family: 'npn', beta: 150, earlyVoltageV: 0, saturationCurrentA: 1e-14 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 10000,
    tail: { topology: 'resistor', resistanceOhm: R_OHM },
    tailCapacitanceF: C_F,
    ...extra,
  } as Design;
}

/** The frequency where ωRC = x. */
const frequencyFor = (x: number) => x / (2 * Math.PI * R_OHM * C_F);

describe('the shares of a resistor tail with a wiring capacitance', () => {
  test.each([0.3, 1, 3])('at ωRC = %s: tail resistance 1/(1 + (ωRC)²), wiring (ωRC)²/(1 + (ωRC)²), within 1 point', (x) => {
    const solved = solveStage(resistorTail());
    const limits = rejectionLimits(solved, frequencyFor(x), 'single-ended', 'nominal');
    const share = (part: string) => limits.limits.find((l) => l.part === part)?.sharePercent ?? 0;
    const hand = 100 / (1 + x * x);
    expect(Math.abs(share('tail-resistance') - hand)).toBeLessThan(1);
    expect(Math.abs(share('tail-wiring') - (100 - hand))).toBeLessThan(1);
    expect(limits.limits.reduce((s, l) => s + l.sharePercent, 0)).toBeCloseTo(100, 9);
    // the elements with their values: the tail's 22 kΩ and the 10 pF
    expect(limits.limits.find((l) => l.part === 'tail-resistance')!.elements).toEqual([{ name: 'tail', resistanceOhm: R_OHM }]);
    expect(limits.limits.find((l) => l.part === 'tail-wiring')!.elements).toEqual([{ name: 'CT', capacitanceF: C_F }]);
  });

  test('removing the wiring capacitance gives back 10·log10(1 + (ωRC)²) dB, within 0.05 dB', () => {
    const x = 3;
    const solved = solveStage(resistorTail());
    const limits = rejectionLimits(solved, frequencyFor(x), 'single-ended', 'nominal');
    const wiring = limits.limits.find((l) => l.part === 'tail-wiring')!;
    expect(Math.abs(wiring.rejectionWithoutDb! - limits.rejectionDb - 10 * Math.log10(1 + x * x))).toBeLessThan(0.05);
    // the tail resistance is not a capacitance: nothing to remove
    expect(limits.limits.find((l) => l.part === 'tail-resistance')!.rejectionWithoutDb).toBeNull();
  });

  test('the rejection falls by 8.69·S dB per unit of relative growth: a 1 % larger capacitance, solved again', () => {
    const f = frequencyFor(2);
    const limits = rejectionLimits(solveStage(resistorTail()), f, 'single-ended', 'nominal');
    const grown = rejectionLimits(solveStage(resistorTail({ tailCapacitanceF: C_F * 1.01 })), f, 'single-ended', 'nominal');
    const wiring = limits.limits.find((l) => l.part === 'tail-wiring')!;
    const predictedDb = -20 * Math.log10(Math.E) * wiring.sensitivity * Math.log(1.01);
    expect(Math.abs(grown.rejectionDb - limits.rejectionDb - predictedDb)).toBeLessThan(0.02 * Math.abs(predictedDb));
  });
});

describe('the tail impedance at a frequency', () => {
  test('a resistor with a wiring capacitance: R/√(1 + (ωRC)²)', () => {
    const solved = solveStage(resistorTail());
    for (const x of [0.1, 1, 10]) {
      const hand = R_OHM / Math.sqrt(1 + x * x);
      expect(Math.abs(tailImpedanceOhm(solved, frequencyFor(x)) / hand - 1)).toBeLessThan(1e-9);
    }
  });

  test('the device’s own capacitances lower it: a mirror’s output transistor’s CJC and CJS with no wiring capacitance', () => {
    const card = { IS: 1e-14, BF: 150, VAF: 80, CJC: 4e-12, CJS: 2e-12 };
    const design: Design = {
      device: { family: 'npn', beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14, model: card },
      supply: { positiveV: 12, negativeV: -12 },
      collectorResistanceOhm: 10000,
      tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
    } as Design;
    const solved = solveStage(design);
    const rout = solved.result.tailOutputResistanceOhm;
    // well above the corner 1/(2π·Rout·C), the impedance is that of the capacitances: below Rout by far
    const f = 100 / (2 * Math.PI * rout * 6e-12);
    const z = tailImpedanceOhm(solved, f);
    expect(z).toBeLessThan(rout / 10);
    // and no larger than that of the output transistor's whole CJC + CJS at zero bias to AC ground
    expect(z).toBeGreaterThan(1 / (2 * Math.PI * f * 6e-12));
    expect(tailImpedanceOhm(solved, 0)).toBe(rout);
  });
});
