/**
 * Reads a file of many requirement specs (CSV with the documented columns, or JSON) into one
 * validated spec document per row, or every problem of the row located by row number and field.
 * Rows are numbered as a spreadsheet user counts them: in a CSV the header is row 1 and the
 * first spec row 2; in JSON a spec's number is its index in the array + 1. Pure (no I/O).
 */
import Papa from 'papaparse';
import type { Spec } from '../engine/types';
import { parseQuantity } from '../units/parse-quantity';
import { validateSpec } from '../validate';
import { columnNamed, SPEC_CSV_COLUMNS, type SpecColumn } from './spec-columns';

export type SpecFileFormat = 'csv' | 'json';

/** One problem: the row it is on, the field (a column name or dotted path; "" for the whole row) and what is wrong. */
export interface ImportIssue {
  row: number;
  field: string;
  message: string;
}

/** One spec of the file: its validated document (defaults applied) when it has no problem. */
export interface SpecFileRow {
  row: number;
  title: string | null;
  document: Spec | null;
  errors: ImportIssue[];
}

export type SpecFileReading =
  | { ok: true; format: SpecFileFormat; headerErrors: ImportIssue[]; rows: SpecFileRow[] }
  | { ok: false; message: string };

export interface SpecFileInput {
  text: string;
  fileName?: string;
  mimeType?: string;
}

/** Specs one file may hold. */
export const MAX_SPECS_PER_FILE = 1000;

/**
 * CSV or JSON: the extension decides when it names one (.json, or .csv/.tsv/.txt); otherwise a
 * file whose first character is "[" or "{" is JSON and anything else CSV.
 */
