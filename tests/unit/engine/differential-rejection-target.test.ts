/**
 * The rejection target applies to the output the spec names. An invented spec (Wrenfield
 * Acoustics' WD-4 receiver) asks 60 dB (+6 dB margin) at 100 kHz of a differential output, with a
 * tail capacitance that pulls the single-ended rejection of some tails below 66 dB while the
 * mismatch-limited differential worst case stays far above it. Assertions are invariants
 * between each option's check and its own figures, and a symmetry of the matched pair; no
 * figure is copied from an engine run.
 */
import { expect, test } from 'vitest';
import { recommend } from '#shared/engine/index';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

const RAW_SPEC = {
  title: 'Wrenfield WD-4 differential receiver',
  device: { beta: 150, earlyVoltageV: 90, saturationCurrentA: 5e-15, vbeMismatchSigmaV: 0.0003 },
  supply: { positiveV: 12, negativeV: -12 },
  gain: { target: 40, tolerancePercent: 10, output: 'differential' },
  cmrr: { minDb: 60, atFrequencyHz: 100000, marginDb: 6, minYieldPercent: 90 },
  inputCommonMode: { minV: -1, maxV: 1 },
  outputSwingVpp: 2,
  powerBudgetW: 0.1,
  temperatureC: { min: 0, max: 70 },
  resistors: { series: 'E96', tolerancePercent: 0.1 },
  tailCapacitanceF: 2e-11,
  monteCarlo: { samples: 200, seed: 3 },
};
const TARGET_DB = 60 + 6;

async function ranked() {
  const validated = validateSpec(RAW_SPEC);
  if (!validated.ok) throw new Error(JSON.stringify(validated));
  return recommend(validated.value, await loadRuleSet());
}

test('differential output: cmrr-target judges the mismatch-limited differential rejection against required + margin', async () => {
  const result = await ranked();
  for (const option of result.options) {
    const facts = option.figures!;
    const check = option.checks.find((c) => c.rule === 'cmrr-target')!;
    expect(check.passed).toBe(facts.cmrrDifferentialWorstCaseDb! >= TARGET_DB);
    expect(check.margin).toBeCloseTo(facts.cmrrDifferentialWorstCaseDb! - TARGET_DB, 9);
    expect(check.reason).toContain('differential output');
  }
  // The defect's situation: single-ended short of the target, differential well above it, check passes.
  const decidedByDifferential = result.options.filter((o) => o.figures!.cmrrAtFrequencyDb < TARGET_DB && o.checks.find((c) => c.rule === 'cmrr-target')!.passed);
  expect(decidedByDifferential.length).toBeGreaterThan(0);
});

test('differential output: the common mode left at each collector is an advisory for the next stage', async () => {
  const result = await ranked();
  for (const option of result.options) {
    const facts = option.figures!;
    const check = option.checks.find((c) => c.rule === 'output-common-mode')!;
    expect(check).toMatchObject({ severity: 'advisory', applicable: true });
    expect(check.margin).toBeCloseTo(facts.outputCommonModeRejectionDb - 60, 9);
    // Matched pair: v(c1 − c2) = 2·v(c1) under a differential drive, so |Ad/Acm| is the single-ended CMRR + 20·log10(2) [SS]
    expect(facts.outputCommonModeRejectionDb - facts.cmrrAtFrequencyDb).toBeCloseTo(20 * Math.log10(2), 2);
  }
});
