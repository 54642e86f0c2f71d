/**
 * Measured against predicted (shared/measurements/comparison.ts): linear interpolation in
 * log-frequency, as a Bode plot is read, and the difference at the spec frequency.
 *
 * Expected values are computed by hand from v = v₀ + (v₁ − v₀)·log10(f/f₀)/log10(f₁/f₀) with
 * log10 2 = 0.30103 and log10 2.5 = 0.39794 (four-figure tables), and 20·log10 for a gain ratio.
 */
import { describe, expect, test } from 'vitest';
import { comparisonSentence, compareMeasurement, interpolateLogFrequency, measurementReference, type MeasurementReference } from '#shared/measurements/comparison';

const curve = (...pairs: [number, number][]) => pairs.map(([frequencyHz, db]) => ({ frequencyHz, db }));

describe('interpolateLogFrequency', () => {
  const line = curve([100, 80], [1000, 60], [10000, 40]);

  test('when the frequency is a point of the curve, then its value', () => {
    expect(interpolateLogFrequency(line, 100)).toBe(80);
    expect(interpolateLogFrequency(line, 1000)).toBe(60);
    expect(interpolateLogFrequency(line, 10000)).toBe(40);
  });

  test('when the frequency lies half a decade in, then the value is half-way (log10 √10 = 0.5)', () => {
    expect(interpolateLogFrequency(line, Math.sqrt(10) * 100)).toBeCloseTo(70, 10);
  });

  test('when the frequency is 200 Hz between 100 Hz and 1 kHz, then 80 − 20·0.30103 = 73.979 dB', () => {
    expect(interpolateLogFrequency(line, 200)).toBeCloseTo(73.979, 3);
  });

  test('when the frequency is 2.5 kHz in the second decade, then 60 − 20·0.39794 = 52.041 dB', () => {
    expect(interpolateLogFrequency(line, 2500)).toBeCloseTo(52.041, 3);
  });

  test('when the frequency is outside the curve or not positive, then null', () => {
    expect(interpolateLogFrequency(line, 99)).toBeNull();
    expect(interpolateLogFrequency(line, 10001)).toBeNull();
    expect(interpolateLogFrequency(line, 0)).toBeNull();
    expect(interpolateLogFrequency([], 100)).toBeNull();
  });
});

const reference = (over: Partial<MeasurementReference> = {}): MeasurementReference => ({
  topology: 'wilson',
  source: 'option',
  predictedCurve: curve([1, 90], [100, 90], [1000, 80]),
  simulatedCurve: null,
  predictedGainDb: 40,
  simulatedGainDb: null,
  ...over,
});

describe('compareMeasurement for rejection', () => {
  const points = [
    { frequencyHz: 100, value: 86 },
    { frequencyHz: 1000, value: 76 },
  ];

  test('when the spec frequency is 200 Hz, then measured 86 − 10·0.30103 = 82.990, predicted 90 − 10·0.30103 = 86.990, difference −4 dB', () => {
    const result = compareMeasurement({ kind: 'cmrr', unit: 'dB', points, specFrequencyHz: 200, reference: reference() });
    expect(result.basis).toBe('spec');
    expect(result.atFrequencyHz).toBe(200);
    expect(result.measuredDb).toBeCloseTo(82.99, 3);
    expect(result.predictedDb).toBeCloseTo(86.99, 3);
    expect(result.differenceFromPredictedDb).toBeCloseTo(-4, 10);
    expect(result.simulatedDb).toBeNull();
    expect(result.differenceFromSimulatedDb).toBeNull();
  });

  test('when a simulated curve exists, then the difference from it too (simulated 85 at 1 kHz: 76 − 85 = −9 dB)', () => {
    const result = compareMeasurement({ kind: 'cmrr', unit: 'dB', points, specFrequencyHz: 1000, reference: reference({ simulatedCurve: curve([10, 88], [1000, 85]) }) });
    expect(result.measuredDb).toBe(76);
    expect(result.predictedDb).toBe(80);
    expect(result.simulatedDb).toBe(85);
    expect(result.differenceFromPredictedDb).toBe(-4);
    expect(result.differenceFromSimulatedDb).toBe(-9);
  });

  test('when the spec asks for DC, then the comparison is at the lowest measured frequency', () => {
    const result = compareMeasurement({ kind: 'cmrr', unit: 'dB', points, specFrequencyHz: 0, reference: reference() });
    expect(result.basis).toBe('lowest-measured');
    expect(result.atFrequencyHz).toBe(100);
    expect(result.differenceFromPredictedDb).toBe(86 - 90);
  });

  test('when the measurement starts below the prediction’s first point (1 Hz), then the prediction holds its first value', () => {
    const result = compareMeasurement({ kind: 'cmrr', unit: 'dB', points: [{ frequencyHz: 0.1, value: 88 }, { frequencyHz: 10, value: 88 }], specFrequencyHz: 0, reference: reference() });
    expect(result.atFrequencyHz).toBe(0.1);
    expect(result.predictedDb).toBe(90);
  });

  test('when the spec frequency is outside the measured span, then no difference and a note saying why', () => {
    const result = compareMeasurement({ kind: 'cmrr', unit: 'dB', points, specFrequencyHz: 50, reference: reference() });
    expect(result.measuredDb).toBeNull();
    expect(result.differenceFromPredictedDb).toBeNull();
    expect(result.note).toBe('The measurement spans 100 Hz to 1 kHz, which does not include the spec frequency 50 Hz.');
  });
});

