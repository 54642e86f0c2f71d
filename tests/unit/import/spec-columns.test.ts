/**
 * The spec CSV's column set comes from the spec schema: every field of a spec document has a
 * column, the required ones are the schema's, units are the fields' `x-unit`, and the
 * documented table (docs/spec-csv-columns.md) and the template are written from the same list.
 */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import { columnNamed, SPEC_CSV_COLUMNS, specCsvColumnsMarkdown, specCsvTemplate, TEMPLATE_EXAMPLE_TITLE } from '#shared/import/spec-columns';
import { readSpecFile } from '#shared/import/spec-file';
import { COLUMNS_DOC_PATH } from '../../../scripts/write-spec-csv-columns';

/** Dotted paths of every leaf value of a JSON object (arrays are leaves: one cell holds a list). */
function leafPaths(value: Record<string, unknown>, prefix = ''): string[] {
  return Object.entries(value).flatMap(([key, child]) =>
    typeof child === 'object' && child !== null && !Array.isArray(child) ? leafPaths(child as Record<string, unknown>, `${prefix}${key}.`) : [`${prefix}${key}`],
  );
}

describe('the column set', () => {
  test.each(['studio-line-receiver.json', 'strain-bridge-receiver.json', 'electrode-amplifier-input.json', 'seismic-node-receiver.json', 'soil-probe-input.json'])('when %s is flattened, then every field it has is a column', (file) => {
    const spec = JSON.parse(readFileSync(new URL(`../../../api/demo/specs/${file}`, import.meta.url), 'utf8')) as Record<string, unknown>;
    const names = new Set(SPEC_CSV_COLUMNS.map((c) => c.name));
    expect(leafPaths(spec).filter((path) => !names.has(path))).toEqual([]);
  });

  test('when the required columns are listed, then they are the figures the schema requires of every spec', () => {
    // spec.schema.json: required title, supply, gain, cmrr; supply requires both rails, gain its target, cmrr its minimum
    expect(SPEC_CSV_COLUMNS.filter((c) => c.required).map((c) => c.name)).toEqual(['title', 'supply.positiveV', 'supply.negativeV', 'gain.target', 'cmrr.minDb']);
  });

  test.each([
    ['supply.positiveV', 'number', 'V'],
    ['cmrr.atFrequencyHz', 'number', 'Hz'],
    ['tailCapacitanceF', 'number', 'F'],
    ['cmrr.minDb', 'number', 'dB'],
    ['monteCarlo.samples', 'integer', '1'],
    ['hazards.patientConnected', 'boolean', undefined],
    ['topologies', 'list', undefined],
  ])('when %s is looked up, then it is read as %s in %s', (name, kind, unit) => {
    expect(columnNamed(name)?.kind).toBe(kind);
    expect(columnNamed(name)?.unit).toBe(unit);
  });

  test('when the documented table is compared with the schema, then it is current (else run: npm run generate:csv-columns)', () => {
    expect(readFileSync(COLUMNS_DOC_PATH, 'utf8')).toBe(specCsvColumnsMarkdown());
  });

  test('when DEVELOPERS.md lists today’s columns under "Batch import", then it names every column of the schema', () => {
    const guide = readFileSync(new URL('../../../DEVELOPERS.md', import.meta.url), 'utf8');
    const section = guide.slice(guide.indexOf('## Batch import'), guide.indexOf('\n## ', guide.indexOf('## Batch import') + 1));
    expect(SPEC_CSV_COLUMNS.map((c) => c.name).filter((name) => !section.includes(`\`${name}\``))).toEqual([]);
  });

  test('when the table is written, then each column has one line with its unit and default', () => {
    const lines = specCsvColumnsMarkdown().split('\n');
    expect(lines.filter((l) => l.startsWith('| `'))).toHaveLength(SPEC_CSV_COLUMNS.length);
    expect(lines.find((l) => l.startsWith('| `gain.tolerancePercent`'))).toMatch(/^\| `gain.tolerancePercent` \| % \| {2}\| 10 \|/);
    expect(specCsvColumnsMarkdown()).toMatch(/estimates to\s+confirm by simulation and bench measurement/);
  });
});

describe('the template', () => {
  test('when parsed, then its header is every column and its one example row is a valid spec', () => {
    const template = specCsvTemplate();
    const parsed = Papa.parse<string[]>(template.trimEnd(), { header: false });
    expect(parsed.data[0]).toEqual(SPEC_CSV_COLUMNS.map((c) => c.name));
    expect(parsed.data).toHaveLength(2);

    const reading = readSpecFile({ text: template, fileName: 'template.csv' });

    expect(reading.ok && reading.rows.map((r) => [r.title, r.errors])).toEqual([[TEMPLATE_EXAMPLE_TITLE, []]]);
  });
});
