/**
 * Prints an SI number in engineering notation with an SI prefix: "4.7 kΩ", "120 µA", "−12 V".
 * Formatting is the edges' job (forms, reports), never the engine's.
 */
import { prefixForExponent } from './si-prefixes';
import { unitSymbolFor } from './unit-symbols';

/** Unicode MINUS SIGN for negative quantities, as typeset text uses it (common practice). */
const MINUS = '\u2212';

/**
 * Formats `value` (SI) with `digits` significant digits (default 3), trailing zeros trimmed.
 * Units that take prefixes get the prefix that leaves a mantissa in [1, 1000); outside femto..tera,
 * or for units without prefixes (dB, %, °C, ratios), the plain number (exponent form if huge or tiny).
 */
export function formatQuantity(value: number, unit: string, digits = 3): string {
  const symbol = unitSymbolFor(unit);
  const withUnit = (number: string) => (symbol.printed === '' ? number : `${number} ${symbol.printed}`);
  if (Number.isNaN(value)) return withUnit('NaN');
  if (!Number.isFinite(value)) return withUnit(value > 0 ? '∞' : `${MINUS}∞`);
  const sign = value < 0 ? MINUS : '';
  const magnitude = Math.abs(value);
  if (magnitude === 0) return withUnit('0');
  if (symbol.takesPrefix) {
    const exponent = engineeringExponent(magnitude, digits);
    const prefix = prefixForExponent(exponent) ?? (exponent === 0 ? { symbol: '' } : undefined);
    if (prefix) {
      const mantissa = roundedText(magnitude / 10 ** exponent, digits);
      return `${sign}${mantissa} ${prefix.symbol}${symbol.printed}`.trimEnd();
    }
  }
  return withUnit(sign + plainNumber(magnitude, digits));
}

/** The multiple of 3 that puts the value, once rounded to `digits`, in [1, 1000). */
function engineeringExponent(magnitude: number, digits: number): number {
  const rounded = Number(magnitude.toPrecision(digits));
  return 3 * Math.floor(Math.floor(Math.log10(rounded) + 1e-12) / 3);
}

/** A positive number rounded to `digits`, in exponent form only below 1e-3 or from 1e6 on. */
function plainNumber(magnitude: number, digits: number): string {
  const rounded = Number(magnitude.toPrecision(digits));
  if (rounded >= 1e-3 && rounded < 1e6) return String(rounded);
  const [mantissa, exponent] = rounded.toExponential(digits - 1).split('e');
  return `${roundedText(Number(mantissa), digits)}e${Number(exponent)}`;
}

/** Rounded to `digits` significant digits, shortest decimal text, so trailing zeros go ("4.70" -> "4.7"). */
function roundedText(value: number, digits: number): string {
  return String(Number(value.toPrecision(digits)));
}
