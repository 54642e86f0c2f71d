import { describe, expect, test } from 'vitest';
import { outputRejection, REJECTION_KIND_WORDS } from '#shared/engine/output-rejection';
import { makeOptionFacts } from '../../helpers/option-facts';

// Which rejection figure an option is judged by, as the rejection target's rule file says
// (rules/cmrr-target.json: the rejection of the output the spec names against the requirement
// plus its design margin). The facts are invented demo numbers (tests/helpers/option-facts.ts).

describe('outputRejection', () => {
  const facts = makeOptionFacts({ cmrrAtFrequencyDb: 94.2, cmrrDifferentialWorstCaseDb: 101.5, cmrrRequiredDb: 80, cmrrMarginRequiredDb: 6 });

  test('single-ended output: the tail-limited CMRR against required + margin (80 + 6 dB)', () => {
    expect(outputRejection({ ...facts, isDifferentialOutput: false })).toEqual({ kind: 'single-ended', valueDb: 94.2, requiredDb: 86 });
  });

  test('differential output: the mismatch worst case against required + margin (80 + 6 dB), as the target is held', () => {
    expect(outputRejection({ ...facts, isDifferentialOutput: true })).toEqual({
      kind: 'differential',
      valueDb: 101.5,
      requiredDb: 86,
    });
  });

  test('a missing differential figure stays missing', () => {
    expect(outputRejection({ ...facts, isDifferentialOutput: true, cmrrDifferentialWorstCaseDb: null }).valueDb).toBeNull();
  });

  test('each kind has its words', () => {
    expect(REJECTION_KIND_WORDS).toEqual({ 'single-ended': 'single-ended, worst corner', differential: 'differential, mismatch worst case' });
  });
});
