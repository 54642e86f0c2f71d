import { describe, expect, test } from 'vitest';
import { DEFAULT_VBE_ON_V, DEFAULT_VCE_SAT_V, NOMINAL_TEMPERATURE_C } from '#shared/engine/constants';
import { validateDesign } from '#shared/validate';
import { deepFreeze, FULL_DESIGN, MINIMAL_DESIGN, paths, printed, TAILS, withField } from './schema-fixtures';

describe('validateDesign', () => {
  test.each(TAILS.map((tail) => [tail.topology, tail]))('a %s tail validates', (_topology, tail) => {
    const design = { ...FULL_DESIGN, tail };
    expect(validateDesign(design)).toEqual({ ok: true, value: design });
  });

  test('a minimal design gets the contract\u2019s defaults, the engine\u2019s own', () => {
    expect(validateDesign(MINIMAL_DESIGN)).toEqual({
      ok: true,
      value: {
        ...MINIMAL_DESIGN,
        device: { family: 'npn', beta: 120, vbeOnV: DEFAULT_VBE_ON_V, vceSatV: DEFAULT_VCE_SAT_V },
        collectorMismatch: 0,
        pairEmitterResistanceOhm: 0,
        pairSaturationCurrentMismatch: 0,
        pairBetaMismatch: 0,
        pairEarlyVoltageMismatch: 0,
        inputCommonModeV: 0,
        temperatureC: NOMINAL_TEMPERATURE_C,
        tailCapacitanceF: 0,
        loadCapacitanceF: 0,
        sourceResistanceOhm: 0,
        frequenciesHz: [],
      },
    });
  });

  test('an unknown topology gives one clear message at /tail/topology', () => {
    const result = validateDesign({ ...MINIMAL_DESIGN, tail: { topology: 'mirror', referenceResistanceOhm: 22000 } });
    expect(printed(result)).toEqual([
      '/tail/topology: must be one of resistor, simple-mirror, degenerated-mirror, widlar, wilson, cascode, ptat, got "mirror"',
    ]);
  });

  test.each([
    [{}, '/tail/topology: is required'],
    [{ topology: 3 }, '/tail/topology: must be one of resistor, simple-mirror, degenerated-mirror, widlar, wilson, cascode, ptat, got 3'],
    ['mirror', '/tail: must be an object, got "mirror"'],
  ])('tail %j: %s', (tail, expected) => {
    expect(printed(validateDesign({ ...MINIMAL_DESIGN, tail }))).toEqual([expected]);
  });

  test.each([
    ['resistor', 'resistanceOhm'],
    ['simple-mirror', 'referenceResistanceOhm'],
    ['degenerated-mirror', 'referenceResistanceOhm'],
    ['degenerated-mirror', 'emitterResistanceOhm'],
    ['widlar', 'referenceResistanceOhm'],
    ['widlar', 'emitterResistanceOhm'],
    ['wilson', 'referenceResistanceOhm'],
    ['cascode', 'referenceResistanceOhm'],
  ])('a %s tail without %s: only that field is reported', (topology, field) => {
    const tail = { ...TAILS.find((t) => t.topology === topology) } as Record<string, unknown>;
    delete tail[field];
    expect(printed(validateDesign({ ...MINIMAL_DESIGN, tail }))).toEqual([`/tail/${field}: is required`]);
  });

  test.each([
    ['resistor', 'referenceResistanceOhm'],
    ['simple-mirror', 'emitterResistanceOhm'],
    ['wilson', 'resistanceOhm'],
  ])('a %s tail with %s (another topology\u2019s field) is rejected there', (topology, field) => {
    const tail = { ...TAILS.find((t) => t.topology === topology), [field]: 1000 };
    expect(paths(validateDesign({ ...MINIMAL_DESIGN, tail }))).toEqual([`/tail/${field}`]);
  });

  test.each([
    ['/collectorResistanceOhm', 0, '/collectorResistanceOhm'],
    ['/collectorResistanceOhm', 1e9, null],
    ['/collectorResistanceOhm', 1.1e9, '/collectorResistanceOhm'],
    ['/tail/referenceResistanceOhm', 0, '/tail/referenceResistanceOhm'],
    ['/tail/referenceResistanceOhm', -100, '/tail/referenceResistanceOhm'],
    ['/tail/referenceResistanceOhm', 2e9, '/tail/referenceResistanceOhm'],
    ['/pairEmitterResistanceOhm', 0, null],
    ['/pairEmitterResistanceOhm', -1, '/pairEmitterResistanceOhm'],
    ['/collectorMismatch', -0.5, null],
    ['/collectorMismatch', 0.5, null],
    ['/collectorMismatch', 0.6, '/collectorMismatch'],
    ['/pairSaturationCurrentMismatch', -0.6, '/pairSaturationCurrentMismatch'],
    ['/temperatureC', -55, null],
    ['/temperatureC', 151, '/temperatureC'],
    ['/tailCapacitanceF', -1e-12, '/tailCapacitanceF'],
    ['/loadCapacitanceF', -1e-12, '/loadCapacitanceF'],
    ['/loadCapacitanceF', 1e-8, null],
    ['/loadCapacitanceF', 2e-8, '/loadCapacitanceF'],
    ['/sourceResistanceOhm', -1, '/sourceResistanceOhm'],
    ['/sourceResistanceOhm', 2e7, '/sourceResistanceOhm'],
    ['/pairBetaMismatch', 0.6, '/pairBetaMismatch'],
    ['/frequenciesHz', [0], '/frequenciesHz/0'],
    ['/frequenciesHz', [1, -5], '/frequenciesHz/1'],
    ['/frequenciesHz', Array.from({ length: 65 }, (_, i) => i + 1), '/frequenciesHz'],
    ['/frequenciesHz', Array.from({ length: 64 }, (_, i) => i + 1), null],
    ['/inputCommonModeV', -11.9, null],
    ['/device/beta', undefined, '/device/beta'],
    ['/device/earlyVoltageV', 0, null],
    ['/device/earlyVoltageV', 0.9, '/device/earlyVoltageV'],
    ['/supply', undefined, '/supply'],
    ['/extra', 1, '/extra'],
  ])('%s = %j: issue at %s', (pointer, value, expectedPath) => {
    const result = validateDesign(withField(FULL_DESIGN, pointer, value));
    expect(paths(result)).toEqual(expectedPath === null ? [] : [expectedPath]);
  });

  test.each([
    [{ supply: { positiveV: 0, negativeV: 5 } }, ['/supply/negativeV: must be below the positive rail (0 V), got 5 V']],
    [{ inputCommonModeV: 12 }, ['/inputCommonModeV: must be below the positive rail (12 V), got 12 V']],
    [{ inputCommonModeV: -12 }, ['/inputCommonModeV: must be above the negative rail (-12 V), got -12 V']],
    [{ supply: { positiveV: 5, negativeV: 0 } }, ['/inputCommonModeV: must be above the negative rail (0 V), got 0 V']],
  ])('cross-field %j', (patch, expected) => {
    expect(printed(validateDesign({ ...MINIMAL_DESIGN, ...patch }))).toEqual(expected);
  });

  test('does not mutate the caller\u2019s object', () => {
    const input = deepFreeze(structuredClone(MINIMAL_DESIGN));
    expect(validateDesign(input).ok).toBe(true);
    expect(input).toEqual(MINIMAL_DESIGN);
  });
});
