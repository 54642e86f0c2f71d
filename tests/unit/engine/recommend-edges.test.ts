/**
 * `recommend` and `evaluateDesign` (shared/engine/recommend.ts) where an option cannot be
 * solved, for a designer's own design, and in the cautions and the summary: the contract's rules
 * (ENGINE-CONTRACT.md: every option of the catalogue appears, passing or not, each with every
 * check's reason) and the 60 V DC limit [IEC62368]. Each test runs its own recommendation.
 */
import { describe, expect, test } from 'vitest';
import { analyze, recommend } from '#shared/engine/index';
import { evaluateDesign } from '#shared/engine/recommend';
import type { Design, Spec, TopologyId } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

const ruleSet = await loadRuleSet();

/** An invented spec of Quillfen Instruments with the given overrides. */
function specWith(overrides: Record<string, unknown> = {}): Spec {
  const result = validateSpec({
    title: 'Quillfen recommendation bench case',
    device: { beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
    supply: { positiveV: 12, negativeV: -12 },
    gain: { target: 40, tolerancePercent: 10, output: 'single-ended' },
    cmrr: { minDb: 50, atFrequencyHz: 100 },
    inputCommonMode: { minV: -0.5, maxV: 0.5 },
    outputSwingVpp: 1,
    powerBudgetW: 0.05,
    temperatureC: { min: 20, max: 30 },
    resistors: { series: 'E96', tolerancePercent: 1 },
    monteCarlo: { samples: 100, seed: 3 },
    ...overrides,
  });
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.value;
}

describe('an option that cannot be sized or solved', () => {
  // a topology outside the catalogue stands for any sizing that throws (the schema refuses one in a spec)
  const withUnknown = () => ({ ...specWith(), topologies: ['simple-mirror', 'zener-diode' as TopologyId, 'wilson'] as TopologyId[] });

  test('still appears, failing, last, with the solver\'s message, no figures and every rule undecided', async () => {
    const result = await recommend(withUnknown(), ruleSet);
    expect(result.options.map((o) => o.topology)).toHaveLength(3);
    const failed = result.options.find((o) => o.topology === ('zener-diode' as TopologyId))!;
    expect(failed.rank).toBe(3);
    expect(failed.passes).toBe(false);
    expect(failed.error!.length).toBeGreaterThan(10);
    expect([failed.design, failed.predicted, failed.figures, failed.curves, failed.monteCarlo, failed.rejectionDb]).toEqual([null, null, null, null, null, null]);
    expect(failed.corners).toEqual([]);
    expect(failed.sizingNotes).toEqual([]);
    expect(failed.checks.map((c) => c.rule)).toEqual(ruleSet.rules.map((r) => r.rule));
    for (const [i, c] of failed.checks.entries()) {
      const rule = ruleSet.rules[i];
      expect(c).toEqual({
        rule: rule.rule,
        passed: false,
        severity: rule.severity,
        reason: `Not decided: this option could not be solved at the spec's conditions (${failed.error}).`,
        margin: null,
        evaluated: false,
        title: rule.title,
        kind: rule.kind,
        figure: rule.figure,
      });
    }
    // the others are sized and solved as usual
    expect(result.options.filter((o) => o !== failed).every((o) => o.error === undefined && o.predicted !== null)).toBe(true);
  });

  test('its undecided hazard checks are not cautions: only decided, failed caution checks are', async () => {
    const result = await recommend({ ...withUnknown(), hazards: { patientConnected: true, mainsReferenced: false } }, ruleSet);
    expect(result.cautions.some((c) => c.startsWith('Not decided'))).toBe(false);
    expect(result.cautions.some((c) => /60601/.test(c))).toBe(true);
  });
});

describe('cautions and summary', () => {
  test('each failed caution appears once, however many options fail it; advisory and blocking failures are not cautions', async () => {
    // ±35 V: 70 V span, above 60 V DC [IEC62368]; every option fails the same caution with the same reason
    const result = await recommend(specWith({ supply: { positiveV: 35, negativeV: -35 }, hazards: { patientConnected: false, mainsReferenced: true } }), ruleSet);
    expect(result.cautions).toHaveLength(2);
    expect(new Set(result.cautions).size).toBe(2);
    expect(result.cautions.some((c) => /70\s?V/.test(c) && /60\s?V/.test(c))).toBe(true);
    const otherFailures = result.options.flatMap((o) => o.checks.filter((c) => c.kind !== 'caution' && !c.passed).map((c) => c.reason));
    for (const reason of otherFailures) expect(result.cautions).not.toContain(reason);
  });

  test('the summary counts the passing options out of all of them', async () => {
    const result = await recommend(specWith(), ruleSet);
    const passing = result.options.filter((o) => o.passes).length;
    expect(passing).toBeGreaterThan(0);
    expect(passing).toBeLessThan(result.options.length); // a real count, neither none nor all
    expect(result.summary).toBe(`The simplest option that passes every blocking check (${passing} of ${result.options.length} options pass).`);
    expect(result.policy).toBe('simplest-sufficient');
  });

  test('with no option passing, the summary says so and nothing is recommended', async () => {
    const result = await recommend(specWith({ cmrr: { minDb: 190, atFrequencyHz: 100 } }), ruleSet);
    expect(result.recommended).toBeNull();
    expect(result.summary).toBe(`None of the ${result.options.length} options passes every blocking check; the ranking shows what each one lacks.`);
  });
});

describe('a designer\'s own design', () => {
  const own = (spec: Spec, overrides: Partial<Design> = {}): Design => ({
    device: { ...spec.device, beta: 200 },
    supply: { positiveV: 15, negativeV: -15 },
    collectorResistanceOhm: 7500,
    tail: { topology: 'simple-mirror', referenceResistanceOhm: 28700 },
    ...overrides,
  });

  test('is analysed with its own device and rails at the spec\'s nominal condition, every rule checked, rank 0, noted as the designer\'s values', async () => {
    const spec = specWith({ tailCapacitanceF: 0 });
    const design = own(spec);
    const option = await evaluateDesign(spec, design, ruleSet);
    expect(option.rank).toBe(0);
    expect(option.topology).toBe('simple-mirror');
    expect(option.design).toBe(design);
    expect(option.sizingNotes).toEqual(['Values given by the designer (override).']);
    expect(option.error).toBeUndefined();
    // nominal: 0 V input (mid of −0.5…0.5 V), 27 °C; the design's ±15 V rails and β = 200
    expect(JSON.stringify(option.predicted)).toBe(JSON.stringify(analyze({ ...design, inputCommonModeV: 0, temperatureC: 27, tailCapacitanceF: 0 })));
    expect(option.figures!.railSpanV).toBe(30);
    expect(option.checks.map((c) => c.rule).sort()).toEqual(ruleSet.rules.map((r) => r.rule).sort());
    expect(option.passes).toBe(option.checks.every((c) => c.passed || c.severity !== 'blocking'));
    expect(option.rejectionDb).toBe(option.figures!.cmrrAtFrequencyDb);
  });

  test('takes the spec\'s tail capacitance unless the design gives its own', async () => {
    const spec = specWith({ tailCapacitanceF: 1e-9, cmrr: { minDb: 50, atFrequencyHz: 100000 } });
    const zOhm = (rOhm: number, ctF: number) => 1 / Math.hypot(1 / rOhm, 2 * Math.PI * 100000 * ctF);
    const inherited = await evaluateDesign(spec, own(spec), ruleSet);
    const rOhm = inherited.figures!.tailOutputResistanceOhm;
    expect(inherited.figures!.tailImpedanceAtFrequencyOhm / zOhm(rOhm, 1e-9)).toBeCloseTo(1, 9);
    const ownCt = await evaluateDesign(spec, own(spec, { tailCapacitanceF: 0 }), ruleSet);
    expect(ownCt.figures!.tailImpedanceAtFrequencyOhm).toBe(ownCt.figures!.tailOutputResistanceOhm);
  });

  test('that cannot be solved fails with the message and keeps the design and its note', async () => {
    const spec = specWith();
    const design = own(spec, { tail: { topology: 'zener-diode' as TopologyId } as unknown as Design['tail'] });
    const option = await evaluateDesign(spec, design, ruleSet);
    expect(option.passes).toBe(false);
    expect(option.design).toBe(design);
    expect(option.sizingNotes).toEqual(['Values given by the designer (override).']);
    expect(option.error).toMatch(/zener-diode/);
    expect(option.checks.every((c) => c.evaluated === false && !c.passed)).toBe(true);
  });
});
