// @vitest-environment jsdom
/**
 * The report's ranked table is the page's ranking table, printed: the same rejection figures
 * against the same targets (the spec's own numbers, read from the fixture spec files), the figure
 * for the spec's output marked in both, and the same verdict words on every row.
 */
import { cleanup, render, within } from '@testing-library/react';
import { afterEach, describe, expect, test } from 'vitest';
import strainSpec from '../fixtures/specs/bridge-receiver.json';
import studioSpec from '../fixtures/specs/line-receiver.json';
import type { RecommendResult } from '#shared/engine/recommend';
import { OptionsTable } from '../../../web/src/features/proposals/components/ranking/options-table';
import { optionRows, specTargets } from '../../../web/src/features/proposals/lib/option-rows';
import { RankedOptions } from '../../../web/src/features/proposals/components/report/ranked-options';
import { proposalOf, strainBridge, studioLine } from '../proposals/ranking/fixtures';

afterEach(cleanup);

/** Both tables on one page: the page's first, the report's second. */
function renderBoth(result: RecommendResult, spec: 'strain' | 'studio') {
  const page = render(<OptionsTable rows={optionRows(result)} targets={specTargets(result)} selected={null} onSelect={() => undefined} />).container;
  const report = render(<RankedOptions proposal={proposalOf(result, spec)} decided={null} />).container;
  return { page: page.querySelector('table')!, report: report.querySelector('table')! };
}

/** The column headings as text, in order, without sort arrows. */
const headings = (table: HTMLTableElement) => [...table.querySelectorAll('thead tr:last-child th')].map((th) => (th.textContent ?? '').replace(/[▲▼↕]/g, '').replace(/\u00a0/g, ' ').trim());

/** Each body row's cell texts, keyed by the tail's name. */
function cells(table: HTMLTableElement): Map<string, string[]> {
  const rows = [...table.querySelectorAll('tbody tr')];
  return new Map(rows.map((tr) => [within(tr as HTMLElement).getByRole('rowheader').textContent!.replace(/\(recommended\)|recommended.*$|◆/g, '').trim(), [...tr.querySelectorAll('td')].map((td) => td.textContent!.trim())]));
}

const blockingShort = (result: RecommendResult, topology: string) => result.options.find((o) => o.topology === topology)!.checks.filter((c) => c.severity === 'blocking' && !c.passed).length;

describe('the report ranks as the page ranks', () => {
  test('differential output: the same rejection columns and targets, the mismatch worst case marked for the output, the same verdict words', () => {
    const result = strainBridge();
    const { page, report } = renderBoth(result, 'strain');
    const rejectionHeads = (table: HTMLTableElement) => headings(table).filter((h) => /^●?(DC|\d[\d.]* k?Hz|Mismatch|Yield %)/.test(h));
    expect(rejectionHeads(report)).toEqual(rejectionHeads(page));
    // Targets as the spec states them: the rejection target is the minimum + margin, for the single-ended
    // figure and for the mismatch worst case that judges this differential output.
    const { minDb, marginDb } = strainSpec.cmrr;
    expect(rejectionHeads(report).join(' | ')).toContain(`worst, ≥ ${minDb + marginDb}`);
    expect(rejectionHeads(report).find((h) => h.includes('Mismatch'))).toMatch(new RegExp(`^●Mismatch \\(for the spec’s output\\)worst, ≥ ${minDb + marginDb}$`));
    expect(rejectionHeads(page).find((h) => h.includes('Mismatch'))).toMatch(/^●/);

    const pageRows = cells(page);
    const reportRows = cells(report);
    expect([...reportRows.keys()]).toEqual([...pageRows.keys()]);
    for (const option of result.options) {
      const name = [...pageRows.keys()][option.rank - 1];
      const pageVerdict = pageRows.get(name)!.find((t) => /^(✓|✕|\?)/.test(t))!;
      const reportVerdict = reportRows.get(name)!.find((t) => /^(✓|✕|\?)/.test(t))!;
      expect(reportVerdict).toBe(pageVerdict);
      expect(reportVerdict).toBe(option.passes ? '✓Passes' : `✕Short · ${blockingShort(result, option.topology)} blocking`);
    }
  });

  test('single-ended output: the single-ended figure at the spec frequency is the one marked, against minimum + margin, on both', () => {
    const result = studioLine();
    const { page, report } = renderBoth(result, 'studio');
    const { minDb, marginDb } = studioSpec.cmrr;
    for (const table of [page, report]) {
      const marked = headings(table).filter((h) => h.startsWith('●'));
      expect(marked).toHaveLength(1);
      expect(marked[0]).toMatch(new RegExp(`Hz \\(for the spec’s output\\)worst, ≥ ${minDb + marginDb}$`));
      expect(headings(table).some((h) => h.includes('Mismatch'))).toBe(false);
    }
  });
});
