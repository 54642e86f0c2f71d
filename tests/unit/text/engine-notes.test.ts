/**
 * The engine's sentences are written from the figures it returns: engineering notation with SI
 * prefixes (BIPM SI Brochure, 9th ed.), the typographic minus (U+2212) for negative figures, and
 * the textbook formulas each value starts from (Sedra & Smith, Gray & Meyer).
 */
import { describe, expect, test } from 'vitest';
import type { MeasuredFacts } from '#shared/engine/option-evaluation';
import { cmrrDifferentialLimitNote, conditionLabel, operatingPointProblemText, sizingNote, tailOutputResistanceNote, wordedFacts } from '#shared/text/engine-notes';
import { makeOptionFacts } from '../../helpers/option-facts';

describe('sizing notes', () => {
  test('when the budget sets the tail current, then the note gives the share, the budget, the rail span and the reference branch', () => {
    const note = sizingNote({
      step: 'tail-current-from-budget',
      currentA: 0.00096,
      capped: false,
      capA: 0.002,
      powerUseFraction: 0.8,
      powerBudgetW: 0.036,
      railSpanV: 15,
      referenceRatio: 1,
    });
    expect(note).toBe('Tail current 960 µA: 80 % of the 36 mW budget across 15 V, shared with a reference branch of 1× the tail current.');
  });

  test('when the cap sets the tail current of a resistor tail, then the note says so and names no reference branch', () => {
    const note = sizingNote({ step: 'tail-current-from-budget', currentA: 0.002, capped: true, capA: 0.002, powerUseFraction: 0.8, powerBudgetW: 1, railSpanV: 24, referenceRatio: 0 });
    expect(note).toBe('Tail current 2 mA: capped at 2 mA.');
  });

  test('when RC is sized for a single-ended output, then the note names 2·|Ase|·VT/IC and its three values in ohms', () => {
    const note = sizingNote({ step: 'collector', formula: 'single-ended', handOhm: 8040, exactOhm: 8312, resistanceOhm: 8250, series: 'E96' });
    expect(note).toBe('RC ≈ 2·|Ase|·VT/IC = 8.04 kΩ, refined by solving the stage with the sized tail to 8.31 kΩ, snapped to 8.25 kΩ (E96).');
  });

  test('when the rails leave a hand formula no positive resistance, then the note gives the formula without a value', () => {
    const note = sizingNote({ step: 'resistor-tail', handOhm: -350, resistanceOhm: 1, series: 'E24' });
    expect(note).toBe('RT ≈ (VICM − VBE − V−)/Itail at the mid input common mode, refined by solving the stage, snapped to 1 Ω (E24).');
  });
});

