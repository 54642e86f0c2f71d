/**
 * Evaluating one sized design over its spec's conditions (shared/engine/option-evaluation.ts).
 * The conditions are the ones DEVELOPERS.md ("Conditions") names: nominal, the four corners of
 * input common mode × temperature, a seven-point temperature sweep. Each figure is checked
 * against its definition applied to `analyze` of the same design at that condition (the
 * contract's figures, ENGINE-CONTRACT.md), the rails' 60 V DC limit [IEC62368] and the tail
 * impedance |Rout ∥ 1/(j2πf·Ct)| [DOMAIN]. Designs are written by hand on E-series values
 * [IEC60063]; each test evaluates its own.
 */
import { GAIN_REMEDY_WORDS } from '#shared/text/engine-notes';
import { describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/index';
import { evaluateOption } from '#shared/engine/option-evaluation';
import { solveCircuit } from '#shared/engine/analyze';
import {
  mismatchSensitivity,
  mismatchSigmas,
  mismatchStages,
  monteCarloDraws,
  screeningSensitivity,
  screeningStages,
  worstCaseMismatchCmrrDb,
} from '#shared/engine/mismatch';
import type { AnalyzeResult, Design, Spec, TailDesign } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';

/** An invented spec of Quillfen Instruments with the given overrides. */
/**
 * The rails, current gain and resistor tempco held at nominal (no spread): these tests check the
 * base corners' figures from their definitions; tests/unit/engine/sign-off-corners.test.ts checks
 * the search over the spreads.
 */
function withoutSpreads(raw: Record<string, unknown>): Record<string, unknown> {
  const beta = (raw.device as { beta: number }).beta;
  return {
    supplyTolerance: { positivePercent: 0, negativePercent: 0 },
    betaRange: { min: beta, max: beta },
    ...raw,
    resistors: { tempcoPpmPerC: 0, ...(raw.resistors as Record<string, unknown>) },
  };
}

function specWith(overrides: Record<string, unknown> = {}): Spec {
  const result = validateSpec(withoutSpreads({
    title: 'Quillfen evaluation bench case',
    device: { beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
    supply: { positiveV: 12, negativeV: -12 },
    gain: { target: 100, tolerancePercent: 10, output: 'single-ended' },
    cmrr: { minDb: 60, atFrequencyHz: 1000 },
    inputCommonMode: { minV: -2, maxV: 2 },
    outputSwingVpp: 2,
    powerBudgetW: 0.05,
    temperatureC: { min: -10, max: 70 },
    resistors: { series: 'E96', tolerancePercent: 1 },
    tailCapacitanceF: 1e-11,
    monteCarlo: { samples: 200, seed: 5 },
    ...overrides,
  }));
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.value;
}

/** A simple mirror of about 1 mA on ±12 V (RREF 22.6 kΩ) into 10 kΩ loads. */
const MIRROR: TailDesign = { topology: 'simple-mirror', referenceResistanceOhm: 22600 };
/** A resistor tail of about 1 mA from 0 V input on −12 V. */
const RESISTOR: TailDesign = { topology: 'resistor', resistanceOhm: 11300 };

function designFor(spec: Spec, tail: TailDesign, collectorResistanceOhm = 10000): Design {
  return { device: spec.device, supply: spec.supply, collectorResistanceOhm, pairEmitterResistanceOhm: 0, tail, inputCommonModeV: 0, temperatureC: 27, tailCapacitanceF: spec.tailCapacitanceF };
}
const at = (design: Design, inputCommonModeV: number, temperatureC: number): AnalyzeResult => analyze({ ...design, inputCommonModeV, temperatureC });
const gainOf = (spec: Spec, r: AnalyzeResult) => Math.abs(spec.gain.output === 'differential' ? r.differentialGain : r.singleEndedGain);
const relative = (actual: number, expected: number) => Math.abs(actual / expected - 1);

describe('corners and the nominal condition', () => {
  test('the four corners are input common mode min/max × temperature min/max, each the analyze output of the design there', () => {
    const spec = specWith();
    const design = designFor(spec, MIRROR);
    const { corners, predicted } = evaluateOption(spec, design);
    expect(corners.map((c) => [c.inputCommonModeV, c.temperatureC])).toEqual([
      [-2, -10],
      [-2, 70],
      [2, -10],
      [2, 70],
    ]);
    expect(corners.map((c) => c.label)).toEqual(['ICM −2 V, −10 °C', 'ICM −2 V, 70 °C', 'ICM 2 V, −10 °C', 'ICM 2 V, 70 °C']);
    for (const c of corners) {
      const r = at(design, c.inputCommonModeV, c.temperatureC);
      expect(c.tailCurrentA).toBe(r.tailCurrentA);
      expect(c.gain).toBe(gainOf(spec, r));
      expect(c.powerW).toBe(r.powerW);
      expect(c.tailComplianceMarginV).toBe(r.tailComplianceMarginV);
      expect(c.pairSaturationMarginV).toBe(r.pairSaturationMarginV);
      expect(c.warnings).toEqual(r.warnings);
      expect(c.operatingPointProblems).toEqual(r.operatingPointProblems);
      // single-ended output: no mismatch figure
      expect(c.cmrrDifferentialWorstCaseDb).toBeNull();
    }
    // nominal: mid input common mode (0 V), 27 °C inside −10…70 °C
    expect(JSON.stringify(predicted)).toBe(JSON.stringify(at(design, 0, 27)));
  });
});

describe('facts: worst corners and margins from their definitions', () => {
  test('rejection: the worst corner\'s single-ended CMRR at the spec frequency, its margin over the required plus the margin asked', () => {
    const spec = specWith({ cmrr: { minDb: 60, atFrequencyHz: 1000, marginDb: 4 } });
    const { facts, corners } = evaluateOption(spec, designFor(spec, MIRROR));
    const worst = corners.reduce((a, b) => (b.cmrrAtFrequencyDb < a.cmrrAtFrequencyDb ? b : a));
    expect(new Set(corners.map((c) => c.cmrrAtFrequencyDb)).size).toBe(4); // a real choice among four
    expect(facts.cmrrAtFrequencyDb).toBe(worst.cmrrAtFrequencyDb);
    expect(facts.worstCmrrCorner).toBe(worst.label);
    expect(facts.cmrrMarginDb).toBeCloseTo(worst.cmrrAtFrequencyDb - 64, 9);
    expect(facts.cmrrFrequencyHz).toBe(1000);
    expect(facts.cmrrRequiredDb).toBe(60);
    expect(facts.cmrrMarginRequiredDb).toBe(4);
    // a single-ended output's rejection is that same figure, its margin the same
    expect(facts.outputCmrrDb).toBe(worst.cmrrAtFrequencyDb);
    expect(facts.outputCmrrMarginDb).toBeCloseTo(worst.cmrrAtFrequencyDb - 64, 9);
  });

  test('rejection of a differential output: the worst-case mismatch-limited figure against the required plus the margin; the common mode left for the next stage against the required alone', () => {
    const spec = specWith({ gain: { target: 100, output: 'differential', tolerancePercent: 10 }, cmrr: { minDb: 60, atFrequencyHz: 1000, marginDb: 4 } });
    const { facts, corners } = evaluateOption(spec, designFor(spec, MIRROR));
    expect(facts.cmrrDifferentialWorstCaseDb).not.toBeNull();
    expect(facts.outputCmrrDb).toBe(facts.cmrrDifferentialWorstCaseDb);
    expect(facts.outputCmrrMarginDb).toBeCloseTo(facts.cmrrDifferentialWorstCaseDb! - 64, 9);
    expect(facts.cmrrDifferentialWorstCaseMarginDb).toBeCloseTo(facts.cmrrDifferentialWorstCaseDb! - 60, 9);
    expect(corners).toHaveLength(4);
    expect(facts.outputCommonModeMarginDb).toBeCloseTo(facts.outputCommonModeRejectionDb - 60, 9);
  });

  test('gain: error at nominal, the corner with the largest error in magnitude, and both margins against the tolerance', () => {
    const spec = specWith();
    const design = designFor(spec, MIRROR);
    const { facts, corners } = evaluateOption(spec, design);
    const nominal = gainOf(spec, at(design, 0, 27));
    expect(facts.gainPredicted).toBe(nominal);
    expect(facts.gainTarget).toBe(100);
    expect(facts.gainErrorPercent).toBeCloseTo(((nominal - 100) / 100) * 100, 9);
    expect(facts.gainMarginPercent).toBeCloseTo(10 - Math.abs(facts.gainErrorPercent), 9);
    const errors = corners.map((c) => ({ label: c.label, error: ((c.gain - 100) / 100) * 100 }));
    const worst = errors.reduce((a, b) => (Math.abs(b.error) > Math.abs(a.error) ? b : a));
    expect(facts.gainWorstCorner).toBe(worst.label);
    expect(facts.gainWorstCornerErrorPercent).toBeCloseTo(worst.error, 9);
    expect(facts.gainOverConditionsMarginPercent).toBeCloseTo(10 - Math.abs(worst.error), 9);
    expect(facts.gainTolerancePercent).toBe(10);
  });

  test('headroom: the low end\'s tail compliance, the high end\'s pair margin less the swing peak, the swing\'s room both ways at nominal', () => {
    const spec = specWith({ outputSwingVpp: 3 }); // single-ended: 1.5 V peak on the collector
    const design = designFor(spec, MIRROR);
    const { facts } = evaluateOption(spec, design);
    const low = [at(design, -2, -10), at(design, -2, 70)];
    const high = [at(design, 2, -10), at(design, 2, 70)];
    expect(facts.icmLowMarginV).toBe(Math.min(...low.map((r) => r.tailComplianceMarginV)));
    expect(facts.icmHighMarginV).toBeCloseTo(Math.min(...high.map((r) => r.pairSaturationMarginV)) - 1.5, 12);
    const nominal = at(design, 0, 27);
    const upRoom = 12 - Math.max(nominal.collectorVoltageV, nominal.collector2VoltageV);
    expect(facts.swingMarginV).toBeCloseTo(Math.min(upRoom - 1.5, nominal.pairSaturationMarginV - 1.5), 12);
    expect(facts.swingPeakPerCollectorV).toBe(1.5);
    expect(facts.outputSwingVpp).toBe(3);
    expect([facts.icmLowV, facts.icmHighV]).toEqual([-2, 2]);
  });

  test('swing: when the collectors sit low, the pair\'s saturation margin rather than the room to the rail governs', () => {
    // 20 kΩ loads at about 0.5 mA each drop about 10 V: VC near 2 V, far from the rail, near the pair's saturation
    const spec = specWith({ outputSwingVpp: 1 });
    const design = designFor(spec, MIRROR, 20000);
    const { facts } = evaluateOption(spec, design);
    const nominal = at(design, 0, 27);
    expect(facts.swingMarginV).toBeCloseTo(nominal.pairSaturationMarginV - 0.5, 12);
    expect(12 - nominal.collectorVoltageV - 0.5).toBeGreaterThan(facts.swingMarginV);
  });

  test('power: the most any condition draws, against the budget', () => {
    const spec = specWith({ powerBudgetW: 0.03 });
    const design = designFor(spec, RESISTOR);
    const { facts } = evaluateOption(spec, design);
    const worst = Math.max(...[[0, 27], [-2, -10], [-2, 70], [2, -10], [2, 70]].map(([v, t]) => at(design, v, t).powerW));
    expect(facts.powerWorstW).toBe(worst);
    // a resistor tail draws most at the highest input common mode
    expect(worst).toBeGreaterThan(at(design, 0, 27).powerW);
    expect(facts.powerMarginW).toBeCloseTo(0.03 - worst, 15);
    expect(facts.powerBudgetW).toBe(0.03);
  });

  test('drift: tail current spread over seven temperatures from min to max at the nominal input, per cent of nominal; the sweep is the curve', () => {
    const spec = specWith({ gain: { target: 100, tolerancePercent: 7, output: 'single-ended' } });
    const design = designFor(spec, RESISTOR);
    const { facts, curves } = evaluateOption(spec, design);
    const temperatures = [-10, 10 / 3, 50 / 3, 30, 130 / 3, 170 / 3, 70];
    expect(curves.temperatureSweep.map((p) => p.temperatureC)).toEqual(temperatures.map((t) => expect.closeTo(t, 9)));
    const currents = temperatures.map((t) => at(design, 0, t).tailCurrentA);
    curves.temperatureSweep.forEach((p, i) => {
      expect(relative(p.tailCurrentA, currents[i])).toBeLessThan(1e-12);
      expect(relative(p.gain, gainOf(spec, at(design, 0, temperatures[i])))).toBeLessThan(1e-12);
    });
    const drift = ((Math.max(...currents) - Math.min(...currents)) / at(design, 0, 27).tailCurrentA) * 100;
    expect(facts.tailCurrentDriftPercent).toBeCloseTo(drift, 9);
    expect(facts.tailCurrentDriftLimitPercent).toBe(7);
    expect(facts.tailCurrentDriftMarginPercent).toBeCloseTo(7 - drift, 9);
    expect([facts.temperatureMinC, facts.temperatureMaxC]).toEqual([-10, 70]);
  });

  test('gain against input common mode: the change from the lowest to the highest input at the nominal temperature, per cent of nominal', () => {
    const spec = specWith();
    const design = designFor(spec, RESISTOR);
    const { facts } = evaluateOption(spec, design);
    const change = (Math.abs(gainOf(spec, at(design, 2, 27)) - gainOf(spec, at(design, -2, 27))) / gainOf(spec, at(design, 0, 27))) * 100;
    // a resistor tail: Itail = (VICM − VBE − V−)/R moves about 4/11.3 ≈ 35 % across −2…2 V [DOMAIN]
    expect(change).toBeGreaterThan(20);
    expect(facts.gainVsCommonModePercent).toBeCloseTo(change, 9);
    expect(facts.gainVsCommonModeMarginPercent).toBeCloseTo(10 - change, 9);
    expect(facts.gainVsCommonModeLimitPercent).toBe(10);
  });

  test('rails: span and its margin below 60 V DC [IEC62368]; hazard flags as the spec gives them', () => {
    const spec = specWith({ supply: { positiveV: 35, negativeV: -30 }, hazards: { patientConnected: true, mainsReferenced: false } });
    const { facts } = evaluateOption(spec, designFor(spec, { topology: 'simple-mirror', referenceResistanceOhm: 64900 }));
    expect(facts.railSpanV).toBe(65);
    expect(facts.hazardousVoltageLimitV).toBe(60);
    expect(facts.hazardousVoltageMarginV).toBe(-5);
    expect(facts.patientConnected).toBe(true);
    expect(facts.mainsReferenced).toBe(false);
  });

  test('tail: output resistance at nominal, its impedance with Ct at the spec frequency, the textbook limit beside it', () => {
    const spec = specWith({ cmrr: { minDb: 60, atFrequencyHz: 200000 }, tailCapacitanceF: 2e-11 });
    const design = designFor(spec, MIRROR);
    const { facts } = evaluateOption(spec, design);
    const nominal = at(design, 0, 27);
    const rOhm = nominal.tailOutputResistanceOhm;
    const zOhm = 1 / Math.hypot(1 / rOhm, 2 * Math.PI * 200000 * 2e-11);
    expect(relative(facts.tailImpedanceAtFrequencyOhm, zOhm)).toBeLessThan(1e-12);
    expect(zOhm).toBeLessThan(rOhm / 2); // Ct matters at this frequency, so the check is not vacuous
    expect(facts.tailOutputResistanceOhm).toBe(rOhm);
    expect(facts.tailOutputResistanceClosedFormOhm).toBe(nominal.tailOutputResistanceClosedForm.valueOhm);
    expect(facts.tailOutputResistanceFormula).toBe(nominal.tailOutputResistanceClosedForm.formula);
    expect(facts.topology).toBe('simple-mirror');
    expect(facts.isResistorTail).toBe(false);
  });
});

describe('what moves the gain most, and the remedy', () => {
  test('a resistor tail over a wide input range and a narrow temperature range: the input common mode, and a current-source tail', () => {
    const spec = specWith({ inputCommonMode: { minV: -4, maxV: 4 }, temperatureC: { min: 20, max: 30 } });
    const { facts } = evaluateOption(spec, designFor(spec, RESISTOR));
    expect(facts.isResistorTail).toBe(true);
    expect(facts.gainOverConditionsCause).toBe('input common mode');
    expect(facts.gainOverConditionsRemedyId).toBe('current-source-tail');
  });

  test('a mirror with a low Early voltage over a wide input range and a narrow temperature range: the input common mode, and a higher-resistance tail', () => {
    // Itail moves with VCB of the output transistor over VAF = 15 V [SPICE]: 8 V of input range moves it about 50 %
    const spec = specWith({ device: { beta: 150, earlyVoltageV: 15, saturationCurrentA: 1e-14 }, inputCommonMode: { minV: -4, maxV: 4 }, temperatureC: { min: 20, max: 30 } });
    const { facts } = evaluateOption(spec, designFor(spec, MIRROR));
    expect(facts.gainOverConditionsCause).toBe('input common mode');
    expect(facts.gainOverConditionsRemedyId).toBe('higher-resistance-tail');
  });

  test('a mirror over a narrow input range and a wide temperature range: temperature (gm = IC/VT), and degeneration or a rising tail current', () => {
    const spec = specWith({ inputCommonMode: { minV: -0.1, maxV: 0.1 }, temperatureC: { min: -40, max: 85 } });
    const { facts } = evaluateOption(spec, designFor(spec, MIRROR));
    expect(facts.gainOverConditionsCause).toBe('temperature');
    expect(facts.gainOverConditionsRemedyId).toBe('degeneration-or-rising-tail-current');
  });

  test('the same mirror with its pair already degenerated: more degeneration, or the PTAT tail (not "degeneration" as if it had none)', () => {
    const spec = specWith({ inputCommonMode: { minV: -0.1, maxV: 0.1 }, temperatureC: { min: -40, max: 85 } });
    const { facts } = evaluateOption(spec, { ...designFor(spec, MIRROR), pairEmitterResistanceOhm: 20 });
    expect(facts.gainOverConditionsCause).toBe('temperature');
    expect(facts.gainOverConditionsRemedyId).toBe('ptat-or-more-degeneration');
    expect(GAIN_REMEDY_WORDS[facts.gainOverConditionsRemedyId]).toMatch(/^more pair emitter degeneration than this pair has/);
  });

  test('a PTAT tail whose gain still moves most with temperature: what the PTAT law does not cancel', () => {
    // a 5 % resistor tempco spread moves the cell's current, which the PTAT law does not cancel
    const spec = specWith({ device: { ...specWith({}).device, pnp: { beta: 90, earlyVoltageV: 45, saturationCurrentA: 4e-15 } }, inputCommonMode: { minV: -0.1, maxV: 0.1 }, temperatureC: { min: -40, max: 85 }, resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 2000 } });
    const ptat: TailDesign = { topology: 'ptat', emitterResistanceOhm: 220, startupResistanceOhm: 2.2e6, areaRatio: 8 };
    const { facts } = evaluateOption(spec, designFor(spec, ptat));
    expect(facts.gainOverConditionsCause).toBe('temperature');
    expect(facts.gainOverConditionsRemedyId).toBe('beyond-ptat');
    expect(GAIN_REMEDY_WORDS[facts.gainOverConditionsRemedyId]).toMatch(/what the PTAT source does not cancel/);
  });
});

describe('operating-point problems', () => {
  test('every problem is listed with the condition it appears at, nominal first, and counted', () => {
    // 33 kΩ loads at about 0.5 mA drop about 16 V from 12 V: the pair saturates at every condition
    const spec = specWith();
    const design = designFor(spec, MIRROR, 33000);
    const { facts } = evaluateOption(spec, design);
    const expected = [
      ['ICM 0 V, 27 °C', at(design, 0, 27)],
      ['ICM −2 V, −10 °C', at(design, -2, -10)],
      ['ICM −2 V, 70 °C', at(design, -2, 70)],
      ['ICM 2 V, −10 °C', at(design, 2, -10)],
      ['ICM 2 V, 70 °C', at(design, 2, 70)],
    ] as const;
    const labels = expected.flatMap(([label, r]) => r.operatingPointProblems.map(() => label));
    expect(labels.length).toBeGreaterThan(0);
    expect(facts.operatingPointProblemsAt.map((p) => p.conditionLabel)).toEqual(labels);
    expect(facts.operatingPointProblemCount).toBe(labels.length);
  });
});

describe('differential output: mismatch worst case and Monte Carlo', () => {
  const differential = () => specWith({ gain: { target: 200, tolerancePercent: 10, output: 'differential' } });

  test('the resistor tail\'s governing corner is an inner one (neither first nor last), so the choice among corners is tested', () => {
    const spec = differential();
    const design = designFor(spec, RESISTOR);
    const f = spec.cmrr.atFrequencyHz;
    const firstOrder = evaluateOption(spec, design).corners.map((c) =>
      worstCaseMismatchCmrrDb(screeningSensitivity(screeningStages(solveCircuit({ ...design, inputCommonModeV: c.inputCommonModeV, temperatureC: c.temperatureC })), f), mismatchSigmas(spec)),
    );
    const governing = firstOrder.indexOf(Math.min(...firstOrder));
    expect(governing).toBeGreaterThan(0);
    expect(governing).toBeLessThan(3);
  });

  test('the draws default to the spec\'s samples and seed; the yield margin is the yield less the required yield', () => {
    const spec = differential();
    const design = designFor(spec, MIRROR);
    const own = evaluateOption(spec, design);
    const shared = evaluateOption(spec, design, monteCarloDraws(200, 5));
    expect(own.monteCarlo).toEqual(shared.monteCarlo);
    expect(own.monteCarlo!.samples).toBe(200);
    expect(own.monteCarlo!.seed).toBe(5);
    expect(own.facts.monteCarloYieldPercent).toBe(own.monteCarlo!.yieldPercent);
    expect(own.facts.monteCarloSamples).toBe(200);
    expect(own.facts.yieldMarginPercent).toBeCloseTo(own.monteCarlo!.yieldPercent - spec.cmrr.minYieldPercent, 12);
    expect(own.facts.isDifferentialOutput).toBe(true);
    // other draws give another Monte Carlo
    expect(evaluateOption(spec, design, monteCarloDraws(200, 6)).monteCarlo).not.toEqual(own.monteCarlo);
  });

  test('the worst case is the governing corner\'s figure, the lowest of the corners, with its margin over the required rejection', () => {
    const spec = differential();
    const { facts, corners, curves } = evaluateOption(spec, designFor(spec, MIRROR));
    const figures = corners.map((c) => c.cmrrDifferentialWorstCaseDb!);
    expect(figures.every((f) => Number.isFinite(f))).toBe(true);
    expect(figures).toContain(facts.cmrrDifferentialWorstCaseDb);
    expect(facts.cmrrDifferentialWorstCaseMarginDb).toBeCloseTo(facts.cmrrDifferentialWorstCaseDb! - 60, 12);
    // the curve's differential worst case at every frequency (a real number for a differential output)
    expect(curves.cmrrVsFrequency.every((p) => Number.isFinite(p.differentialWorstCaseDb))).toBe(true);
  });

  test.each([
    ['resistor tail', RESISTOR],
    ['simple mirror', MIRROR],
  ])(
    '%s: the corner with the lowest first-order worst case governs and gets the second-order figure; the others keep the first-order one (DEVELOPERS.md, "Differential output")',
    (_, tail) => {
      const spec = differential();
      const design = designFor(spec, tail);
      const { corners, facts } = evaluateOption(spec, design);
      const sigmas = mismatchSigmas(spec);
      const f = spec.cmrr.atFrequencyHz;
      const screened = corners.map((c) => screeningStages(solveCircuit({ ...design, inputCommonModeV: c.inputCommonModeV, temperatureC: c.temperatureC })));
      const firstOrder = screened.map((stages) => worstCaseMismatchCmrrDb(screeningSensitivity(stages, f), sigmas));
      const governing = firstOrder.indexOf(Math.min(...firstOrder));
      // not the first corner (the resistor tail's is neither the first nor the last): the choice is a real one
      expect(governing).toBeGreaterThan(0);
      const secondOrder = worstCaseMismatchCmrrDb(mismatchSensitivity(mismatchStages(screened[governing]), f), sigmas);
      corners.forEach((c, i) => expect(c.cmrrDifferentialWorstCaseDb, c.label).toBeCloseTo(i === governing ? secondOrder : firstOrder[i], 9));
      expect(facts.cmrrDifferentialWorstCaseDb).toBeCloseTo(secondOrder, 9);
    },
  );

  test('a single-ended output has no Monte Carlo, no mismatch figures and no differential curve', () => {
    const spec = specWith();
    const { facts, monteCarlo, curves } = evaluateOption(spec, designFor(spec, MIRROR));
    expect(monteCarlo).toBeNull();
    expect(facts.monteCarloYieldPercent).toBeNull();
    expect(facts.yieldMarginPercent).toBeNull();
    expect(facts.cmrrDifferentialWorstCaseDb).toBeNull();
    expect(facts.cmrrDifferentialWorstCaseMarginDb).toBeNull();
    expect(facts.isDifferentialOutput).toBe(false);
    expect(curves.cmrrVsFrequency.every((p) => p.differentialWorstCaseDb === null)).toBe(true);
  });
});

describe('the rejection-versus-frequency curve', () => {
  test('four points a decade from 1 Hz to 10 MHz; flat at the nominal low-frequency CMRR well below the Ct corner, 3 dB down at it, falling above', () => {
    const spec = specWith({ tailCapacitanceF: 1e-10 });
    const design = designFor(spec, MIRROR);
    const { curves } = evaluateOption(spec, design);
    const points = curves.cmrrVsFrequency;
    expect(points).toHaveLength(29);
    points.forEach((p, i) => expect(relative(p.frequencyHz, 10 ** (i / 4))).toBeLessThan(1e-12));
    const nominal = at(design, 0, 27);
    expect(points[0].singleEndedDb).toBeCloseTo(nominal.cmrrDb.singleEnded, 3);
    // the contract's cmrrCornerHz: where the single-ended CMRR has fallen 3 dB; between grid points the fall is monotonic
    const cornerHz = nominal.cmrrCornerHz!;
    expect(cornerHz).toBeGreaterThan(10);
    expect(cornerHz).toBeLessThan(1e6);
    const below = points.filter((p) => p.frequencyHz < cornerHz).at(-1)!;
    const above = points.find((p) => p.frequencyHz > cornerHz)!;
    expect(nominal.cmrrDb.singleEnded - below.singleEndedDb).toBeLessThan(3);
    expect(nominal.cmrrDb.singleEnded - above.singleEndedDb).toBeGreaterThan(3);
    for (let i = 1; i < points.length; i += 1) expect(points[i].singleEndedDb).toBeLessThanOrEqual(points[i - 1].singleEndedDb + 1e-9);
  });
});
