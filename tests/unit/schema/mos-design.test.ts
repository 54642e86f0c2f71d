/**
 * Validation of a MOS `analyze` design (shared/schema/mos-design.schema.json, ENGINE-CONTRACT.md
 * "Families"): defaults, the refusals of the schema and of the cross-field rules, each naming its
 * field; and the bipolar design check refusing a MOS family in one issue (the web app's form).
 */
import { describe, expect, test } from 'vitest';
import { MOS_DESIGN_SCHEMA, formatIssue, isMosDesignInput, validateDesign, validateMosDesign } from '#shared/validate';
import { MOS_TAIL_TOPOLOGIES, type MosDesign, type MosTailDesign } from '#shared/engine/mos-stage';

/** Every field of the hand-written MosDesign type (the compiler holds this list to the type). */
const DESIGN_FIELDS: Record<keyof MosDesign, true> = {
  device: true,
  supply: true,
  drainResistanceOhm: true,
  drainMismatch: true,
  pairSourceResistanceOhm: true,
  pair: true,
  pairBodyTiedToSource: true,
  pairThresholdMismatchV: true,
  pairBetaMismatch: true,
  tail: true,
  inputCommonModeV: true,
  temperatureC: true,
  tailCapacitanceF: true,
};

/** Every tail field of the hand-written type, per topology (the compiler holds each list to its branch). */
type FieldsOf<T> = Record<Exclude<keyof T, 'topology'>, true>;
const SIZE = { widthM: true, lengthM: true, referenceResistanceOhm: true, referenceWidthM: true, referenceLengthM: true } as const;
const TAIL_FIELDS: { [K in MosTailDesign['topology']]: FieldsOf<Extract<MosTailDesign, { topology: K }>> } = {
  resistor: { resistanceOhm: true },
  'simple-mirror': SIZE,
  cascode: { ...SIZE, cascodeWidthM: true, cascodeLengthM: true },
  'wide-swing-cascode': { ...SIZE, cascodeWidthM: true, cascodeLengthM: true, biasResistanceOhm: true, biasWidthM: true, biasLengthM: true },
  'regulated-cascode': { ...SIZE, cascodeWidthM: true, cascodeLengthM: true, boosterResistanceOhm: true, boosterWidthM: true, boosterLengthM: true },
};

describe('the MOS design schema and the engine\'s MosDesign type describe the same document', () => {
  test('the same top-level fields', () => {
    expect(Object.keys(MOS_DESIGN_SCHEMA.properties as object).sort()).toEqual(Object.keys(DESIGN_FIELDS).sort());
  });
  test('the same tails, in the same order, each with the same fields (all required)', () => {
    const branches = (MOS_DESIGN_SCHEMA.properties as { tail: { oneOf: { properties: Record<string, { const?: string }>; required: string[] }[] } }).tail.oneOf;
    expect(branches.map((b) => b.properties.topology.const)).toEqual([...MOS_TAIL_TOPOLOGIES]);
    for (const branch of branches) {
      const topology = branch.properties.topology.const as MosTailDesign['topology'];
      const fields = Object.keys(TAIL_FIELDS[topology]).sort();
      expect(Object.keys(branch.properties).filter((k) => k !== 'topology').sort(), topology).toEqual(fields);
      expect(branch.required.filter((k) => k !== 'topology').sort(), topology).toEqual(fields);
    }
  });
});

const NMOS = {
  device: { family: 'nmos', model: { VTO: 0.7, KP: 100e-6 } },
  supply: { positiveV: 5, negativeV: -5 },
  drainResistanceOhm: 10_000,
  pair: { widthM: 40e-6, lengthM: 2e-6 },
  tail: { topology: 'simple-mirror', referenceResistanceOhm: 22_000, widthM: 20e-6, lengthM: 2e-6, referenceWidthM: 20e-6, referenceLengthM: 2e-6 },
};

function printed(input: unknown): string[] {
  const result = validateMosDesign(input);
  return result.ok ? [] : result.errors.map(formatIssue);
}

