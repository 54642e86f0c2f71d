/**
 * The one figure formatter for text people read: decibels, per cent, percentage points, signed
 * margins and differences, tolerances, size ratios. The app's tables and charts, the report, the measurement
 * comparison, the audit trail and the reason templates all print figures through it, so a figure
 * reads the same everywhere. Formatting is the edges' job, never the engine's.
 *
 * Digits come from `Intl.NumberFormat` (en-US, no grouping) with its `signDisplay`: `negative`
 * for a figure (a minus only when the printed figure is not zero: −0.01 dB prints "0.0 dB"),
 * `exceptZero` for a margin or a difference (a plus or a minus unless it prints as zero:
 * "+17.8 dB", "−1.1 %", "0.0 %"). Negative figures take the typeset minus U+2212, as
 * `formatQuantity` writes them. Numbers are rounded as JavaScript's `toFixed` and `toPrecision`
 * round the stored double (1.005 is 1.00499… and prints "1.00"), then handed to Intl as that
 * decimal text, so Intl only lays out the digits and the sign.
 */
import { formatQuantity } from './format-quantity';

/** Unicode MINUS SIGN, as typeset text and `formatQuantity` use it. */
export const MINUS = '\u2212';

/** When a sign is printed: `negative` for figures, `exceptZero` for margins and differences (Intl's names). */
export type SignDisplay = 'negative' | 'exceptZero';

export interface FixedOptions {
  /** Which signs print; `negative` by default. */
  sign?: SignDisplay;
  /** Trailing zeros of the decimals dropped ("100 %", "84.5 dB"); kept by default ("0.0 dB"). */
  trimZeros?: boolean;
}

const numberFormats = new Map<string, Intl.NumberFormat>();

function numberFormat(options: Intl.NumberFormatOptions): Intl.NumberFormat {
  const key = JSON.stringify(options);
  let format = numberFormats.get(key);
  if (!format) {
    format = new Intl.NumberFormat('en-US', { useGrouping: false, ...options });
    numberFormats.set(key, format);
  }
  return format;
}

/** Intl's text for an exact decimal (a string, so Intl does not round it again), with the typeset minus. */
function laidOut(format: Intl.NumberFormat, decimal: string): string {
  // Intl.NumberFormat reads a decimal string exactly (ECMA-402, Intl.NumberFormat v3).
  return format
    .formatToParts(decimal as unknown as number)
    .map((part) => (part.type === 'minusSign' ? MINUS : part.value))
    .join('');
}

/** A number with a fixed count of decimals: "−3.2", "0.0" for −0.01; signs as `options.sign`. */
export function formatFixed(value: number, decimals: number, options: FixedOptions = {}): string {
  if (!Number.isFinite(value)) return `${value < 0 ? MINUS : value > 0 && options.sign === 'exceptZero' ? '+' : ''}${Math.abs(value)}`;
  const format = numberFormat({
    minimumFractionDigits: options.trimZeros ? 0 : decimals,
    maximumFractionDigits: decimals,
    signDisplay: options.sign ?? 'negative',
  });
  return laidOut(format, value.toFixed(decimals));
}

/** The sign a figure prints with at `digits` significant digits: "+", MINUS or "" (zero). */
function signOf(value: number, digits: number): string {
  const parts = numberFormat({ maximumSignificantDigits: digits, signDisplay: 'exceptZero' }).formatToParts(value.toPrecision(digits) as unknown as number);
  const sign = parts.find((part) => part.type === 'plusSign' || part.type === 'minusSign');
  return sign === undefined ? '' : sign.type === 'minusSign' ? MINUS : '+';
}

/** "101.8 dB" (one decimal by default); with `sign: 'exceptZero'` a difference: "+0.4 dB", "−2.3 dB". */
export function formatDb(valueDb: number, options: FixedOptions & { decimals?: number } = {}): string {
  return `${formatFixed(valueDb, options.decimals ?? 1, options)} dB`;
}

/** A spec's own figure in dB, as written ("78 dB", "84.5 dB"): one decimal, trailing ".0" dropped. */
export function formatTargetDb(valueDb: number): string {
  return formatDb(valueDb, { trimZeros: true });
}

/** "99.5 %", "100 %" (one decimal, trailing ".0" dropped by default). */
export function formatPercent(valuePercent: number, options: FixedOptions & { decimals?: number } = {}): string {
  return `${formatFixed(valuePercent, options.decimals ?? 1, { trimZeros: true, ...options })} %`;
}

/** A signed deviation in per cent with one decimal: "+0.9 %", "−1.1 %", "0.0 %". */
export function formatDeviationPercent(valuePercent: number): string {
  return formatPercent(valuePercent, { sign: 'exceptZero', trimZeros: false });
}

/** A plain figure in engineering notation, e.g. "2.32 kΩ", "960 µA"; dB and % with one decimal. */
export function formatFigure(value: number, unit: string, digits = 3): string {
  if (unit === 'dB') return formatDb(value);
  if (unit === '%') return formatPercent(value);
  return formatQuantity(value, unit, digits);
}

/** A signed quantity in engineering notation: "+6.77 mW", "−302 mV", "0 V" (no sign at zero). */
export function formatSignedQuantity(value: number, unit: string, digits = 3): string {
  if (!Number.isFinite(value)) return formatQuantity(value, unit, digits);
  return `${signOf(value, digits)}${formatQuantity(Math.abs(value), unit, digits)}`;
}

/**
 * A margin with its sign ("+17.8 dB", "−302 mV", "+7.1 pp"): how far on the good side, negative
 * when short; no sign when it prints as zero. A margin between two percentages (a yield against
 * its requirement, an error against its tolerance) is a difference of percentage points: "pp",
 * never "%" (which would read as a share of the figure).
 */
export function formatMargin(value: number, unit: string | undefined): string {
  if (unit === '%') return `${formatFixed(value, 1, { sign: 'exceptZero', trimZeros: true })} pp`;
  if (unit === 'dB') return formatDb(value, { sign: 'exceptZero' });
  return formatSignedQuantity(value, unit ?? '1');
}

/** The tolerance a figure is held to: in % and dB as written ("±3 %", "±1.5 dB"), else in engineering notation ("±50 mV"). */
export function formatTolerance(tolerance: number, unit: string): string {
  if (unit === '%' || unit === 'dB') return `±${String(tolerance)} ${unit}`;
  return `±${formatQuantity(tolerance, unit)}`;
}

/** A ratio of sizes (an emitter area over a unit transistor's): "8×", "1.5×", never a unit of its own. */
export function formatRatio(value: number, digits = 3): string {
  return `${formatQuantity(value, '1', digits)}×`;
}

/** A plain number with `digits` significant digits, zeros kept ("23.0", "6.29", "177"); engineering form past 1000. */
export function formatSignificant(value: number, digits = 3): string {
  if (Math.abs(value) >= 10 ** digits) return formatQuantity(value, '1', digits);
  const text = value.toPrecision(digits);
  return text.startsWith('-') ? `${MINUS}${text.slice(1)}` : text;
}
