/**
 * Whether a value read from a form is plausible for its field: each quantity field may declare
 * the range its values usually fall in (`x-typical: { min, max }` in shared/schema, in the
 * field's SI unit). Outside it the value is still allowed (the schema's minimum and maximum
 * decide that); the form shows a note with the value understood, and, when the value would fall
 * inside the range with M read as m (or m as M), says so: "60M" in a watt field is 60 MW in SI,
 * where SPICE habit means milli.
 */
import { formatQuantity } from './format-quantity';

/** The range a field's values usually fall in, in its SI unit; either end may be absent. */
export interface TypicalRange {
  min?: number;
  max?: number;
}

/** Mega over milli: the factor between reading M as mega and as milli. */
const MEGA_OVER_MILLI = 1e9;

/** The typical range a schema node declares (`x-typical`), if any. */
export function typicalRangeOf(schema: object | undefined): TypicalRange | undefined {
  const typical = (schema as Record<string, unknown> | undefined)?.['x-typical'];
  if (!typical || typeof typical !== 'object') return undefined;
  const { min, max } = typical as Record<string, unknown>;
  return { min: typeof min === 'number' ? min : undefined, max: typeof max === 'number' ? max : undefined };
}

function inside(magnitude: number, typical: TypicalRange): boolean {
  return (typical.min === undefined || magnitude >= typical.min) && (typical.max === undefined || magnitude <= typical.max);
}

/**
 * A note when `value` (SI, in `unit`) lies outside the field's typical range, else null. Zero is
 * never flagged (fields that take 0 mean "none" by it). Example: 6e7 W with a range up to 10 W
 * gives "60 MW is far above the usual for this field (up to 10 W); M is mega: for 60 mW type 60m".
 */
export function plausibilityNote(value: number, unit: string, typical: TypicalRange | undefined): string | null {
  if (!typical || !Number.isFinite(value) || value === 0) return null;
  const magnitude = Math.abs(value);
  if (inside(magnitude, typical)) return null;
  const shown = formatQuantity(value, unit, 4);
  if (typical.max !== undefined && magnitude > typical.max) {
    const usual = `up to ${formatQuantity(typical.max, unit, 3)}`;
    const milli = value / MEGA_OVER_MILLI;
    const hint = inside(Math.abs(milli), typical) ? `; M is mega: for ${formatQuantity(milli, unit, 4)} type m (milli)` : '';
    return `${shown} is far above the usual for this field (${usual})${hint}`;
  }
  const usual = `from ${formatQuantity(typical.min ?? 0, unit, 3)}`;
  const mega = value * MEGA_OVER_MILLI;
  const hint = inside(Math.abs(mega), typical) ? `; m is milli: for ${formatQuantity(mega, unit, 4)} type M (mega)` : '';
  return `${shown} is far below the usual for this field (${usual})${hint}`;
}
