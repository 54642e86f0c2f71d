/**
 * The batch results CSV: one row per proposal, the recommended option's figures (or the
 * first-ranked option's when none passes), RFC 4180 fields, and titles a spreadsheet would run
 * as formulas defused (OWASP, "CSV Injection").
 */
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import type { RecommendResult } from '#shared/engine/recommend';
import { BATCH_CSV_HEADER, batchResultsCsv } from '#shared/export/batch-csv';
import { spreadsheetSafe } from '#shared/text/plain-text';

/** A made-up ranking of two options with round figures (not engine output): only what the table reads. */
function ranking(recommended: string | null, differential = false): RecommendResult {
  const option = (topology: string, rank: number, passes: boolean, scale: number) => ({
    topology,
    rank,
    passes,
    rejectionDb: 70 + scale,
    predicted: { tailCurrentA: 0.001 * scale },
    figures: { gainPredicted: 20 + scale, powerWorstW: 0.01 * scale, isDifferentialOutput: differential, cmrrAtFrequencyDb: 70 + scale, cmrrDifferentialWorstCaseDb: differential ? 70 + scale : null, cmrrRequiredDb: 60, cmrrMarginRequiredDb: 6 },
  });
  return { recommended, options: [option('wilson', 1, recommended !== null, 2), option('resistor', 2, false, 1)] } as unknown as RecommendResult;
}

describe('batchResultsCsv', () => {
  test('when two proposals are written, then each row carries its spec and the figures of the option shown', () => {
    const csv = batchResultsCsv([
      { specTitle: 'Tarn probe, channel A', specVersion: 3, proposalId: 41, status: 'ranked', result: ranking('wilson') },
      { specTitle: 'Tarn probe — channel B', specVersion: 1, proposalId: 42, status: 'decided', result: ranking(null) },
    ]);

    expect(csv.endsWith('\r\n')).toBe(true);
    const parsed = Papa.parse<string[]>(csv.trimEnd(), { header: false, newline: '\r\n' });
    expect(parsed.data).toEqual([
      [...BATCH_CSV_HEADER],
      ['Tarn probe, channel A', '3', '41', 'Awaiting decision', 'wilson', 'wilson', 'true', '72', 'single-ended', '0.002', '22', '0.02'],
      ['Tarn probe — channel B', '1', '42', 'Awaiting review', '', 'wilson', 'false', '72', 'single-ended', '0.002', '22', '0.02'],
    ]);
  });

  test('when the spec asks for a differential output, then the rejection is marked differential', () => {
    const csv = batchResultsCsv([{ specTitle: 'Tarn probe, bridge', specVersion: 1, proposalId: 43, status: 'approved', result: ranking('wilson', true) }]);
    const [header, row] = Papa.parse<string[]>(csv.trimEnd(), { header: false, newline: '\r\n' }).data;
    expect(row[header.indexOf('rejection_kind')]).toBe('differential');
    expect(row[header.indexOf('state')]).toBe('Approved');
  });

  test('when figures carry the engine’s full precision, then they are written as the page shows them: dB to one decimal, the rest to three significant digits', () => {
    const result = ranking('wilson');
    Object.assign(result.options[0], { rejectionDb: 84.4567, predicted: { tailCurrentA: 0.000961234 } });
    Object.assign(result.options[0].figures!, { gainPredicted: 49.8765, powerWorstW: 0.0123456 });
    const csv = batchResultsCsv([{ specTitle: 'Tarn probe', specVersion: 1, proposalId: 44, status: 'ranked', result }]);
    const [header, row] = Papa.parse<string[]>(csv.trimEnd(), { header: false, newline: '\r\n' }).data;
    const cell = (name: string) => row[header.indexOf(name)];
    expect([cell('rejection_db'), cell('tail_current_a'), cell('gain_v_per_v'), cell('power_worst_w')]).toEqual(['84.5', '0.000961', '49.9', '0.0123']);
  });

  test.each([
    ['=SUM(A1:A9)', "'=SUM(A1:A9)"],
    ['+12 V rail', "'+12 V rail"],
    ['-12 V rail', "'-12 V rail"],
    ['@probe', "'@probe"],
    ['Tarn probe', 'Tarn probe'],
  ])('when a title is %j, then it is written %j', (title, written) => {
    expect(spreadsheetSafe(title)).toBe(written);
  });
});
