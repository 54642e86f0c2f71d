/**
 * Bench measurements of a decided design: our own small CSV format, read and checked (pure).
 *
 * The format (DEVELOPERS.md, "Bench measurements"):
 *
 *     # Fernhollow bench, board 3, 2 Vpp common mode     <- comment lines start with #
 *     frequency_hz,cmrr_db                               <- header: the quantity and its unit
 *     10,84.1
 *     1k,83.9                                            <- engineering notation through shared/units
 *     2.5 kHz,82.7
 *
 * - Exactly two columns: frequency, then the measured quantity. Comma, semicolon or tab
 *   between them (the header decides); cells may be quoted; a point is the decimal separator.
 * - Headers, without regard to case, blanks, underscores or brackets: frequency as
 *   `frequency_hz` / `Frequency (Hz)` / `freq [kHz]` / `f_MHz` (Hz, kHz or MHz); the quantity as
 *   `cmrr_db` / `CMRR (dB)` / `rejection_db` / `common-mode rejection (dB)` (rejection in dB),
 *   `gain_db` / `Gain (dB)` (gain in dB), or `gain_v_per_v` / `Gain (V/V)` (gain as a ratio).
 * - A frequency cell that names its unit ("2.5 kHz", "10Hz") is read as written; a bare number
 *   (or one with a prefix only, "1k") is in the header's unit.
 * - Frequencies strictly increasing, from 0.01 Hz to 1 GHz; rejection 0 to 200 dB; gain
 *   −100 to +100 dB, or above 0 and at most 100 000 V/V. 2 to 10 000 points; at most 256 KB;
 *   UTF-8 or ASCII text (a byte-order mark is fine), checked by content, never by file name.
 *
 * Every problem comes with its line (lines count from 1, comment and blank lines included).
 */
import Papa from 'papaparse';
import { decodeUploadText } from '../text/upload-text';
import { parseQuantity } from '../units/parse-quantity';

export const MEASUREMENT_FILE_MAX_BYTES = 256 * 1024;
export const MEASUREMENT_MIN_POINTS = 2;
export const MEASUREMENT_MAX_POINTS = 10_000;
export const MEASUREMENT_FREQUENCY_RANGE_HZ = { min: 0.01, max: 1e9 } as const;
export const MEASUREMENT_CMRR_RANGE_DB = { min: 0, max: 200 } as const;
export const MEASUREMENT_GAIN_RANGE_DB = { min: -100, max: 100 } as const;
/** Gain as a ratio: above 0, at most this (100 dB). */
export const MEASUREMENT_GAIN_MAX_V_PER_V = 100_000;
/** Problems listed at most (the rest are counted in the last one). */
const MAX_PROBLEMS = 50;

/** What was measured: common-mode rejection, or the stage's gain. */
export type MeasurementKind = 'cmrr' | 'gain';
/** The unit of the measured values as stored: dB, or V/V for a gain given as a ratio. */
export type MeasurementUnit = 'dB' | 'V/V';

export interface MeasuredPoint {
  frequencyHz: number;
  /** In the measurement's unit (dB or V/V). */
  value: number;
}

export interface MeasurementProblem {
  /** Line of the file (from 1); absent for whole-file problems. */
  line?: number;
  message: string;
}

export type MeasurementFileResult =
  | { ok: true; kind: MeasurementKind; unit: MeasurementUnit; points: MeasuredPoint[] }
  | { ok: false; problems: MeasurementProblem[] };

interface FrequencyColumn {
  scale: number;
  unit: 'Hz' | 'kHz' | 'MHz';
}

interface ValueColumn {
  kind: MeasurementKind;
  unit: MeasurementUnit;
}

const FREQUENCY_NAMES = ['frequency', 'freq', 'f'];
const FREQUENCY_UNITS: Record<string, FrequencyColumn> = { hz: { scale: 1, unit: 'Hz' }, khz: { scale: 1e3, unit: 'kHz' }, mhz: { scale: 1e6, unit: 'MHz' } };
const REJECTION_NAMES = ['cmrr', 'cmr', 'rejection', 'common-mode rejection', 'common mode rejection', 'common-mode rejection ratio', 'common mode rejection ratio'];
const GAIN_NAMES = ['gain'];

