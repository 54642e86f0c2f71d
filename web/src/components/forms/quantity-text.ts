/**
 * Quantities as people type them in a form field: reading typed text ("4k7", "10u", "-12 V")
 * into an SI number with shared/units, and writing a stored SI number back as short text.
 */
import { formatQuantity } from '#shared/units/format-quantity';
import { parseQuantity } from '#shared/units/parse-quantity';
import { unitSymbolFor } from '#shared/units/unit-symbols';

/** Every message about unreadable text starts so; the field's own widget shows it (see FieldErrors). */
export const UNREADABLE_PREFIX = 'cannot read ';

/** Significant digits of the value shown back ("= 4.753 kΩ"): enough to show what was understood. */
const READING_DIGITS = 6;

export type QuantityReading = { kind: 'empty' } | { kind: 'value'; value: number } | { kind: 'unreadable'; message: string };

/** The unit's printed name in messages: "V", "kΩ"…, or "a plain number" for dimensionless fields. */
function unitWords(unit: string): string {
  const printed = unitSymbolFor(unit).printed;
  return printed === '' ? 'as a plain number' : `as a quantity in ${printed}`;
}

/** Reads typed text as a quantity in `unit` (the schema's x-unit); empty text is "empty", not an error. */
export function readQuantity(text: string, unit: string): QuantityReading {
  if (text.trim() === '') return { kind: 'empty' };
  const parsed = parseQuantity(text, unit);
  if (parsed.ok) return { kind: 'value', value: parsed.value };
  // The parser's own words help with a comma or a wrong unit; a plain "not a number" gets examples
  const why = parsed.message.includes('is not a number') ? 'try 4.7k, 4k7, 10u or 2e-3' : parsed.message.replace(/^"[^"]*"\s*:?\s*/, '');
  return { kind: 'unreadable', message: `${UNREADABLE_PREFIX}'${text.trim()}' ${unitWords(unit)} (${why})` };
}

/** What was understood, formatted: "= 4.7 kΩ", "= −12 V". */
export function readingText(value: number, unit: string): string {
  return `= ${formatQuantity(value, unit, READING_DIGITS)}`;
}

/** Drops binary noise (0.1 + 0.2) so the text shows what a person would have typed. */
function tidy(value: number): string {
  return String(Number(value.toPrecision(12)));
}

/**
 * A stored SI value as the text the field starts with, without the unit (shown beside the
 * field): plain between 0.1 and 1000 ("0.65", "-12"), else with a prefix ("4.7k", "10µ", "2p").
 */
export function quantityText(value: number | undefined | null, unit: string): string {
  if (value === undefined || value === null || !Number.isFinite(value)) return '';
  const magnitude = Math.abs(value);
  if (!unitSymbolFor(unit).takesPrefix || magnitude === 0 || (magnitude >= 0.1 && magnitude < 1000)) return tidy(value);
  const printed = unitSymbolFor(unit).printed;
  const formatted = formatQuantity(value, unit, 12).replace(/\u2212/g, '-');
  const withoutUnit = formatted.endsWith(printed) ? formatted.slice(0, formatted.length - printed.length) : formatted;
  return withoutUnit.replace(/\s+/g, '');
}

/** The unit symbol shown beside the input ("" for a plain number). */
export function unitLabel(unit: string): string {
  return unitSymbolFor(unit).printed;
}
