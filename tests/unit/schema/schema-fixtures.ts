/**
 * Inputs and small helpers for the schema tests. Typed as the engine's shapes, so the compiler checks that they
 * carry every field of `Spec` / `Design` and nothing else (excess-property checks).
 */
import type { Design, Spec, TailDesign } from '#shared/engine/types';
import { formatIssue, type ValidationResult } from '#shared/validate';

/** A spec with every field, optional ones included, all different from the defaults. */
export const FULL_SPEC: Spec = {
  title: 'ECG front end, first stage',
  device: {
    family: 'npn',
    beta: 150,
    earlyVoltageV: 74,
    saturationCurrentA: 6.7e-15,
    vbeOnV: 0.68,
    vceSatV: 0.25,
    vbeMismatchSigmaV: 0.0005,
    betaMismatchSigma: 0.015,
    earlyVoltageMismatchSigma: 0.08,
    pnp: { beta: 95, earlyVoltageV: 52, saturationCurrentA: 3e-15 },
  },
  deviceModel: { name: 'QX-150', checksum: 'a'.repeat(64) },
  betaRange: { min: 10, max: 2000 }, // the widest spread the nominal's own bounds allow, so any nominal fits
  supply: { positiveV: 15, negativeV: -15 },
  supplyTolerance: { positivePercent: 2, negativePercent: 10 },
  gain: { target: 50, tolerancePercent: 5, output: 'single-ended' },
  cmrr: { minDb: 90, atFrequencyHz: 50, marginDb: 3, minYieldPercent: 95 },
  inputCommonMode: { minV: -5, maxV: 5 },
  outputSwingVpp: 4,
  outputSwingMaxCompressionPercent: 2.5,
  powerBudgetW: 0.1,
  tailCurrentA: 0.001,
  temperatureC: { min: -20, max: 85 },
  resistors: { series: 'E192', tolerancePercent: 0.1, tempcoPpmPerC: 25 },
  tailCapacitanceF: 1e-12,
  loadCapacitanceF: 10e-12,
  sourceResistanceOhm: 600,
  noise: { maxVPerRtHz: 8e-9, atFrequencyHz: 1000 },
  inputBiasCurrentMaxA: 3e-6,
  offset: { maxV: 0.002, driftMaxVPerC: 5e-6, sigmas: 4 },
  slewRateMinVPerS: 2e6,
  bandwidthMinHz: 1e6,
  psrrMinDb: { positive: 60, negative: 55 },
  linearInputRangeMinV: 0.02,
  topologies: ['wilson', 'cascode'],
  policy: 'highest-rejection',
  hazards: { patientConnected: true, mainsReferenced: true },
  monteCarlo: { samples: 500, seed: 42 },
};

/** The fields a spec must state: everything else has a default. */
export const MINIMAL_SPEC = {
  title: 'x',
  supply: { positiveV: 12, negativeV: -12 },
  gain: { target: 100 },
  cmrr: { minDb: 80 },
};

/** One tail of each topology, every field present. */
export const TAILS: TailDesign[] = [
  { topology: 'resistor', resistanceOhm: 10000 },
  { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
  { topology: 'degenerated-mirror', referenceResistanceOhm: 22000, emitterResistanceOhm: 470 },
  { topology: 'widlar', referenceResistanceOhm: 4700, emitterResistanceOhm: 1000 },
  { topology: 'wilson', referenceResistanceOhm: 22000 },
  { topology: 'cascode', referenceResistanceOhm: 22000 },
  { topology: 'ptat', emitterResistanceOhm: 270, startupResistanceOhm: 1.5e6, areaRatio: 8, outputAreaRatio: 1 },
];

/** A design with every field, optional ones included (the contract's example, filled out). */
export const FULL_DESIGN: Design = {
  device: {
    family: 'npn',
    beta: 120,
    earlyVoltageV: 80,
    saturationCurrentA: 1e-15,
    vbeOnV: 0.66,
    vceSatV: 0.2,
    vbeMismatchSigmaV: 0.001,
    betaMismatchSigma: 0.02,
    earlyVoltageMismatchSigma: 0.05,
    pnp: { beta: 90, earlyVoltageV: 50, saturationCurrentA: 8e-16 },
  },
  supply: { positiveV: 12, negativeV: -12 },
  collectorResistanceOhm: 8200,
  collectorMismatch: 0.01,
  pairEmitterResistanceOhm: 100,
  pairSaturationCurrentMismatch: -0.02,
  pairBetaMismatch: 0.03,
  pairEarlyVoltageMismatch: -0.04,
  tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
  inputCommonModeV: 1,
  temperatureC: 50,
  tailCapacitanceF: 2e-12,
  loadCapacitanceF: 5e-12,
  sourceResistanceOhm: 1000,
  frequenciesHz: [1000, 1e6],
};

/** The contract's required fields only. */
export const MINIMAL_DESIGN = {
  device: { beta: 120 },
  supply: { positiveV: 12, negativeV: -12 },
  collectorResistanceOhm: 8200,
  tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
};

/** A deep copy with one field replaced, addressed by a JSON pointer ("/supply/negativeV"). */
export function withField(base: object, pointer: string, value: unknown): Record<string, unknown> {
  const copy = structuredClone(base) as Record<string, unknown>;
  const keys = pointer.split('/').slice(1);
  const parent = keys.slice(0, -1).reduce((node, key) => {
    node[key] ??= {};
    return node[key] as Record<string, unknown>;
  }, copy);
  const last = keys[keys.length - 1];
  if (value === undefined) delete parent[last];
  else parent[last] = value;
  return copy;
}

/** The issues of a failed validation as the CLI prints them ("/path: message"). */
export function printed(result: ValidationResult<unknown>): string[] {
  return result.ok ? [] : result.errors.map(formatIssue);
}

/** The JSON paths of a failed validation's issues, in order. */
export function paths(result: ValidationResult<unknown>): string[] {
  return result.ok ? [] : result.errors.map((e) => e.path);
}

/** Freezes a value and everything in it, so any write to it throws. */
export function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object') Object.values(value).forEach(deepFreeze);
  return Object.freeze(value);
}
