/**
 * The trade-off view's data (web/src/features/proposals/lib/tradeoff-plot.ts): the swept currents
 * (log-spaced, a tenth to ten times the option's own, inside what the sizing works at), one chart
 * per target the spec sets plus power and gain, each with the spec's own limit (read from the
 * fixture's spec file), the feasible window to shade, and the what-if figures against each limit.
 */
import { describe, expect, test } from 'vitest';
import type { TradeoffSweepFigures, TradeoffSweepPoint } from '#shared/engine/tradeoff-sweep';
import { feasibleBand, ownCurrentA, sweepCurrentsA, tradeoffCharts, whatIfRows } from '../../../../web/src/features/proposals/lib/tradeoff-plot';
import { hydrophonePreamp, specOf, strainBridge } from '../ranking/fixtures';

/** A solved point with invented figures (the view only places them). */
function point(tailCurrentA: number, change: Partial<TradeoffSweepFigures> = {}): TradeoffSweepPoint {
  return {
    ok: true,
    tailCurrentA,
    solvedTailCurrentA: tailCurrentA,
    gain: 40,
    powerW: 0.01,
    cmrrAtFrequencyDb: 80,
    noiseVPerRtHz: 3e-9,
    inputBiasCurrentA: 2e-7,
    bandwidthHz: 1e6,
    slewRateVPerS: 1e7,
    psrrPositiveDb: 70,
    psrrNegativeDb: 72,
    linearInputRangeV: 0.05,
    offsetAtSigmasV: 0.001,
    offsetDriftAtSigmasVPerC: null,
    ...change,
  };
}

describe('sweepCurrentsA', () => {
  test('25 currents evenly spaced on a log axis from a tenth to ten times the centre', () => {
    const currents = sweepCurrentsA(500e-6);
    expect(currents).toHaveLength(25);
    expect(currents[0]).toBeCloseTo(50e-6, 12);
    expect(currents[24]).toBeCloseTo(5e-3, 10);
    const ratios = currents.slice(1).map((c, i) => c / currents[i]);
    for (const r of ratios) expect(r).toBeCloseTo(100 ** (1 / 24), 3);
  });

  test.each([
    ['near the smallest current the sizing works at', 3e-7, 1e-7, 3e-6],
    ['near the largest', 0.05, 5e-3, 0.1],
  ])('%s: clipped to 100 nA … 100 mA', (_name, centre, low, high) => {
    const currents = sweepCurrentsA(centre);
    expect(currents[0]).toBeCloseTo(low, 15);
    expect(currents[currents.length - 1]).toBeCloseTo(high, 12);
  });
});

describe('ownCurrentA', () => {
  test('the current the sizing aimed at when the option has a window, else its solved nominal current, else none', () => {
    const [withWindow] = hydrophonePreamp().options;
    expect(ownCurrentA(withWindow)).toBe(withWindow.tailCurrentWindow!.sizedAtA);
    const [plain] = strainBridge().options;
    expect(plain.tailCurrentWindow).toBeNull();
    expect(ownCurrentA(plain)).toBe(plain.predicted!.tailCurrentA);
    expect(ownCurrentA({ tailCurrentWindow: null, predicted: null })).toBeNull();
  });
});

