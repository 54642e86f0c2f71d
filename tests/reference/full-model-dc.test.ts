/**
 * `analyze` against ngspice with full Gummel-Poon model cards (`device.model`): every topology
 * at −40, 27 and 125 °C, on the netlist the product writes (four-terminal transistors, the
 * substrate at the negative rail, the whole card, `.temp`, `.options tnom=27`). The cards carry
 * every DC parameter the engine models (NF, NR, BR, IKF, IKR, VAR, ISE/NE, ISC/NC, RB, RE, RC,
 * XTI, EG, XTB) and the charge parameters too, which leave these low-frequency figures (1 Hz)
 * untouched. Reference figures come from `spiceFigures` (tests/helpers/spice.ts).
 *
 * Contract tolerances (ENGINE-CONTRACT.md): currents 3 %, gains 5 %, single-ended CMRR 1.5 dB,
 * differential CMRR 2 dB, power 5 %, tail output resistance 20 %. Both sides solve the same
 * model, so each figure is also held to a tight bound: currents, gains, power and tail output
 * resistance 0.01 %; the differential common-mode gain (a residue of two nearly equal terms)
 * 0.1 %; CMRR 0.01 dB — the bounds of spice-agreement.test.ts, which a model error of a percent
 * (a missing base-charge term, a beta law off over temperature) could never pass.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import type { Design, TailDesign } from '#shared/engine/types';
import { spiceFigures, startSpice, type SpiceFigures } from '../helpers/spice';

const CURRENT_TOLERANCE = 0.03;
const GAIN_TOLERANCE = 0.05;
const CMRR_SINGLE_ENDED_TOLERANCE_DB = 1.5;
const CMRR_DIFFERENTIAL_TOLERANCE_DB = 2;
const TAIL_OUTPUT_RESISTANCE_TOLERANCE = 0.2;
const POWER_TOLERANCE = 0.05;
const SAME_MODEL_TOLERANCE = 1e-4;
const SAME_MODEL_RESIDUE_TOLERANCE = 1e-3;
const SAME_MODEL_CMRR_TOLERANCE_DB = 0.01;

const ENGINE_START_TIMEOUT_MS = 120_000;

/** Invented small-signal NPN cards (Fernhollow demo devices): every parameter given. */
const FERNHOLLOW_FN2210: BjtModelCard = {
  IS: 4.2e-15, BF: 165, NF: 1.005, VAF: 74, IKF: 0.045, ISE: 2.1e-14, NE: 1.55, BR: 4.2, NR: 1.01, VAR: 18, IKR: 0.012,
  ISC: 3e-14, NC: 1.8, RB: 85, RE: 0.9, RC: 6.5, CJE: 1.2e-11, VJE: 0.72, MJE: 0.36, CJC: 4.4e-12, VJC: 0.68, MJC: 0.41,
  CJS: 1.5e-12, VJS: 0.6, MJS: 0.3, FC: 0.5, TF: 4.6e-10, TR: 8e-8, EG: 1.12, XTI: 3.2, XTB: 1.55, KF: 2e-16, AF: 1.1,
};
/** A second card, some parameters left to SPICE's defaults (NR, IKR, VJE, MJE, VJC, MJC, VJS, MJS, FC, TR, KF, AF). */
const FERNHOLLOW_FN3904: BjtModelCard = {
  IS: 9.5e-16, BF: 240, NF: 1, VAF: 110, IKF: 0.12, ISE: 6e-15, NE: 1.9, BR: 2.5, VAR: 25, ISC: 1e-15, NC: 1.6,
  RB: 210, RE: 0.35, RC: 22, CJE: 6e-12, CJC: 2.8e-12, CJS: 0, TF: 3.2e-10, EG: 1.11, XTI: 3, XTB: 1.3,
};

const TEMPERATURES_C = [-40, 27, 125] as const;

