/**
 * The swing check on the pair's large-signal transfer, against the handbook law of an
 * emitter-coupled pair with an ideal tail [GM]: the collector currents split as
 * x = (IC1 − IC2)/(IC1 + IC2) = tanh(u), u = (VBE1 − VBE2)/(2VT), so with emitter resistors RE
 * the input is vid = 2VT·atanh(x) + RE·Itail·x and the differential output α·Itail·RC·x; the
 * small-signal gain is the slope at x = 0, α·Itail·RC/(2VT + RE·Itail). Compression at a peak
 * Vo: 1 − Vo/(Ad·vid). A mirror tail with no Early effect (VAF = 0) is an ideal tail here.
 */
import { describe, expect, test } from 'vitest';
import { solveStage } from '#shared/engine/analyze';
import { thermalVoltageV } from '#shared/engine/constants';
import { outputAtDifferentialInput, swingCompression } from '#shared/engine/large-signal';
import { evaluateOption } from '#shared/engine/option-evaluation';
import { validateSpec } from '#shared/validate';
import type { Design, Spec } from '#shared/engine/types';

// Invented designs (not from a textbook): ideal tails, so the handbook law holds exactly.
const IDEAL_TAIL: Record<string, Design> = {
  'undegenerated, 27 °C': {
    device: { family: 'npn', beta: 180, earlyVoltageV: 0, saturationCurrentA: 8.1e-15 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 9090,
    tail: { topology: 'simple-mirror', referenceResistanceOhm: 23200 },
    inputCommonModeV: 0,
    temperatureC: 27,
  },
  'RE 330 Ω, 85 °C': {
    device: { family: 'npn', beta: 125, earlyVoltageV: 0, saturationCurrentA: 2.2e-14 },
    supply: { positiveV: 15, negativeV: -15 },
    collectorResistanceOhm: 6190,
    pairEmitterResistanceOhm: 330,
    tail: { topology: 'simple-mirror', referenceResistanceOhm: 14700 },
    inputCommonModeV: 1.2,
    temperatureC: 85,
  },
};

/** The handbook compression at a differential output peak Vo (per cent), and the input it needs. */
function handbook(design: Design, tailCurrentA: number, peakV: number) {
  const vt = thermalVoltageV(design.temperatureC!);
  const alpha = design.device.beta! / (design.device.beta! + 1);
  const re = design.pairEmitterResistanceOhm ?? 0;
  const full = alpha * tailCurrentA * design.collectorResistanceOhm;
  const x = peakV / full;
  const inputV = 2 * vt * Math.atanh(x) + re * tailCurrentA * x;
  const gain = full / (2 * vt + re * tailCurrentA);
  return { inputV, compressionPercent: 100 * (1 - peakV / (gain * inputV)) };
}

describe.each(Object.entries(IDEAL_TAIL))('%s', (_name, design) => {
  test.each([0.2, 0.5, 0.8, 0.95])('a differential peak at %f of the fully switched output: input and compression as the tanh law', (fraction) => {
    const solution = solveStage(design);
    const { tailCurrentA, differentialGain } = solution.result;
    const alpha = design.device.beta! / (design.device.beta! + 1);
    const peakV = fraction * alpha * tailCurrentA * design.collectorResistanceOhm;
    const expected = handbook(design, tailCurrentA, peakV);
    const found = swingCompression(solution, 'differential', peakV, Math.abs(differentialGain));
    expect(Math.abs(found.peakInputV! / expected.inputV - 1)).toBeLessThan(1e-4);
    expect(Math.abs(found.compressionPercent - expected.compressionPercent)).toBeLessThan(0.02);
  });

  test.each([0.3, 0.9])('a single-ended peak at %f of the fully switched collector swing: each collector carries half the differential output, so the same input as the differential peak twice as large', (fraction) => {
    const solution = solveStage(design);
    const { tailCurrentA, singleEndedGain } = solution.result;
    const alpha = design.device.beta! / (design.device.beta! + 1);
    // v(c1) moves by α·Itail·RC·x/2; with an ideal tail it moves as far down as up for ±vid
    const fullDifferentialV = alpha * tailCurrentA * design.collectorResistanceOhm;
    const expected = handbook(design, tailCurrentA, fraction * fullDifferentialV);
    const found = swingCompression(solution, 'single-ended', (fraction * fullDifferentialV) / 2, Math.abs(singleEndedGain));
    expect(Math.abs(found.peakInputV! / expected.inputV - 1)).toBeLessThan(1e-4);
    expect(Math.abs(found.linearInputV / ((fraction * fullDifferentialV) / 2 / Math.abs(singleEndedGain)) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(found.compressionPercent - expected.compressionPercent)).toBeLessThan(0.02);
  });

  test('no swing asked for: nothing to reach, no compression', () => {
    const solution = solveStage(design);
    expect(swingCompression(solution, 'differential', 0, Math.abs(solution.result.differentialGain))).toEqual({ peakInputV: 0, linearInputV: 0, compressionPercent: 0 });
  });

  test('a peak beyond the fully switched output is out of reach: 100 % compression, no input', () => {
    const solution = solveStage(design);
    const full = (design.device.beta! / (design.device.beta! + 1)) * solution.result.tailCurrentA * design.collectorResistanceOhm;
    const found = swingCompression(solution, 'differential', 1.05 * full, Math.abs(solution.result.differentialGain));
    expect(found.peakInputV).toBeNull();
    expect(found.compressionPercent).toBe(100);
  });
});

describe('the swing check of an option', () => {
  // An invented spec: 100 V/V differential from ±12 V with a 5 Vpp swing and 1 mA of tail current.
  const spec = () => {
    const result = validateSpec({
      title: 'Swing compression check',
      supply: { positiveV: 12, negativeV: -12 },
      gain: { target: 100, output: 'differential' },
      cmrr: { minDb: 60 },
      outputSwingVpp: 5,
      tailCurrentA: 0.001,
      topologies: ['cascode'],
    });
    if (!result.ok) throw new Error(JSON.stringify(result.errors));
    return result.value as Spec;
  };
  const design = (): Design => ({
    device: { family: 'npn', beta: 100, earlyVoltageV: 100, vbeOnV: 0.65 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 5110,
    tail: { topology: 'cascode', referenceResistanceOhm: 22600 },
  });

  test('a 5 Vpp differential swing from a 1 mA undegenerated pair at 100 V/V is compressed far beyond 4 % and fails; the tanh law says so too', () => {
    const { facts } = evaluateOption(spec(), design());
    // the peak, 2.5 V, against a fully switched output of about 1 mA·5.11 kΩ = 5.1 V: x ≈ 0.49, tanh law: 1 − x/atanh(x) ≈ 8 %
    const x = 2.5 / (0.99 * 0.001 * 5110);
    expect(facts.swingCompressionPercent).toBeGreaterThan(100 * (1 - x / Math.atanh(x)) - 1.5);
    expect(facts.swingCompressionLimitPercent).toBe(4);
    expect(facts.swingCompressionMarginPercent).toBeLessThan(0);
    expect(facts.swingPeakInputV! / facts.swingLinearInputV).toBeGreaterThan(1.04);
  });
});

describe('a single-ended swing with a resistor tail (the tail current rises with either polarity of input)', () => {
  const design = (): Design => ({
    device: { family: 'npn', beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 10000,
    tail: { topology: 'resistor', resistanceOhm: 11000 },
    inputCommonModeV: 0,
  });

  test('the input found is the larger of the two polarities: there v(c1) has moved at least the peak both down and up, and exactly the peak one way', () => {
    const solution = solveStage(design());
    const peakV = 3;
    const found = swingCompression(solution, 'single-ended', peakV, Math.abs(solution.result.singleEndedGain));
    const vid = found.peakInputV!;
    // a positive input turns Q1 on: v(c1) falls; a negative one lets it rise
    const down = -outputAtDifferentialInput(solution, vid).collector1V;
    const up = outputAtDifferentialInput(solution, -vid).collector1V;
    expect(Math.min(down, up)).toBeGreaterThan(peakV * (1 - 1e-5));
    expect(Math.abs(Math.max(down, up) - Math.min(down, up))).toBeGreaterThan(1e-3); // the two polarities do differ here
    expect(Math.abs(Math.min(down, up) / peakV - 1)).toBeLessThan(1e-5);
  });
});

describe('the large-signal output, as a change from zero input', () => {
  const base = (): Design => ({
    device: { family: 'npn', beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 10000,
    tail: { topology: 'resistor', resistanceOhm: 11000 },
    inputCommonModeV: 2,
  });

  test.each([
    ['a common mode of 2 V on a resistor tail', {}],
    ['mismatched loads', { collectorMismatch: 0.03 }],
    ['a pair transistor with its own BF and VAF', { pairBetaMismatch: 0.2, pairEarlyVoltageMismatch: -0.3 }],
  ])('%s: zero input, zero change on either output', (_name, overrides) => {
    const solution = solveStage({ ...base(), ...overrides });
    const out = outputAtDifferentialInput(solution, 0);
    expect(Math.abs(out.differentialV)).toBeLessThan(1e-9);
    expect(Math.abs(out.collector1V)).toBeLessThan(1e-9);
  });

  test('the peak is found to the stated accuracy: the output there is the peak to within a few parts per million', () => {
    const solution = solveStage(base());
    const peakV = 4;
    const found = swingCompression(solution, 'differential', peakV, Math.abs(solution.result.differentialGain));
    // a positive input lowers v(c1): the differential output goes negative
    expect(Math.abs(-outputAtDifferentialInput(solution, found.peakInputV!).differentialV / peakV - 1)).toBeLessThan(5e-6);
  });

  test('a differential output is checked on one polarity (a positive input), the transfer being odd', () => {
    const solution = solveStage({ ...base(), pairSaturationCurrentMismatch: 0.15 });
    const peakV = 3;
    const found = swingCompression(solution, 'differential', peakV, Math.abs(solution.result.differentialGain));
    expect(Math.abs(-outputAtDifferentialInput(solution, found.peakInputV!).differentialV / peakV - 1)).toBeLessThan(5e-6);
  });

  test('single-ended: when v(c1) cannot fall by the peak, though it could rise by it, the swing is out of reach', () => {
    // Q2's IS 40 % lower: Q1 carries more than half of an ideal tail's current, so v(c1) can rise by
    // IC1·RC but fall only by (Itail − IC1)·RC
    const design: Design = {
      device: { family: 'npn', beta: 180, earlyVoltageV: 0, saturationCurrentA: 8.1e-15 },
      supply: { positiveV: 12, negativeV: -12 },
      collectorResistanceOhm: 9090,
      tail: { topology: 'simple-mirror', referenceResistanceOhm: 23200 },
      inputCommonModeV: 0,
      pairSaturationCurrentMismatch: -0.4,
    };
    const solution = solveStage(design);
    const rise = outputAtDifferentialInput(solution, -1).collector1V;
    const fall = -outputAtDifferentialInput(solution, 1).collector1V;
    expect(rise).toBeGreaterThan(fall * 1.2);
    const found = swingCompression(solution, 'single-ended', (rise + fall) / 2, Math.abs(solution.result.singleEndedGain));
    expect(found).toMatchObject({ peakInputV: null, compressionPercent: 100 });
  });
});
