/**
 * An option's rejection over frequency from its devices (shared/engine/option-evaluation.ts): the
 * tail impedance at the spec frequency with the tail transistor's own junction capacitances, the
 * rejection curve's extent, and what limits the rejection at the spec frequency. The expected
 * values come from hand analysis: a junction's depletion capacitance C = CJ/(1 + VR/VJ)^MJ at
 * reverse bias VR [SPICE] (ngspice manual, BJT model; Gray & Meyer 1.2), in parallel with the tail
 * output resistance at the mirror's output node; the current through the output transistor's CJC
 * flows into the mirror's input (its base node, held near AC ground by the diode-connected
 * transistor, 1/gm ≈ 26 Ω) and the mirror copies it to its output, so CJC counts twice there
 * [GM] (the mirror's current gain of 1); the gain's fall from `analyze`'s `ac` entries.
 * The specs and cards are invented; each test evaluates its own design.
 */
import { describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/index';
import { evaluateOption } from '#shared/engine/option-evaluation';
import type { Design, Spec, TailDesign } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';

const CARD = { IS: 1e-14, BF: 150, VAF: 80, CJE: 10e-12, CJC: 4e-12, VJC: 0.7, MJC: 0.4, CJS: 2e-12, VJS: 0.6, MJS: 0.5, TF: 0.4e-9 };

function specWith(overrides: Record<string, unknown> = {}): Spec {
  const result = validateSpec({
    title: 'Quillfen rejection over frequency case',
    device: { model: CARD },
    supply: { positiveV: 12, negativeV: -12 },
    gain: { target: 100, tolerancePercent: 10, output: 'single-ended' },
    cmrr: { minDb: 40, atFrequencyHz: 300000 },
    inputCommonMode: { minV: -2, maxV: 2 },
    outputSwingVpp: 2,
    powerBudgetW: 0.05,
    temperatureC: { min: -10, max: 70 },
    resistors: { series: 'E96', tolerancePercent: 1 },
    tailCapacitanceF: 0,
    monteCarlo: { samples: 200, seed: 5 },
    ...overrides,
  });
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.value;
}

const MIRROR: TailDesign = { topology: 'simple-mirror', referenceResistanceOhm: 22600 };

function designFor(spec: Spec, tail: TailDesign): Design {
  return { device: spec.device, supply: spec.supply, collectorResistanceOhm: 10000, pairEmitterResistanceOhm: 0, tail, inputCommonModeV: 0, temperatureC: 27, tailCapacitanceF: spec.tailCapacitanceF };
}

describe('the tail impedance at the spec frequency', () => {
  test('with no wiring capacitance, the output transistor’s CJC and CJS at its bias bring it below Rout: |Rout ∥ 1/(jω(2·Cbc + Ccs))| within 2 %', () => {
    const spec = specWith();
    const design = designFor(spec, MIRROR);
    const { facts } = evaluateOption(spec, design);
    const nominal = analyze(design);
    const q4 = nominal.transistors.find((q) => q.name === 'Q4')!;
    // reverse biases: collector–base VCB, collector–substrate VCE (emitter and substrate both at the negative rail)
    const cbcF = CARD.CJC / (1 + q4.vcbV / CARD.VJC) ** CARD.MJC;
    const ccsF = CARD.CJS / (1 + q4.vceV / CARD.VJS) ** CARD.MJS;
    const omega = 2 * Math.PI * spec.cmrr.atFrequencyHz;
    // the current CJC feeds into the mirror's input comes back out of its output: 2·Cbc at the tail node
    const handOhm = 1 / Math.hypot(1 / nominal.tailOutputResistanceOhm, omega * (2 * cbcF + ccsF));
    expect(Math.abs(facts.tailImpedanceAtFrequencyOhm / handOhm - 1)).toBeLessThan(0.02);
    expect(facts.tailImpedanceAtFrequencyOhm).toBeLessThan(0.95 * facts.tailOutputResistanceOhm);
  });
});

describe('the rejection curve', () => {
  test('a card with capacitances: past 10 MHz, up to the last grid point where the differential gain is within 20 dB of its low-frequency value', () => {
    const spec = specWith({ cmrr: { minDb: 40, atFrequencyHz: 1000 } });
    const design = designFor(spec, MIRROR);
    const { curves } = evaluateOption(spec, design);
    const points = curves.cmrrVsFrequency;
    const lastHz = points.at(-1)!.frequencyHz;
    expect(lastHz).toBeGreaterThan(1e7);
    points.forEach((p, i) => expect(Math.abs(p.frequencyHz / 10 ** (i / 4) - 1)).toBeLessThan(1e-12));
    const nextHz = lastHz * 10 ** 0.25;
    const { ac } = analyze({ ...design, frequenciesHz: [1, lastHz, nextHz] });
    const dropDb = (k: number) => 20 * Math.log10(ac[0].differentialGain / ac[k].differentialGain);
    expect(dropDb(1)).toBeLessThanOrEqual(20);
    if (lastHz < 1e9 * 0.999) expect(dropDb(2)).toBeGreaterThan(20);
  });

  test('a three-parameter device (no capacitances given) stops at 10 MHz', () => {
    const spec = specWith({ device: { beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 }, tailCapacitanceF: 1e-11 });
    const { curves } = evaluateOption(spec, designFor(spec, MIRROR));
    expect(curves.cmrrVsFrequency.at(-1)!.frequencyHz).toBeCloseTo(1e7, 0);
  });
});

describe('what limits the rejection at the spec frequency', () => {
  test('single-ended: at the corner that governs the rejection, its figure, the shares adding to 100 %, the mirror’s output transistor named', () => {
    const spec = specWith();
    const { facts, rejectionLimits } = evaluateOption(spec, designFor(spec, MIRROR));
    expect(rejectionLimits).not.toBeNull();
    const limits = rejectionLimits!;
    expect(limits.output).toBe('single-ended');
    expect(limits.frequencyHz).toBe(spec.cmrr.atFrequencyHz);
    expect(limits.conditionLabel).toBe(facts.worstCmrrCorner);
    expect(Math.abs(limits.rejectionDb - facts.cmrrAtFrequencyDb)).toBeLessThan(1e-9);
    expect(limits.limits.reduce((s, l) => s + l.sharePercent, 0)).toBeCloseTo(100, 9);
    const collectorBase = limits.limits.find((l) => l.part === 'tail-base-collector')!;
    expect(collectorBase.elements[0].name).toBe('Q4');
    expect(collectorBase.sharePercent).toBeGreaterThan(1);
  });

  test('differential output: on c1 − c2 with the mismatches at their worst case, at the governing corner', () => {
    const spec = specWith({ gain: { target: 200, tolerancePercent: 10, output: 'differential' } });
    const { facts, rejectionLimits } = evaluateOption(spec, designFor(spec, MIRROR));
    expect(rejectionLimits!.output).toBe('differential');
    // the worst case adds every mismatch's term in magnitude; the one solved circuit with aligned signs comes close
    expect(Math.abs(rejectionLimits!.rejectionDb - facts.cmrrDifferentialWorstCaseDb!)).toBeLessThan(6);
    expect(rejectionLimits!.limits.reduce((s, l) => s + l.sharePercent, 0)).toBeCloseTo(100, 9);
  });
});
