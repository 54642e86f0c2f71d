import { describe, expect, test } from 'vitest';
import type { VerificationJobView } from '#shared/verification/types';
import { withJob } from '../../../../web/src/features/proposals/api/verification-mutations';
import { hasRunningJob } from '../../../../web/src/lib/verification-queries';
import { deltaText, durationText, optionVerdict, toleranceText, verificationTally } from '../../../../web/src/features/proposals/lib/verification-format';
import { monteCarloPlot, rejectionComparisonPlot } from '../../../../web/src/features/proposals/lib/verification-plots';
import { job, monteCarloJob, monteCarloResult, simulating, status } from './verification-fixtures';

describe('verification figures as text', () => {
  test('differences carry their sign and their own unit; a difference that rounds to zero has no sign', () => {
    expect(deltaText({ delta: 0.316, deltaKind: 'percent' })).toBe('+0.3 %');
    expect(deltaText({ delta: -1.26, deltaKind: 'percent' })).toBe('−1.3 %');
    expect(deltaText({ delta: 2.3, deltaKind: 'db' })).toBe('+2.3 dB');
    expect(deltaText({ delta: -0.04, deltaKind: 'db' })).toBe('0.0 dB');
    expect(deltaText({ delta: -0.02, deltaKind: 'volts' })).toBe('−20 mV');
    expect(deltaText({ delta: 0.0031, deltaKind: 'volts' })).toBe('+3.1 mV');
    expect(deltaText({ delta: null, deltaKind: 'percent' })).toBe('—');
  });

  test('tolerances read as plus or minus in the difference’s unit', () => {
    expect(toleranceText({ tolerance: 3, deltaKind: 'percent' })).toBe('±3 %');
    expect(toleranceText({ tolerance: 1.5, deltaKind: 'db' })).toBe('±1.5 dB');
    expect(toleranceText({ tolerance: 0.05, deltaKind: 'volts' })).toBe('±50 mV');
  });

  test('an option’s verdict: agrees, how many figures are outside, or not simulated', () => {
    expect(optionVerdict({ outcome: 'verified', agrees: true, disagreements: 0 })).toEqual({ kind: 'holds', label: 'Agrees' });
    expect(optionVerdict({ outcome: 'verified', agrees: false, disagreements: 2 })).toEqual({ kind: 'short', label: '2 figures outside tolerance' });
    expect(optionVerdict({ outcome: 'error', agrees: false, disagreements: 0 })).toEqual({ kind: 'note', label: 'Not simulated' });
    expect(
      verificationTally([
        { outcome: 'verified', agrees: true, disagreements: 0 },
        { outcome: 'verified', agrees: false, disagreements: 1 },
        { outcome: 'verified', agrees: false, disagreements: 3 },
      ]),
    ).toBe('1 of 3 agree with the engine within tolerance; 2 have figures outside it.');
  });

  test('durations in seconds or milliseconds, minutes past two', () => {
    expect(durationText(4200)).toBe('4.2 s');
    expect(durationText(310)).toBe('310 ms');
    expect(durationText(150_000)).toBe('2.5 min');
  });
});

describe('verification plot data', () => {
  test('the rejection comparison is sorted by frequency, finds the widest gap, and marks where the engine’s curve stops', () => {
    const plot = rejectionComparisonPlot({
      rejectionCurve: [
        { frequencyHz: 1e8, simulatedDb: 10, predictedDb: null },
        { frequencyHz: 100, simulatedDb: 99.0, predictedDb: 100.0 },
        { frequencyHz: 1e4, simulatedDb: 80.0, predictedDb: 82.5 },
        { frequencyHz: 1e6, simulatedDb: 40.0, predictedDb: 39.0 },
      ],
    })!;
    expect(plot.frequencyHz).toEqual([100, 1e4, 1e6, 1e8]);
    expect(plot.data).toEqual([
      [100, 1e4, 1e6, 1e8],
      [100.0, 82.5, 39.0, null],
      [99.0, 80.0, 40.0, 10],
    ]);
    expect(plot.largestGap).toEqual({ db: 2.5, atHz: 1e4 });
    expect(plot.simulatedOnlyFromHz).toBe(1e8);
    expect(rejectionComparisonPlot({ rejectionCurve: [] })).toBeNull();
  });

  test('both Monte Carlo histograms share the bin edges, each closed by repeating its last bin; the range holds the required line', () => {
    const result = { ...monteCarloResult(), requiredDb: 70, histogram: { binEdgesDb: [80, 90, 100], simulatedCounts: [5, 7], predictedCounts: [6, 6] } };
    const plot = monteCarloPlot(result)!;
    expect(plot.data).toEqual([
      [80, 90, 100],
      [5, 7, 7],
      [6, 6, 6],
    ]);
    expect(plot.mostCount).toBe(7);
    expect(plot.rangeDb[0]).toBeLessThan(70);
    expect(plot.rangeDb[1]).toBeGreaterThan(100);
  });
});

describe('verification status in the cache', () => {
  test('polling is wanted while any job waits or simulates, and not once all have settled', () => {
    expect(hasRunningJob(status(simulating(1)))).toBe(true);
    expect(hasRunningJob(status(job(), [monteCarloJob({ state: 'waiting', result: null })]))).toBe(true);
    expect(hasRunningJob(status(job({ state: 'stopped', result: null }), [monteCarloJob()]))).toBe(false);
    expect(hasRunningJob(status(null))).toBe(false);
    expect(hasRunningJob(undefined)).toBe(false);
  });

  test('a new job takes its place: the proposal’s check, or the newest Monte Carlo of its option first', () => {
    const older = monteCarloJob({ id: 50, topology: 'cascode' });
    const wilsonBefore = monteCarloJob({ id: 51, topology: 'wilson' });
    const wilsonNow: VerificationJobView = monteCarloJob({ id: 60, topology: 'wilson', state: 'waiting', result: null });
    const next = withJob(status(job(), [wilsonBefore, older]), wilsonNow);
    expect(next.monteCarlo.map((j) => j.id)).toEqual([60, 50]);
    expect(withJob(undefined, simulating(0)).verification?.state).toBe('simulating');
  });
});