/** Lower case; brackets, underscores and commas become blanks; "per" becomes "/"; blanks collapsed. */
function normalizeHeader(cell: string): string {
  return cell
    .toLowerCase()
    .replace(/[()[\]_,]/g, ' ')
    .replace(/\s+per\s+/g, '/')
    .replace(/\s*\/\s*/g, '/')
    .replace(/\s+/g, ' ')
    .trim();
}

/** "frequency hz" → name "frequency", unit "hz"; a header without a unit has unit "". */
function splitHeader(normalized: string): { name: string; unit: string } {
  const at = normalized.lastIndexOf(' ');
  return at < 0 ? { name: normalized, unit: '' } : { name: normalized.slice(0, at), unit: normalized.slice(at + 1) };
}

function frequencyColumn(cell: string): FrequencyColumn | string {
  const { name, unit } = splitHeader(normalizeHeader(cell));
  if (!FREQUENCY_NAMES.includes(name) && !FREQUENCY_NAMES.includes(`${name} ${unit}`.trim())) {
    return `the first column must be the frequency, e.g. "frequency_hz" or "Frequency (Hz)"; found "${cell.trim()}"`;
  }
  if (FREQUENCY_NAMES.includes(`${name} ${unit}`.trim())) return `name the frequency's unit in the header: "frequency_hz", "Frequency (kHz)" or "Frequency (MHz)"; found "${cell.trim()}"`;
  const column = FREQUENCY_UNITS[unit];
  return column ?? `the frequency column's unit must be Hz, kHz or MHz; found "${cell.trim()}"`;
}

function valueColumn(cell: string): ValueColumn | string {
  const normalized = normalizeHeader(cell);
  const { name, unit } = splitHeader(normalized);
  const rejection = REJECTION_NAMES.includes(name);
  const gain = GAIN_NAMES.includes(name);
  if (REJECTION_NAMES.includes(normalized) || GAIN_NAMES.includes(normalized)) {
    return `name the unit of "${cell.trim()}" in the header: ${REJECTION_NAMES.includes(normalized) ? '"cmrr_db" or "CMRR (dB)"' : '"gain_db", "Gain (dB)", "gain_v_per_v" or "Gain (V/V)"'}`;
  }
  if (rejection && unit === 'db') return { kind: 'cmrr', unit: 'dB' };
  if (rejection) return `rejection is given in dB ("cmrr_db" or "CMRR (dB)"); found "${cell.trim()}"`;
  if (gain && unit === 'db') return { kind: 'gain', unit: 'dB' };
  if (gain && unit === 'v/v') return { kind: 'gain', unit: 'V/V' };
  if (gain) return `gain is given in dB or V/V ("gain_db" or "gain_v_per_v"); found "${cell.trim()}"`;
  return `the second column must be the measured rejection or gain with its unit: "cmrr_db", "gain_db" or "gain_v_per_v" (or "CMRR (dB)", "Gain (dB)", "Gain (V/V)"); found "${cell.trim()}"`;
}

/** The file's text, checked by content with the one upload check (`shared/text/upload-text.ts`): size, no NUL byte, valid UTF-8, no control characters. */
export function decodeMeasurementFile(bytes: Uint8Array): { ok: true; text: string } | { ok: false; problems: MeasurementProblem[] } {
  if (bytes.length === 0) return fail('The file is empty: it needs a header row and at least two measured points.');
  const decoded = decodeUploadText(bytes, { maxBytes: MEASUREMENT_FILE_MAX_BYTES, controls: 'refuse' });
  if (decoded.ok) return decoded;
  const problem = decoded.problem;
  switch (problem.kind) {
    case 'too-large':
      return fail(`The file is ${problem.bytes} bytes; a measurement file may hold at most ${MEASUREMENT_FILE_MAX_BYTES / 1024} KB.`);
    case 'nul':
      return fail('The file holds NUL bytes: it is binary (or UTF-16) rather than a CSV text file; save it as UTF-8 or ASCII text.', problem.line);
    case 'not-utf8':
      return fail('The file is not valid UTF-8 text; save it as UTF-8 or plain ASCII.', problem.line);
    case 'control':
      return fail(`A control character (U+${problem.code.toString(16).toUpperCase().padStart(4, '0')}) is not allowed in a measurement file: is it a text file?`, problem.line);
  }
}

