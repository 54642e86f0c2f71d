/**
 * PNP input pairs (`device.family` "pnp", ENGINE-CONTRACT.md version 2, "Families") against
 * ngspice on the netlist the product writes: the mirror image of the NPN stage (PNP pair and
 * tail, the tail element from `t` to the positive rail, loads and reference resistors to the
 * negative rail, every substrate at the negative rail, one `.model QPNP PNP` card). Every tail
 * that needs no second device, at −40, 27 and 125 °C, with a full Gummel-Poon PNP card (DC,
 * ohmic, leakage, temperature and charge parameters), the pair mismatched; then a single supply
 * with the input common mode near the negative rail (where a PNP pair's input range reaches).
 *
 * Measures: `spiceFigures` (api/verification/spice-analyses.ts: currents from the load drops in
 * the direction the transistors conduct, gains and rejection from `.ac`, Rout from the tail
 * alone), the trade-off measures of api/verification/spice-tradeoffs.ts (bias and offset
 * currents from `.op`, offset and linear range from `.dc` sweeps, PSRR from `.ac` on a rail,
 * noise from `.noise`, the slew rate from `.tran`). Tolerances: the contract's (currents 3 %,
 * gains 5 %, single-ended CMRR 1.5 dB, differential 2 dB, tail output resistance 20 %, power
 * 5 %; bias and offset currents 3 %, offset 3 % or 20 µV, drift 5 % or 0.1 µV/°C, noise 5 %,
 * slew rate 10 %, linear range 5 %, PSRR 1.5 dB, input resistance 5 %, `ac` gains 5 %), and
 * for the DC and low-frequency figures the same-model bounds of full-model-dc.test.ts (0.01 %,
 * residue 0.1 %, 0.01 dB), which a sign or polarity slip anywhere could never pass.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze, solveCircuit } from '#shared/engine/analyze';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import { parseNetlistElements, spiceNetlist, PNP_MODEL_NAME } from '#shared/engine/netlist';
import { slewRun } from '#shared/engine/slew-rate';
import type { Design, TailDesign, TopologyId } from '#shared/engine/types';
import {
  spiceInputFigures,
  spiceInputNoiseVPerRtHz,
  spiceInputResistanceOhm,
  spiceLinearInputRangeV,
  spiceOffsetDriftVPerC,
  spicePsrrDb,
  spiceSlewRateVPerS,
} from '../../api/verification/spice-tradeoffs';
import { runSpice, spiceAc, spiceFigures, startSpice, type SpiceFigures } from '../helpers/spice';

const CURRENT_TOLERANCE = 0.03;
const GAIN_TOLERANCE = 0.05;
const CMRR_SINGLE_ENDED_TOLERANCE_DB = 1.5;
const CMRR_DIFFERENTIAL_TOLERANCE_DB = 2;
const TAIL_OUTPUT_RESISTANCE_TOLERANCE = 0.2;
const POWER_TOLERANCE = 0.05;
const SAME_MODEL_TOLERANCE = 1e-4;
const SAME_MODEL_RESIDUE_TOLERANCE = 1e-3;
const SAME_MODEL_CMRR_TOLERANCE_DB = 0.01;
const OFFSET_RELATIVE = 0.03;
const OFFSET_ABSOLUTE_V = 20e-6;
const DRIFT_RELATIVE = 0.05;
const DRIFT_ABSOLUTE_V_PER_C = 0.1e-6;
const LINEAR_RANGE_TOLERANCE = 0.05;
const PSRR_TOLERANCE_DB = 1.5;
const INPUT_RESISTANCE_TOLERANCE = 0.05;
const NOISE_TOLERANCE = 0.05;
const SLEW_TOLERANCE = 0.1;
const AC_GAIN_TOLERANCE = 0.05;

const ENGINE_START_TIMEOUT_MS = 120_000;
const RUN_TIMEOUT_MS = 240_000;

/**
 * An invented PNP card (Fernhollow FP3906, demo device): every DC parameter the engine models,
 * its own ohmic resistances, and junction and transit-time charges (CJS on the lateral PNP's base).
 */