export function detectFormat({ text, fileName = '', mimeType = '' }: SpecFileInput): SpecFileFormat {
  const extension = /\.([a-z0-9]+)$/i.exec(fileName)?.[1]?.toLowerCase();
  if (extension === 'json') return 'json';
  if (extension === 'csv' || extension === 'tsv' || extension === 'txt') return 'csv';
  if (/json/i.test(mimeType)) return 'json';
  if (/csv|tab-separated/i.test(mimeType)) return 'csv';
  return /^\s*[[{]/.test(text) ? 'json' : 'csv';
}

/** Reads and validates every spec of the file; `ok: false` when the file as a whole cannot be read. */
export function readSpecFile(input: SpecFileInput, maxSpecs = MAX_SPECS_PER_FILE): SpecFileReading {
  const text = input.text.replace(/^\uFEFF/, ''); // a spreadsheet's byte-order mark
  const format = detectFormat({ ...input, text });
  const read = format === 'json' ? readJson(text) : readCsv(text);
  if (!read.ok) return read;
  if (read.rows.length === 0) return { ok: false, message: format === 'csv' ? 'holds no spec rows under the header' : 'holds no specs' };
  if (read.rows.length > maxSpecs) return { ok: false, message: `holds ${read.rows.length} specs; a file may hold at most ${maxSpecs}` };
  const rows = read.rows.map((row) => validateRow(row, format));
  markRepeatedTitles(rows);
  return { ok: true, format, headerErrors: read.headerErrors, rows };
}

/** A row before validation: the spec document built from it and the problems found while building it. */
interface RawRow {
  row: number;
  input: unknown;
  errors: ImportIssue[];
  /** CSV: each field's column position, so a row's problems read left to right as the sheet does. */
  order?: ReadonlyMap<string, number>;
}

type RawReading = { ok: true; headerErrors: ImportIssue[]; rows: RawRow[] } | { ok: false; message: string };

// ---------------------------------------------------------------------------------------------
// CSV

/** "A", "B", … "Z", "AA": a column as a spreadsheet names it. */
export function columnLetter(index: number): string {
  let n = index + 1;
  let letters = '';
  while (n > 0) {
    const rest = (n - 1) % 26;
    letters = String.fromCharCode(65 + rest) + letters;
    n = Math.floor((n - 1) / 26);
  }
  return letters;
}

export type HeaderCell = { kind: 'column'; column: SpecColumn } | { kind: 'unknown'; text: string } | { kind: 'empty' };

function readCsv(text: string): RawReading {
  // One line ending throughout: a file edited on two systems can mix CRLF and LF, and the parser
  // guesses a single newline from the first line it sees.
  const oneEnding = text.replace(/\r\n?/g, '\n');
  const parsed = Papa.parse<string[]>(oneEnding, { header: false, newline: '\n', skipEmptyLines: false, delimitersToGuess: [',', ';', '\t'] });
  const records = parsed.data;
  if (records.length === 0 || records[0].every((cell) => cell.trim() === '')) {
    return { ok: false, message: 'must start with a header row naming the columns (row 1)' };
  }
  const header: HeaderCell[] = records[0].map((cell) => {
    const trimmed = cell.trim();
    if (trimmed === '') return { kind: 'empty' };
    const column = columnNamed(trimmed);
    return column ? { kind: 'column', column } : { kind: 'unknown', text: trimmed };
  });
  const headerErrors = headerIssues(header);
  const order = new Map<string, number>();
  header.forEach((cell, index) => {
    const name = cell.kind === 'column' ? cell.column.name : cell.kind === 'unknown' ? cell.text : '';
    if (name !== '' && !order.has(name)) order.set(name, index);
  });
  const quoteErrors = new Map<number, string>();
  for (const error of parsed.errors) {
    if (error.type === 'Quotes' && typeof error.row === 'number') quoteErrors.set(error.row, error.message);
  }
  const rows: RawRow[] = [];
  records.forEach((record, index) => {
    if (index === 0 || record.every((cell) => cell.trim() === '')) return; // the header; blank rows keep their number
    const rowNumber = index + 1;
    const built = csvRecordToInput(header, record, rowNumber);
    const quote = quoteErrors.get(index);
    if (quote) built.errors.unshift({ row: rowNumber, field: '', message: `cannot be read: ${quote.toLowerCase()}` });
    rows.push({ row: rowNumber, ...built, order });
  });
  return { ok: true, headerErrors, rows };
}

/** Problems of the header itself, on row 1: unknown and repeated columns, a missing title. */
function headerIssues(header: HeaderCell[]): ImportIssue[] {
  const issues: ImportIssue[] = [];
  const seen = new Map<string, number[]>();
  header.forEach((cell, index) => {
    if (cell.kind === 'unknown') {
      issues.push({ row: 1, field: cell.text, message: `is not a known column (column ${columnLetter(index)}); check its spelling against the template` });
    }
    if (cell.kind === 'column') seen.set(cell.column.name, [...(seen.get(cell.column.name) ?? []), index]);
  });
  for (const [name, indexes] of seen) {
    if (indexes.length > 1) issues.push({ row: 1, field: name, message: `appears in more than one column (${indexes.map(columnLetter).join(', ')})` });
  }
  if (!seen.has('title')) issues.push({ row: 1, field: 'title', message: 'is missing: every spec needs a title column' });
  return issues;
}

/**
 * One CSV row as a spec document: each filled cell read by its column's kind and unit and set at
 * its path; empty cells are left out (the schema's default applies, or "is required" is said).
 */
export function csvRecordToInput(header: HeaderCell[], record: string[], rowNumber: number): { input: Record<string, unknown>; errors: ImportIssue[] } {
  const input: Record<string, unknown> = {};
  const errors: ImportIssue[] = [];
  const filled = new Map<string, number[]>();
  record.forEach((raw, index) => {
    const text = raw.trim();
    if (text === '') return;
    const cell = header[index];
    if (!cell || cell.kind === 'empty') {
      errors.push({ row: rowNumber, field: '', message: `has a value in column ${columnLetter(index)}, which has no header: "${shorten(text)}"` });
      return;
    }
    if (cell.kind === 'unknown') {
      errors.push({ row: rowNumber, field: cell.text, message: `is not a known column, so "${shorten(text)}" would be lost; check its spelling against the template` });
      return;
    }
    filled.set(cell.column.name, [...(filled.get(cell.column.name) ?? []), index]);
    if ((filled.get(cell.column.name) ?? []).length > 1) return;
    const value = readCell(cell.column, text);
    if (value.ok) setAt(input, cell.column.path, value.value);
    else errors.push({ row: rowNumber, field: cell.column.name, message: value.message });
  });
  // The objects every spec must have are always there, so a missing required figure is named at its own column.
  for (const column of SPEC_CSV_COLUMNS) {
    if (column.required && column.path.length > 1) ensureObject(input, column.path.slice(0, -1));
  }
  for (const [name, indexes] of filled) {
    if (indexes.length > 1) errors.push({ row: rowNumber, field: name, message: `is filled in more than one column (${indexes.map(columnLetter).join(', ')}): keep one` });
  }
  return { input, errors };
}

/** Builds the header cells of a column-name list (for callers outside this module, and tests). */
export function headerFrom(names: readonly string[]): HeaderCell[] {
  return names.map((name) => {
    const trimmed = name.trim();
    if (trimmed === '') return { kind: 'empty' };
    const column = columnNamed(trimmed);
    return column ? { kind: 'column', column } : { kind: 'unknown', text: trimmed };
  });
}

type CellReading = { ok: true; value: unknown } | { ok: false; message: string };

const TRUE_WORDS = new Set(['true', 'yes', 'y', '1']);
const FALSE_WORDS = new Set(['false', 'no', 'n', '0']);

/** One non-empty cell, read by its column's kind: quantities through the unit parser, in the column's unit. */
export function readCell(column: SpecColumn, text: string): CellReading {
  switch (column.kind) {
    case 'number':
    case 'integer': {
      const parsed = parseQuantity(text, column.unit);
      if (parsed.ok) return parsed;
      return { ok: false, message: quotedReading(text, parsed.message) };
    }
    case 'boolean': {
      const word = text.toLowerCase();
      if (TRUE_WORDS.has(word)) return { ok: true, value: true };
      if (FALSE_WORDS.has(word)) return { ok: true, value: false };
      return { ok: false, message: `must be true or false (also yes/no, 1/0), got "${shorten(text)}"` };
    }
    case 'list':
      return { ok: true, value: text.split(/[\s,;]+/).filter((word) => word !== '') };
    case 'string':
      return { ok: true, value: text };
  }
}

function ensureObject(target: Record<string, unknown>, path: readonly string[]): Record<string, unknown> {
  let node = target;
  for (const key of path) {
    if (typeof node[key] !== 'object' || node[key] === null) node[key] = {};
    node = node[key] as Record<string, unknown>;
  }
  return node;
}

function setAt(target: Record<string, unknown>, path: readonly string[], value: unknown): void {
  ensureObject(target, path.slice(0, -1))[path[path.length - 1]] = value;
}

/** The unit parser's message with the cell's text in front: '"12 A" has an unexpected unit …', '"60 kdB": dB takes no prefix …'. */
function quotedReading(text: string, message: string): string {
  if (message.startsWith('"')) return message;
  return /^(has|is) /.test(message) ? `"${shorten(text)}" ${message}` : `"${shorten(text)}": ${message}`;
}

function shorten(text: string): string {
  return text.length > 40 ? `${text.slice(0, 40)}…` : text;
}

// ---------------------------------------------------------------------------------------------
// JSON

const isPlainObject = (value: unknown): value is Record<string, unknown> => typeof value === 'object' && value !== null && !Array.isArray(value);

function readJson(text: string): RawReading {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    return { ok: false, message: `is not valid JSON (${(error as Error).message})` };
  }
  let items: unknown[];
  if (Array.isArray(data)) items = data;
  else if (isPlainObject(data) && Array.isArray(data.specs)) {
    const others = Object.keys(data).filter((key) => key !== 'specs');
    if (others.length > 0) return { ok: false, message: `may hold only "specs" at the top level, not ${others.map((k) => JSON.stringify(k)).join(', ')}` };
    items = data.specs;
  } else return { ok: false, message: 'must hold an array of specs, or an object { "specs": [ … ] }' };
  return { ok: true, headerErrors: [], rows: items.map((item, index) => jsonItemToInput(item, index + 1)) };
}

/** A JSON item: a spec document (its title inside), or { title, payload } as the spec routes take it. */
function jsonItemToInput(item: unknown, rowNumber: number): RawRow {
  if (!isPlainObject(item)) {
    return { row: rowNumber, input: item, errors: [{ row: rowNumber, field: '', message: `must be an object (a spec), got ${Array.isArray(item) ? 'an array' : JSON.stringify(item)}` }] };
  }
  if (!('payload' in item)) return { row: rowNumber, input: item, errors: [] };
  const errors: ImportIssue[] = Object.keys(item)
    .filter((key) => key !== 'title' && key !== 'payload')
    .map((key) => ({ row: rowNumber, field: key, message: 'is not a known field beside "title" and "payload"' }));
  if (!isPlainObject(item.payload)) {
    errors.push({ row: rowNumber, field: 'payload', message: 'must be an object (the spec document)' });
    return { row: rowNumber, input: {}, errors };
  }
  const input = typeof item.title === 'string' ? { ...item.payload, title: item.title } : item.payload;
  return { row: rowNumber, input, errors };
}

// ---------------------------------------------------------------------------------------------
// Validation

/**
 * "/supply/positiveV" -> "supply.positiveV"; in a CSV, an item of a list is reported at its
 * column, and a group that has no column of its own (a missing `device.pnp`) at its first column.
 */
function fieldOf(pointer: string, format: SpecFileFormat): string {
  const segments = pointer
    .split('/')
    .slice(1)
    .map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'));
  const dotted = segments.join('.');
  if (format === 'json') return dotted;
  const firstOfGroup = columnNamed(dotted) ? undefined : SPEC_CSV_COLUMNS.find((c) => c.name.startsWith(`${dotted}.`));
  if (firstOfGroup) return firstOfGroup.name;
  for (let n = segments.length; n > 0; n -= 1) {
    const column = columnNamed(segments.slice(0, n).join('.'));
    if (column) return column.name;
  }
  return dotted;
}

function validateRow(raw: RawRow, format: SpecFileFormat): SpecFileRow {
  const input = isPlainObject(raw.input) && typeof raw.input.title === 'string' ? { ...raw.input, title: raw.input.title.trim() } : raw.input;
  const title = isPlainObject(input) && typeof input.title === 'string' && input.title !== '' ? input.title : null;
  if (!isPlainObject(input)) return { row: raw.row, title: null, document: null, errors: raw.errors };
  const result = validateSpec(input);
  const errors = [...raw.errors];
  if (!result.ok) {
    const alreadySaid = new Set(raw.errors.map((e) => e.field));
    for (const issue of result.errors) {
      const field = fieldOf(issue.path, format);
      if (!alreadySaid.has(field)) errors.push({ row: raw.row, field, message: issue.message });
    }
  }
  if (raw.order) {
    const position = (field: string) => (field === '' ? -1 : (raw.order!.get(field) ?? Number.MAX_SAFE_INTEGER));
    errors.sort((a, b) => position(a.field) - position(b.field)); // stable: one field's problems keep their order
  }
  return { row: raw.row, title, document: result.ok && errors.length === 0 ? result.value : null, errors };
}

/** A title given twice in one file: the later rows are refused (which one was meant is not for the server to guess). */
function markRepeatedTitles(rows: SpecFileRow[]): void {
  const first = new Map<string, number>();
  for (const row of rows) {
    if (row.title === null) continue;
    const earlier = first.get(row.title);
    if (earlier === undefined) {
      first.set(row.title, row.row);
      continue;
    }
    row.errors.push({ row: row.row, field: 'title', message: `repeats the title of row ${earlier}: a file holds each spec once` });
    row.document = null;
  }
}