function fail(message: string, line?: number): { ok: false; problems: MeasurementProblem[] } {
  return { ok: false, problems: [line === undefined ? { message } : { line, message }] };
}

/** The cells of one line (quoted cells read by papaparse, RFC 4180); trailing empty cells dropped. */
function cellsOf(line: string, delimiter: string): { cells: string[]; quoteProblem: string | null } {
  if (!line.includes('"')) {
    const cells = line.split(delimiter);
    while (cells.length > 0 && cells[cells.length - 1].trim() === '') cells.pop();
    return { cells, quoteProblem: null };
  }
  const parsed = Papa.parse<string[]>(line, { header: false, delimiter, skipEmptyLines: false });
  const cells = [...(parsed.data[0] ?? [])];
  while (cells.length > 0 && cells[cells.length - 1].trim() === '') cells.pop();
  const quote = parsed.errors.find((error) => error.type === 'Quotes');
  return { cells, quoteProblem: quote ? quote.message : null };
}

function delimiterOf(headerLine: string): string {
  for (const candidate of ['\t', ';', ',']) {
    if (headerLine.includes(candidate)) return candidate;
  }
  return ',';
}

/** A frequency cell: with its own unit as written, else in the column's unit. */
function readFrequency(cell: string, column: FrequencyColumn): { ok: true; value: number } | { ok: false; message: string } {
  const namesUnit = /hz\s*$/i.test(cell.trim());
  const read = parseQuantity(cell, 'Hz');
  if (!read.ok) return { ok: false, message: `frequency ${read.message.startsWith('"') ? read.message : `"${cell.trim()}" ${read.message}`}` };
  return { ok: true, value: namesUnit ? read.value : read.value * column.scale };
}

function readValue(cell: string, column: ValueColumn): { ok: true; value: number } | { ok: false; message: string } {
  const what = column.kind === 'cmrr' ? 'rejection' : 'gain';
  const read = parseQuantity(cell, column.unit);
  if (!read.ok) return { ok: false, message: `${what} ${read.message.startsWith('"') ? read.message : `"${cell.trim()}" ${read.message}`}` };
  const value = read.value;
  if (column.kind === 'cmrr' && (value < MEASUREMENT_CMRR_RANGE_DB.min || value > MEASUREMENT_CMRR_RANGE_DB.max)) {
    return { ok: false, message: `rejection ${cell.trim()} is outside ${MEASUREMENT_CMRR_RANGE_DB.min} to ${MEASUREMENT_CMRR_RANGE_DB.max} dB (give it as a positive number of dB)` };
  }
  if (column.kind === 'gain' && column.unit === 'dB' && (value < MEASUREMENT_GAIN_RANGE_DB.min || value > MEASUREMENT_GAIN_RANGE_DB.max)) {
    return { ok: false, message: `gain ${cell.trim()} is outside ${MEASUREMENT_GAIN_RANGE_DB.min} to +${MEASUREMENT_GAIN_RANGE_DB.max} dB` };
  }
  if (column.kind === 'gain' && column.unit === 'V/V' && (value <= 0 || value > MEASUREMENT_GAIN_MAX_V_PER_V)) {
    return { ok: false, message: `gain ${cell.trim()} must be above 0 and at most ${MEASUREMENT_GAIN_MAX_V_PER_V} V/V (a magnitude)` };
  }
  return { ok: true, value };
}

