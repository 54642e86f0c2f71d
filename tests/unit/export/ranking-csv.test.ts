/**
 * The ranking CSV at the precision the ranking page shows: rejection and yield to one decimal
 * (the page prints "101.8"), currents, powers, impedances, margins and gains to three significant
 * digits (the page prints "961 µA", "12.3 mW", "49.9"). Hand-made figures, not engine output.
 */
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import type { RecommendResult } from '#shared/engine/recommend';
import { rankingCsv } from '#shared/export/ranking-csv';

function result(): RecommendResult {
  const option = {
    topology: 'wilson',
    rank: 1,
    passes: true,
    checks: [],
    design: { collectorResistanceOhm: 4870, pairEmitterResistanceOhm: 0, tail: { topology: 'wilson', referenceResistanceOhm: 11500 } },
    predicted: { tailOutputResistanceOhm: 12_345_678, tailCurrentA: 0.000961234, cmrrDb: { singleEnded: 101.8349 } },
    figures: {
      tailImpedanceAtFrequencyOhm: 2_345_678,
      cmrrAtFrequencyDb: 84.4567,
      cmrrDifferentialWorstCaseDb: 79.04,
      monteCarloYieldPercent: 99.4567,
      gainPredicted: 49.8765,
      gainTarget: 50,
      powerWorstW: 0.0123456,
      icmLowMarginV: 1.23456,
      icmHighMarginV: -0.302345,
      swingMarginV: 0.0456789,
    },
  };
  return { recommended: 'wilson', options: [option] } as unknown as RecommendResult;
}

describe('rankingCsv', () => {
  test('figures are rounded to the precision shown on screen', () => {
    const [row] = Papa.parse<Record<string, string>>(rankingCsv(result()).trimEnd(), { header: true, newline: '\r\n' }).data;
    expect(row).toMatchObject({
      tail_impedance_at_spec_frequency_ohm: '2350000',
      tail_output_resistance_ohm: '12300000',
      cmrr_single_ended_dc_db: '101.8',
      cmrr_single_ended_at_spec_frequency_worst_corner_db: '84.5',
      cmrr_differential_worst_case_db: '79',
      monte_carlo_yield_percent: '99.5',
      gain_v_per_v: '49.9',
      gain_target_v_per_v: '50',
      tail_current_a: '0.000961',
      power_worst_w: '0.0123',
      icm_low_margin_v: '1.23',
      icm_high_margin_v: '-0.302',
      swing_margin_v: '0.0457',
      collector_resistance_ohm: '4870',
    });
  });
});

describe('the rejection limits column', () => {
  test('each part with its share in per cent to one decimal, largest first; empty for a ranking made before the engine gave them', () => {
    const withLimits = result();
    const limits = [
      { part: 'tail-base-collector', sharePercent: 48.94, elements: [], sensitivity: 1, rejectionWithoutDb: 79 },
      { part: 'tail-wiring', sharePercent: 36.46, elements: [], sensitivity: 0.7, rejectionWithoutDb: 74 },
      { part: 'tail-resistance', sharePercent: 14.6, elements: [], sensitivity: 0.3, rejectionWithoutDb: null },
    ];
    Object.assign(withLimits.options[0], { rejectionLimits: { frequencyHz: 1e5, output: 'single-ended', conditionLabel: 'nominal', rejectionDb: 67, limits, offsetting: [] } });
    const [row] = Papa.parse<Record<string, string>>(rankingCsv(withLimits).trimEnd(), { header: true, newline: '\r\n' }).data;
    expect(row.rejection_limits_at_spec_frequency_percent).toBe('tail-base-collector=48.9 tail-wiring=36.5 tail-resistance=14.6');
    const [older] = Papa.parse<Record<string, string>>(rankingCsv(result()).trimEnd(), { header: true, newline: '\r\n' }).data;
    expect(older.rejection_limits_at_spec_frequency_percent).toBe('');
  });
});