describe('tradeoffCharts', () => {
  const spec = specOf('hydrophone');
  const facts = hydrophonePreamp().options[0].figures!;

  test('one chart per target the spec sets, then power and gain, each with the spec’s limit and safe side', () => {
    const charts = tradeoffCharts([point(1e-4), point(1e-3)], facts);
    expect(charts.map((c) => [c.id, c.limit, c.side])).toEqual([
      ['noiseVPerRtHz', spec.noise!.maxVPerRtHz, 'max'],
      ['inputBiasCurrentA', spec.inputBiasCurrentMaxA, 'max'],
      ['offsetAtSigmasV', spec.offset!.maxV, 'max'],
      ['slewRateVPerS', spec.slewRateMinVPerS, 'min'],
      ['powerW', spec.powerBudgetW, 'max'],
      ['gain', spec.gain.target, 'band'],
    ]);
    const gain = charts.find((c) => c.id === 'gain')!;
    expect(gain.band![0]).toBeCloseTo(spec.gain.target * (1 - spec.gain.tolerancePercent / 100), 12);
    expect(gain.band![1]).toBeCloseTo(spec.gain.target * (1 + spec.gain.tolerancePercent / 100), 12);
  });

  test('a spec with no optional target: power and gain only', () => {
    expect(tradeoffCharts([point(1e-3)], strainBridge().options[0].figures!).map((c) => c.id)).toEqual(['powerW', 'gain']);
  });

  test('values follow the points in order, a point that was not solved leaves a gap; quantities on a log axis, the gain on a linear one', () => {
    const points: TradeoffSweepPoint[] = [point(1e-4, { noiseVPerRtHz: 5e-9 }), { ok: false, tailCurrentA: 3e-4, error: 'no operating point' }, point(1e-3, { noiseVPerRtHz: 1.6e-9 })];
    const charts = tradeoffCharts(points, facts);
    const noise = charts.find((c) => c.id === 'noiseVPerRtHz')!;
    expect(noise.values).toEqual([5e-9, null, 1.6e-9]);
    expect(noise.logY).toBe(true);
    expect(charts.find((c) => c.id === 'gain')!.logY).toBe(false);
  });
});

describe('feasibleBand', () => {
  const window = (lower: number | null, upper: number | null, empty = false) => ({
    tailCurrentWindow: {
      bounds: [],
      lower: lower === null ? null : { requirement: 'noise' as const, side: 'lower' as const, currentA: lower, basis: 'solved' as const },
      upper: upper === null ? null : { requirement: 'power-budget' as const, side: 'upper' as const, currentA: upper, basis: 'hand' as const },
      empty,
      currentA: 1e-4,
      setBy: 'preferred' as const,
      sizedAtA: 1e-4,
    },
  });

  test('from the floor to the ceiling; an open end reaches the plot’s edge', () => {
    expect(feasibleBand(window(2e-5, 6e-4))).toEqual({ fromA: 2e-5, toA: 6e-4 });
    expect(feasibleBand(window(null, 6e-4))).toEqual({ fromA: null, toA: 6e-4 });
  });

  test('nothing to shade for an empty window (the fixture’s noise and bias targets collide) or none', () => {
    expect(hydrophonePreamp().options.every((o) => o.tailCurrentWindow!.empty)).toBe(true);
    expect(feasibleBand(hydrophonePreamp().options[0])).toBeNull();
    expect(feasibleBand({ tailCurrentWindow: null })).toBeNull();
    expect(feasibleBand({})).toBeNull();
  });
});

describe('whatIfRows', () => {
  const spec = specOf('hydrophone');
  const facts = hydrophonePreamp().options[0].figures!;
  const charts = tradeoffCharts([point(1e-3)], facts);

  test('each figure against its limit: below a maximum meets, above it misses; the gain inside its band meets', () => {
    const rows = whatIfRows(charts, point(1e-3, { noiseVPerRtHz: spec.noise!.maxVPerRtHz! / 2, inputBiasCurrentA: spec.inputBiasCurrentMaxA! * 2, powerW: spec.powerBudgetW * 0.9, slewRateVPerS: spec.slewRateMinVPerS! / 2 }) as TradeoffSweepFigures);
    const meets = Object.fromEntries(rows.map((r) => [r.id, r.meets]));
    expect(meets).toEqual({ noiseVPerRtHz: true, inputBiasCurrentA: false, offsetAtSigmasV: true, slewRateVPerS: false, powerW: true, gain: true });
    expect(rows.find((r) => r.id === 'noiseVPerRtHz')!.text).toBe('1 nV/√Hz');
  });

  test('the gain outside its tolerance misses', () => {
    const rows = whatIfRows(charts, point(1e-3, { gain: spec.gain.target * (1 + (2 * spec.gain.tolerancePercent) / 100) }) as TradeoffSweepFigures);
    expect(rows.find((r) => r.id === 'gain')!.meets).toBe(false);
  });
});