const FERNHOLLOW_FP3906: BjtModelCard = {
  IS: 2.2e-15, BF: 110, NF: 1.01, VAF: 38, IKF: 0.05, ISE: 8e-15, NE: 1.7, BR: 3, NR: 1.02, VAR: 14, IKR: 0.02,
  ISC: 5e-15, NC: 1.7, RB: 260, RE: 1.1, RC: 9, EG: 1.12, XTI: 3.4, XTB: 1.6,
  CJE: 9e-12, VJE: 0.75, MJE: 0.35, CJC: 5.5e-12, VJC: 0.7, MJC: 0.4, CJS: 1.8e-12, TF: 5e-10, TR: 9e-8,
};

const PNP_DEVICE: Design['device'] = { family: 'pnp', model: FERNHOLLOW_FP3906 };

/** Every tail built from the stage's own device (the PTAT tail needs the opposite one). */
const TAILS: Record<Exclude<TopologyId, 'ptat'>, TailDesign> = {
  resistor: { topology: 'resistor', resistanceOhm: 8200 },
  'simple-mirror': { topology: 'simple-mirror', referenceResistanceOhm: 15000 },
  'degenerated-mirror': { topology: 'degenerated-mirror', referenceResistanceOhm: 15000, emitterResistanceOhm: 680 },
  widlar: { topology: 'widlar', referenceResistanceOhm: 11000, emitterResistanceOhm: 270 },
  wilson: { topology: 'wilson', referenceResistanceOhm: 15000 },
  cascode: { topology: 'cascode', referenceResistanceOhm: 15000 },
};

/** The pair's mismatches, so the differential figures and the offset are finite. */
const MISMATCHES: Partial<Design> = { collectorMismatch: 0.012, pairSaturationCurrentMismatch: -0.025, pairBetaMismatch: 0.06 };

function pnpDesign(tail: TailDesign, overrides: Partial<Design> = {}): Design {
  return {
    device: PNP_DEVICE,
    supply: { positiveV: 9, negativeV: -9 },
    collectorResistanceOhm: 6200,
    tail,
    inputCommonModeV: -0.5,
    temperatureC: 27,
    ...MISMATCHES,
    ...overrides,
  };
}

const TEMPERATURES_C = [-40, 27, 125] as const;

const CASES: [string, Design][] = [
  ...Object.values(TAILS).flatMap((tail) => TEMPERATURES_C.map((temperatureC): [string, Design] => [`${tail.topology}, ${temperatureC} °C`, pnpDesign(tail, { temperatureC })])),
  // single supply, common mode 1.5 V above the negative rail: the loads drop under 1 V
  ['simple-mirror, 0 V to 10 V, common mode 1.5 V', pnpDesign(TAILS['simple-mirror'], { supply: { positiveV: 10, negativeV: 0 }, inputCommonModeV: 1.5, collectorResistanceOhm: 1200 })],
  ['cascode, 0 V to 12 V, common mode 2 V, source resistors 2.2 kΩ, pair degeneration 100 Ω', pnpDesign(TAILS.cascode, { supply: { positiveV: 12, negativeV: 0 }, inputCommonModeV: 2, collectorResistanceOhm: 1500, sourceResistanceOhm: 2200, pairEmitterResistanceOhm: 100 })],
];

function describeValues(what: string, predicted: number | null, reference: number | null): string {
  return `${what}: analyze ${predicted} vs ngspice ${reference}`;
}

function expectRelative(what: string, predicted: number, reference: number, tolerance: number, absolute = 0): void {
  expect(Number.isFinite(predicted), describeValues(what, predicted, reference)).toBe(true);
  expect(Math.abs(predicted - reference), describeValues(what, predicted, reference)).toBeLessThanOrEqual(Math.max(tolerance * Math.abs(reference), absolute));
}

function expectWithinDb(what: string, predictedDb: number | null, referenceDb: number | null, toleranceDb: number): void {
  expect(predictedDb === null, describeValues(`${what} (null?)`, predictedDb, referenceDb)).toBe(referenceDb === null);
  if (predictedDb === null || referenceDb === null) return;
  expect(Math.abs(predictedDb - referenceDb), describeValues(what, predictedDb, referenceDb)).toBeLessThanOrEqual(toleranceDb);
}