describe('figures worded', () => {
  test('when a condition sits below zero, then its label carries the typographic minus', () => {
    expect(conditionLabel(-2, -20)).toBe('ICM \u22122 V, \u221220 °C');
    expect(conditionLabel(1.5, 85)).toBe('ICM 1.5 V, 85 °C');
  });

  test('when a transistor saturates, then the sentence gives VCE to the millivolt and its current-gain loss beside the limit', () => {
    expect(operatingPointProblemText({ problem: 'saturated', transistor: 'Q4', vceV: 0.2134, currentGainLossFraction: 0.2214, limitFraction: 0.05 })).toBe(
      'Q4 is saturated: VCE = 0.213 V and its current gain is 22.1 % below its forward-active value (saturated: more than 5.0 % below).',
    );
    expect(operatingPointProblemText({ problem: 'saturated', transistor: 'Q4', vceV: 0.018, currentGainLossFraction: 0.99995, limitFraction: 0.05 })).toBe(
      'Q4 is saturated: VCE = 0.018 V and its current gain is over 99.9 % below its forward-active value (saturated: more than 5.0 % below).',
    );
  });

  test('when the differential worst case is above 120 dB, then the note says plainly that only the model limits it', () => {
    const shares = { load: 0, is: 0, beta: 0, early: 100 };
    expect(cmrrDifferentialLimitNote(134.2, shares)).toContain('Limited only by the model: above 120 dB');
    expect(cmrrDifferentialLimitNote(104.2, shares)).not.toContain('Limited only by the model');
    expect(cmrrDifferentialLimitNote(null, null)).toBe('');
  });

  test('when the device has no Early voltage, then the tail Rout note says the textbook limit is unbounded', () => {
    expect(tailOutputResistanceNote(5.48e6, { valueOhm: null, formula: 'β·ro/2' })).toBe('5.48 MΩ by node analysis (textbook β·ro/2 unbounded without an Early voltage)');
    expect(tailOutputResistanceNote(5.48e6, { valueOhm: 5.29e6, formula: 'β·ro/2' })).toBe('5.48 MΩ by node analysis (textbook β·ro/2 ≈ 5.29 MΩ)');
  });

  /** Measured facts from the shared option facts (their worded ones left out). */
  function wordedInput(): MeasuredFacts {
    const { gainOverConditionsRemedy: _w, tailOutputResistanceNote: _n, operatingPointProblems: _p, cmrrDifferentialLimitNote: _l, tailCurrentWindowNote: _t, icmLowHeadroom: _lh, icmLowShortfall: _ls, icmHighHeadroom: _hh, icmHighShortfall: _hs, ...rest } = makeOptionFacts();
    return { ...rest, gainOverConditionsRemedyId: 'current-source-tail', icmLowLimitId: 'tail-compliance', icmHighLimitId: 'pair-saturation', operatingPointProblemsAt: [], cmrrDifferentialSharesPercent: null, tailCurrentWindow: null };
  }

  test('when an option\'s facts are worded, then the remedy id and the problems become words in their places and the Rout note is written from the figures', () => {
    const { gainOverConditionsRemedy: _words, tailOutputResistanceNote: _note, operatingPointProblems: _problems, cmrrDifferentialLimitNote: _limit, tailCurrentWindowNote: _window, icmLowHeadroom: _lh, icmLowShortfall: _ls, icmHighHeadroom: _hh, icmHighShortfall: _hs, ...rest } = makeOptionFacts();
    const measured: MeasuredFacts = {
      ...rest,
      gainOverConditionsRemedyId: 'current-source-tail',
      icmLowLimitId: 'tail-compliance',
      icmHighLimitId: 'pair-saturation',
      operatingPointProblemsAt: [
        { conditionLabel: 'ICM 3.5 V, 5 °C', problem: { problem: 'saturated', transistor: 'Q2', vceV: 0.0204, currentGainLossFraction: 0.9981, limitFraction: 0.05 } },
        { conditionLabel: 'ICM \u22123.2 V, 5 °C', problem: { problem: 'dead-reference' } },
      ],
      operatingPointProblemCount: 2,
      tailOutputResistanceOhm: 2.3e6,
      tailOutputResistanceClosedFormOhm: 2.5e6,
      tailOutputResistanceFormula: 'ro·(1 + gm·(RE ∥ rπ))',
      cmrrDifferentialSharesPercent: { load: 12.4, is: 6.1, beta: 0.6, early: 80.9 },
      tailCurrentWindow: {
        window: {
          bounds: [
            { requirement: 'noise', side: 'lower', currentA: 9.03e-6, basis: 'solved' },
            { requirement: 'input-bias-current', side: 'upper', currentA: 538e-6, basis: 'hand' },
          ],
          lower: { requirement: 'noise', side: 'lower', currentA: 9.03e-6, basis: 'solved' },
          upper: { requirement: 'input-bias-current', side: 'upper', currentA: 538e-6, basis: 'hand' },
          empty: false,
        },
        pick: { currentA: 431e-6, setBy: 'input-bias-current' },
      },
    };
    const facts = wordedFacts(measured);
    expect(facts.tailCurrentWindowNote).toBe(
      'Tail current 431 µA, set by the input bias-current limit, inside the window the targets allow (≥ 9.03 µA for the noise limit (hand formula scaled to the solved circuit); ≤ 538 µA for the input bias-current limit (hand formula)).',
    );
    expect(facts.cmrrDifferentialLimitNote).toBe('Shares of the worst-case common-mode gain by mismatch: Early voltage 81 %, load resistors 12 %, VBE 6 %, beta 1 %.');
    expect(facts.gainOverConditionsRemedy).toBe('a current-source tail instead of the resistor (the tail current then stops following the input common mode)');
    expect(facts.tailOutputResistanceNote).toBe('2.3 MΩ by node analysis (textbook ro·(1 + gm·(RE ∥ rπ)) ≈ 2.5 MΩ)');
    expect(facts.operatingPointProblems).toEqual([
      'ICM 3.5 V, 5 °C: Q2 is saturated: VCE = 0.020 V and its current gain is 99.8 % below its forward-active value (saturated: more than 5.0 % below).',
      'ICM \u22123.2 V, 5 °C: The reference branch carries no current: the rails are too close for this tail.',
    ]);
    expect('gainOverConditionsRemedyId' in facts).toBe(false);
    const worded: Record<string, string[]> = {
      gainOverConditionsRemedyId: ['gainOverConditionsRemedy'],
      icmLowLimitId: ['icmLowHeadroom', 'icmLowShortfall'],
      icmHighLimitId: ['icmHighHeadroom', 'icmHighShortfall'],
      operatingPointProblemsAt: ['operatingPointProblems'],
      cmrrDifferentialSharesPercent: ['cmrrDifferentialLimitNote'],
      tailCurrentWindow: ['tailCurrentWindowNote'],
    };
    const measuredKeys = Object.keys(measured).flatMap((key) => worded[key] ?? [key]);
    expect(Object.keys(facts)).toEqual([...measuredKeys, 'tailOutputResistanceNote']);
  });

  test('when an end of the input common-mode range is worded, then an NPN stage’s low end is the tail’s compliance towards the negative rail and a PNP stage’s the pair’s saturation (the mirror image)', () => {
    const npn = wordedFacts(wordedInput());
    expect([npn.icmLowHeadroom, npn.icmLowShortfall]).toEqual(["the tail source's compliance headroom", 'the tail node sits too close to the negative rail']);
    expect([npn.icmHighHeadroom, npn.icmHighShortfall]).toEqual(["the pair's collector headroom with the output swing's negative peak", 'the pair saturates']);
    const pnp = wordedFacts({ ...wordedInput(), icmLowLimitId: 'pair-saturation', icmHighLimitId: 'tail-compliance' });
    expect([pnp.icmLowHeadroom, pnp.icmLowShortfall]).toEqual(["the pair's collector headroom with the output swing's positive peak", 'the pair saturates']);
    expect([pnp.icmHighHeadroom, pnp.icmHighShortfall]).toEqual(["the tail source's compliance headroom", 'the tail node sits too close to the positive rail']);
  });

  test('when the targets collide, then the window note names both requirements and their currents; without a window, what set the current', () => {
    const collide = wordedFacts({
      ...wordedInput(),
      tailCurrentWindow: {
        window: {
          bounds: [
            { requirement: 'slew-rate', side: 'lower', currentA: 1.2e-3, basis: 'solved' },
            { requirement: 'input-bias-current', side: 'upper', currentA: 400e-6, basis: 'solved' },
          ],
          lower: { requirement: 'slew-rate', side: 'lower', currentA: 1.2e-3, basis: 'solved' },
          upper: { requirement: 'input-bias-current', side: 'upper', currentA: 400e-6, basis: 'solved' },
          empty: true,
        },
        pick: { currentA: 400e-6, setBy: 'input-bias-current' },
      },
    }).tailCurrentWindowNote;
    expect(collide).toContain('No tail current meets every target: the slew-rate target needs 1.2 mA or more, the input bias-current limit allows 400 µA at most');
    expect(collide).toContain('sized at 400 µA, the ceiling');
    expect(wordedFacts({ ...wordedInput(), tailCurrentWindow: null }).tailCurrentWindowNote).toContain('No target bounds the tail current');
  });
});