/** Reads the text of a measurement file: the kind, unit and points, or every problem with its line. */
export function parseMeasurementCsv(text: string): MeasurementFileResult {
  const lines = text.split(/\r\n|\n|\r/);
  const problems: MeasurementProblem[] = [];
  const add = (line: number, message: string) => {
    if (problems.length < MAX_PROBLEMS) problems.push({ line, message });
  };
  let header: { frequency: FrequencyColumn; value: ValueColumn; delimiter: string } | null = null;
  let headerLine = 0;
  const points: MeasuredPoint[] = [];
  let previous: { frequencyHz: number; line: number } | null = null;
  let rows = 0;

  for (let index = 0; index < lines.length; index += 1) {
    const line = index + 1;
    const raw = lines[index];
    const trimmed = raw.trim();
    if (trimmed === '' || trimmed.startsWith('#')) continue;
    if (header === null && headerLine === 0) {
      headerLine = line;
      const delimiter = delimiterOf(raw);
      const { cells, quoteProblem } = cellsOf(raw, delimiter);
      if (quoteProblem) {
        add(line, `the header cannot be read: ${quoteProblem.toLowerCase()}`);
        break;
      }
      if (cells.length !== 2) {
        add(line, `the header must name two columns, frequency then the measured quantity (e.g. "frequency_hz,cmrr_db"); found ${cells.length === 1 ? `one: "${cells[0].trim()}"` : `${cells.length}`}`);
        break;
      }
      const frequency = frequencyColumn(cells[0]);
      const value = valueColumn(cells[1]);
      if (typeof frequency === 'string') add(line, frequency);
      if (typeof value === 'string') add(line, value);
      if (typeof frequency === 'string' || typeof value === 'string') break;
      header = { frequency, value, delimiter };
      continue;
    }
    if (header === null) break;
    rows += 1;
    if (rows > MEASUREMENT_MAX_POINTS) {
      add(line, `more than ${MEASUREMENT_MAX_POINTS} points: a measurement file holds at most ${MEASUREMENT_MAX_POINTS}`);
      break;
    }
    const { cells, quoteProblem } = cellsOf(raw, header.delimiter);
    if (quoteProblem) {
      add(line, `cannot be read: ${quoteProblem.toLowerCase()}`);
      continue;
    }
    if (cells.length !== 2) {
      add(line, `expected two values, frequency and ${header.value.kind === 'cmrr' ? 'rejection' : 'gain'}; found ${cells.length}`);
      continue;
    }
    const frequency = readFrequency(cells[0], header.frequency);
    const value = readValue(cells[1], header.value);
    if (!frequency.ok) add(line, frequency.message);
    if (!value.ok) add(line, value.message);
    if (!frequency.ok || !value.ok) continue;
    const frequencyHz = frequency.value;
    if (frequencyHz < MEASUREMENT_FREQUENCY_RANGE_HZ.min || frequencyHz > MEASUREMENT_FREQUENCY_RANGE_HZ.max) {
      add(line, `frequency ${cells[0].trim()} is outside 0.01 Hz to 1 GHz`);
      continue;
    }
    if (previous !== null && frequencyHz <= previous.frequencyHz) {
      add(line, `frequencies must increase from line to line: ${cells[0].trim()} is not above the ${formatHz(previous.frequencyHz)} of line ${previous.line}`);
      continue;
    }
    previous = { frequencyHz, line };
    points.push({ frequencyHz, value: value.value });
  }

  if (problems.length === 0 && header === null) {
    return fail('The file has no header row: start with e.g. "frequency_hz,cmrr_db" (comment lines starting with # may come first).');
  }
  if (problems.length > 0) return { ok: false, problems };
  if (header === null) return { ok: false, problems };
  if (points.length < MEASUREMENT_MIN_POINTS) {
    return fail(`The file holds ${points.length === 0 ? 'no measured point' : 'one measured point'}; at least ${MEASUREMENT_MIN_POINTS} are needed for a curve.`);
  }
  return { ok: true, kind: header.value.kind, unit: header.value.unit, points };
}

function formatHz(value: number): string {
  return `${Number(value.toPrecision(6))} Hz`;
}

/** Checks the bytes as text, then reads them: the one entry point for an uploaded file. */
export function readMeasurementFile(bytes: Uint8Array): MeasurementFileResult {
  const decoded = decodeMeasurementFile(bytes);
  if (!decoded.ok) return decoded;
  return parseMeasurementCsv(decoded.text);
}

/** A measured value in dB: dB as is, V/V as 20·log10 (IEC 60027-3 field quantity). */
export function pointDb(value: number, unit: MeasurementUnit): number {
  return unit === 'dB' ? value : 20 * Math.log10(value);
}
