/**
 * The CSV column set of a requirement spec, derived from the spec schema (shared/schema, the
 * single source of truth): one column per leaf field, named by its dotted path ("supply.positiveV",
 * "cmrr.minDb"), with the field's unit (`x-unit`), default and allowed values. The same list
 * writes the downloadable template and the documented column table. Pure.
 */
import { SPEC_SCHEMA } from '../validate';
import { unitSymbolFor } from '../units/unit-symbols';

type SchemaNode = Record<string, unknown>;

/** How a cell is read: a quantity, a whole count, a word, yes/no, or a list of words. */
export type SpecColumnKind = 'number' | 'integer' | 'string' | 'boolean' | 'list';

/** One column of the spec CSV. */
export interface SpecColumn {
  /** Dotted path of the field in the spec document, as written in the header ("gain.target"). */
  name: string;
  /** The same path as property names. */
  path: readonly string[];
  kind: SpecColumnKind;
  /** The schema's title and description of the field. */
  title: string;
  description: string;
  /** The field's SI unit (`x-unit`), when it has one ("V", "Hz", "dB", "1" for a pure number). */
  unit?: string;
  /** Whether a spec must give it (the field and every object above it are required). */
  required: boolean;
  /** The schema default, filled in when the cell is empty. */
  default?: unknown;
  /** The words the cell may hold (enumerations, a constant, or the items of a list). */
  allowed?: readonly string[];
  /** An example value from the schema, for required fields without a default. */
  example?: unknown;
}

/** Every leaf field of the spec schema, in schema order. */
export const SPEC_CSV_COLUMNS: readonly SpecColumn[] = collectColumns(SPEC_SCHEMA as SchemaNode, [], true);

/**
 * Columns of older files, still read (not in the template or the column table): each fills the
 * older field, which validateSpec converts (shared/validation/spec-upgrade.ts).
 */
export const LEGACY_CSV_COLUMNS: readonly SpecColumn[] = [
  {
    name: 'resistors.tolerance',
    path: ['resistors', 'tolerance'],
    kind: 'number',
    title: 'Resistor tolerance (as a fraction)',
    description: 'Older files: the resistor tolerance as a fraction, 0.01 for ±1 %; today the column is resistors.tolerancePercent, in per cent.',
    unit: '1',
    required: false,
  },
];

/** Columns by lower-cased name: headers are matched without regard to case. */
const BY_LOWER_NAME = new Map([...SPEC_CSV_COLUMNS, ...LEGACY_CSV_COLUMNS].map((column) => [column.name.toLowerCase(), column]));

/** The column a header cell names (case-insensitive, surrounding blanks ignored), if any. */
export function columnNamed(header: string): SpecColumn | undefined {
  return BY_LOWER_NAME.get(header.trim().toLowerCase());
}

function collectColumns(node: SchemaNode, path: string[], required: boolean): SpecColumn[] {
  const properties = (node.properties ?? {}) as Record<string, SchemaNode>;
  const requiredNames = new Set((node.required ?? []) as string[]);
  return Object.entries(properties).flatMap(([key, child]) => {
    const childPath = [...path, key];
    const childRequired = required && requiredNames.has(key);
    if (child.type === 'object') return collectColumns(child, childPath, childRequired);
    return [leafColumn(child, childPath, childRequired)];
  });
}

function leafColumn(node: SchemaNode, path: string[], required: boolean): SpecColumn {
  const kind = columnKind(node);
  const items = node.items as SchemaNode | undefined;
  const allowed = (node.enum ?? (node.const !== undefined ? [node.const] : undefined) ?? items?.enum) as string[] | undefined;
  const examples = node.examples as unknown[] | undefined;
  return {
    name: path.join('.'),
    path,
    kind,
    title: String(node.title ?? path.at(-1)),
    description: String(node.description ?? ''),
    ...(typeof node['x-unit'] === 'string' ? { unit: node['x-unit'] } : {}),
    required,
    ...(node.default !== undefined ? { default: node.default } : {}),
    ...(allowed ? { allowed } : {}),
    ...(examples?.length ? { example: examples[0] } : {}),
  };
}