describe('the spec targets’ columns', () => {
  test('each worst-corner figure at the page’s precision beside its limit, the window’s bounds and what set the current', () => {
    const withTargets = result();
    Object.assign(withTargets.options[0].figures!, {
      noiseVPerRtHz: 3.45678e-9,
      noiseMaxVPerRtHz: 1e-8,
      noiseFrequencyHz: 1000,
      inputBiasCurrentWorstA: 2.56789e-7,
      psrrPositiveDb: 63.456,
      psrrPositiveMinDb: 60,
      slewRateWorstVPerS: 12_345_678,
    });
    Object.assign(withTargets.options[0], {
      tailCurrentWindow: { bounds: [], lower: { requirement: 'noise', side: 'lower', currentA: 2.3456e-5, basis: 'solved' }, upper: { requirement: 'power-budget', side: 'upper', currentA: 6.25e-4, basis: 'hand' }, empty: false, currentA: 5e-4, setBy: 'power-budget', sizedAtA: 5e-4 },
    });
    const [row] = Papa.parse<Record<string, string>>(rankingCsv(withTargets).trimEnd(), { header: true, newline: '\r\n' }).data;
    expect(row).toMatchObject({
      noise_worst_v_per_rthz: '3.46e-9',
      noise_limit_v_per_rthz: '1e-8',
      noise_frequency_hz: '1000',
      input_bias_current_worst_a: '2.57e-7',
      psrr_positive_worst_db: '63.5',
      psrr_positive_limit_db: '60',
      slew_rate_worst_v_per_s: '12300000',
      bandwidth_worst_hz: '',
      tail_current_window_low_a: '0.0000235',
      tail_current_window_high_a: '0.000625',
      tail_current_window_empty: 'false',
      tail_current_set_by: 'power-budget',
    });
  });
});

describe('the tail values column', () => {
  test('a PTAT tail lists its resistors in ohms, then its emitter-area ratios as plain numbers, the output ratio the design leaves out at its default of 1', () => {
    // ENGINE-CONTRACT.md, "New topology: ptat": areaRatio N, outputAreaRatio (default 1), emitterResistanceOhm, startupResistanceOhm
    const ptat = result();
    Object.assign(ptat.options[0], { topology: 'ptat', design: { collectorResistanceOhm: 6340, tail: { topology: 'ptat', emitterResistanceOhm: 340, startupResistanceOhm: 2_940_000, areaRatio: 8 } } });
    const [row] = Papa.parse<Record<string, string>>(rankingCsv(ptat).trimEnd(), { header: true, newline: '\r\n' }).data;
    expect(row.tail_values).toBe('emitterResistanceOhm=340 startupResistanceOhm=2940000 areaRatio=8 outputAreaRatio=1');
  });

  test('a mirror lists its resistors only', () => {
    const [row] = Papa.parse<Record<string, string>>(rankingCsv(result()).trimEnd(), { header: true, newline: '\r\n' }).data;
    expect(row.tail_values).toBe('referenceResistanceOhm=11500');
  });
});

describe('the device family column', () => {
  test('a PNP stage’s options say pnp, an NPN stage’s npn, a design that names no family npn (the schema’s default), an option without a design nothing', () => {
    // ENGINE-CONTRACT.md / docs/command-line.md: device.family is "npn" (the default) or "pnp"
    const withFamily = (family: 'npn' | 'pnp' | undefined) => {
      const r = result();
      const design = r.options[0].design as unknown as Record<string, unknown>;
      design.device = family === undefined ? { beta: 120 } : { family, beta: 120 };
      return r;
    };
    const family = (r: RecommendResult) => Papa.parse<Record<string, string>>(rankingCsv(r).trimEnd(), { header: true, newline: '\r\n' }).data[0].device_family;
    expect(family(withFamily('pnp'))).toBe('pnp');
    expect(family(withFamily('npn'))).toBe('npn');
    expect(family(withFamily(undefined))).toBe('npn');
    const none = result();
    (none.options[0] as unknown as Record<string, unknown>).design = null;
    expect(family(none)).toBe('');
  });
});
