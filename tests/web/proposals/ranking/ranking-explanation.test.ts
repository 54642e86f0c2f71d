/**
 * The sentence under the ranking table when the first row is not the recommendation (the table
 * orders by tail impedance, the policy picks the recommendation).
 */
import { describe, expect, test } from 'vitest';
import { loadRuleFiles } from '../../../../rules/run-rules';
import { noPassingExplanation, rankingExplanation } from '../../../../web/src/features/proposals/lib/ranking-explanation';

/** Each rule's title, from the rule files (checks carry it). */
const titles = new Map((await loadRuleFiles()).map((r) => [r.name, r.title]));
const options = (...topologies: string[]) => topologies.map((topology) => ({ topology })) as never;

describe('rankingExplanation', () => {
  test('when the cascode heads the table and the policy recommends the degenerated mirror third, then one sentence names both reasons', () => {
    const text = rankingExplanation({ policy: 'simplest-sufficient', recommended: 'degenerated-mirror', options: options('cascode', 'wilson', 'degenerated-mirror') });
    expect(text).toMatch(/^Ranked by tail impedance at the spec’s frequency, passing options first, so Cascode.* heads the table; recommended by the policy “simplest sufficient”/);
    expect(text).toMatch(/Degenerated mirror \(row 3\)\.$/);
  });

  test.each([
    ['the first row is the recommendation', { policy: 'highest-rejection', recommended: 'cascode', options: options('cascode', 'wilson') }],
    ['nothing is recommended', { policy: 'simplest-sufficient', recommended: null, options: options('cascode', 'wilson') }],
  ] as const)('when %s, then no sentence', (_title, result) => {
    expect(rankingExplanation(result as never)).toBeNull();
  });
});

describe('noPassingExplanation', () => {
  const check = (rule: string, passed: boolean, severity: 'blocking' | 'advisory' = 'blocking') => ({ rule, passed, severity, reason: '', title: titles.get(rule) });
  const option = (topology: string, checks: ReturnType<typeof check>[], solved = true) => ({ topology, checks, figures: solved ? {} : null, design: solved ? {} : null });

  test('when every solved option falls short on the gain over temperature check, then the sentence names that check and the ways on', () => {
    const result = {
      recommended: null,
      options: [
        option('cascode', [check('gain-over-conditions', false), check('cmrr-target', true)]),
        option('resistor', [check('gain-over-conditions', false), check('cmrr-target', false), check('power-budget', false)]),
        option('wilson', [check('gain-over-conditions', false), check('cmrr-differential-worst-case', false, 'advisory')]),
        option('widlar', [check('operating-point', false)], false),
      ],
    };

    const text = noPassingExplanation(result as never);

    expect(text).toMatch(/^Every option falls short on the same blocking check: “Gain over temperature and input range”;/);
    expect(text).not.toMatch(/Rejection|Power budget/);
    expect(text).toMatch(/revise that requirement in the spec, or decide on an option anyway and say why/);
  });

  test('when the options fall short on different checks, then the checks most often short are named with how many options each holds back', () => {
    const result = {
      recommended: null,
      options: [
        option('cascode', [check('gain-over-conditions', false)]),
        option('widlar', [check('gain-over-conditions', true), check('cmrr-target', false)]),
        option('resistor', [check('gain-over-conditions', false), check('cmrr-target', false), check('power-budget', false)]),
      ],
    };

    const text = noPassingExplanation(result as never);

    expect(text).toMatch(/^No one blocking check holds every option back; most often short: “Gain over temperature and input range” \(2 of 3\), “Rejection at the spec's output” \(2 of 3\), “Power budget” \(1 of 3\)\./);
    expect(text).toMatch(/revise those requirements in the spec/);
  });

  test('when an option passes and is recommended, or nothing was solved, then no sentence', () => {
    expect(noPassingExplanation({ recommended: 'cascode', options: [option('cascode', [])] } as never)).toBeNull();
    expect(noPassingExplanation({ recommended: null, options: [option('cascode', [check('operating-point', false)], false)] } as never)).toBeNull();
  });
});
