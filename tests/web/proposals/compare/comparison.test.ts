/**
 * The side-by-side comparison's logic on rankings the real engine made (tests/web/fixtures): each
 * side's record, the warnings about engine and rule-set versions, the marks (a verdict changed, a
 * figure moved by more than 1 % of the larger, a margin that changed sign, a row on one side
 * only), both curves on one plot, and the state in the address. Expected figures are read from the
 * fixtures' own options, never from the code under test.
 */
import { describe, expect, test } from 'vitest';
import type { Proposal } from '#shared/api/proposals';
import type { RecommendResult } from '#shared/engine/recommend';
import { checkRows, comparisonKind, comparisonPlot, figureMarks, figureRows, markWords, MOVED_FRACTION, provenanceOf, provenanceWarnings, sideOf, type Side } from '../../../../web/src/features/proposals/lib/comparison';
import { compareQuery, readCompareState } from '../../../../web/src/features/proposals/lib/compare-address';
import { proposalOf, strainBridge, studioLine } from '../ranking/fixtures';

const side = (key: 'a' | 'b', proposal: Proposal, topology: string | null = null): Side => sideOf(key, proposal, topology)!;

/** A copy of a proposal under another id (and, when given, another spec version). */
function another(proposal: Proposal, id: number, version = proposal.specVersion.version): Proposal {
  const copy = structuredClone(proposal);
  return { ...copy, id, specVersion: { ...copy.specVersion, version } };
}

describe('sides', () => {
  test('a side with no option named shows the recommendation; an unknown option falls back to it too', () => {
    const proposal = proposalOf(strainBridge());
    expect(side('a', proposal).option.topology).toBe(proposal.result.recommended);
    expect(side('a', proposal, 'no-such-tail').option.topology).toBe(proposal.result.recommended);
    const other = proposal.result.options.find((o) => o.topology !== proposal.result.recommended)!;
    expect(side('b', proposal, other.topology).option).toBe(other);
  });

  test('each side says exactly which proposal, spec version, engine and rule set it comes from', () => {
    const proposal = proposalOf(strainBridge());
    const p = provenanceOf(side('a', proposal));
    expect(p).toMatchObject({ proposalId: proposal.id, specVersion: 1, specTitle: proposal.specVersion.title, engineVersion: proposal.result.engineVersion, rulesetVersion: proposal.result.rulesetVersion });
    expect(p.rulesetVersion).toMatch(/^[0-9a-f]{64}$/);
  });

  test('the kind of comparison: two options of one proposal, two versions of one spec, two rankings', () => {
    const proposal = proposalOf(strainBridge());
    const [first, second] = proposal.result.options;
    expect(comparisonKind(side('a', proposal, first.topology), side('b', proposal, second.topology))).toBe('options');
    expect(comparisonKind(side('a', proposal), side('b', another(proposal, 8, 2)))).toBe('versions');
    expect(comparisonKind(side('a', proposal), side('b', another(proposal, 8)))).toBe('rankings');
  });
});

describe('warnings above the table', () => {
  test('the same engine, rule set and spec version: nothing to warn of', () => {
    const proposal = proposalOf(strainBridge());
    expect(provenanceWarnings(side('a', proposal), side('b', another(proposal, 8)))).toEqual([]);
  });

  test('another engine version, another rule set and another spec version are each said plainly, with both versions named', () => {
    const proposal = proposalOf(strainBridge());
    const later = { ...another(proposal, 8, 2), engineVersion: '9.9.9', rulesetVersion: 'f'.repeat(64) };
    const warnings = provenanceWarnings(side('a', proposal), side('b', later));
    expect(warnings).toHaveLength(3);
    expect(warnings[0]).toContain(`different engine versions (A: ${proposal.engineVersion}, B: 9.9.9)`);
    expect(warnings[0]).toContain('may differ for that reason alone');
    expect(warnings[1]).toContain(`different rule sets (A: ${proposal.rulesetVersion.slice(0, 12)}, B: ffffffffffff)`);
    expect(warnings[2]).toContain('A: version 1, B: version 2');
  });
});

