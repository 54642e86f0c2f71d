/**
 * Every rule on each side of its threshold, through the real rule files and the runner: a margin
 * just below zero fails, exactly zero and just above pass (the product's choice: a figure that
 * meets its requirement exactly meets it, as "at least" reads); a count of problems passes at 0
 * and fails at 1; a caution flag passes
 * when false and fails when true. The per-rule files hold the reasons; this file holds where
 * the line falls, and fails when a rule file appears without a row here.
 */
import { describe, expect, test } from 'vitest';
import { loadRuleFiles, runRules, type RuleFile } from '../../../rules/run-rules';
import type { Check, OptionFacts } from '#shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

type NumericFact = { [K in keyof OptionFacts]: OptionFacts[K] extends number ? K : OptionFacts[K] extends number | null ? K : never }[keyof OptionFacts];
type FlagFact = { [K in keyof OptionFacts]: OptionFacts[K] extends boolean ? K : never }[keyof OptionFacts];

/** How a rule's threshold is crossed. */
type Boundary =
  /** A signed margin in `unit`: negative fails, zero and positive pass. */
  | { kind: 'margin'; fact: NumericFact; unit: string; context?: Partial<OptionFacts> }
  /** A count of problems: 0 passes, 1 fails. */
  | { kind: 'count'; fact: NumericFact }
  /** A caution flag: false passes, true fails. */
  | { kind: 'flag'; fact: FlagFact }
  /** A collision flag of a rule that applies (its `context` makes it apply): false passes, true fails. */
  | { kind: 'collision'; fact: FlagFact };

const DIFFERENTIAL: Partial<OptionFacts> = { output: 'differential', isDifferentialOutput: true };
const RESISTOR_TAIL: Partial<OptionFacts> = { topology: 'resistor', isResistorTail: true };

/** One row per rule file. `context` makes the rule apply (its not-applicable side passes whatever the margin). */
const BOUNDARIES: Record<string, Boundary> = {
  bandwidth: { kind: 'margin', fact: 'bandwidthMarginHz', unit: 'Hz' },
  'input-bias-current': { kind: 'margin', fact: 'inputBiasCurrentMarginA', unit: 'A' },
  'input-noise': { kind: 'margin', fact: 'noiseMarginVPerRtHz', unit: 'V/√Hz' },
  'input-offset': { kind: 'margin', fact: 'offsetMarginV', unit: 'V' },
  'linear-input-range': { kind: 'margin', fact: 'linearInputRangeMarginV', unit: 'V' },
  'offset-drift': { kind: 'margin', fact: 'offsetDriftMarginVPerC', unit: 'V/°C' },
  'psrr-negative': { kind: 'margin', fact: 'psrrNegativeMarginDb', unit: 'dB' },
  'psrr-positive': { kind: 'margin', fact: 'psrrPositiveMarginDb', unit: 'dB' },
  'slew-rate': { kind: 'margin', fact: 'slewRateMarginVPerS', unit: 'V/s' },
  'cmrr-differential-worst-case': { kind: 'margin', fact: 'cmrrDifferentialWorstCaseMarginDb', unit: 'dB', context: DIFFERENTIAL },
  'cmrr-target': { kind: 'margin', fact: 'outputCmrrMarginDb', unit: 'dB' },
  'cmrr-yield': { kind: 'margin', fact: 'yieldMarginPercent', unit: '%', context: DIFFERENTIAL },
  'gain-over-conditions': { kind: 'margin', fact: 'gainOverConditionsMarginPercent', unit: '%' },
  'gain-tolerance': { kind: 'margin', fact: 'gainMarginPercent', unit: '%' },
  'gain-vs-common-mode': { kind: 'margin', fact: 'gainVsCommonModeMarginPercent', unit: '%', context: RESISTOR_TAIL },
  'hazardous-voltage': { kind: 'margin', fact: 'hazardousVoltageMarginV', unit: 'V' },
  'input-common-mode-high': { kind: 'margin', fact: 'icmHighMarginV', unit: 'V' },
  'input-common-mode-low': { kind: 'margin', fact: 'icmLowMarginV', unit: 'V' },
  'mains-referenced': { kind: 'flag', fact: 'mainsReferenced' },
  'operating-point': { kind: 'count', fact: 'operatingPointProblemCount' },
  'output-common-mode': { kind: 'margin', fact: 'outputCommonModeMarginDb', unit: 'dB', context: DIFFERENTIAL },
  'output-swing': { kind: 'margin', fact: 'swingMarginV', unit: 'V' },
  'output-swing-compression': { kind: 'margin', fact: 'swingCompressionMarginPercent', unit: '%' },
  'patient-connected': { kind: 'flag', fact: 'patientConnected' },
  'power-budget': { kind: 'margin', fact: 'powerMarginW', unit: 'W' },
  'tail-current-drift': { kind: 'margin', fact: 'tailCurrentDriftMarginPercent', unit: '%' },
  'tail-current-window': { kind: 'collision', fact: 'tailCurrentWindowEmpty' },
};

/** Margins tried on each side, in the rule's unit: one unit, a hundredth (the finest step a reason prints) and a millionth. */
const STEPS = [1, 0.01, 1e-6];

const allRules = await loadRuleFiles();

async function checkOf(rule: RuleFile, overrides: Partial<OptionFacts>): Promise<Check> {
  const [check] = await runRules([rule], makeOptionFacts(overrides));
  expect(check.rule).toBe(rule.name);
  return check;
}

test('every rule file has a boundary row here, and every row a rule file', () => {
  expect(allRules.map((rule) => rule.name)).toEqual(Object.keys(BOUNDARIES).sort());
});

describe.each(allRules.map((rule) => [rule.name, rule] as const))('%s', (name, rule) => {
  const boundary = BOUNDARIES[name];
  if (boundary === undefined) return; // reported by the coverage test above

  if (boundary.kind === 'margin') {
    const { fact, unit, context = {} } = boundary;
    const cases = [...STEPS.map((step) => [-step, false] as const), [0, true] as const, ...STEPS.map((step) => [step, true] as const)];
    test.each(cases)(`${fact} = %d ${unit}: passed %s`, async (margin, passed) => {
      const check = await checkOf(rule, { ...context, [fact]: margin });
      expect(check).toMatchObject({ passed, applicable: true, margin, marginUnit: unit });
    });
  }

  if (boundary.kind === 'count') {
    test.each([
      [0, true],
      [1, false],
    ] as const)(`${boundary.fact} = %d: passed %s`, async (count, passed) => {
      const problems = Array.from({ length: count }, (_, i) => `Q${i + 1} saturated at ICM 2 V, 85 °C`);
      const check = await checkOf(rule, { [boundary.fact]: count, operatingPointProblems: problems });
      expect(check).toMatchObject({ passed, applicable: true });
    });
  }

  if (boundary.kind === 'flag') {
    test.each([
      [false, true],
      [true, false],
    ] as const)(`${boundary.fact} = %s: passed %s`, async (flag, passed) => {
      const check = await checkOf(rule, { [boundary.fact]: flag });
      // A caution applies only when its flag is set; unset, it passes as not applicable.
      expect(check).toMatchObject({ passed, applicable: flag });
    });
  }

  if (boundary.kind === 'collision') {
    test.each([
      [false, true],
      [true, false],
    ] as const)(`${boundary.fact} = %s: passed %s`, async (flag, passed) => {
      const check = await checkOf(rule, { [boundary.fact]: flag });
      expect(check).toMatchObject({ passed, applicable: true });
    });
  }
});