describe('validateMosDesign', () => {
  test('a complete design passes with the contract\'s defaults filled in', () => {
    const result = validateMosDesign(NMOS);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value).toMatchObject({ drainMismatch: 0, pairSourceResistanceOhm: 0, pairBodyTiedToSource: false, pairThresholdMismatchV: 0, pairBetaMismatch: 0, inputCommonModeV: 0, temperatureC: 27, tailCapacitanceF: 0 });
  });

  test.each([
    ['a bipolar field', { ...NMOS, collectorResistanceOhm: 1000 }, '/collectorResistanceOhm: is not a known field here (remove it or check its spelling)'],
    ['a level-1 parameter the contract does not name', { ...NMOS, device: { family: 'nmos', model: { VTO: 0.7, KP: 1e-4, TOX: 1e-8 } } }, '/device/model/TOX: is not a known field here (remove it or check its spelling)'],
    ['no KP', { ...NMOS, device: { family: 'nmos', model: { VTO: 0.7 } } }, '/device/model/KP: is required'],
    ['no channel length', { ...NMOS, pair: { widthM: 1e-5 } }, '/pair/lengthM: is required'],
    ['a bipolar tail', { ...NMOS, tail: { topology: 'widlar', referenceResistanceOhm: 1e4, emitterResistanceOhm: 100 } }, '/tail/topology: must be one of resistor, simple-mirror, cascode, wide-swing-cascode, regulated-cascode, got "widlar"'],
    ['an NMOS with a negative VTO', { ...NMOS, device: { family: 'nmos', model: { VTO: -0.7, KP: 1e-4 } } }, "/device/model/VTO: must be above 0 V for an NMOS (SPICE's sign: an enhancement NMOS has a positive threshold), got -0.7 V"],
    ['a PMOS with a positive VTO', { ...NMOS, device: { family: 'pmos', model: { VTO: 0.7, KP: 1e-4 } } }, "/device/model/VTO: must be below 0 V for a PMOS (SPICE's sign: an enhancement PMOS has a negative threshold), got 0.7 V"],
    ['rails in the wrong order', { ...NMOS, supply: { positiveV: 5, negativeV: 6 } }, '/supply/negativeV: must be below the positive rail (5 V), got 6 V'],
    [
      'a PHI that ngspice\'s temperature law takes below zero when hot (mos1temp.c: 0.3 V falls to about −0.075 V at 140 °C)',
      { ...NMOS, device: { family: 'nmos', model: { VTO: 0.7, KP: 1e-4, PHI: 0.3 } }, temperatureC: 140 },
      "/device/model/PHI: must stay positive at 140 °C: 0.3 V falls to -0.0749 V there by ngspice's level-1 temperature law; give a larger PHI (about 0.6 V is usual) or lower the temperature",
    ],
    ['the common mode on a rail', { ...NMOS, inputCommonModeV: 5 }, '/inputCommonModeV: must be below the positive rail (5 V), got 5 V'],
  ])('%s is refused naming the field', (_what, input, expected) => {
    expect(printed(input)).toEqual([expected]);
  });

  test('the wide-swing cascode asks for its bias branch', () => {
    const { referenceResistanceOhm, widthM, lengthM, referenceWidthM, referenceLengthM } = NMOS.tail;
    const tail = { topology: 'wide-swing-cascode', referenceResistanceOhm, widthM, lengthM, referenceWidthM, referenceLengthM, cascodeWidthM: 2e-5, cascodeLengthM: 2e-6 };
    expect(printed({ ...NMOS, tail })).toEqual(['/tail/biasResistanceOhm: is required', '/tail/biasWidthM: is required', '/tail/biasLengthM: is required']);
  });
});

describe('the bipolar design check meets a MOS design', () => {
  test('one issue naming /device/family and where MOS pairs are analysed', () => {
    const result = validateDesign(NMOS);
    expect(result.ok ? [] : result.errors.map(formatIssue)).toEqual(['/device/family: "nmos" is not available here yet: MOS pairs are analysed by `longtail analyze` alone (sizing and ranking take "npn" or "pnp")']);
    expect(isMosDesignInput(NMOS)).toBe(true);
    expect(isMosDesignInput({ device: { family: 'pnp' } })).toBe(false);
  });
});