describe('figure marks', () => {
  test('the threshold is 1 % of the larger magnitude', () => {
    expect(MOVED_FRACTION).toBe(0.01);
    expect(figureMarks(100, 100.9, false)).toEqual([]);
    expect(figureMarks(100, 101.5, false)).toEqual([{ kind: 'moved', fraction: 0.015 }]);
    expect(figureMarks(-2, -1, false)).toEqual([{ kind: 'moved', fraction: 0.5 }]);
  });

  test('a margin that crosses zero is marked as a change of sign, in words and a symbol', () => {
    const marks = figureMarks(0.3, -0.1, true);
    expect(marks[0]).toEqual({ kind: 'sign', toSafeSide: false });
    expect(markWords(marks[0])).toEqual({ symbol: '⇅', words: 'margin changed sign: now short' });
    expect(markWords({ kind: 'sign', toSafeSide: true }).words).toBe('margin changed sign: now on the safe side');
    // a figure (not a margin) crossing zero only moves
    expect(figureMarks(0.3, -0.1, false).map((m) => m.kind)).toEqual(['moved']);
  });

  test('a figure missing on one side says which', () => {
    expect(figureMarks(null, 3, false)).toEqual([{ kind: 'one-side', missingOn: 'a' }]);
    expect(markWords({ kind: 'one-side', missingOn: 'a' }).words).toBe('only on side B');
    expect(figureMarks(null, null, false)).toEqual([]);
  });
});

describe('figure rows on the engine’s rankings', () => {
  test('the same option on both sides: every figure the same, nothing marked', () => {
    const proposal = proposalOf(strainBridge());
    const rows = figureRows(side('a', proposal), side('b', another(proposal, 8)));
    expect(rows.length).toBeGreaterThan(8);
    expect(rows.filter((r) => r.marks.length > 0)).toEqual([]);
  });

  test('two options of the strain bridge: the rejection at the spec frequency is each option’s own, marked when they differ by more than 1 %', () => {
    const result = strainBridge();
    const proposal = proposalOf(result);
    const [first, second] = result.options.filter((o) => o.figures);
    const rows = figureRows(side('a', proposal, first.topology), side('b', proposal, second.topology));
    const row = rows.find((r) => r.key === 'cmrrAtFrequencyDb')!;
    const a = first.figures!.cmrrAtFrequencyDb;
    const b = second.figures!.cmrrAtFrequencyDb;
    expect([row.a, row.b]).toEqual([a, b]);
    expect(row.textA).toBe(`${a.toFixed(1).replace('-', '\u2212')} dB`);
    const moved = Math.abs(b - a) > 0.01 * Math.max(Math.abs(a), Math.abs(b));
    expect(row.marks.some((m) => m.kind === 'moved')).toBe(moved);
    // differential output: the mismatch worst case and the yield are among the rows
    expect(rows.map((r) => r.key)).toEqual(expect.arrayContaining(['mismatchWorstCaseDb', 'yieldPercent', 'gain', 'powerWorstW', 'swingMarginV']));
  });

  test('a ranking whose option drew 2 % more power and lost its swing margin: power moved +2 %, the swing margin changed sign', () => {
    const proposal = proposalOf(strainBridge());
    const changed = another(proposal, 8);
    const option = changed.result.options.find((o) => o.topology === proposal.result.recommended)!;
    const power = option.figures!.powerWorstW;
    option.figures!.powerWorstW = power * 1.02;
    const swing = option.figures!.swingMarginV;
    option.figures!.swingMarginV = swing >= 0 ? -0.05 : 0.05;
    const rows = figureRows(side('a', proposal), side('b', changed));
    const powerRow = rows.find((r) => r.key === 'powerWorstW')!;
    expect(powerRow.marks).toHaveLength(1);
    expect(markWords(powerRow.marks[0]).words).toBe('moved +2 %');
    expect(rows.find((r) => r.key === 'swingMarginV')!.marks[0]).toEqual({ kind: 'sign', toSafeSide: swing < 0 });
    expect(rows.filter((r) => r.marks.length > 0).map((r) => r.key).sort()).toEqual(['powerWorstW', 'swingMarginV']);
  });
});