interface Base {
  card: BjtModelCard;
  supply: Design['supply'];
  collectorResistanceOhm: number;
  tail: TailDesign;
  extra?: Partial<Design>;
  /** The PNP's card, for a tail with PNPs (its own RB, RE, RC, leakage and temperature terms). */
  pnpCard?: BjtModelCard;
}

/** An invented PNP card for the PTAT tail's mirror: every DC parameter the engine models, its own ohmic resistances. */
const FERNHOLLOW_FP3906: BjtModelCard = {
  IS: 2.2e-15, BF: 110, NF: 1.01, VAF: 38, IKF: 0.05, ISE: 8e-15, NE: 1.7, BR: 3, NR: 1.02, VAR: 14, IKR: 0.02,
  ISC: 5e-15, NC: 1.7, RB: 260, RE: 1.1, RC: 9, EG: 1.12, XTI: 3.4, XTB: 1.6,
};

/** One design per topology, with mismatches on some so the differential CMRR is finite (the cascode's pair also with beta and Early-voltage mismatch: Q2 on its own card). */
const BASES: Base[] = [
  { card: FERNHOLLOW_FN2210, supply: { positiveV: 9, negativeV: -9 }, collectorResistanceOhm: 4700, tail: { topology: 'resistor', resistanceOhm: 3900 }, extra: { collectorMismatch: 0.01 } },
  { card: FERNHOLLOW_FN3904, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 8200, tail: { topology: 'simple-mirror', referenceResistanceOhm: 10000 }, extra: { pairSaturationCurrentMismatch: 0.02 } },
  { card: FERNHOLLOW_FN2210, supply: { positiveV: 15, negativeV: -15 }, collectorResistanceOhm: 5600, tail: { topology: 'degenerated-mirror', referenceResistanceOhm: 5600, emitterResistanceOhm: 220 }, extra: { pairEmitterResistanceOhm: 47, collectorMismatch: 0.01 } },
  { card: FERNHOLLOW_FN3904, supply: { positiveV: 10, negativeV: 0 }, collectorResistanceOhm: 22000, tail: { topology: 'widlar', referenceResistanceOhm: 8200, emitterResistanceOhm: 330 }, extra: { inputCommonModeV: 3, collectorMismatch: 0.01 } },
  { card: FERNHOLLOW_FN2210, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 3300, tail: { topology: 'wilson', referenceResistanceOhm: 3900 }, extra: { pairSaturationCurrentMismatch: -0.02 } },
  { card: FERNHOLLOW_FN3904, supply: { positiveV: 15, negativeV: -15 }, collectorResistanceOhm: 6800, tail: { topology: 'cascode', referenceResistanceOhm: 12000 }, extra: { collectorMismatch: 0.01, inputCommonModeV: 1, pairBetaMismatch: 0.05, pairEarlyVoltageMismatch: -0.1 } },
  { card: FERNHOLLOW_FN2210, pnpCard: FERNHOLLOW_FP3906, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 15000, tail: { topology: 'ptat', emitterResistanceOhm: 220, startupResistanceOhm: 2.2e6, areaRatio: 8 }, extra: { collectorMismatch: 0.01, pairSaturationCurrentMismatch: 0.02 } },
];

function designOf(base: Base, temperatureC: number): Design {
  return {
    device: { family: 'npn', model: base.card, ...(base.pnpCard ? { pnp: { model: base.pnpCard } } : {}) },
    supply: base.supply,
    collectorResistanceOhm: base.collectorResistanceOhm,
    tail: base.tail,
    temperatureC,
    ...base.extra,
  };
}

const CASES = BASES.flatMap((base) => TEMPERATURES_C.map((temperatureC) => [`${base.tail.topology}, ${temperatureC} °C`, designOf(base, temperatureC)] as const));

function describeValues(what: string, predicted: number | null, reference: number | null): string {
  return `${what}: analyze ${predicted} vs ngspice ${reference}`;
}

function expectRelative(what: string, predicted: number, reference: number, tolerance: number): void {
  expect(Number.isFinite(predicted), describeValues(what, predicted, reference)).toBe(true);
  expect(Math.abs(predicted - reference) / Math.abs(reference), describeValues(what, predicted, reference)).toBeLessThanOrEqual(tolerance);
}

