/**
 * `recommend` on specs no option can meet: every option still comes back, inside the design
 * schema's bounds (analyze accepts each sized design), failing the checks it cannot pass and
 * saying why, never a non-finite figure and never a fault that loses the whole answer.
 *
 * Why the targets are out of reach, from first principles: a differential gain of 520 V/V
 * needs |Ad| = IC·RC/VT, a drop of 520 × 25.9 mV ≈ 13.4 V across each RC at 27 °C, before the
 * Early effect (ro = VAF/IC ≈ 6 RC at VAF 85 V) asks for about 15 % more; on +15 V with
 * collectors that must stay above an input common mode of up to +5 V, no RC gives it. A power
 * budget of 100 nW across 30 V allows at most 3.3 nA in total, and a gain of 45 V/V from that
 * current would need RC = 45 × 25.9 mV / 1.67 nA ≈ 0.7 GΩ or more at every option: the sizing's
 * smallest tail current (100 nA, the smallest a spec may fix) is out of reach.
 */
import { describe, expect, test } from 'vitest';
import { recommend } from '#shared/engine/index';
import { firstNonFinitePath } from '#shared/engine/finite';
import type { Spec } from '#shared/engine/types';
import { validateDesign, validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

function specOf(changes: Record<string, unknown>): Spec {
  const checked = validateSpec({
    title: 'Tarnwick TL-2 sensor front end',
    device: { beta: 210, earlyVoltageV: 85, saturationCurrentA: 5e-15, vbeMismatchSigmaV: 0.0007 },
    supply: { positiveV: 15, negativeV: -15 },
    gain: { target: 45, tolerancePercent: 8, output: 'differential' },
    cmrr: { minDb: 75, atFrequencyHz: 50, marginDb: 6, minYieldPercent: 95 },
    inputCommonMode: { minV: -1, maxV: 1 },
    outputSwingVpp: 2,
    powerBudgetW: 0.06,
    temperatureC: { min: -5, max: 55 },
    resistors: { series: 'E96', tolerancePercent: 1 },
    monteCarlo: { samples: 100, seed: 5 },
    ...changes,
  });
  if (!checked.ok) throw new Error(`spec should be valid: ${JSON.stringify(checked.errors)}`);
  return checked.value;
}

describe('a differential gain of 520 V/V on ±15 V with an input common mode of ±5 V', () => {
  const spec = () => specOf({ gain: { target: 520, tolerancePercent: 8, output: 'differential' }, inputCommonMode: { minV: -5, maxV: 5 } });

  test('every option comes back with finite figures, a design analyze accepts, and the gain check failed with the reason in its notes', async () => {
    const result = await recommend(spec(), await loadRuleSet());
    expect(firstNonFinitePath(result)).toBeNull();
    expect(result.options).toHaveLength(spec().topologies.length);
    expect(result.recommended).toBeNull();
    for (const option of result.options) {
      expect(option.error, option.topology).toBeUndefined();
      expect(option.passes).toBe(false);
      expect(validateDesign(option.design).ok, option.topology).toBe(true);
      expect(option.checks.find((c) => c.rule === 'gain-tolerance')?.passed, option.topology).toBe(false);
      expect(option.sizingNotes.join(' '), option.topology).toMatch(/gain target 520 V\/V is out of reach/);
    }
  });
});

describe('a power budget too small to size any option', () => {
  test.each([1e-7, 1e-9])('at %s W: every option says it cannot be sized and why, no design outside the schema, no snapping fault', async (powerBudgetW) => {
    const result = await recommend(specOf({ powerBudgetW }), await loadRuleSet());
    expect(firstNonFinitePath(result)).toBeNull();
    for (const option of result.options) {
      if (option.design !== null) expect(validateDesign(option.design).ok, option.topology).toBe(true);
      else {
        expect(option.error, option.topology).toMatch(/power budget .* leaves .* of tail current, below the 100 nA/);
        expect(option.error).not.toMatch(/snapToSeries/);
      }
      expect(option.passes).toBe(false);
    }
  });

  test('at 1 µW the budget allows 26.7 nA per branch: the sizing still refuses rather than propose resistors past 1 GΩ', async () => {
    const result = await recommend(specOf({ powerBudgetW: 1e-6 }), await loadRuleSet());
    for (const option of result.options) {
      if (option.design !== null) expect(validateDesign(option.design).ok, option.topology).toBe(true);
      else expect(option.error).toMatch(/raise the power budget/);
    }
  });
});