describe('check rows', () => {
  test('a check whose verdict flipped and whose margin crossed zero is marked twice, the others not at all', () => {
    const proposal = proposalOf(strainBridge());
    const changed = another(proposal, 8);
    const option = changed.result.options.find((o) => o.topology === proposal.result.recommended)!;
    const check = option.checks.find((c) => c.severity === 'blocking' && c.passed && typeof c.margin === 'number' && c.margin > 0)!;
    check.passed = false;
    check.margin = -check.margin!;
    const rows = checkRows(side('a', proposal), side('b', changed));
    const row = rows.find((r) => r.rule === check.rule)!;
    expect(row.marks).toEqual([
      { kind: 'verdict', from: 'holds', to: 'short' },
      { kind: 'sign', toSafeSide: false },
    ]);
    expect(markWords(row.marks[0])).toEqual({ symbol: '≠', words: 'verdict changed: holds → short' });
    expect(rows.filter((r) => r.marks.length > 0)).toHaveLength(1);
    // the row that differs comes first; every rule of the option is there once
    expect(rows[0].rule).toBe(check.rule);
    expect(rows.map((r) => r.rule).sort()).toEqual(option.checks.map((c) => c.rule).sort());
  });

  test('two options of the studio line: a verdict is marked changed exactly where the two options’ checks pass differently', () => {
    const result: RecommendResult = studioLine();
    const proposal = proposalOf(result, 'studio');
    const passing = result.options.find((o) => o.passes)!;
    const failing = result.options.find((o) => !o.passes && o.figures)!;
    const rows = checkRows(side('a', proposal, passing.topology), side('b', proposal, failing.topology));
    const expected = passing.checks
      .filter((c) => {
        const other = failing.checks.find((d) => d.rule === c.rule)!;
        return c.passed !== other.passed || c.applicable !== other.applicable || c.evaluated !== other.evaluated;
      })
      .map((c) => c.rule)
      .sort();
    expect(expected.length).toBeGreaterThan(0);
    expect(rows.filter((r) => r.marks.some((m) => m.kind === 'verdict')).map((r) => r.rule).sort()).toEqual(expected);
  });
});

describe('both rejection curves on one plot', () => {
  test('one series per side on the union of their frequencies, A solid and heavier, B dashed, named by side, option, proposal and version', () => {
    const proposal = proposalOf(strainBridge());
    const [first, second] = proposal.result.options.filter((o) => o.curves);
    const plotted = comparisonPlot(side('a', proposal, first.topology), side('b', another(proposal, 8, 2), second.topology))!;
    expect(plotted.targetsDiffer).toBe(false);
    const { plot } = plotted;
    expect(plot.series.map((s) => s.name)).toEqual([expect.stringMatching(/^A · .+, #7 v1$/), expect.stringMatching(/^B · .+, #8 v2$/)]);
    expect(plot.series[0].width).toBeGreaterThan(plot.series[1].width!);
    expect(plot.series[0].dash).toEqual([]);
    expect(plot.series[1].dash).toBeDefined();
    const f = first.curves!.cmrrVsFrequency;
    const i = plot.frequencyHz.indexOf(f[3].frequencyHz);
    expect(plot.series[0].valuesDb[i]).toBe(f[3].singleEndedDb);
    expect(plot.data).toHaveLength(3);
  });

  test('another rejection target on side B is flagged', () => {
    const proposal = proposalOf(strainBridge());
    const changed = another(proposal, 8, 2);
    for (const o of changed.result.options) if (o.figures) o.figures.cmrrRequiredDb += 6;
    expect(comparisonPlot(side('a', proposal), side('b', changed))!.targetsDiffer).toBe(true);
  });
});

describe('the address', () => {
  test('two proposals and their options round-trip; anything else is not a comparison', () => {
    const state = { a: 12, b: 15, tailA: 'wilson', tailB: 'cascode' };
    expect(compareQuery(state)).toBe('?a=12&b=15&tailA=wilson&tailB=cascode');
    expect(readCompareState(new URLSearchParams(compareQuery(state)))).toEqual(state);
    expect(readCompareState(new URLSearchParams('?a=12&b=15'))).toEqual({ a: 12, b: 15, tailA: null, tailB: null });
    expect(readCompareState(new URLSearchParams('?a=12'))).toBeNull();
    expect(readCompareState(new URLSearchParams('?a=0&b=2'))).toBeNull();
    expect(readCompareState(new URLSearchParams('?a=1e3&b=2'))).toBeNull();
    expect(readCompareState(new URLSearchParams('?a=1&b=2&tailA=<b>'))!.tailA).toBeNull();
  });
});
