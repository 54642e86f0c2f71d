/**
 * The bench measurement CSV reader (shared/measurements/measurement-csv.ts): the documented
 * header spellings, engineering notation in cells, comments and blank lines; and every refusal
 * with the line it is on.
 *
 * Expected numbers are the files' own values with the SI prefixes of the SI Brochure (9th ed.,
 * Table 7: k = 1e3, M = 1e6) and, for V/V, nothing else: the reader converts nothing but the
 * frequency unit. The files are invented.
 */
import { describe, expect, test } from 'vitest';
import { MEASUREMENT_FILE_MAX_BYTES, parseMeasurementCsv, pointDb, readMeasurementFile } from '#shared/measurements/measurement-csv';

const bytes = (text: string) => new TextEncoder().encode(text);

describe('parseMeasurementCsv with valid files', () => {
  const VALID: [string, string, { kind: string; unit: string; points: [number, number][] }][] = [
    ['snake-case header, plain numbers', 'frequency_hz,cmrr_db\n10,84.1\n100,83.9\n', { kind: 'cmrr', unit: 'dB', points: [[10, 84.1], [100, 83.9]] }],
    [
      'spreadsheet header with units in brackets, comments and blank lines, CRLF',
      '# bench K-03\r\n\r\nFrequency (Hz),CMRR (dB)\r\n# a comment between points\r\n1k,80\r\n\r\n2.5 kHz,79.5 dB\r\n',
      { kind: 'cmrr', unit: 'dB', points: [[1000, 80], [2500, 79.5]] },
    ],
    ['kHz header: bare numbers in kHz, a cell naming Hz as written', 'Frequency [kHz];Rejection [dB]\n0.5;70\n2;69\n5000 Hz;68\n', { kind: 'cmrr', unit: 'dB', points: [[500, 70], [2000, 69], [5000, 68]] }],
    ['MHz header, tab-separated, quoted cells', '"f (MHz)"\t"Common-mode rejection (dB)"\n"0.001"\t"60"\n"1"\t"30"\n', { kind: 'cmrr', unit: 'dB', points: [[1000, 60], [1e6, 30]] }],
    ['gain in dB, exponent form and negative values', 'frequency_hz,gain_db\n1e1,32.5\n1e6,-3.25\n', { kind: 'gain', unit: 'dB', points: [[10, 32.5], [1e6, -3.25]] }],
    ['gain as a ratio, "per" spelled out', 'Frequency_Hz,Gain_V_per_V\n10,42.4\n10k,41\n', { kind: 'gain', unit: 'V/V', points: [[10, 42.4], [10000, 41]] }],
    ['gain as a ratio, V/V in brackets, a byte-order mark, trailing empty cells', '\uFEFFFrequency (Hz),Gain (V/V),\n100,20,\n1 MHz,7.5,,\n', { kind: 'gain', unit: 'V/V', points: [[100, 20], [1e6, 7.5]] }],
    ['range ends: 0.01 Hz and 1 GHz, 0 and 200 dB', 'frequency_hz,cmrr_db\n0.01,0\n1G,200\n', { kind: 'cmrr', unit: 'dB', points: [[0.01, 0], [1e9, 200]] }],
  ];

  test.each(VALID)('when the file has a %s, then it reads the exact points', (_title, text, expected) => {
    // Act
    const result = readMeasurementFile(bytes(text));

    // Assert
    expect(result.ok, JSON.stringify(result)).toBe(true);
    if (!result.ok) return;
    expect(result.kind).toBe(expected.kind);
    expect(result.unit).toBe(expected.unit);
    expect(result.points.map((p) => [p.frequencyHz, p.value])).toEqual(expected.points);
  });
});

