import { describe, expect, test } from 'vitest';
import { formatIssue, validateSpec } from '#shared/validate';
import { deepFreeze, FULL_SPEC, MINIMAL_SPEC, paths, printed, withField } from './schema-fixtures';

describe('validateSpec', () => {
  test('a full spec validates and comes back unchanged', () => {
    expect(validateSpec(FULL_SPEC)).toEqual({ ok: true, value: FULL_SPEC });
  });

  test('a minimal spec gets every default filled in', () => {
    // Defaults are this project's choices; sources where they are more than a choice
    expect(validateSpec(MINIMAL_SPEC)).toEqual({
      ok: true,
      value: {
        ...MINIMAL_SPEC,
        // VBE 0.65 V and VCE(sat) 0.2 V at 1 mA: common practice for small-signal silicon;
        // beta 100, VAF 100 V, 1 mV mismatch: a typical small-signal NPN (common practice, from memory);
        // a matched pair's BF and VAF a few per cent apart at 1σ (common practice, from memory)
        device: { family: 'npn', beta: 100, earlyVoltageV: 100, vbeOnV: 0.65, vceSatV: 0.2, vbeMismatchSigmaV: 0.001, betaMismatchSigma: 0.02, earlyVoltageMismatchSigma: 0.05 },
        gain: { target: 100, tolerancePercent: 10, output: 'differential' },
        cmrr: { minDb: 80, atFrequencyHz: 0, marginDb: 6, minYieldPercent: 99 },
        inputCommonMode: { minV: 0, maxV: 0 },
        outputSwingVpp: 1,
        // 4 % compression at the peak ≈ 1 % third harmonic (a cubic: HD3 = compression/4)
        outputSwingMaxCompressionPercent: 4,
        powerBudgetW: 1,
        // ±5 % on each rail: a regulated rail's usual tolerance (common practice)
        supplyTolerance: { positivePercent: 5, negativePercent: 5 },
        temperatureC: { min: 0, max: 70 },
        // E96 is the ±1 % series; ±100 ppm/°C is usual for 1 % thick- and metal-film parts (common practice)
        resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 100 },
        tailCapacitanceF: 0,
        loadCapacitanceF: 0,
        sourceResistanceOhm: 0,
        topologies: ['resistor', 'simple-mirror', 'degenerated-mirror', 'widlar', 'wilson', 'cascode'],
        policy: 'simplest-sufficient',
        hazards: { patientConnected: false, mainsReferenced: false },
        monteCarlo: { samples: 2000, seed: 1 },
      },
    });
  });

  test.each(['/title', '/supply', '/gain', '/cmrr', '/supply/positiveV', '/supply/negativeV', '/gain/target', '/cmrr/minDb'])(
    'without %s: "is required" at that path',
    (pointer) => {
      expect(printed(validateSpec(withField(MINIMAL_SPEC, pointer, undefined)))).toEqual([`${pointer}: is required`]);
    },
  );

  // Ranges from the spec brief; `null` = valid, else the path of the one issue expected
  test.each([
    ['/device/beta', 10, null],
    ['/device/beta', 9.9, '/device/beta'],
    ['/device/beta', 2000, null],
    ['/device/beta', 2000.5, '/device/beta'],
    ['/device/earlyVoltageV', 0, null],
    ['/device/earlyVoltageV', 0.5, '/device/earlyVoltageV'],
    ['/device/earlyVoltageV', 1, null],
    ['/device/earlyVoltageV', 1000, null],
    ['/device/earlyVoltageV', 1001, '/device/earlyVoltageV'],
    ['/device/earlyVoltageV', -1, '/device/earlyVoltageV'],
    ['/device/saturationCurrentA', 1e-20, null],
    ['/device/saturationCurrentA', 1e-21, '/device/saturationCurrentA'],
    ['/device/saturationCurrentA', 1e-9, null],
    ['/device/saturationCurrentA', 2e-9, '/device/saturationCurrentA'],
    ['/device/vbeOnV', 0.4, null],
    ['/device/vbeOnV', 0.39, '/device/vbeOnV'],
    ['/device/vbeOnV', 0.9, null],
    ['/device/vbeOnV', 0.91, '/device/vbeOnV'],
    ['/device/vceSatV', 0.05, null],
    ['/device/vceSatV', 0.04, '/device/vceSatV'],
    ['/device/vceSatV', 1, null],
    ['/device/vceSatV', 1.1, '/device/vceSatV'],
    ['/device/vbeMismatchSigmaV', 0, null],
    ['/device/vbeMismatchSigmaV', -0.001, '/device/vbeMismatchSigmaV'],
    ['/device/vbeMismatchSigmaV', 0.02, null],
    ['/device/vbeMismatchSigmaV', 0.021, '/device/vbeMismatchSigmaV'],
    ['/device/family', 'pnp', null],
    ['/device/family', 'nmos', '/device/family'],
    ['/supply/positiveV', 100, null],
    ['/supply/positiveV', 101, '/supply/positiveV'],
    ['/supply/negativeV', -100, null],
    ['/supply/negativeV', -101, '/supply/negativeV'],
    ['/gain/target', 0, '/gain/target'],
    ['/gain/target', 10000, null],
    ['/gain/target', 10001, '/gain/target'],
    ['/gain/tolerancePercent', 0.1, null],
    ['/gain/tolerancePercent', 0.09, '/gain/tolerancePercent'],
    ['/gain/tolerancePercent', 50, null],
    ['/gain/tolerancePercent', 51, '/gain/tolerancePercent'],
    ['/gain/output', 'differential', null],
    ['/gain/output', 'both', '/gain/output'],
    ['/cmrr/minDb', 0, null],
    ['/cmrr/minDb', -1, '/cmrr/minDb'],
    ['/cmrr/minDb', 200, null],
    ['/cmrr/minDb', 201, '/cmrr/minDb'],
    ['/cmrr/atFrequencyHz', 0, null],
    ['/cmrr/atFrequencyHz', -1, '/cmrr/atFrequencyHz'],
    ['/cmrr/atFrequencyHz', 1e9, null],
    ['/cmrr/atFrequencyHz', 2e9, '/cmrr/atFrequencyHz'],
    ['/cmrr/marginDb', 0, null],
    ['/cmrr/marginDb', 40, null],
    ['/cmrr/marginDb', 41, '/cmrr/marginDb'],
    ['/cmrr/minYieldPercent', 0, null],
    ['/cmrr/minYieldPercent', 100, null],
    ['/cmrr/minYieldPercent', 101, '/cmrr/minYieldPercent'],
    ['/outputSwingVpp', 0, null],
    ['/outputSwingVpp', -1, '/outputSwingVpp'],
    ['/powerBudgetW', 0, '/powerBudgetW'],
    ['/powerBudgetW', 0.001, null],
    ['/tailCurrentA', 1e-7, null],
    ['/tailCurrentA', 1e-8, '/tailCurrentA'],
    ['/tailCurrentA', 0.1, null],
    ['/tailCurrentA', 0.2, '/tailCurrentA'],
    ['/temperatureC/min', -55, null],
    ['/temperatureC/min', -56, '/temperatureC/min'],
    ['/temperatureC/max', 150, null],
    ['/temperatureC/max', 151, '/temperatureC/max'],
    ['/resistors/series', 'E24', null],
    ['/resistors/series', 'E12', '/resistors/series'],
    ['/resistors/tolerancePercent', 0.05, null],
    ['/resistors/tolerancePercent', 0.04, '/resistors/tolerancePercent'],
    ['/resistors/tolerancePercent', 20, null],
    ['/resistors/tolerancePercent', 30, '/resistors/tolerancePercent'],
    ['/tailCapacitanceF', 0, null],
    ['/tailCapacitanceF', 1e-9, null],
    ['/tailCapacitanceF', 2e-9, '/tailCapacitanceF'],
    ['/tailCapacitanceF', -1e-12, '/tailCapacitanceF'],
    ['/loadCapacitanceF', -1e-12, '/loadCapacitanceF'],
    ['/sourceResistanceOhm', -1, '/sourceResistanceOhm'],
    ['/topologies', ['cascode'], null],
    ['/topologies', [], '/topologies'],
    ['/topologies', ['wilson', 'wilson'], '/topologies'],
    ['/topologies', ['wilson', 'current-conveyor'], '/topologies/1'],
    ['/policy', 'cheapest', '/policy'],
    ['/hazards/patientConnected', false, null],
    ['/monteCarlo/samples', 100, null],
    ['/monteCarlo/samples', 99, '/monteCarlo/samples'],
    ['/monteCarlo/samples', 100000, null],
    ['/monteCarlo/samples', 100001, '/monteCarlo/samples'],
    ['/monteCarlo/samples', 500.5, '/monteCarlo/samples'],
    ['/monteCarlo/seed', 0, null],
    ['/monteCarlo/seed', -1, '/monteCarlo/seed'],
    ['/monteCarlo/seed', 1.5, '/monteCarlo/seed'],
    ['/title', '', '/title'],
    ['/noise/maxVPerRtHz', 0, '/noise/maxVPerRtHz'],
    ['/noise/maxVPerRtHz', 1e-3, null],
    ['/noise/maxVPerRtHz', 2e-3, '/noise/maxVPerRtHz'],
    ['/noise/atFrequencyHz', 0, '/noise/atFrequencyHz'],
    ['/noise/atFrequencyHz', 1e9, null],
    ['/noise/atFrequencyHz', 2e9, '/noise/atFrequencyHz'],
    ['/inputBiasCurrentMaxA', 0, '/inputBiasCurrentMaxA'],
    ['/inputBiasCurrentMaxA', 0.1, null],
    ['/inputBiasCurrentMaxA', 0.2, '/inputBiasCurrentMaxA'],
    ['/offset/maxV', 0, '/offset/maxV'],
    ['/offset/maxV', 1, null],
    ['/offset/maxV', 1.5, '/offset/maxV'],
    ['/offset/driftMaxVPerC', 0, '/offset/driftMaxVPerC'],
    ['/offset/driftMaxVPerC', 0.01, null],
    ['/offset/driftMaxVPerC', 0.02, '/offset/driftMaxVPerC'],
    ['/offset/sigmas', 1, null],
    ['/offset/sigmas', 0.5, '/offset/sigmas'],
    ['/offset/sigmas', 6, null],
    ['/offset/sigmas', 7, '/offset/sigmas'],
    ['/slewRateMinVPerS', 0, '/slewRateMinVPerS'],
    ['/slewRateMinVPerS', 1e12, null],
    ['/slewRateMinVPerS', 2e12, '/slewRateMinVPerS'],
    ['/bandwidthMinHz', 0, '/bandwidthMinHz'],
    ['/bandwidthMinHz', 1e10, null],
    ['/bandwidthMinHz', 2e10, '/bandwidthMinHz'],
    ['/psrrMinDb/positive', 0, null],
    ['/psrrMinDb/positive', -1, '/psrrMinDb/positive'],
    ['/psrrMinDb/negative', 200, null],
    ['/psrrMinDb/negative', 201, '/psrrMinDb/negative'],
    ['/psrrMinDb', {}, null],
    ['/psrrMinDb', { positive: 60 }, null],
    ['/psrrMinDb', { zero: 60 }, '/psrrMinDb/zero'],
    ['/linearInputRangeMinV', 0, '/linearInputRangeMinV'],
    ['/linearInputRangeMinV', 100, null],
    ['/linearInputRangeMinV', 101, '/linearInputRangeMinV'],
    ['/supplyTolerance/positivePercent', 0, null],
    ['/supplyTolerance/positivePercent', -1, '/supplyTolerance/positivePercent'],
    ['/supplyTolerance/negativePercent', 50, null],
    ['/supplyTolerance/negativePercent', 51, '/supplyTolerance/negativePercent'],
    ['/betaRange/min', 1, null],
    ['/betaRange/min', 0.5, '/betaRange/min'],
    ['/betaRange/max', 10000, null],
    ['/betaRange/max', 10001, '/betaRange/max'],
    ['/resistors/tempcoPpmPerC', 0, null],
    ['/resistors/tempcoPpmPerC', -25, '/resistors/tempcoPpmPerC'],
    ['/resistors/tempcoPpmPerC', 5000, null],
    ['/resistors/tempcoPpmPerC', 5001, '/resistors/tempcoPpmPerC'],
  ])('%s = %j: issue at %s', (pointer, value, expectedPath) => {
    const result = validateSpec(withField(FULL_SPEC, pointer, value));
    expect(paths(result)).toEqual(expectedPath === null ? [] : [expectedPath]);
  });

  test.each([
    ['/supply/positiveV', '12', '/supply/positiveV: must be a number, got "12"'],
    ['/cmrr/minDb', null, '/cmrr/minDb: must be a number, got null'],
    ['/cmrr/minDb', NaN, '/cmrr/minDb: must be a number, got NaN'],
    ['/cmrr/minDb', Infinity, '/cmrr/minDb: must be a number, got Infinity'],
    ['/gain/output', 3, '/gain/output: must be a string, got 3'],
    ['/topologies', 'wilson', '/topologies: must be an array, got "wilson"'],
    ['/hazards/mainsReferenced', 1, '/hazards/mainsReferenced: must be a boolean, got 1'],
    ['/device', 'npn', '/device: must be an object, got "npn"'],
    ['/monteCarlo/seed', 1.5, '/monteCarlo/seed: must be an integer, got 1.5'],
    ['/vaf', 100, '/vaf: is not a known field here (remove it or check its spelling)'],
    ['/device/vaf', 100, '/device/vaf: is not a known field here (remove it or check its spelling)'],
  ])('%s = %j is reported as %j', (pointer, value, expected) => {
    expect(printed(validateSpec(withField(FULL_SPEC, pointer, value)))).toEqual([expected]);
  });

  test.each([
    ['/device/beta', 5, '/device/beta: must be >= 10 A/A, got 5 A/A'],
    ['/device/earlyVoltageV', 0.5, '/device/earlyVoltageV: must not be strictly between 0 and 1 V, got 0.5 V'],
    ['/powerBudgetW', 0, '/powerBudgetW: must be > 0 W, got 0 W'],
    ['/resistors/tolerancePercent', 30, '/resistors/tolerancePercent: must be <= 20 %, got 30 %'],
    ['/gain/output', 'both', '/gain/output: must be one of differential, single-ended, got "both"'],
    ['/device/family', 'jfet', '/device/family: must be one of npn, pnp, got "jfet"'],
    ['/device/family', 'nmos', '/device/family: "nmos" is not available to recommend yet: MOS pairs are analysed by `longtail analyze` alone (sizing and ranking take "npn" or "pnp")'],
    ['/device/family', 'pmos', '/device/family: "pmos" is not available to recommend yet: MOS pairs are analysed by `longtail analyze` alone (sizing and ranking take "npn" or "pnp")'],
    ['/noise/maxVPerRtHz', 0, '/noise/maxVPerRtHz: must be > 0 V/√Hz, got 0 V/√Hz'],
    ['/offset/driftMaxVPerC', 0.02, '/offset/driftMaxVPerC: must be <= 0.01 V/°C, got 0.02 V/°C'],
    ['/slewRateMinVPerS', -1, '/slewRateMinVPerS: must be > 0 V/s, got -1 V/s'],
    ['/psrrMinDb/negative', 201, '/psrrMinDb/negative: must be <= 200 dB, got 201 dB'],
    ['/resistors/tempcoPpmPerC', 5001, '/resistors/tempcoPpmPerC: must be <= 5000 ppm/°C, got 5001 ppm/°C'],
    ['/supplyTolerance/positivePercent', 60, '/supplyTolerance/positivePercent: must be <= 50 %, got 60 %'],
  ])('range message for %s = %j names the limit and unit', (pointer, value, expected) => {
    expect(printed(validateSpec(withField(FULL_SPEC, pointer, value)))).toEqual([expected]);
  });

  test.each([
    ['rails in the wrong order', { supply: { positiveV: 5, negativeV: 12 } }, ['/supply/negativeV: must be below the positive rail (5 V), got 12 V']],
    ['equal rails', { supply: { positiveV: 5, negativeV: 5 } }, ['/supply/negativeV: must be below the positive rail (5 V), got 5 V']],
    [
      'common-mode range inverted',
      { inputCommonMode: { minV: 3, maxV: 2 } },
      ['/inputCommonMode/minV: must be at most the highest input common mode (2 V), got 3 V'],
    ],
    ['temperature range inverted', { temperatureC: { min: 80, max: 70 } }, ['/temperatureC/min: must be at most the highest temperature (70 °C), got 80 °C']],
    [
      'common mode above the positive rail',
      { inputCommonMode: { minV: 0, maxV: 14 } },
      ['/inputCommonMode/maxV: must be below the positive rail (12 V), got 14 V'],
    ],
    [
      'common mode on the positive rail (strictly inside)',
      { inputCommonMode: { minV: 0, maxV: 12 } },
      ['/inputCommonMode/maxV: must be below the positive rail (12 V), got 12 V'],
    ],
    [
      'common mode below the negative rail',
      { inputCommonMode: { minV: -13, maxV: 0 } },
      ['/inputCommonMode/minV: must be above the negative rail (-12 V), got -13 V'],
    ],
    [
      'single supply with the default common mode (0 V, on the rail)',
      { supply: { positiveV: 5, negativeV: 0 } },
      [
        '/inputCommonMode/minV: must be above the negative rail (0 V), got 0 V',
        '/inputCommonMode/maxV: must be above the negative rail (0 V), got 0 V',
      ],
    ],
    [
      'swing as large as the rail span',
      { outputSwingVpp: 24 },
      ['/outputSwingVpp: must be less than the span from the negative rail to the positive rail (24 V), got 24 V'],
    ],
  ])('%s', (_name, patch, expected) => {
    expect(printed(validateSpec({ ...MINIMAL_SPEC, ...patch }))).toEqual(expected);
  });

  describe('optional targets and corners', () => {
    test('when a target is left out, then the spec has none (it is not checked) and no default stands in for it', () => {
      const result = validateSpec(MINIMAL_SPEC);
      expect(result.ok).toBe(true);
      const value: object = result.ok ? result.value : {};
      for (const target of ['noise', 'inputBiasCurrentMaxA', 'offset', 'slewRateMinVPerS', 'bandwidthMinHz', 'psrrMinDb', 'linearInputRangeMinV', 'betaRange']) {
        expect(value).not.toHaveProperty(target);
      }
    });

    test('when every target is given, then each is kept as written', () => {
      const targets = {
        noise: { maxVPerRtHz: 8e-9, atFrequencyHz: 1000 },
        inputBiasCurrentMaxA: 3e-6,
        offset: { maxV: 0.002, driftMaxVPerC: 5e-6, sigmas: 4 },
        slewRateMinVPerS: 2e6,
        bandwidthMinHz: 1e6,
        psrrMinDb: { positive: 60, negative: 55 },
        linearInputRangeMinV: 0.02,
        betaRange: { min: 50, max: 300 },
      };
      const result = validateSpec({ ...MINIMAL_SPEC, ...targets });
      expect(result.ok && result.value).toMatchObject(targets);
    });

    test.each([
      ['the largest offset only', { maxV: 0.001 }],
      ['the largest drift only', { driftMaxVPerC: 2e-6 }],
    ])('when the offset target gives %s, then the standard deviations default to 3 (about 99.7 %% of a normal distribution)', (_name, offset) => {
      const result = validateSpec({ ...MINIMAL_SPEC, offset });
      expect(result.ok && result.value.offset).toEqual({ ...offset, sigmas: 3 });
    });

    test.each([
      [
        'an offset target with neither limit',
        { offset: { sigmas: 3 } },
        ['/offset/maxV: is required unless the largest offset drift is given (leave the input offset out to check neither)'],
      ],
      [
        'an empty offset target',
        { offset: {} },
        ['/offset/maxV: is required unless the largest offset drift is given (leave the input offset out to check neither)'],
      ],
      ['a noise limit without its frequency', { noise: { maxVPerRtHz: 8e-9 } }, ['/noise/atFrequencyHz: is required with the largest noise density (leave the input noise out to check no noise)']],
      ['a noise frequency without its limit', { noise: { atFrequencyHz: 1000 } }, ['/noise/maxVPerRtHz: is required with the noise frequency (leave the input noise out to check no noise)']],
      ['an empty noise target', { noise: {} }, ['/noise/maxVPerRtHz: is required with the noise frequency (leave the input noise out to check no noise)', '/noise/atFrequencyHz: is required with the largest noise density (leave the input noise out to check no noise)']],
      ['a spread whose lowest is above its highest', { betaRange: { min: 300, max: 200 } }, ['/betaRange/min: must be at most the highest current gain (200), got 300']],
      ['a spread above the nominal current gain', { betaRange: { min: 120 } }, ['/betaRange/min: must be at most the current gain (beta) (100), got 120']],
      ['a spread below the nominal current gain', { betaRange: { max: 80 } }, ['/betaRange/max: must be at least the current gain (beta) (100), got 80']],
    ])('%s is refused, naming the field', (_name, patch, expected) => {
      expect(printed(validateSpec({ ...MINIMAL_SPEC, ...patch }))).toEqual(expected);
    });

    test('when the spread is given with a model card, then the nominal it must hold is the card’s BF', () => {
      const withCard = { ...MINIMAL_SPEC, device: { model: { BF: 400 } } };
      expect(printed(validateSpec({ ...withCard, betaRange: { min: 200, max: 800 } }))).toEqual([]);
      expect(printed(validateSpec({ ...withCard, betaRange: { max: 300 } }))).toEqual(['/betaRange/max: must be at least the current gain (beta) (400), got 300']);
    });

    test('when the supply tolerance gives one rail, then the other takes its default', () => {
      const result = validateSpec({ ...MINIMAL_SPEC, supplyTolerance: { negativePercent: 10 } });
      expect(result.ok && result.value.supplyTolerance).toEqual({ positivePercent: 5, negativePercent: 10 });
    });
  });

  test('collects every cross-field issue, not just the first', () => {
    const result = validateSpec({
      ...MINIMAL_SPEC,
      inputCommonMode: { minV: 13, maxV: 12.5 },
      temperatureC: { min: 100, max: 0 },
      outputSwingVpp: 30,
    });
    expect(paths(result)).toEqual([
      '/inputCommonMode/minV',
      '/temperatureC/min',
      '/inputCommonMode/minV',
      '/inputCommonMode/maxV',
      '/outputSwingVpp',
    ]);
  });

  test('collects every schema issue, not just the first', () => {
    const result = validateSpec({ supply: { positiveV: 'x' }, gain: { target: -1 }, cmrr: {}, policy: 'x' });
    expect(paths(result)).toEqual(
      expect.arrayContaining(['/title', '/supply/negativeV', '/supply/positiveV', '/gain/target', '/cmrr/minDb', '/policy']),
    );
  });

  test('does not mutate the caller\u2019s object, and never shares defaults between calls', () => {
    const input = deepFreeze(structuredClone(MINIMAL_SPEC));
    const first = validateSpec(input);
    expect(input).toEqual(MINIMAL_SPEC);
    expect(first.ok && first.value).not.toBe(input);
    if (first.ok) first.value.topologies.pop();
    const second = validateSpec(input);
    expect(second.ok && second.value.topologies).toHaveLength(6);
  });

  test.each([
    [null, '/: must be an object, got null'],
    [[], '/: must be an object, got an array'],
    ['spec', '/: must be an object, got "spec"'],
    [undefined, '/: must be an object, got undefined'],
    [{ ...MINIMAL_SPEC, title: () => 'x' }, '/: must be plain JSON data'],
  ])('%j is rejected at the root', (input, expected) => {
    expect(printed(validateSpec(input))).toEqual([expected]);
  });
});

describe('formatIssue', () => {
  test.each([
    [{ path: '/supply/negativeV', message: 'must be below the positive rail' }, '/supply/negativeV: must be below the positive rail'],
    [{ path: '', message: 'must be an object' }, '/: must be an object'],
  ])('%j prints as %j', (issue, expected) => {
    expect(formatIssue(issue)).toBe(expected);
  });
});
