/**
 * The CSV -> spec mapping of the batch import: columns read by kind and unit, engineering
 * notation through the unit parser, empty cells left to the schema's defaults, unknown and
 * repeated columns reported, rows numbered as a spreadsheet counts them (header = row 1).
 * Prefix values are [SI] (k = 1e3, m = 1e-3, u/µ = 1e-6, p = 1e-12); "4k7" and "meg" are
 * common practice (DOMAIN.md).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { cellText, SPEC_CSV_COLUMNS } from '#shared/import/spec-columns';
import { detectFormat, readSpecFile, type SpecFileRow } from '#shared/import/spec-file';
import { validateSpec } from '#shared/validate';
import { FULL_SPEC } from '../schema/schema-fixtures';

const REQUIRED_HEADER = 'title,supply.positiveV,supply.negativeV,gain.target,cmrr.minDb';

/** Reads a CSV and insists the file as a whole could be read. */
function readCsv(text: string) {
  const reading = readSpecFile({ text, fileName: 'specs.csv' });
  if (!reading.ok) throw new Error(`file refused: ${reading.message}`);
  return reading;
}

function onlyRow(text: string): SpecFileRow {
  const { rows } = readCsv(text);
  expect(rows).toHaveLength(1);
  return rows[0];
}

describe('a demo spec written as one CSV row', () => {
  test.each(['studio-line-receiver.json', 'strain-bridge-receiver.json', 'electrode-amplifier-input.json', 'seismic-node-receiver.json', 'soil-probe-input.json'])(
    'when %s is written with every column and read back, then it is the same document as the JSON gives',
    (file) => {
      const spec = JSON.parse(readFileSync(new URL(`../../../api/demo/specs/${file}`, import.meta.url), 'utf8')) as Record<string, unknown>;
      const valueAt = (path: readonly string[]) => path.reduce<unknown>((node, key) => (node as Record<string, unknown> | undefined)?.[key], spec);
      const quote = (text: string) => (/[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text);
      const csv = `${SPEC_CSV_COLUMNS.map((c) => c.name).join(',')}\r\n${SPEC_CSV_COLUMNS.map((c) => quote(cellText(valueAt(c.path)))).join(',')}\r\n`;

      const row = onlyRow(csv);

      const expected = validateSpec(spec);
      expect(expected.ok).toBe(true);
      expect(row.errors).toEqual([]);
      expect(row.document).toEqual(expected.ok && expected.value);
    },
  );
});

describe('the optional targets and corners in CSV', () => {
  const quote = (text: string) => (/[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text);

  test('when a spec with every target and corner is written with every column and read back, then it is the same document', () => {
    const valueAt = (path: readonly string[]) => path.reduce<unknown>((node, key) => (node as Record<string, unknown> | undefined)?.[key], FULL_SPEC);
    const csv = `${SPEC_CSV_COLUMNS.map((c) => c.name).join(',')}\r\n${SPEC_CSV_COLUMNS.map((c) => quote(cellText(valueAt(c.path)))).join(',')}\r\n`;

    const row = onlyRow(csv);

    expect(row.errors).toEqual([]);
    expect(row.document).toEqual(FULL_SPEC);
  });

  test('when the targets are written as a datasheet quotes them, then each is read in SI', () => {
    const cells: Record<string, string> = {
      'noise.maxVPerRtHz': '8 nV/√Hz',
      'noise.atFrequencyHz': '1 kHz',
      inputBiasCurrentMaxA: '3 µA',
      'offset.maxV': '2 mV',
      'offset.driftMaxVPerC': '5 µV/°C',
      slewRateMinVPerS: '2 V/µs',
      bandwidthMinHz: '1 MHz',
      'psrrMinDb.positive': '60 dB',
      linearInputRangeMinV: '20m',
      loadCapacitanceF: '20 pF',
      'supplyTolerance.negativePercent': '10 %',
      'betaRange.min': '80',
      'resistors.tempcoPpmPerC': '50 ppm/°C',
    };
    const names = [...REQUIRED_HEADER.split(','), ...Object.keys(cells)];
    const values: Record<string, string> = { title: 'Tarn probe', 'supply.positiveV': '15', 'supply.negativeV': '-15', 'gain.target': '20', 'cmrr.minDb': '60', ...cells };

    const row = onlyRow(`${names.join(',')}\r\n${names.map((n) => quote(values[n])).join(',')}\r\n`);

    expect(row.errors).toEqual([]);
    const document = row.document!;
    // n = 1e-9, k = 1e3, µ = 1e-6, m = 1e-3, M = 1e6, p = 1e-12 [SI]; 1 V/µs = 1e6 V/s
    expect(document.noise?.maxVPerRtHz).toBeCloseTo(8e-9, 21);
    expect(document.noise?.atFrequencyHz).toBe(1000);
    expect(document.inputBiasCurrentMaxA).toBeCloseTo(3e-6, 18);
    expect(document.offset).toEqual({ maxV: 2e-3, driftMaxVPerC: 5e-6, sigmas: 3 });
    expect(document.slewRateMinVPerS).toBe(2e6);
    expect(document.bandwidthMinHz).toBe(1e6);
    expect(document.psrrMinDb).toEqual({ positive: 60 });
    expect(document.linearInputRangeMinV).toBe(0.02);
    expect(document.loadCapacitanceF).toBeCloseTo(20e-12, 24);
    expect(document.supplyTolerance).toEqual({ positivePercent: 5, negativePercent: 10 });
    expect(document.betaRange).toEqual({ min: 80 });
    expect(document.resistors.tempcoPpmPerC).toBe(50);
  });

  test.each([
    ['slewRateMinVPerS', '=2*1E6', '"=2*1E6" is not a number'],
    ['noise.maxVPerRtHz', '+8n', null],
    ['offset.maxV', '@SUM(1)', '"@SUM(1)" is not a number'],
  ])('when %s holds %j, then it is read as a number or refused, never evaluated', (column, cell, fragment) => {
    const extra: Record<string, string> = column.startsWith('noise.') ? { 'noise.atFrequencyHz': '1k' } : {};
    const values: Record<string, string> = { title: 'Tarn probe', 'supply.positiveV': '15', 'supply.negativeV': '-15', 'gain.target': '20', 'cmrr.minDb': '60', [column]: cell, ...extra };
    const names = [...REQUIRED_HEADER.split(','), column, ...Object.keys(extra)];

    const row = onlyRow(`${names.join(',')}\r\n${names.map((n) => quote(values[n])).join(',')}\r\n`);

    if (fragment === null) {
      expect(row.errors).toEqual([]);
      expect(row.document?.noise?.maxVPerRtHz).toBeCloseTo(8e-9, 21);
    } else {
      expect(row.document).toBeNull();
      expect(row.errors).toHaveLength(1);
      expect(row.errors[0].field).toBe(column);
      expect(row.errors[0].message).toContain(fragment);
    }
  });

  test('when a noise limit is given without its frequency, then the row is refused at the frequency column', () => {
    const row = onlyRow(`${REQUIRED_HEADER},noise.maxVPerRtHz\r\nTarn probe,15,-15,20,60,8n\r\n`);
    expect(row.errors).toEqual([{ row: 2, field: 'noise.atFrequencyHz', message: 'is required with the largest noise density (leave the input noise out to check no noise)' }]);
  });
});

describe('the PNP transistor in CSV', () => {
  const PNP_HEADER = `${REQUIRED_HEADER},topologies,device.pnp.beta,device.pnp.earlyVoltageV,device.pnp.saturationCurrentA`;

  test('when a row lists the PTAT source with its PNP, then the PNP is read in SI from its columns', () => {
    const row = onlyRow(`${PNP_HEADER}\r\nFen gauge input,9,-9,36,66,widlar ptat,110,46 V,6.3f\r\n`);
    expect(row.errors).toEqual([]);
    expect(row.document?.topologies).toEqual(['widlar', 'ptat']);
    // f = 1e-15 [SI]
    expect(row.document?.device.pnp).toEqual({ beta: 110, earlyVoltageV: 46, saturationCurrentA: 6.3e-15 });
  });

  test('when a row lists the PTAT source without its PNP, then it is refused at the PNP’s first column, saying why', () => {
    const row = onlyRow(`${PNP_HEADER}\r\nFen gauge input,9,-9,36,66,widlar ptat,,,\r\n`);
    expect(row.document).toBeNull();
    expect(row.errors).toHaveLength(1);
    expect(row.errors[0].field).toBe('device.pnp.beta');
    expect(row.errors[0].message).toMatch(/^is required: the tail options include the PTAT \(constant-gm\) source, whose mirror is PNP/);
  });

  test('when a row gives the PNP’s Early voltage but not its current gain, then the current gain’s column is named', () => {
    const row = onlyRow(`${PNP_HEADER}\r\nFen gauge input,9,-9,36,66,ptat,,46,\r\n`);
    expect(row.errors).toEqual([{ row: 2, field: 'device.pnp.beta', message: 'is required unless the PNP SPICE model card is given' }]);
  });

  test('when a row does not list the PTAT source, then it needs no PNP columns', () => {
    const row = onlyRow(`${REQUIRED_HEADER},topologies\r\nFen gauge input,9,-9,36,66,widlar cascode\r\n`);
    expect(row.errors).toEqual([]);
    expect(row.document?.device.pnp).toBeUndefined();
  });
});

describe('cells in engineering notation, in the column’s unit', () => {
  test.each([
    ['tailCurrentA', '10u', 10e-6],
    ['tailCurrentA', '250 µA', 250e-6],
    ['supply.negativeV', '-12 V', -12],
    ['supply.negativeV', '−12', -12],
    ['tailCapacitanceF', '2.2 pF', 2.2e-12],
    ['cmrr.atFrequencyHz', '4k7', 4700],
    ['cmrr.atFrequencyHz', '1meg', 1e6],
    ['device.vbeMismatchSigmaV', '0.9m', 0.9e-3],
    ['powerBudgetW', '2.5e-2', 0.025],
    ['gain.tolerancePercent', '7.5 %', 7.5],
  ])('when %s holds %j, then the spec has %d', (column, cell, value) => {
    const values: Record<string, string> = { title: 'Tarn probe', 'supply.positiveV': '15', 'supply.negativeV': '-15', 'gain.target': '20', 'cmrr.minDb': '60', [column]: cell };
    const names = [...new Set([...REQUIRED_HEADER.split(','), column])];

    const row = onlyRow(`${names.join(',')}\r\n${names.map((n) => values[n]).join(',')}\r\n`);

    expect(row.errors).toEqual([]);
    const path = column.split('.');
    expect(path.reduce<unknown>((node, key) => (node as Record<string, unknown>)[key], row.document)).toBe(value);
  });

  test.each([
    ['supply.positiveV', '12 A', '"12 A" has an unexpected unit "A": expected V'],
    ['cmrr.minDb', '60 kdB', '"60 kdB": dB takes no prefix: "k" is not allowed'],
    ['gain.target', 'twenty', '"twenty" is not a number (examples: 40, 2.5e1, 40 V/V)'],
    ['hazards.mainsReferenced', 'perhaps', 'must be true or false (also yes/no, 1/0), got "perhaps"'],
  ])('when %s holds %j, then the row is refused at that column with %j', (column, cell, message) => {
    const values: Record<string, string> = { title: 'Tarn probe', 'supply.positiveV': '15', 'supply.negativeV': '-15', 'gain.target': '20', 'cmrr.minDb': '60', [column]: cell };
    const names = [...new Set([...REQUIRED_HEADER.split(','), column])];

    const row = onlyRow(`${names.join(',')}\r\n${names.map((n) => values[n]).join(',')}\r\n`);

    expect(row.document).toBeNull();
    expect(row.errors).toEqual([{ row: 2, field: column, message }]);
  });

  test('when a semicolon file writes a decimal comma, then the cell is refused with the reason, not misread', () => {
    const row = onlyRow(`${REQUIRED_HEADER.replace(/,/g, ';')};resistors.tolerance\r\nTarn probe;15;-15;20;60;0,01\r\n`);
    expect(row.errors).toEqual([{ row: 2, field: 'resistors.tolerance', message: '"0,01": use a point as the decimal separator' }]);
  });

  test('when an older file gives resistors.tolerance as a fraction, then it is read into the tolerance in per cent', () => {
    const row = onlyRow(`${REQUIRED_HEADER},resistors.tolerance\r\nTarn probe,15,-15,20,60,0.05\r\n`);
    expect(row.errors).toEqual([]);
    expect((row.document as { resistors: unknown }).resistors).toEqual({ series: 'E96', tolerancePercent: 5, tempcoPpmPerC: 100 });
  });

  test('when the tolerance is given in per cent, "1 %" reads as 1 %', () => {
    const row = onlyRow(`${REQUIRED_HEADER},resistors.tolerancePercent\r\nTarn probe,15,-15,20,60,0.5 %\r\n`);
    expect((row.document as { resistors: unknown }).resistors).toEqual({ series: 'E96', tolerancePercent: 0.5, tempcoPpmPerC: 100 });
  });

  test('when yes/no, lists and words are given, then they become booleans, arrays and strings', () => {
    const row = onlyRow(`${REQUIRED_HEADER},hazards.patientConnected,hazards.mainsReferenced,topologies,gain.output\r\nTarn probe,15,-15,20,60,Yes,0,"wilson; cascode, widlar",single-ended\r\n`);
    expect(row.errors).toEqual([]);
    expect(row.document).toMatchObject({ hazards: { patientConnected: true, mainsReferenced: false }, topologies: ['wilson', 'cascode', 'widlar'], gain: { output: 'single-ended' } });
  });

  test('when a list repeats an item, then the schema’s rule is reported at the list’s column', () => {
    const row = onlyRow(`${REQUIRED_HEADER},topologies\r\nTarn probe,15,-15,20,60,wilson wilson\r\n`);
    expect(row.errors).toEqual([{ row: 2, field: 'topologies', message: 'must not repeat an item (items 1 and 0 are the same)' }]);
  });
});

describe('empty cells and missing columns', () => {
  test('when only the required columns are filled, then the schema defaults apply and fields without a default stay absent', () => {
    const row = onlyRow(`${REQUIRED_HEADER},tailCurrentA,gain.tolerancePercent,policy\r\nTarn probe,15,-15,20,60,,,\r\n`);

    expect(row.errors).toEqual([]);
    // Defaults as shared/schema/spec.schema.json states them
    expect(row.document).toMatchObject({ gain: { tolerancePercent: 10, output: 'differential' }, cmrr: { marginDb: 6, atFrequencyHz: 0 }, policy: 'simplest-sufficient', outputSwingVpp: 1 });
    expect(row.document && 'tailCurrentA' in row.document).toBe(false);
    expect(row.document?.device && 'saturationCurrentA' in row.document.device).toBe(false);
  });

  test('when the supply columns are left out, then each required rail is named at its own column', () => {
    const row = onlyRow('title,gain.target,cmrr.minDb\r\nTarn probe,20,60\r\n');
    expect(row.errors).toEqual([
      { row: 2, field: 'supply.positiveV', message: 'is required' },
      { row: 2, field: 'supply.negativeV', message: 'is required' },
    ]);
  });

  test('when blank cells surround a value, then surrounding blanks are ignored', () => {
    const row = onlyRow(`${REQUIRED_HEADER}\r\n  Tarn probe  , 15 , -15 ,20,  60 \r\n`);
    expect(row.title).toBe('Tarn probe');
    expect(row.document?.supply).toEqual({ positiveV: 15, negativeV: -15 });
  });
});

describe('the header', () => {
  test('when a column is not known, then the header says so on row 1 and each row filling it is refused at that column', () => {
    const reading = readCsv(`${REQUIRED_HEADER},cmrr.minimum\r\nTarn A,15,-15,20,60,\r\nTarn B,15,-15,20,60,70\r\n`);

    expect(reading.headerErrors).toEqual([{ row: 1, field: 'cmrr.minimum', message: 'is not a known column (column F); check its spelling against the template' }]);
    expect(reading.rows.map((r) => [r.row, r.errors])).toEqual([
      [2, []],
      [3, [{ row: 3, field: 'cmrr.minimum', message: 'is not a known column, so "70" would be lost; check its spelling against the template' }]],
    ]);
  });

  test('when a header differs only in case, then it is the column', () => {
    const row = onlyRow('Title,SUPPLY.POSITIVEV,supply.negativev,Gain.Target,cmrr.minDB\r\nTarn probe,15,-15,20,60\r\n');
    expect(row.errors).toEqual([]);
    expect(row.document?.cmrr.minDb).toBe(60);
  });

  test('when a column appears twice, then the header says where, and a row filling both is refused', () => {
    const reading = readCsv(`${REQUIRED_HEADER},gain.target\r\nTarn A,15,-15,20,60,\r\nTarn B,15,-15,20,60,25\r\n`);

    expect(reading.headerErrors).toEqual([{ row: 1, field: 'gain.target', message: 'appears in more than one column (D, F)' }]);
    expect(reading.rows[0].errors).toEqual([]);
    expect(reading.rows[1].errors).toEqual([{ row: 3, field: 'gain.target', message: 'is filled in more than one column (D, F): keep one' }]);
  });

  test('when there is no title column, then the header says so and every row lacks its title', () => {
    const reading = readCsv('supply.positiveV,supply.negativeV,gain.target,cmrr.minDb\r\n15,-15,20,60\r\n');
    expect(reading.headerErrors).toEqual([{ row: 1, field: 'title', message: 'is missing: every spec needs a title column' }]);
    expect(reading.rows[0].errors).toEqual([{ row: 2, field: 'title', message: 'is required' }]);
  });
});

describe('row numbers as a spreadsheet counts them', () => {
  test('when there are blank lines and a cell spanning two lines, then rows keep their spreadsheet numbers', () => {
    const text = `\uFEFF${REQUIRED_HEADER}\r\nTarn A,15,-15,20,60\r\n\r\n"Tarn B, second
line",15,-15,20,60\r\nTarn C,15,-15,0,60\r\n`;

    const reading = readCsv(text);

    expect(reading.rows.map((r) => [r.row, r.title])).toEqual([
      [2, 'Tarn A'],
      [4, 'Tarn B, second\nline'],
      [5, 'Tarn C'],
    ]);
    expect(reading.rows[2].errors).toEqual([{ row: 5, field: 'gain.target', message: 'must be > 0 V/V, got 0 V/V' }]);
  });

  test('when a file mixes CRLF and LF line endings (edited on two systems), then every line is its own row', () => {
    const reading = readCsv(`${REQUIRED_HEADER}\r\nTarn A,15,-15,20,60\r\nTarn B,15,-15,20,60\nTarn C,15,-15,20,60\r\n`);
    expect(reading.rows.map((r) => [r.row, r.title, r.errors.length])).toEqual([
      [2, 'Tarn A', 0],
      [3, 'Tarn B', 0],
      [4, 'Tarn C', 0],
    ]);
  });

  test('when a title repeats in the file, then the later row is refused and names the first', () => {
    const reading = readCsv(`${REQUIRED_HEADER}\r\nTarn A,15,-15,20,60\r\nTarn B,15,-15,20,60\r\nTarn A ,15,-15,22,60\r\n`);
    expect(reading.rows.map((r) => r.document !== null)).toEqual([true, true, false]);
    expect(reading.rows[2].errors).toEqual([{ row: 4, field: 'title', message: 'repeats the title of row 2: a file holds each spec once' }]);
  });

  test('when a row’s problems are in several columns, then they read left to right in the sheet’s column order', () => {
    const row = onlyRow('cmrr.minDb,gain.target,title,supply.negativeV,supply.positiveV\r\n-1,0,Tarn probe,-15,15\r\n');
    expect(row.errors.map((e) => e.field)).toEqual(['cmrr.minDb', 'gain.target']);
  });
});

describe('files as a whole', () => {
  test.each([
    [{ text: '[]', fileName: 'a.csv' }, 'csv'],
    [{ text: 'title\r\n', fileName: 'a.JSON' }, 'json'],
    [{ text: '  [{"title":"x"}]', fileName: 'upload' }, 'json'],
    [{ text: '{"specs":[]}', fileName: '' }, 'json'],
    [{ text: 'title,gain.target', fileName: 'upload', mimeType: 'application/json' }, 'json'],
    [{ text: 'title,gain.target', fileName: 'upload' }, 'csv'],
  ] as const)('when the file is %j, then it is read as %s', (input, format) => {
    expect(detectFormat(input)).toBe(format);
  });

  test.each([
    ['', 'specs.csv', 'must start with a header row naming the columns (row 1)'],
    [`${REQUIRED_HEADER}\r\n\r\n`, 'specs.csv', 'holds no spec rows under the header'],
    ['{"specs": [], "exportedAt": "2026-01-01"}', 'specs.json', 'may hold only "specs" at the top level, not "exportedAt"'],
    ['"a spec"', 'specs.json', 'must hold an array of specs, or an object { "specs": [ … ] }'],
  ])('when the file is %j, then it is refused as a whole', (text, fileName, message) => {
    expect(readSpecFile({ text, fileName })).toEqual({ ok: false, message });
  });

  test('when a file holds more specs than allowed, then it is refused as a whole', () => {
    const text = `${REQUIRED_HEADER}\r\nA,15,-15,20,60\r\nB,15,-15,20,60\r\nC,15,-15,20,60\r\n`;
    expect(readSpecFile({ text, fileName: 'specs.csv' }, 2)).toEqual({ ok: false, message: 'holds 3 specs; a file may hold at most 2' });
  });

  test('when the example file of the demo scenario is read, then every row is a valid spec', () => {
    const text = readFileSync(new URL('../../fixtures/fernhollow-batch-specs.csv', import.meta.url), 'utf8');
    const reading = readCsv(text);
    expect(reading.headerErrors).toEqual([]);
    expect(reading.rows.map((r) => [r.row, r.errors])).toEqual([2, 3, 4, 5, 6].map((n) => [n, []]));
    // "0.9m" V and "1k" Hz in the first row, "800u" V in the fourth: engineering notation read in SI
    expect(reading.rows[0].document).toMatchObject({ device: { vbeMismatchSigmaV: 0.9e-3 }, cmrr: { atFrequencyHz: 1000 }, tailCapacitanceF: 3e-12 });
    expect(reading.rows[3].document).toMatchObject({ device: { vbeMismatchSigmaV: 800e-6 }, topologies: ['degenerated-mirror', 'wilson', 'cascode'] });
  });
});