describe('parseMeasurementCsv with invalid files', () => {
  const INVALID: [string, string, { line?: number; message: RegExp }][] = [
    ['no header at all', '# only a comment\n\n', { message: /no header row/ }],
    ['a header without units', 'frequency,cmrr\n10,80\n20,79\n', { line: 1, message: /name the frequency's unit/ }],
    ['an unknown quantity', '# c\nfrequency_hz,phase_deg\n10,80\n20,79\n', { line: 2, message: /second column must be the measured rejection or gain/ }],
    ['rejection in a unit other than dB', 'frequency_hz,cmrr_v_per_v\n10,80\n20,79\n', { line: 1, message: /rejection is given in dB/ }],
    ['a third column', 'frequency_hz,cmrr_db,phase_deg\n10,80,1\n', { line: 1, message: /two columns/ }],
    ['an HTML page', '<!doctype html>\n<html><body><script>alert(1)</script></body></html>\n', { line: 1, message: /header must name two columns/ }],
    ['a value that is not a number', 'frequency_hz,cmrr_db\n10,80\n# note\n20,eighty\n', { line: 4, message: /rejection "eighty" is not a number/ }],
    ['a decimal comma', 'frequency_hz;cmrr_db\n10;80,5\n20;79\n', { line: 2, message: /use a point as the decimal separator/ }],
    ['a wrong unit in a frequency cell', 'frequency_hz,cmrr_db\n10 V,80\n20,79\n', { line: 2, message: /unexpected unit "V"/ }],
    ['a frequency that does not increase', 'frequency_hz,cmrr_db\n10,80\n100,79\n100,78\n', { line: 4, message: /must increase.*line 3/ }],
    ['a frequency that goes down', 'frequency_hz,cmrr_db\n1k,80\n500,79\n', { line: 3, message: /not above the 1000 Hz of line 2/ }],
    ['a zero frequency', 'frequency_hz,cmrr_db\n0,80\n10,79\n', { line: 2, message: /outside 0.01 Hz to 1 GHz/ }],
    ['a frequency above 1 GHz', 'frequency_hz,cmrr_db\n10,80\n2G,79\n', { line: 3, message: /outside 0.01 Hz to 1 GHz/ }],
    ['a negative rejection', 'frequency_hz,cmrr_db\n10,-3\n20,79\n', { line: 2, message: /outside 0 to 200 dB/ }],
    ['a rejection above 200 dB', 'frequency_hz,cmrr_db\n10,80\n20,201\n', { line: 3, message: /outside 0 to 200 dB/ }],
    ['a gain of 0 V/V', 'frequency_hz,gain_v_per_v\n10,0\n20,5\n', { line: 2, message: /above 0 and at most 100000 V\/V/ }],
    ['a gain above 100 dB', 'frequency_hz,gain_db\n10,120\n20,5\n', { line: 2, message: /outside -100 to \+100 dB/ }],
    ['a row with one value', 'frequency_hz,cmrr_db\n10,80\n20\n', { line: 3, message: /expected two values/ }],
    ['one point only', 'frequency_hz,cmrr_db\n10,80\n', { message: /one measured point; at least 2/ }],
    ['a NUL byte (binary or UTF-16)', 'frequency_hz,cmrr_db\n10,80\n\u000020,79\n', { line: 3, message: /NUL bytes/ }],
    ['a stray control character', 'frequency_hz,cmrr_db\n10,80\u0007\n20,79\n', { line: 2, message: /control character \(U\+0007\)/ }],
  ];

  test.each(INVALID)('when the file has %s, then it is refused with the line and the reason', (_title, text, expected) => {
    // Act
    const result = readMeasurementFile(bytes(text));

    // Assert
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems[0].line).toBe(expected.line);
    expect(result.problems[0].message).toMatch(expected.message);
  });

  test('when a file is not valid UTF-8, then it is refused on the line of the bad byte', () => {
    const file = new Uint8Array([...bytes('frequency_hz,cmrr_db\n10,80\n'), 0xff, 0xfe, ...bytes(',79\n')]);
    const result = readMeasurementFile(file);
    expect(result).toEqual({ ok: false, problems: [{ line: 3, message: expect.stringMatching(/not valid UTF-8/) }] });
  });

  test('when a file is over 256 KB, then it is refused whole', () => {
    const file = bytes(`frequency_hz,cmrr_db\n${'#'.repeat(MEASUREMENT_FILE_MAX_BYTES)}\n`);
    const result = readMeasurementFile(file);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.problems[0].message).toMatch(/at most 256 KB/);
  });

  test('when a file has 10,001 points, then it is refused on the line of the 10,001st', () => {
    const rows = Array.from({ length: 10_001 }, (_, i) => `${i + 1},80`);
    const result = parseMeasurementCsv(['frequency_hz,cmrr_db', ...rows].join('\n'));
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.problems).toEqual([{ line: 10_002, message: expect.stringMatching(/more than 10000 points/) }]);
  });

  test('when a file has 10,000 points, then every one is read', () => {
    const rows = Array.from({ length: 10_000 }, (_, i) => `${i + 1},80`);
    const result = parseMeasurementCsv(['frequency_hz,cmrr_db', ...rows].join('\n'));
    expect(result.ok && result.points.length).toBe(10_000);
  });

  test('when several lines are wrong, then each is listed with its own line', () => {
    const result = parseMeasurementCsv('frequency_hz,cmrr_db\n10,x\n20,80\n30,y\n');
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.problems.map((p) => p.line)).toEqual([2, 4]);
  });
});

describe('pointDb', () => {
  test('when a gain is a ratio, then it is 20·log10 of it (a field quantity, IEC 60027-3); dB stays as is', () => {
    // 20·log10(100) = 40 exactly; 20·log10(2) = 6.0206 (log10 2 = 0.30103)
    expect(pointDb(100, 'V/V')).toBeCloseTo(40, 12);
    expect(pointDb(2, 'V/V')).toBeCloseTo(6.0206, 4);
    expect(pointDb(-3.5, 'dB')).toBe(-3.5);
  });
});