function columnKind(node: SchemaNode): SpecColumnKind {
  switch (node.type) {
    case 'number':
      return 'number';
    case 'integer':
      return 'integer';
    case 'boolean':
      return 'boolean';
    case 'array':
      return 'list';
    case 'string':
      return 'string';
    default:
      throw new Error(`The spec schema has a field of a type the CSV cannot hold: ${JSON.stringify(node.type)}`);
  }
}

/** A value as a CSV cell writes it: numbers in SI as JavaScript prints them, lists space-separated. */
export function cellText(value: unknown): string {
  if (value === undefined || value === null) return '';
  if (Array.isArray(value)) return value.map(String).join(' ');
  return String(value);
}

/** One CSV field (RFC 4180): quoted when it holds a comma, a quote or a line break. */
function field(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The title of the template's example row. */
export const TEMPLATE_EXAMPLE_TITLE = 'Example spec (replace this row)';

/**
 * The downloadable template: the header, then one example row that is a valid spec (the required
 * fields from the schema's examples, every optional cell empty so its default applies). RFC 4180.
 */
export function specCsvTemplate(): string {
  const header = SPEC_CSV_COLUMNS.map((c) => field(c.name));
  const example = SPEC_CSV_COLUMNS.map((c) => {
    if (c.name === 'title') return field(TEMPLATE_EXAMPLE_TITLE);
    return c.required ? field(cellText(c.example ?? c.default)) : '';
  });
  return `${header.join(',')}\r\n${example.join(',')}\r\n`;
}

/** How a column's cell is written, for the documentation table. */
function cellHint(column: SpecColumn): string {
  const unit = column.unit ? unitSymbolFor(column.unit) : undefined;
  switch (column.kind) {
    case 'number':
      if (!unit || unit.printed === '') return 'number';
      return unit.takesPrefix ? `number in ${unit.printed}; an SI prefix and the unit may follow ("10m", "4k7", "2.2 µ${unit.printed}")` : `number in ${unit.printed}, no prefix`;
    case 'integer':
      return 'whole number';
    case 'boolean':
      return 'true or false (also yes/no, 1/0)';
    case 'list':
      return `words separated by spaces, commas or semicolons: ${(column.allowed ?? []).join(', ')}`;
    case 'string':
      return column.allowed ? `one of ${column.allowed.join(', ')}` : 'text';
  }
}

const cell = (text: string) => text.replace(/\|/g, '\\|').replace(/\r?\n/g, ' ');

/** The column table as Markdown (docs/spec-csv-columns.md is this text; a test keeps it current). */
export function specCsvColumnsMarkdown(): string {
  const lines = [
    '# Spec CSV columns',
    '',
    '<!-- Generated from shared/schema/spec.schema.json by `npm run generate:csv-columns`; do not edit by hand. -->',
    '',
    'One row per requirement spec, the header on row 1. Columns may come in any order and any may be',
    'left out; an empty cell means the field is absent, so the schema default applies (a required',
    'field left empty is reported). Quantities are in SI units; the unit parser also reads engineering',
    'notation ("4k7", "10u", "-12 V", "2 pF") in the column\'s own unit. A header that is not listed',
    'here is reported on every row that fills it. Figures computed from these specs are estimates to',
    'confirm by simulation and bench measurement.',
    '',
    '| Column | Unit | Required | Default | Cell | Meaning |',
    '|---|---|---|---|---|---|',
  ];
  for (const column of SPEC_CSV_COLUMNS) {
    const unit = column.unit ? unitSymbolFor(column.unit).printed || '(number)' : '';
    const fallback = column.default === undefined ? '' : cellText(column.default) || '(empty)';
    lines.push(
      `| \`${column.name}\` | ${cell(unit)} | ${column.required ? 'yes' : ''} | ${cell(fallback)} | ${cell(cellHint(column))} | ${cell(`${column.title}: ${column.description}`)} |`,
    );
  }
  return `${lines.join('\n')}\n`;
}