describe('compareMeasurement for gain', () => {
  test('when 50 V/V is measured against a predicted 40 dB, then 20·log10 50 = 33.979 dB, 6.021 dB below', () => {
    const result = compareMeasurement({ kind: 'gain', unit: 'V/V', points: [{ frequencyHz: 10, value: 50 }, { frequencyHz: 1e5, value: 30 }], specFrequencyHz: 1000, reference: reference() });
    expect(result.atFrequencyHz).toBe(10);
    expect(result.measuredDb).toBeCloseTo(33.979, 3);
    expect(result.differenceFromPredictedDb).toBeCloseTo(-6.021, 3);
  });
});

describe('measurementReference', () => {
  const options = [
    { topology: 'wilson', curves: { cmrrVsFrequency: [{ frequencyHz: 1, singleEndedDb: 91 }] }, predicted: { differentialGain: -100, singleEndedGain: -50 } },
    { topology: 'cascode', curves: { cmrrVsFrequency: [{ frequencyHz: 1, singleEndedDb: 120 }] }, predicted: { differentialGain: -10, singleEndedGain: -5 } },
  ];

  test('when an option was accepted, then its curve and its gain for the spec’s output (|−50| → 20·log10 50 = 33.979 dB)', () => {
    const result = measurementReference({ options, decision: { kind: 'accept', topology: 'wilson', evaluation: null }, output: 'single-ended', verification: null });
    expect(result?.source).toBe('option');
    expect(result?.predictedCurve).toEqual([{ frequencyHz: 1, db: 91 }]);
    expect(result?.predictedGainDb).toBeCloseTo(33.979, 3);
  });

  test('when the decision overrides, then the evaluation of the own values, and the simulated curve of the decision only', () => {
    const evaluation = { curves: { cmrrVsFrequency: [{ frequencyHz: 1, singleEndedDb: 77 }] }, predicted: { differentialGain: -1000, singleEndedGain: -500 } };
    const verified = (source: 'option' | 'decision', db: number) => ({
      topology: 'wilson',
      source,
      outcome: 'verified' as const,
      error: null,
      nominal: null,
      corners: [],
      rejectionCurve: [{ frequencyHz: 10, simulatedDb: db, predictedDb: null }],
      agrees: true,
      disagreements: 0,
      elapsedMs: 1,
    });
    const result = measurementReference({ options, decision: { kind: 'override', topology: 'wilson', evaluation }, output: 'differential', verification: { options: [verified('option', 50), verified('decision', 75)] } });
    expect(result?.source).toBe('decision');
    expect(result?.predictedCurve).toEqual([{ frequencyHz: 1, db: 77 }]);
    expect(result?.predictedGainDb).toBeCloseTo(60, 10);
    expect(result?.simulatedCurve).toEqual([{ frequencyHz: 10, db: 75 }]);
  });

  test('when nothing is decided, then there is nothing to compare with', () => {
    expect(measurementReference({ options, decision: null, output: 'differential', verification: null })).toBeNull();
  });
});

describe('comparisonSentence', () => {
  test('when measured 71.2 dB at 1 kHz against 73.5 dB, then the sentence says 2.3 dB below the prediction', () => {
    const sentence = comparisonSentence({
      kind: 'cmrr',
      atFrequencyHz: 1000,
      basis: 'spec',
      measuredDb: 71.2,
      predictedDb: 73.5,
      simulatedDb: 70.2,
      differenceFromPredictedDb: 71.2 - 73.5,
      differenceFromSimulatedDb: 71.2 - 70.2,
      note: null,
    });
    expect(sentence).toBe('Measured 71.2 dB at 1 kHz, 2.3 dB below the prediction (73.5 dB) and 1.0 dB above the SPICE simulation (70.2 dB).');
  });
});