function expectWithinDb(what: string, predictedDb: number | null, referenceDb: number | null, toleranceDb: number): void {
  expect(predictedDb === null, describeValues(`${what} (null?)`, predictedDb, referenceDb)).toBe(referenceDb === null);
  if (predictedDb === null || referenceDb === null) return;
  expect(Math.abs(predictedDb - referenceDb), describeValues(what, predictedDb, referenceDb)).toBeLessThanOrEqual(toleranceDb);
}

describe('analyze agrees with ngspice on designs with full model cards', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  describe.each(CASES)('%s', (_title, design) => {
    let reference: Promise<SpiceFigures> | undefined;
    const spice = (): Promise<SpiceFigures> => (reference ??= spiceFigures(design));

    test('reference: every transistor forward-active in ngspice', async () => {
      for (const q of (await spice()).transistors) {
        // 0.3 V: a PTAT cell's 8× transistor at 125 °C conducts its current below 0.4 V
        expect(q.vbeV, `${q.name} VBE`).toBeGreaterThan(0.3);
        if (q.vcbV !== 0) expect(q.vceV, `${q.name} VCE`).toBeGreaterThan(0.3);
      }
    });

    test('currents and power: within the contract (3 %, 5 %) and within 0.01 %', async () => {
      const s = await spice();
      const p = analyze(design);
      for (const [what, tolerance] of [['tailCurrentA', CURRENT_TOLERANCE], ['collectorCurrentA', CURRENT_TOLERANCE], ['powerW', POWER_TOLERANCE]] as const) {
        expectRelative(what, p[what], s[what], tolerance);
        expectRelative(`${what} (same model)`, p[what], s[what], SAME_MODEL_TOLERANCE);
      }
    });

    test('low-frequency gains: within 5 % and within 0.01 % (differential common-mode gain 0.1 %)', async () => {
      const s = await spice();
      const p = analyze(design);
      for (const what of ['differentialGain', 'singleEndedGain', 'commonModeGain'] as const) {
        expectRelative(what, p[what], s[what], GAIN_TOLERANCE);
        expectRelative(`${what} (same model)`, p[what], s[what], SAME_MODEL_TOLERANCE);
      }
      expectRelative('differentialCommonModeGain', p.differentialCommonModeGain, s.differentialCommonModeGain, SAME_MODEL_RESIDUE_TOLERANCE);
    });

    test('rejection: single-ended within 1.5 dB, differential within 2 dB, both within 0.01 dB', async () => {
      const s = await spice();
      const p = analyze(design);
      expectWithinDb('cmrrDb.singleEnded', p.cmrrDb.singleEnded, s.cmrrDb.singleEnded, CMRR_SINGLE_ENDED_TOLERANCE_DB);
      expectWithinDb('cmrrDb.differential', p.cmrrDb.differential, s.cmrrDb.differential, CMRR_DIFFERENTIAL_TOLERANCE_DB);
      expectWithinDb('cmrrDb.singleEnded (same model)', p.cmrrDb.singleEnded, s.cmrrDb.singleEnded, SAME_MODEL_CMRR_TOLERANCE_DB);
      expectWithinDb('cmrrDb.differential (same model)', p.cmrrDb.differential, s.cmrrDb.differential, SAME_MODEL_CMRR_TOLERANCE_DB);
    });

    test('tail output resistance: within 20 % and within 0.01 %', async () => {
      const s = await spice();
      const p = analyze(design);
      expectRelative('tailOutputResistanceOhm', p.tailOutputResistanceOhm, s.tailOutputResistanceOhm, TAIL_OUTPUT_RESISTANCE_TOLERANCE);
      expectRelative('tailOutputResistanceOhm (same model)', p.tailOutputResistanceOhm, s.tailOutputResistanceOhm, SAME_MODEL_TOLERANCE);
    });
  });
});
