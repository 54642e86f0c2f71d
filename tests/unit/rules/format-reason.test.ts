import { describe, expect, test } from 'vitest';
import { formatReason, templateProblems } from '../../../rules/format-reason';
import type { OptionFacts } from '#shared/engine/types';
import { makeOptionFacts } from '../../helpers/option-facts';

describe('formatReason', () => {
  test.each<{ template: string; facts: Partial<OptionFacts>; expected: string }>([
    { template: '{cmrrAtFrequencyDb:dB1}', facts: { cmrrAtFrequencyDb: 94.24 }, expected: '94.2 dB' },
    { template: '{cmrrRequiredDb:dB1}', facts: { cmrrRequiredDb: 80 }, expected: '80 dB' },
    { template: '{cmrrMarginDb:dB1}', facts: { cmrrMarginDb: -2.9 }, expected: '\u22122.9 dB' },
    { template: '{|cmrrMarginDb|:dB1}', facts: { cmrrMarginDb: -2.9 }, expected: '2.9 dB' },
    { template: '{cmrrMarginDb:dB1}', facts: { cmrrMarginDb: 0.04 }, expected: '0.04 dB' },
    { template: '{cmrrFrequencyHz:hz}', facts: { cmrrFrequencyHz: 1000 }, expected: '1 kHz' },
    { template: '{cmrrFrequencyHz:hz}', facts: { cmrrFrequencyHz: 0 }, expected: 'DC' },
    { template: '{powerWorstW:si:W}', facts: { powerWorstW: 0.0284 }, expected: '28.4 mW' },
    { template: '{icmLowMarginV:si:V}', facts: { icmLowMarginV: 999.7 }, expected: '1 kV' },
    { template: '{tailOutputResistanceOhm:si:Ω}', facts: { tailOutputResistanceOhm: 2.345e6 }, expected: '2.35 MΩ' },
    { template: '{icmLowV:si:V}', facts: { icmLowV: -2 }, expected: '\u22122 V' },
    { template: '{gainErrorPercent:pct1}', facts: { gainErrorPercent: -1.44 }, expected: '\u22121.4 %' },
    { template: '{temperatureMinC:degC}', facts: { temperatureMinC: -40 }, expected: '\u221240 °C' },
    { template: '{gainPredicted:num}', facts: { gainPredicted: 98.649 }, expected: '98.6' },
    { template: '{monteCarloSamples:int}', facts: { monteCarloSamples: 2000 }, expected: '2000' },
    { template: '{operatingPointProblems:list}', facts: { operatingPointProblems: ['Q3 cut off', 'Q4 saturated'] }, expected: 'Q3 cut off; Q4 saturated' },
    { template: '{operatingPointProblems:list}', facts: { operatingPointProblems: [] }, expected: 'none' },
    // a nonzero figure that rounds to 0.0 keeps one significant digit, with its sign
    { template: '{cmrrMarginDb:dB1}', facts: { cmrrMarginDb: -0.004 }, expected: '\u22120.004 dB' },
    { template: '{cmrrMarginDb:dB1}', facts: { cmrrMarginDb: 0 }, expected: '0 dB' },
    // only a leading minus is a sign; text is shown as given
    { template: '{worstCmrrCorner:text}', facts: { worstCmrrCorner: 'ICM -2 V, 85 °C' }, expected: 'ICM -2 V, 85 °C' },
    { template: '{gainPredicted:num} V/V', facts: { gainPredicted: -98.649 }, expected: '\u221298.6 V/V' },
  ])('when $template formats $facts, then it reads "$expected"', ({ template, facts, expected }) => {
    expect(formatReason(template, makeOptionFacts(facts))).toBe(expected);
  });

  test.each<Partial<OptionFacts>>([{ yieldMarginPercent: null }, { yieldMarginPercent: Number.NaN }])(
    'when a number format meets %o, then it throws',
    (facts) => {
      expect(() => formatReason('{yieldMarginPercent:pct1}', makeOptionFacts(facts))).toThrow(/yieldMarginPercent/);
    },
  );
});

describe('formatReason refuses a value of the wrong shape, naming it', () => {
  test.each<[string, string, Partial<OptionFacts>, string]>([
    ['a number format given text', '{gainPredicted:num}', { gainPredicted: 'high' as unknown as number }, 'fact "gainPredicted" is "high", not a number value'],
    ['a number format given Infinity', '{gainPredicted:num}', { gainPredicted: Infinity }, 'fact "gainPredicted" is Infinity, not a number value'],
    ['a text format given a number', '{worstCmrrCorner:text}', { worstCmrrCorner: 5 as unknown as string }, 'fact "worstCmrrCorner" is 5, not a text value'],
    ['a list format given text', '{operatingPointProblems:list}', { operatingPointProblems: 'Q3 cut off' as unknown as string[] }, 'fact "operatingPointProblems" is "Q3 cut off", not a text-list value'],
    ['a list format given a list with a number', '{operatingPointProblems:list}', { operatingPointProblems: ['Q3', 4] as unknown as string[] }, 'not a text-list value'],
    ['an unknown format', '{gainPredicted:decibel}', { gainPredicted: 1 }, 'fact "gainPredicted" is 1, not a known format value'],
  ])('%s', (_name, template, facts, message) => {
    expect(() => formatReason(template, makeOptionFacts(facts))).toThrow(message);
  });

  test('a missing fact reads as undefined', () => {
    const facts = makeOptionFacts({}) as unknown as Record<string, unknown>;
    delete facts.gainPredicted;
    expect(() => formatReason('{gainPredicted:num}', facts as unknown as OptionFacts)).toThrow('fact "gainPredicted" is undefined, not a number value');
  });
});

describe('templateProblems', () => {
  test.each([
    { template: '{cmrrAtFrequencyDb:dB1} at {cmrrFrequencyHz:hz}', problem: undefined },
    { template: '{cmrrDb:dB1}', problem: 'unknown fact "cmrrDb"' },
    { template: '{cmrrAtFrequencyDb:decibel}', problem: 'unknown format "decibel"' },
    { template: '{worstCmrrCorner:dB1}', problem: 'does not fit a text fact' },
    { template: '{powerWorstW:si}', problem: 'needs unit' },
    { template: '{|worstCmrrCorner|:text}', problem: 'applies to numbers only' },
    { template: 'margin {cmrrMarginDb}', problem: 'stray brace' },
    { template: '{cmrrMarginDb:dB1} and a lone }', problem: 'stray brace' },
    { template: '{gainPredicted:num:V}', problem: 'format "num" takes no unit' },
  ])('when the template is "$template", then the problem is $problem', ({ template, problem }) => {
    const problems = templateProblems(template);
    if (problem === undefined) expect(problems).toEqual([]);
    else expect(problems.join('\n')).toContain(problem);
  });
});
