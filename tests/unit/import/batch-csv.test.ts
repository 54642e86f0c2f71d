/**
 * The batch results CSV: one row per proposal, the recommended option's figures (or the
 * first-ranked option's when none passes), RFC 4180 fields, and titles a spreadsheet would run
 * as formulas defused (OWASP, "CSV Injection").
 */
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import type { RecommendResult } from '../../../shared/engine/recommend';
import { BATCH_CSV_HEADER, batchResultsCsv } from '../../../shared/export/batch-csv';
import { spreadsheetSafe } from '../../../shared/text/plain-text';

/** A made-up ranking of two options with round figures (not engine output): only what the table reads. */
function ranking(recommended: string | null): RecommendResult {
  const option = (topology: string, rank: number, passes: boolean, scale: number) => ({
    topology,
    rank,
    passes,
    rejectionDb: 70 + scale,
    predicted: { tailCurrentA: 0.001 * scale },
    figures: { gainPredicted: 20 + scale, powerWorstW: 0.01 * scale },
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
      ['Tarn probe, channel A', '3', '41', 'ranked', 'wilson', 'wilson', 'true', '72', '0.002', '22', '0.02'],
      ['Tarn probe — channel B', '1', '42', 'decided', '', 'wilson', 'false', '72', '0.002', '22', '0.02'],
    ]);
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
