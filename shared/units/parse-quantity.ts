/**
 * Reads a quantity as engineers type it in a form ("4k7", "10µ", "2 pF", "-12 V", "1meg",
 * "2.2e-3", "68kΩ", "4.7 pf", "60 mw") into an SI number. Pure; the form shows the value
 * understood before saving, and warns when it is implausible for the field (`plausibility.ts`).
 */
import { PREFIX_SPELLINGS, startsWithSpelling } from './si-prefixes';
import { spellsUnit, spellsUnitIgnoringCase, unitSymbolFor, type UnitSymbol } from './unit-symbols';

/** The number read, in SI units, or why the text could not be read. */
export type ParseQuantityResult = { ok: true; value: number } | { ok: false; message: string };

/** A plain decimal number with an optional exponent, then the rest of the text. */
const NUMBER_PATTERN = /^([+-]?)(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?\s*(.*)$/;
/** "4k7": digits, a prefix standing for the decimal point, digits (common practice, IEC 60062 style). */
const INFIX_PATTERN = /^([+-]?)(\d+)([^\d\s.]+)(\d+)\s*(.*)$/;

/** A prefix exponent and the unit text left after it, or an error message. */
type SuffixReading = { ok: true; exponent: number } | { ok: false; message: string };

/**
 * Parses `text` to a number in SI units. A unit at the end is accepted when it is `unit` (or one
 * of its spellings) or absent; another unit is an error. "M" is mega and "m" milli (SI, as the
 * forms have always read them), "meg" mega in any case (SPICE), "u" micro; dB, %, °C and ratios
 * take no prefix. Prefix letters are case-sensitive; the unit's letters are not where that is
 * unambiguous: after a prefix ("4.7 pf", "60 mw", "1 MOHM") or alone when they are no prefix
 * ("12 v", "60 w"); a lone "f" or "m" is still femto or milli.
 */
export function parseQuantity(text: string, unit?: string): ParseQuantityResult {
  const normalized = text.trim().replace(/\u2212/g, '-');
  if (normalized === '') return { ok: false, message: 'is empty: enter a number' };
  if (normalized.includes(',')) return { ok: false, message: `"${text}": use a point as the decimal separator` };
  const expected = unit === undefined ? undefined : unitSymbolFor(unit);
  const infix = INFIX_PATTERN.exec(normalized);
  if (infix) {
    const [, sign, whole, mark, fraction, rest] = infix;
    const markExponent = infixExponent(mark, expected);
    if (markExponent !== undefined) {
      const suffix = readSuffix(rest, expected, false);
      if (!suffix.ok) return suffix;
      return finish(`${sign}${whole}.${fraction}e${markExponent + suffix.exponent}`, text);
    }
  }
  const plain = NUMBER_PATTERN.exec(normalized);
  if (!plain) return { ok: false, message: `"${text}" is not a number (examples: ${examplesFor(expected)})` };
  const [, sign, digits, exponentText, rest] = plain;
  const suffix = readSuffix(rest, expected, true);
  if (!suffix.ok) return suffix;
  return finish(`${sign}${digits}e${Number(exponentText ?? 0) + suffix.exponent}`, text);
}

/** Examples of what can be typed, in the field's own unit where it has one. */
function examplesFor(expected: UnitSymbol | undefined): string {
  if (!expected) return '4.7k, 4k7, 2.2e-3, 10 µA';
  if (!expected.takesPrefix) return expected.printed ? `40, 2.5e1, 40 ${expected.printed}` : '40, 2.5e1, 0.04';
  return `4.7k, 4k7, 2.2e-3, 10 µ${expected.printed}`;
}

/** The exponent a mark between digits stands for: a prefix ("4k7"), or "R" for ohms ("4R7"). */
function infixExponent(mark: string, expected: UnitSymbol | undefined): number | undefined {
  if (mark === 'R' && expected?.symbol === 'Ω') return 0;
  return PREFIX_SPELLINGS.find((p) => startsWithSpelling(mark, p) && mark.length === p.spelling.length)?.prefix.exponent;
}

/** The power of ten a scaled spelling of the unit stands for ("V/µs" in V/s: 6), if the text is one. */
function scaledExponent(text: string, expected: UnitSymbol | undefined): number | undefined {
  return expected?.scaledSpellings?.find((scaled) => scaled.spelling === text)?.exponent;
}

/**
 * Reads what follows the number: nothing, the unit (or a scaled spelling of it, "V/µs"), or a
 * prefix and then optionally the unit.
 */
function readSuffix(rest: string, expected: UnitSymbol | undefined, prefixAllowed: boolean): SuffixReading {
  const trimmed = rest.trim();
  if (trimmed === '' || (expected && spellsUnit(trimmed, expected))) return { ok: true, exponent: 0 };
  const scaled = scaledExponent(trimmed, expected);
  if (scaled !== undefined) return { ok: true, exponent: scaled };
  for (const entry of PREFIX_SPELLINGS) {
    if (!startsWithSpelling(trimmed, entry)) continue;
    const spelling = trimmed.slice(0, entry.spelling.length);
    const after = trimmed.slice(entry.spelling.length).trim();
    const afterScaled = scaledExponent(after, expected) ?? 0;
    if (after !== '' && !(expected && spellsUnitIgnoringCase(after, expected)) && afterScaled === 0) continue;
    if (!prefixAllowed) return { ok: false, message: `has a second prefix "${spelling}"` };
    if (expected && !expected.takesPrefix) {
      return { ok: false, message: `${expected.symbol} takes no prefix: "${spelling}" is not allowed` };
    }
    return { ok: true, exponent: entry.prefix.exponent + afterScaled };
  }
  if (expected && spellsUnitIgnoringCase(trimmed, expected)) return { ok: true, exponent: 0 };
  const wanted = expected ? `expected ${expected.printed || 'a plain number'}` : 'expected a plain number';
  return { ok: false, message: `has an unexpected unit "${trimmed}": ${wanted}` };
}

/** Converts the assembled decimal text (correctly rounded) and rejects overflow. */
function finish(decimal: string, original: string): ParseQuantityResult {
  const value = Number(decimal);
  if (!Number.isFinite(value)) return { ok: false, message: `"${original}" is out of range` };
  return { ok: true, value: Object.is(value, -0) ? 0 : value };
}
