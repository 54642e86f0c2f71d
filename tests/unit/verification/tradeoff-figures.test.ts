/**
 * What the SPICE check reads from a stored prediction before simulating the trade-off figures:
 * the noise frequencies its `ac` entries carry, whether it predicts a slew rate and the transient
 * window set from it, and the Monte Carlo's offset statistics and the engine's stored figure.
 */
import { describe, expect, test } from 'vitest';
import { noiseFrequencies, predictsSlewRate, slewWindowS, type StoredPrediction } from '../../../api/verification/tradeoff-figures';
import { offsetStatistics } from '../../../api/verification/monte-carlo';
import { storedOffsetStatistics } from '../../../api/verification/stored-offset';
import type { Design } from '#shared/engine/types';

const entry = (frequencyHz: number, inputNoiseVPerRtHz?: number | null) => ({
  frequencyHz,
  differentialGain: 100,
  singleEndedGain: 50,
  commonModeGain: 0.01,
  differentialCommonModeGain: 0,
  cmrrDb: { singleEnded: 74, differential: null },
  ...(inputNoiseVPerRtHz === undefined ? {} : { inputNoiseVPerRtHz }),
});

const prediction = (fields: Partial<StoredPrediction>) => ({ differentialGain: -100, tailCurrentA: 1e-3, ...fields }) as StoredPrediction;
const design = { collectorResistanceOhm: 10_000 } as Design;

describe('noise frequencies', () => {
  test('each ac entry with a density, and one stored without the field as not predicted; a zero-gain entry (null) is skipped', () => {
    const p = prediction({ ac: [entry(1e3, 8e-9), entry(1e4, null), entry(1e5)] });
    expect(noiseFrequencies(p)).toEqual([
      { frequencyHz: 1e3, predicted: 8e-9 },
      { frequencyHz: 1e5, predicted: undefined },
    ]);
  });

  test('no ac entries (no noise target): nothing to measure', () => {
    expect(noiseFrequencies(prediction({ ac: [] }))).toEqual([]);
    expect(noiseFrequencies(prediction({}))).toEqual([]);
  });
});

describe('the slew rate', () => {
  test('simulated only when the stored prediction has one', () => {
    expect(predictsSlewRate(prediction({}))).toBe(false);
    expect(predictsSlewRate(prediction({ slewRateVPerS: null }))).toBe(false);
    expect(predictsSlewRate(prediction({ slewRateVPerS: 5e6 }))).toBe(true);
  });

  test('window: 20 × swing/slew + 10/(2π·BW); the swing is |Ad|·2 V capped at 2·Itail·RC', () => {
    // |Ad|·2 = 200 V, 2·Itail·RC = 20 V: 20 V; 20 × 20 V / 5 V/µs = 80 µs; 10/(2π·1 MHz) = 1.59 µs
    const p = prediction({ slewRateVPerS: 5e6, differentialBandwidthHz: 1e6 }) as StoredPrediction & { slewRateVPerS: number };
    expect(slewWindowS(design, p)).toBeCloseTo(80e-6 + 10 / (2 * Math.PI * 1e6), 12);
    // A small gain: |Ad|·2 = 4 V sets the swing; no bandwidth, no pole term
    const small = prediction({ differentialGain: 2, slewRateVPerS: 5e6, differentialBandwidthHz: null }) as StoredPrediction & { slewRateVPerS: number };
    expect(slewWindowS(design, small)).toBeCloseTo(16e-6, 12);
  });
});

describe('the Monte Carlo offset statistics', () => {
  test('mean, sample standard deviation (n − 1) and its value at the sigmas, by hand', () => {
    // 1, 2, 3, 4 mV: mean 2.5 mV; squares of deviations 2.25 + 0.25 + 0.25 + 2.25 = 5 (mV²); /3 → σ = 1.291 mV
    const s = offsetStatistics([1e-3, 2e-3, 3e-3, 4e-3], 3);
    expect(s.meanV).toBeCloseTo(2.5e-3, 15);
    expect(s.standardDeviationV).toBeCloseTo(Math.sqrt(5 / 3) * 1e-3, 15);
    expect(s.atSigmasV).toBeCloseTo(3 * Math.sqrt(5 / 3) * 1e-3, 15);
  });

  test('the engine figure: absent on an option without it; σ is the stored value over its sigmas, and the asked sigmas scale it', () => {
    expect(storedOffsetStatistics({ figures: null }, 3)).toBeNull();
    expect(storedOffsetStatistics({ figures: {} as never }, 3)).toBeNull();
    expect(storedOffsetStatistics({ figures: { offsetAtSigmasV: null, offsetSigmas: null } as never }, 3)).toBeNull();
    const stored = storedOffsetStatistics({ figures: { offsetAtSigmasV: 3e-3, offsetSigmas: 3 } as never }, 4)!;
    expect(stored.standardDeviationV).toBeCloseTo(1e-3, 15);
    expect(stored.atSigmasV).toBeCloseTo(4e-3, 15);
  });
});
