/**
 * The sign-off corners (shared/engine/sign-off-corners.ts): each spread resolved to the circuit's
 * values as the spec states them, the shifted design built from them, and the search in
 * `evaluateOption` against an exhaustive one (every sign of every spread at every base corner,
 * 2^5 × 4 circuits) on two invented specs: the search must find the worst gain (both ways), the
 * worst single-ended rejection and the highest power that the exhaustive search finds, within
 * 0.2 % (gain, power) and 0.05 dB (rejection). That bound is the method's claim (monotone spreads,
 * no strong interaction), checked here rather than assumed.
 */
import { describe, expect, test } from 'vitest';
import { cornerConditions, shiftedCondition } from '#shared/engine/conditions';
import { singleEndedCmrrDbAt, solveCondition } from '#shared/engine/analyze';
import { recommend } from '#shared/engine/index';
import { betaSpread, resolveShift, shiftedDesign, SHIFT_DIMENSIONS, type ShiftSigns } from '#shared/engine/sign-off-corners';
import { designAt, outputGain } from '#shared/engine/sizing';
import type { Design, Spec } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

const ruleSet = await loadRuleSet();

/** Invented front ends of Harrowgate Sensing: a bridge input and a line input. */
function spec(extra: Record<string, unknown>): Spec {
  const checked = validateSpec({
    title: 'Harrowgate sign-off bench',
    device: { beta: 140, earlyVoltageV: 70, saturationCurrentA: 9e-15 },
    supply: { positiveV: 9, negativeV: -9 },
    gain: { target: 40, tolerancePercent: 15, output: 'differential' },
    cmrr: { minDb: 70, atFrequencyHz: 1000 },
    inputCommonMode: { minV: -1, maxV: 1.5 },
    outputSwingVpp: 1,
    powerBudgetW: 0.03,
    temperatureC: { min: -20, max: 70 },
    resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 200 },
    supplyTolerance: { positivePercent: 5, negativePercent: 10 },
    betaRange: { min: 80, max: 300 },
    tailCapacitanceF: 5e-12,
    monteCarlo: { samples: 200, seed: 11 },
    topologies: ['simple-mirror', 'resistor', 'cascode'],
    ...extra,
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.errors));
  return checked.value;
}

describe('each spread resolved from the spec', () => {
  const s = spec({});
  test('rails at ± their tolerance, the current gain at the spread’s ends, each resistor group at ±tc·(T − 27 °C)', () => {
    const shift = resolveShift(s, 70, { positiveRail: 1, negativeRail: -1, beta: -1, loadTempco: 1, tailTempco: -1 });
    expect(shift.positiveV).toBeCloseTo(9 * 1.05, 12);
    expect(shift.negativeV).toBeCloseTo(-9 * 0.9, 12);
    expect(shift.betaScale).toBeCloseTo(80 / 140, 12);
    expect(shift.loadResistorScale).toBeCloseTo(1 + 200e-6 * 43, 12);
    expect(shift.tailResistorScale).toBeCloseTo(1 - 200e-6 * 43, 12);
    expect(resolveShift(s, 27, { positiveRail: 0, negativeRail: 0, beta: 0, loadTempco: 1, tailTempco: 1 })).toEqual({ loadResistorScale: 1, tailResistorScale: 1 });
  });

  test('a spread left out: half and twice the nominal current gain (the card’s BF when there is one)', () => {
    expect(betaSpread(spec({ betaRange: undefined }))).toEqual({ min: 70, max: 280 });
    const card = spec({ betaRange: undefined, device: { model: { IS: 9e-15, BF: 220, VAF: 70 } } });
    expect(betaSpread(card)).toEqual({ min: 110, max: 440 });
  });

  test('the shifted design: rails replaced, BF scaled, the loads and pair emitters by one scale, every tail resistor by the other', () => {
    const design: Design = {
      device: { family: 'npn', beta: 140, earlyVoltageV: 70, saturationCurrentA: 9e-15 },
      supply: { positiveV: 9, negativeV: -9 },
      collectorResistanceOhm: 10_000,
      pairEmitterResistanceOhm: 100,
      tail: { topology: 'widlar', referenceResistanceOhm: 20_000, emitterResistanceOhm: 500 },
    };
    const shifted = shiftedDesign(design, { positiveV: 9.45, betaScale: 0.5, loadResistorScale: 1.01, tailResistorScale: 0.99 });
    expect(shifted.supply).toEqual({ positiveV: 9.45, negativeV: -9 });
    expect(shifted.device.beta).toBeCloseTo(70, 12);
    expect(shifted.collectorResistanceOhm).toBeCloseTo(10_100, 9);
    expect(shifted.pairEmitterResistanceOhm).toBeCloseTo(101, 9);
    expect(shifted.tail).toMatchObject({ referenceResistanceOhm: 19_800, emitterResistanceOhm: 495 });
    expect(shiftedDesign(design, undefined)).toBe(design);
  });
});

/** Every sign vector of the five spreads. */
function allSigns(): ShiftSigns[] {
  const out: ShiftSigns[] = [];
  for (let bits = 0; bits < 1 << SHIFT_DIMENSIONS.length; bits += 1) {
    const signs = Object.fromEntries(SHIFT_DIMENSIONS.map((d, i) => [d, bits & (1 << i) ? 1 : -1])) as unknown as ShiftSigns;
    out.push(signs);
  }
  return out;
}

describe.each([
  ['a differential bridge input', {}],
  ['a single-ended line input with a wide common-mode range', { gain: { target: 12, tolerancePercent: 20, output: 'single-ended' }, inputCommonMode: { minV: -3, maxV: 3 } }],
])('the search finds what an exhaustive one finds: %s', (_title, extra) => {
  test('worst gain both ways, worst single-ended rejection, highest power', async () => {
    const s = spec(extra);
    const result = await recommend(s, ruleSet);
    for (const option of result.options) {
      if (!option.design) continue;
      const values = { tail: option.design.tail, collectorResistanceOhm: option.design.collectorResistanceOhm, pairEmitterResistanceOhm: option.design.pairEmitterResistanceOhm ?? 0 };
      let gainHigh = -Infinity;
      let gainLow = Infinity;
      let cmrrLow = Infinity;
      let powerHigh = -Infinity;
      for (const base of cornerConditions(s)) {
        for (const signs of allSigns()) {
          const solution = solveCondition(designAt(s, shiftedCondition(s, base, signs), values));
          const gain = outputGain(s, solution.result);
          gainHigh = Math.max(gainHigh, gain);
          gainLow = Math.min(gainLow, gain);
          cmrrLow = Math.min(cmrrLow, singleEndedCmrrDbAt(solution, s.cmrr.atFrequencyHz));
          powerHigh = Math.max(powerHigh, solution.result.powerW);
        }
      }
      const gains = option.corners.map((c) => c.gain);
      expect(Math.max(...gains) / gainHigh, `${option.topology}: highest gain`).toBeGreaterThan(0.998);
      expect(Math.min(...gains) / gainLow, `${option.topology}: lowest gain`).toBeLessThan(1.002);
      expect(Math.min(...option.corners.map((c) => c.cmrrAtFrequencyDb)) - cmrrLow, `${option.topology}: lowest rejection`).toBeLessThan(0.05);
      expect(Math.max(...option.corners.map((c) => c.powerW)) / powerHigh, `${option.topology}: highest power`).toBeGreaterThan(0.998);
      // the shifted corners name what they move
      expect(option.corners.some((c) => /V\+ .*BF .*loads .*tail resistors/.test(c.label))).toBe(true);
    }
  }, 120_000);
});
