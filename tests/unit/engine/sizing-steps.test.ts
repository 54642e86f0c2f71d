/**
 * Each step of sizing one topology (shared/engine/sizing.ts), against the rules DEVELOPERS.md
 * ("Sizing") and docs/device-and-formulas.md ("How the sizing chooses") state for it, the hand
 * formulas of the same page [GM, SS], the exact k and q [SI] and the E-series tables
 * [IEC60063]. Every expected value is computed here from those; none is copied from a run.
 * Each test sizes its own spec (sizeTopology, no rule set, no Monte Carlo): milliseconds each.
 */
import { describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/index';
import { nominalCondition } from '#shared/engine/conditions';
import { designAt, outputGain, sizeTopology, SizingError, swingPeakPerCollectorV, targetTailCurrentA, type SizingStep } from '#shared/engine/sizing';
import type { AnalyzeResult, Spec, TopologyId } from '#shared/engine/types';
import { E_SERIES } from '#shared/units/e-series';
import { validateSpec } from '#shared/validate';

/** kT/q [SI]: k = 1.380649e-23 J/K, q = 1.602176634e-19 C, exact. */
const vtAt = (temperatureC: number) => (1.380649e-23 * (temperatureC + 273.15)) / 1.602176634e-19;
const VT_27 = vtAt(27);
const IS_A = 1e-14;

/** The member of a series nearest a value by logarithmic distance, from the [IEC60063] table, searched over the neighbouring decades. */
function nearestOnSeries(valueOhm: number, series: 'E24' | 'E96' | 'E192'): number {
  const decade = Math.floor(Math.log10(valueOhm));
  const candidates = [decade - 1, decade, decade + 1].flatMap((d) => E_SERIES[series].map((m) => Number(`${m}e${d}`)));
  return candidates.reduce((best, c) => (Math.abs(Math.log(c / valueOhm)) < Math.abs(Math.log(best / valueOhm)) ? c : best));
}

/** An invented spec of Quillfen Instruments with the given overrides. */
function specWith(overrides: Record<string, unknown> = {}): Spec {
  const result = validateSpec({
    title: 'Quillfen sizing bench case',
    device: { beta: 150, earlyVoltageV: 80, saturationCurrentA: IS_A },
    supply: { positiveV: 12, negativeV: -12 },
    gain: { target: 50, output: 'differential' },
    cmrr: { minDb: 60 },
    inputCommonMode: { minV: -1, maxV: 1 },
    powerBudgetW: 0.05,
    resistors: { series: 'E192' },
    // a narrow temperature range: gm alone holds the gain, so only the cases below that widen it see temperature degeneration
    temperatureC: { min: 20, max: 30 },
    ...overrides,
  });
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.value;
}

const size = (spec: Spec, topology: TopologyId) => sizeTopology(spec, topology, nominalCondition(spec));
function stepOf<K extends SizingStep['step']>(steps: SizingStep[], kind: K): Extract<SizingStep, { step: K }> {
  const found = steps.find((s) => s.step === kind);
  if (!found) throw new Error(`no ${kind} step in ${JSON.stringify(steps)}`);
  return found as Extract<SizingStep, { step: K }>;
}

const vbeAt = (currentA: number, temperatureC = 27) => vtAt(temperatureC) * Math.log(currentA / IS_A);
const relative = (actual: number, expected: number) => Math.abs(actual / expected - 1);

describe('tail current from the power budget: 80 % across the rail span, shared with the reference branch, capped at 2 mA', () => {
  // ±12 V (24 V span), 50 mW: 40 mW for the stage [docs/device-and-formulas.md, "How the sizing chooses"]
  test.each([
    ['resistor', 0],
    ['simple-mirror', 1],
    ['degenerated-mirror', 1],
    ['wilson', 1],
    ['cascode', 1],
    ['widlar', 5],
  ] as const)('%s: reference branch %i × the tail current', (topology, ratio) => {
    const spec = specWith();
    const step = targetTailCurrentA(spec, topology);
    expect(step).toEqual({
      step: 'tail-current-from-budget',
      currentA: expect.any(Number),
      capped: false,
      capA: 2e-3,
      powerUseFraction: 0.8,
      powerBudgetW: 0.05,
      railSpanV: 24,
      referenceRatio: ratio,
    });
    expect(relative(step.currentA, (0.8 * 0.05) / (24 * (1 + ratio)))).toBeLessThan(1e-12);
    // the sizing's first step is this one
    expect(size(spec, topology).steps[0]).toEqual(step);
  });

  test('a budget that allows more than 2 mA is capped, and says so', () => {
    const step = targetTailCurrentA(specWith({ powerBudgetW: 1 }), 'resistor');
    expect(step).toMatchObject({ step: 'tail-current-from-budget', currentA: 2e-3, capped: true });
  });

  test('a budget that allows exactly 2 mA is not capped (60 mW across 24 V: 0.8 × 60 mW / 24 V = 2 mA)', () => {
    const step = targetTailCurrentA(specWith({ powerBudgetW: 0.06 }), 'resistor');
    expect(step).toMatchObject({ currentA: 2e-3, capped: false });
  });

  test('a budget leaving less than 100 nA (the smallest tail current a spec may fix) refuses the option and says why', () => {
    // ±15 V, 100 nW: 0.8 × 100 nW / 30 V = 2.67 nA for a resistor tail, half that beside a mirror's reference branch
    const spec = specWith({ supply: { positiveV: 15, negativeV: -15 }, powerBudgetW: 1e-7 });
    const refusal = (topology: TopologyId) => {
      try {
        targetTailCurrentA(spec, topology);
      } catch (error) {
        return error;
      }
      throw new Error('not refused');
    };
    const resistor = refusal('resistor') as Error;
    expect(resistor).toBeInstanceOf(SizingError);
    expect(resistor.name).toBe('SizingError');
    expect(resistor.message).toBe(
      'cannot be sized: 80 % of the 100 nW power budget across 30 V leaves 2.67 nA of tail current, below the 100 nA the sizing works at (the smallest tail current a spec may fix); raise the power budget',
    );
    expect((refusal('wilson') as Error).message).toBe(
      'cannot be sized: 80 % of the 100 nW power budget across 30 V, shared with a reference branch of 1× the tail current, leaves 1.33 nA of tail current, below the 100 nA the sizing works at (the smallest tail current a spec may fix); raise the power budget',
    );
  });

  test('a budget leaving exactly 100 nA is sized (1 µW across 8 V: 0.8 × 1 µW / 8 V = 100 nA)', () => {
    const spec = specWith({ supply: { positiveV: 4, negativeV: -4 }, powerBudgetW: 1e-6, inputCommonMode: { minV: 0, maxV: 0 } });
    expect(targetTailCurrentA(spec, 'resistor')).toMatchObject({ step: 'tail-current-from-budget', currentA: 1e-7, capped: false });
  });

  test('a tail current fixed by the spec is taken as it is, whatever the budget', () => {
    expect(targetTailCurrentA(specWith({ tailCurrentA: 7.5e-4, powerBudgetW: 1 }), 'widlar')).toEqual({ step: 'tail-current-fixed', currentA: 7.5e-4 });
  });
});

describe('the swing and the gain each output kind asks for', () => {
  test('peak swing per collector: a quarter of the peak-to-peak swing for a differential output, half for a single-ended one', () => {
    // v(c1 − c2) swinging Vpp is each collector swinging Vpp/2 in antiphase, peak Vpp/4 [SS]
    expect(swingPeakPerCollectorV(specWith({ outputSwingVpp: 4 }))).toBe(1);
    expect(swingPeakPerCollectorV(specWith({ outputSwingVpp: 4, gain: { target: 50, output: 'single-ended' } }))).toBe(2);
  });

  test('the gain compared with the target is the magnitude of the spec output\'s gain', () => {
    const result = { differentialGain: -180, singleEndedGain: -90 } as AnalyzeResult;
    expect(outputGain(specWith(), result)).toBe(180);
    expect(outputGain(specWith({ gain: { target: 50, output: 'single-ended' } }), result)).toBe(90);
  });

  test('the design at a condition takes the condition\'s input common mode and temperature and the spec\'s device, rails and tail capacitance', () => {
    const spec = specWith({ tailCapacitanceF: 4.7e-12 });
    const tail = { topology: 'resistor' as const, resistanceOhm: 10000 };
    expect(designAt(spec, { label: 'x', inputCommonModeV: 0.4, temperatureC: 55 }, { tail, collectorResistanceOhm: 4700, pairEmitterResistanceOhm: 22 })).toEqual({
      device: spec.device,
      supply: spec.supply,
      collectorResistanceOhm: 4700,
      pairEmitterResistanceOhm: 22,
      tail,
      inputCommonModeV: 0.4,
      temperatureC: 55,
      tailCapacitanceF: 4.7e-12,
    });
  });
});

describe('tail elements from the hand formulas, refined and snapped', () => {
  const I_A = 5e-4;
  const fixed = (overrides: Record<string, unknown> = {}) => specWith({ tailCurrentA: I_A, ...overrides });

  test('resistor tail: RT = (VICM − VBE − V−)/Itail at the mid input common mode, then the tail current within the E192 snapping', () => {
    // input common mode 0…2 V: 1 V at nominal, so 1 − VBE + 12 across RT
    const spec = fixed({ inputCommonMode: { minV: 0, maxV: 2 } });
    const { steps, design } = size(spec, 'resistor');
    const step = stepOf(steps, 'resistor-tail');
    expect(relative(step.handOhm, (1 - vbeAt(I_A) + 12) / I_A)).toBeLessThan(1e-9);
    expect(step.series).toBe('E192');
    expect(design.tail).toEqual({ topology: 'resistor', resistanceOhm: step.resistanceOhm });
    expect(relative(analyze(design).tailCurrentA, I_A)).toBeLessThan(0.011);
  });

  test.each([
    ['simple-mirror', 1],
    ['wilson', 2],
    ['cascode', 2],
  ] as const)('%s: RREF = (V+ − V− − %i·VBE)/Itail, one VBE per base-emitter junction in the reference path', (topology, n) => {
    const { steps, design } = size(fixed(), topology);
    const step = stepOf(steps, 'mirror-reference');
    expect(step.stackedVbe).toBe(n);
    expect(relative(step.handOhm, (24 - n * vbeAt(I_A)) / I_A)).toBeLessThan(1e-9);
    expect(design.tail).toEqual({ topology, referenceResistanceOhm: step.resistanceOhm });
    // refinement moves it by the base currents (2/β) and the Early effect on the output (VCB below 12 V over VAF 80 V) [GM], not more
    expect(relative(step.resistanceOhm, step.handOhm)).toBeLessThan((1 + 2 / 150) * (1 + 12 / 80) - 1);
    expect(relative(analyze(design).tailCurrentA, I_A)).toBeLessThan(0.011);
  });

  describe('degenerated mirror: an emitter drop of half the room at the lowest input common mode, within 0.1–1 V', () => {
    const check = (spec: Spec, expectedDropV: number) => {
      const { steps, design } = size(spec, 'degenerated-mirror');
      const emitters = stepOf(steps, 'degeneration-emitters');
      const reference = stepOf(steps, 'degenerated-reference');
      expect(relative(emitters.dropV, expectedDropV)).toBeLessThan(1e-9);
      expect(emitters.resistanceOhm).toBe(nearestOnSeries(expectedDropV / I_A, 'E192'));
      const span = spec.supply.positiveV - spec.supply.negativeV;
      expect(relative(reference.handOhm, (span - vbeAt(I_A) - expectedDropV) / I_A)).toBeLessThan(1e-9);
      expect(design.tail).toEqual({ topology: 'degenerated-mirror', referenceResistanceOhm: reference.resistanceOhm, emitterResistanceOhm: emitters.resistanceOhm });
      expect(relative(analyze(design).tailCurrentA, I_A)).toBeLessThan(0.011);
    };

    test('±12 V, input down to −1 V: nearly 10 V of room, so the 1 V ceiling', () => check(fixed(), 1));

    test('a single 12 V rail, input down to 1.6 V, VCE(sat) 0.25 V: half of 1.6 − VBE − 0 − 0.25 − 0.2', () => {
      const spec = fixed({ supply: { positiveV: 12, negativeV: 0 }, inputCommonMode: { minV: 1.6, maxV: 3 }, device: { beta: 150, earlyVoltageV: 80, saturationCurrentA: IS_A, vceSatV: 0.25 } });
      check(spec, (1.6 - vbeAt(I_A) - 0.25 - 0.2) / 2);
    });

    test('a single 12 V rail, input down to 1.1 V: less than 0.2 V of room, so the 0.1 V floor', () => {
      check(fixed({ supply: { positiveV: 12, negativeV: 0 }, inputCommonMode: { minV: 1.1, maxV: 3 } }), 0.1);
    });
  });

  test('Widlar source: Iref = 5·Itail through RREF = (V+ − V− − VBE(Iref))/Iref; RE from Iout·RE = VT·ln 5, refined', () => {
    const { steps, design } = size(fixed(), 'widlar');
    const reference = stepOf(steps, 'widlar-reference');
    const emitter = stepOf(steps, 'widlar-emitter');
    expect(reference.referenceRatio).toBe(5);
    expect(relative(reference.handOhm, (24 - vbeAt(5 * I_A)) / (5 * I_A))).toBeLessThan(1e-9);
    expect(reference.resistanceOhm).toBe(nearestOnSeries(reference.handOhm, 'E192'));
    expect(relative(emitter.handOhm, (VT_27 * Math.log(5)) / I_A)).toBeLessThan(1e-9);
    expect(design.tail).toEqual({ topology: 'widlar', referenceResistanceOhm: reference.resistanceOhm, emitterResistanceOhm: emitter.resistanceOhm });
    // the solved reference branch carries about five times the tail current (base currents and snapping aside)
    expect(relative(analyze(design).referenceCurrentA / I_A, 5)).toBeLessThan(0.03);
  });
});

describe('the collector resistor and pair degeneration', () => {
  const I_A = 1e-3;
  const IC_A = I_A / 2;

  test.each([
    ['differential', 100, 100],
    ['single-ended', 50, 100],
  ] as const)('%s output, gain %i: RC = |A per collector|·VT/IC, no degeneration; refined to the target within 0.1 %, then snapped', (output, gain, perCollector) => {
    const spec = specWith({ tailCurrentA: I_A, gain: { target: gain, output }, outputSwingVpp: 1 });
    const { steps, design } = size(spec, 'simple-mirror');
    expect(steps.map((s) => s.step)).toEqual(['tail-current-fixed', 'mirror-reference', 'collector']);
    const collector = stepOf(steps, 'collector');
    expect(collector.formula).toBe(output);
    expect(relative(collector.handOhm, (perCollector * VT_27) / IC_A)).toBeLessThan(1e-9);
    expect(design.pairEmitterResistanceOhm).toBe(0);
    // the refined value meets the gain target on an exact solve to the sizing's 0.1 % (a little more for the snapped tail's own refinement)
    const exact = analyze({ ...design, collectorResistanceOhm: collector.exactOhm });
    expect(relative(outputGain(spec, exact), gain)).toBeLessThan(1e-3);
    expect(collector.resistanceOhm).toBe(nearestOnSeries(collector.exactOhm, 'E192'));
    expect(design.collectorResistanceOhm).toBe(collector.resistanceOhm);
  });

  test.each([
    ['differential', 10, 10, 4, 1],
    ['single-ended', 5, 10, 4, 2],
  ] as const)(
    '%s output, gain %i, %i V swing: the gain\'s drop is below 1.25 × the peak swing per collector, so RC takes that drop and the pair emitters RE = RC/|A| − 1/gm',
    (output, gain, perCollector, swingVpp, peakV) => {
      const spec = specWith({ tailCurrentA: I_A, gain: { target: gain, output }, outputSwingVpp: swingVpp });
      const { steps, design } = size(spec, 'simple-mirror');
      expect(steps.map((s) => s.step)).toEqual(['tail-current-fixed', 'pair-degeneration', 'mirror-reference', 'collector']);
      const pair = stepOf(steps, 'pair-degeneration');
      expect(relative(pair.gainDropV, perCollector * VT_27)).toBeLessThan(1e-9);
      expect(pair.neededDropV).toBeCloseTo(1.25 * peakV, 12);
      expect(pair.swingDropFactor).toBe(1.25);
      const rcOhm = (1.25 * peakV) / IC_A;
      expect(pair.resistanceOhm).toBe(nearestOnSeries(rcOhm / perCollector - VT_27 / IC_A, 'E192'));
      expect(pair.series).toBe('E192');
      expect(design.pairEmitterResistanceOhm).toBe(pair.resistanceOhm);
      const collector = stepOf(steps, 'collector');
      expect(collector.formula).toBe('degenerated');
      expect(relative(collector.handOhm, rcOhm)).toBeLessThan(1e-9);
      const exact = analyze({ ...design, collectorResistanceOhm: collector.exactOhm });
      expect(relative(outputGain(spec, exact), gain)).toBeLessThan(1e-3);
    },
  );
});

test('the gain\'s drop exactly equal to 1.25 × the peak swing per collector is enough: no pair degeneration', () => {
  // gain 20 differential: 20·VT across each RC; a swing of 4·20·VT/1.25 V peak-to-peak needs exactly that
  const spec = specWith({ tailCurrentA: 1e-3, gain: { target: 20, output: 'differential' }, outputSwingVpp: (4 * 20 * VT_27) / 1.25 });
  expect(1.25 * swingPeakPerCollectorV(spec)).toBe(20 * VT_27); // the case sits on the boundary in floating point too
  const { steps, design } = size(spec, 'resistor');
  expect(steps.map((s) => s.step)).toEqual(['tail-current-fixed', 'resistor-tail', 'collector']);
  expect(design.pairEmitterResistanceOhm).toBe(0);
});

test('a topology outside the catalogue is refused by name', () => {
  expect(() => size(specWith({ tailCurrentA: 1e-3 }), 'zener-diode' as TopologyId)).toThrow('No case for the tail topology "zener-diode"');
});

describe('a gain target out of reach', () => {
  test('the gain peaks as RC grows (the collectors near saturation): the RC closest to the target is kept, and a step says the gain peaked', () => {
    // |Ad| = IC·RC/VT: 600 V/V at 0.5 mA per collector asks 600 × 25.9 mV ≈ 15.5 V across RC, more than the 12 V rail leaves [SS]
    const spec = specWith({ tailCurrentA: 1e-3, gain: { target: 600, output: 'differential' }, outputSwingVpp: 1 });
    const { steps, design } = size(spec, 'simple-mirror');
    const collector = stepOf(steps, 'collector');
    const short = stepOf(steps, 'collector-short');
    expect(short.limit).toBe('gain-peak');
    expect(short.targetGain).toBe(600);
    expect(short.reachedGain).toBeLessThan(600);
    expect(short.resistanceOhm).toBe(collector.exactOhm);
    // the kept RC gives the gain the step reports, and a larger RC gives less: the gain has peaked
    const gainAt = (rOhm: number) => outputGain(spec, analyze({ ...design, collectorResistanceOhm: rOhm }));
    expect(relative(gainAt(collector.exactOhm), short.reachedGain)).toBeLessThan(1e-6);
    expect(gainAt(collector.exactOhm * 1.3)).toBeLessThan(short.reachedGain);
    expect(collector.resistanceOhm).toBe(nearestOnSeries(collector.exactOhm, 'E192'));
  });

  test('a target in reach has no such step', () => {
    expect(size(specWith({ tailCurrentA: 1e-3, gain: { target: 100, output: 'differential' } }), 'simple-mirror').steps.some((s) => s.step === 'collector-short')).toBe(false);
  });
});

// Gain over temperature [GM]: with the tail current held, re = VT/IC = kT/(q·IC) grows with T,
// and a resistor-loaded gain RC/(RE + re) moves by (re(Tmax) − re(Tmin))/(2·(RE + re(T0))) either
// side of its middle. The sizing lets temperature take 80 % of the tolerance (its stated design choice).
describe('temperature degeneration: the pair is degenerated when gm alone would move the gain past 80 % of its tolerance', () => {
  const wide = { temperatureC: { min: -40, max: 85 }, supplyTolerance: { positivePercent: 0, negativePercent: 0 }, resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 0 } };

  test('±5 % over −40…85 °C: RE from the hand formula, snapped; the gain over the sweep stays near the share of the tolerance allowed', () => {
    const spec = specWith({ ...wide, gain: { target: 30, tolerancePercent: 5, output: 'differential' }, tailCurrentA: 5e-4, outputSwingVpp: 1 });
    const sized = size(spec, 'cascode');
    const step = stepOf(sized.steps, 'temperature-degeneration');
    const re = (c: number) => vtAt(c) / 2.5e-4;
    expect(step.spreadPercent).toBeCloseTo(((re(85) - re(-40)) / (2 * re(27))) * 100, 9);
    expect(step.allowedPercent).toBe(4);
    expect(step.resistanceOhm).toBe(nearestOnSeries((re(85) - re(-40)) / (2 * 0.04) - re(27), 'E96'));
    expect(sized.design.pairEmitterResistanceOhm).toBe(step.resistanceOhm);
    // the solved gain over the range: within the allowed half-spread plus 1.5 % for the tail's own
    // drift (a VBE that falls with T moves a mirror's current) and snapping
    const gains = [-40, 27, 85].map((t) => outputGain(spec, analyze({ ...sized.design, temperatureC: t })));
    const halfSpread = (Math.max(...gains) - Math.min(...gains)) / (2 * spec.gain.target);
    expect(halfSpread * 100).toBeLessThan(4 + 1.5);
    // without the step the same tail current and gain would spread about as the hand formula says
    expect(step.spreadPercent).toBeGreaterThan(15);
  });

  test('a wide tolerance needs none: no step, no pair emitter resistor', () => {
    const spec = specWith({ ...wide, gain: { target: 30, tolerancePercent: 30, output: 'differential' }, tailCurrentA: 5e-4, outputSwingVpp: 1 });
    const sized = size(spec, 'cascode');
    expect(sized.steps.some((s) => s.step === 'temperature-degeneration')).toBe(false);
    expect(sized.design.pairEmitterResistanceOhm).toBe(0);
  });
});