describe('a PNP pair agrees with ngspice on every tail that needs no second device', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  test('the netlist is the mirror image: PNPs on one PNP card, substrates at vn, loads to vn, the tail fed from vp', () => {
    const netlist = spiceNetlist(pnpDesign(TAILS['simple-mirror']), { analysis: 'op' });
    const elements = parseNetlistElements(netlist);
    expect(netlist).toMatch(new RegExp(`^\\.model ${PNP_MODEL_NAME} PNP \\(`, 'm'));
    expect(netlist).not.toMatch(/ NPN \(/);
    for (const q of elements.filter((e) => e.kind === 'Q')) {
      expect(q.kind === 'Q' && q.substrate, `${q.name} substrate`).toBe('vn');
      expect(q.kind === 'Q' && q.model.startsWith(PNP_MODEL_NAME), `${q.name} model`).toBe(true);
    }
    const resistor = (name: string) => elements.find((e) => e.name === name);
    expect(resistor('RC1')).toMatchObject({ nodes: ['vn', 'c1'] });
    expect(resistor('RREF')).toMatchObject({ nodes: ['vn', 'ref'] });
    expect(elements.find((e) => e.name === 'Q4')).toMatchObject({ collector: 't', base: 'ref', emitter: 'vp' });
  });

  describe.each(CASES)('%s', (_title, design) => {
    let reference: Promise<SpiceFigures> | undefined;
    const spice = (): Promise<SpiceFigures> => (reference ??= spiceFigures(design));

    test('reference: every transistor conducts forward-active in ngspice (VEB and VEC in the PNP direction)', async () => {
      for (const q of (await spice()).transistors) {
        expect(q.vbeV, `${q.name} VEB`).toBeGreaterThan(0.3);
        if (q.vcbV !== 0) expect(q.vceV, `${q.name} VEC`).toBeGreaterThan(0.3);
      }
    });

    test('currents (positive magnitudes) and power: within 3 % and 5 %, and within 0.01 %', async () => {
      const s = await spice();
      const p = analyze(design);
      expect(p.tailCurrentA).toBeGreaterThan(0);
      expect(p.collectorCurrentA).toBeGreaterThan(0);
      for (const [what, tolerance] of [['tailCurrentA', CURRENT_TOLERANCE], ['collectorCurrentA', CURRENT_TOLERANCE], ['powerW', POWER_TOLERANCE]] as const) {
        expectRelative(what, p[what], s[what], tolerance);
        expectRelative(`${what} (same model)`, p[what], s[what], SAME_MODEL_TOLERANCE);
      }
      expectRelative('collectorVoltageV (same model)', p.collectorVoltageV, s.collectorVoltageV, SAME_MODEL_TOLERANCE);
      expectRelative('tailNodeVoltageV (same model)', p.tailNodeVoltageV, s.tailNodeVoltageV, SAME_MODEL_TOLERANCE);
    });

    test('low-frequency gains and rejection: within the contract and the same-model bounds', async () => {
      const s = await spice();
      const p = analyze(design);
      for (const what of ['differentialGain', 'singleEndedGain', 'commonModeGain'] as const) {
        expectRelative(what, p[what], s[what], GAIN_TOLERANCE);
        expectRelative(`${what} (same model)`, p[what], s[what], SAME_MODEL_TOLERANCE);
      }
      expectRelative('differentialCommonModeGain', p.differentialCommonModeGain, s.differentialCommonModeGain, SAME_MODEL_RESIDUE_TOLERANCE);
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

    test('input figures: bias and offset currents, offset and drift, linear range, PSRR, input resistance within the contract', async () => {
      const p = analyze(design);
      const s = await spiceInputFigures(runSpice, design);
      expect(p.inputBiasCurrentA).toBeGreaterThan(0);
      expectRelative('inputBiasCurrentA', p.inputBiasCurrentA, s.inputBiasCurrentA, CURRENT_TOLERANCE);
      expectRelative('inputOffsetVoltageV', p.inputOffsetVoltageV, s.inputOffsetVoltageV, OFFSET_RELATIVE, OFFSET_ABSOLUTE_V);
      expectRelative('inputOffsetCurrentA', p.inputOffsetCurrentA, s.inputOffsetCurrentA, CURRENT_TOLERANCE);
      expectRelative('offsetDriftVPerC', p.offsetDriftVPerC, await spiceOffsetDriftVPerC(runSpice, design), DRIFT_RELATIVE, DRIFT_ABSOLUTE_V_PER_C);
      expect(p.linearInputRangeV).not.toBeNull();
      expectRelative('linearInputRangeV', p.linearInputRangeV!, await spiceLinearInputRangeV(runSpice, design), LINEAR_RANGE_TOLERANCE);
      const psrr = await spicePsrrDb(runSpice, design);
      for (const rail of ['positive', 'negative'] as const) {
        expectWithinDb(`psrrDb.${rail}.singleEnded`, p.psrrDb[rail].singleEnded, psrr[rail].singleEnded, PSRR_TOLERANCE_DB);
        expectWithinDb(`psrrDb.${rail}.differential`, p.psrrDb[rail].differential, psrr[rail].differential, PSRR_TOLERANCE_DB);
      }
      expectRelative('inputResistanceOhm', p.inputResistanceOhm, await spiceInputResistanceOhm(runSpice, design), INPUT_RESISTANCE_TOLERANCE);
    }, RUN_TIMEOUT_MS);
  });
});

describe('a PNP pair over frequency: ac gains and noise density, and the slew rate, agree with ngspice', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  const FREQUENCIES_HZ = [1e3, 1e6];
  const OVER_FREQUENCY: [string, Design][] = [
    ['simple-mirror, 27 °C, 10 pF loads', pnpDesign(TAILS['simple-mirror'], { loadCapacitanceF: 10e-12, frequenciesHz: FREQUENCIES_HZ })],
    ['widlar, 125 °C, 5 pF loads, 1 kΩ source resistors', pnpDesign(TAILS.widlar, { loadCapacitanceF: 5e-12, sourceResistanceOhm: 1000, temperatureC: 125, frequenciesHz: FREQUENCIES_HZ })],
    ['cascode, −40 °C, 22 pF loads, 2 pF tail wiring', pnpDesign(TAILS.cascode, { loadCapacitanceF: 22e-12, tailCapacitanceF: 2e-12, temperatureC: -40, frequenciesHz: FREQUENCIES_HZ })],
  ];

  test.each(OVER_FREQUENCY)('%s: ac differential and common-mode gains within 5 %, noise density within 5 %', async (_title, design) => {
    const p = analyze(design);
    const differential = await spiceAc(design, { analysis: 'ac-differential', startHz: 1e3, stopHz: 1e6, pointsPerDecade: 1 });
    const commonMode = await spiceAc(design, { analysis: 'ac-common-mode', startHz: 1e3, stopHz: 1e6, pointsPerDecade: 1 });
    const noise = await spiceInputNoiseVPerRtHz(runSpice, design, FREQUENCIES_HZ);
    FREQUENCIES_HZ.forEach((frequencyHz, k) => {
      const at = differential.frequenciesHz.findIndex((f) => Math.abs(f - frequencyHz) <= 1e-6 * frequencyHz);
      expect(at, `ngspice has ${frequencyHz} Hz`).toBeGreaterThanOrEqual(0);
      const magnitude = (z: { re: number; im: number }) => Math.hypot(z.re, z.im);
      const c1 = differential.nodeVoltages.c1[at];
      const c2 = differential.nodeVoltages.c2[at];
      const entry = p.ac[k];
      expectRelative(`ac ${frequencyHz} Hz differentialGain`, entry.differentialGain, magnitude({ re: c1.re - c2.re, im: c1.im - c2.im }), AC_GAIN_TOLERANCE);
      expectRelative(`ac ${frequencyHz} Hz commonModeGain`, entry.commonModeGain, magnitude(commonMode.nodeVoltages.c1[at]), AC_GAIN_TOLERANCE);
      expect(entry.inputNoiseVPerRtHz).not.toBeNull();
      expectRelative(`ac ${frequencyHz} Hz inputNoiseVPerRtHz`, entry.inputNoiseVPerRtHz!, noise[k], NOISE_TOLERANCE);
    });
  }, RUN_TIMEOUT_MS);

  test.each(OVER_FREQUENCY)('%s: slew rate within 10 %', async (_title, design) => {
    const { settlingS } = slewRun(solveCircuit(design), { untilSettled: true });
    const reference = await spiceSlewRateVPerS(runSpice, design, 1e-9 + 3 * settlingS);
    const predicted = analyze(design).slewRateVPerS;
    expect(predicted).not.toBeNull();
    expectRelative('slewRateVPerS', predicted!, reference, SLEW_TOLERANCE);
  }, RUN_TIMEOUT_MS);
});
