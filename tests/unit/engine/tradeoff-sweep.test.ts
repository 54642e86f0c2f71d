/**
 * The trade-off sweep (shared/engine/tradeoff-sweep.ts) on an invented spec (Brackenmoor Audio's
 * microphone preamplifier input): at the ranked option's own current it gives the ranked option's
 * nominal figures; across currents it follows the textbook dependences of the emitter-coupled pair
 * (Gray, Hurst, Lewis, Meyer, Analysis and Design of Analog Integrated Circuits, ch. 3 and 11):
 * base current IC/β per input, collector shot noise 2q·IC referred through gm = IC/VT (en ∝ 1/√I),
 * slew rate rising with the current that charges the load; and a current it cannot size gives a
 * message for that point, not an exception.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { evaluateDesign, recommend, type RecommendResult } from '#shared/engine/index';
import { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C } from '#shared/engine/constants';
import { tradeoffSweep, type TradeoffSweepPoint } from '#shared/engine/tradeoff-sweep';
import type { Spec } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

const BETA = 150;
const RAW_SPEC = {
  title: 'Brackenmoor MP-2 microphone preamplifier input',
  device: { beta: BETA, earlyVoltageV: 80, saturationCurrentA: 8e-15 },
  supply: { positiveV: 12, negativeV: -12 },
  gain: { target: 40, tolerancePercent: 20, output: 'differential' }, // ±20 %: gm alone holds it over 0…50 °C (no temperature degeneration)
  cmrr: { minDb: 60, atFrequencyHz: 1000, marginDb: 3, minYieldPercent: 90 },
  inputCommonMode: { minV: -1, maxV: 1 },
  outputSwingVpp: 2,
  powerBudgetW: 0.05,
  temperatureC: { min: 0, max: 50 },
  resistors: { series: 'E96', tolerancePercent: 1 },
  tailCapacitanceF: 5e-12,
  loadCapacitanceF: 20e-12,
  noise: { maxVPerRtHz: 10e-9, atFrequencyHz: 1000 },
  slewRateMinVPerS: 5e6,
  inputBiasCurrentMaxA: 3e-6,
  offset: { maxV: 5e-3 },
  topologies: ['simple-mirror', 'resistor'],
  monteCarlo: { samples: 300, seed: 5 },
};

function checkedSpec(raw: unknown): Spec {
  const checked = validateSpec(raw);
  if (!checked.ok) throw new Error(JSON.stringify(checked.errors));
  return checked.value;
}

const spec = checkedSpec(RAW_SPEC);
const solved = (points: TradeoffSweepPoint[]) => points.map((p) => (p.ok ? p : expect.unreachable(`no figures at ${p.tailCurrentA} A: ${p.error}`)));

describe('tradeoffSweep at the ranked option’s own current', () => {
  let ranking: RecommendResult;
  beforeAll(async () => {
    ranking = await recommend(spec, await loadRuleSet());
  });

  test.each(['simple-mirror', 'resistor'] as const)('the %s option’s figures equal its ranked nominal figures', (topology) => {
    const option = ranking.options.find((o) => o.topology === topology)!;
    const window = option.tailCurrentWindow!;
    expect(window.bounds.map((b) => b.requirement)).toEqual(expect.arrayContaining(['noise', 'slew-rate', 'input-bias-current', 'power-budget']));
    const [point] = solved(tradeoffSweep(spec, topology, [window.sizedAtA]));
    const predicted = option.predicted!;
    const close = (a: number | null, b: number | null) => expect(a! / b!).toBeCloseTo(1, 9);
    close(point.solvedTailCurrentA, predicted.tailCurrentA);
    close(point.gain, Math.abs(predicted.differentialGain));
    close(point.powerW, predicted.powerW);
    close(point.inputBiasCurrentA, predicted.inputBiasCurrentA);
    close(point.bandwidthHz, predicted.differentialBandwidthHz);
    // the checks take the worst corner; the nominal figure lies on its good side
    expect(point.noiseVPerRtHz!).toBeLessThanOrEqual(option.figures!.noiseVPerRtHz! * (1 + 1e-9));
    expect(point.inputBiasCurrentA).toBeLessThanOrEqual(option.figures!.inputBiasCurrentWorstA! * (1 + 1e-9));
  });

  test('a designer’s own values and a spec with no bounding target carry no window', async () => {
    const plain = checkedSpec({ ...RAW_SPEC, noise: undefined, slewRateMinVPerS: undefined, inputBiasCurrentMaxA: undefined, offset: undefined });
    const result = await recommend(plain, await loadRuleSet());
    expect(result.options.map((o) => o.tailCurrentWindow)).toEqual([null, null]);
    const own = await evaluateDesign(spec, ranking.options[0].design!, await loadRuleSet());
    expect(own.tailCurrentWindow).toBeNull();
  });
});

describe('tradeoffSweep across currents', () => {
  const currentsA = [30e-6, 100e-6, 300e-6, 1e-3, 3e-3];
  const points = solved(tradeoffSweep(spec, 'simple-mirror', currentsA));

  test('each point is sized at the current asked for (within the series’ snapping)', () => {
    points.forEach((p, i) => {
      expect(p.tailCurrentA).toBe(currentsA[i]);
      expect(Math.abs(p.solvedTailCurrentA / currentsA[i] - 1)).toBeLessThan(0.03);
    });
  });

  test('the input noise falls as 1/√I (collector shot noise through gm = IC/VT) and sits near the hand formula', () => {
    const kelvin = 300.15;
    const vt = (BOLTZMANN_J_PER_K * kelvin) / ELEMENTARY_CHARGE_C;
    // en² = 8q·VT²/I + 16kT·VT/(Ad·I): both halves' collector shot noise and the load resistors' thermal noise, the
    // differential gain Ad = gm·RC held at the target (a gain of 40 needs no emitter degeneration for this swing)
    const alpha = 8 * ELEMENTARY_CHARGE_C * vt * vt + (16 * BOLTZMANN_J_PER_K * kelvin * vt) / RAW_SPEC.gain.target;
    for (let i = 1; i < points.length; i += 1) expect(points[i].noiseVPerRtHz!).toBeLessThan(points[i - 1].noiseVPerRtHz!);
    for (const p of points) expect(p.noiseVPerRtHz! / Math.sqrt(alpha / p.solvedTailCurrentA)).toBeGreaterThan(0.85);
    for (const p of points) expect(p.noiseVPerRtHz! / Math.sqrt(alpha / p.solvedTailCurrentA)).toBeLessThan(1.15);
  });

  test('the slew rate rises with the current', () => {
    for (let i = 1; i < points.length; i += 1) expect(points[i].slewRateVPerS!).toBeGreaterThan(points[i - 1].slewRateVPerS!);
    // at the lowest current the tail current charging the load limits it: about 2·I/CL on the differential output
    expect(points[0].slewRateVPerS! / ((2 * points[0].solvedTailCurrentA) / RAW_SPEC.loadCapacitanceF)).toBeGreaterThan(0.8);
  });

  test('the input bias current is IC/β = I/(2β), less the Early effect’s share, and the power grows with the current', () => {
    // the Early effect raises IC by (1 + VCE/VA) over the base current's drive, so IB lies between I/(2β(1 + span/VA)) and I/(2β)
    const earlyShare = 1 + (RAW_SPEC.supply.positiveV - RAW_SPEC.supply.negativeV) / RAW_SPEC.device.earlyVoltageV;
    for (const p of points) {
      const ratio = p.inputBiasCurrentA / (p.solvedTailCurrentA / (2 * BETA));
      expect(ratio).toBeGreaterThan(1 / earlyShare);
      expect(ratio).toBeLessThanOrEqual(1);
    }
    for (let i = 1; i < points.length; i += 1) expect(points[i].powerW).toBeGreaterThan(points[i - 1].powerW);
  });

  test('the figures the spec sets no target for are absent, the others present', () => {
    expect(points.every((p) => p.offsetDriftAtSigmasVPerC === null && p.offsetAtSigmasV !== null && p.offsetAtSigmasV > 0)).toBe(true);
    expect(points.every((p) => Number.isFinite(p.psrrPositiveDb) && Number.isFinite(p.psrrNegativeDb))).toBe(true);
  });
});

describe('tradeoffSweep with a current it cannot use', () => {
  test.each([
    ['negative', -1e-3],
    ['zero', 0],
    ['not a number', Number.NaN],
    ['above the 100 mA the sizing works at', 1],
    ['below the 100 nA the sizing works at', 1e-9],
  ])('a %s current gives that point a message and the others their figures', (_name, bad) => {
    const [good, point] = tradeoffSweep(spec, 'simple-mirror', [1e-3, bad]);
    expect(good.ok).toBe(true);
    expect(point).toMatchObject({ ok: false, tailCurrentA: bad });
    expect(point.ok === false && point.error).toMatch(/outside what the sizing works at \(100 nA to 100 mA\)/);
  });

  test('a point whose sizing throws carries the sizing’s message, the sweep goes on', () => {
    const points = tradeoffSweep(spec, 'no-such-tail' as never, [1e-3, 2e-3]);
    expect(points.map((p) => p.ok)).toEqual([false, false]);
    for (const p of points) expect(p.ok === false && p.error).toMatch(/no-such-tail/);
  });
});
