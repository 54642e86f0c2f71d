/**
 * Text for the figures the ranking shows: decibels and percentages with one decimal, margins
 * with their sign, everything else in engineering notation through shared/units.
 */
import { formatQuantity } from '../../../shared/units/format-quantity';

/** Typeset minus sign, as formatQuantity writes it. */
const MINUS = '\u2212';

/** A number with a fixed count of decimals and a typeset minus ("−3.2"); "-0.0" shows as "0.0". */
export function formatFixed(value: number, decimals: number): string {
  return fixed(value, decimals);
}

function fixed(value: number, decimals: number): string {
  const text = Math.abs(value).toFixed(decimals);
  return value < 0 && Number(text) !== 0 ? `${MINUS}${text}` : text;
}

/** "101.8 dB". */
export function formatDb(valueDb: number): string {
  return `${fixed(valueDb, 1)} dB`;
}

/** "99.5 %" (one decimal, trailing ".0" dropped). */
export function formatPercent(valuePercent: number): string {
  return `${fixed(valuePercent, 1).replace(/\.0$/, '')} %`;
}

/** A plain figure in engineering notation, e.g. "2.32 kΩ", "960 µA"; dB and % with one decimal. */
export function formatFigure(value: number, unit: string, digits = 3): string {
  if (unit === 'dB') return formatDb(value);
  if (unit === '%') return formatPercent(value);
  return formatQuantity(value, unit, digits);
}

/**
 * A margin with its sign ("+17.8 dB", "−302 mV", "+7.1 pp"): how far on the good side, negative
 * when short. A margin between two percentages (a yield against its requirement, an error against
 * its tolerance) is a difference of percentage points: "pp", never "%" (which would read as a
 * share of the figure).
 */
export function formatMargin(value: number, unit: string | undefined): string {
  const text = unit === '%' ? `${fixed(Math.abs(value), 1).replace(/\.0$/, '')} pp` : formatFigure(Math.abs(value), unit ?? '1');
  if (value === 0) return text;
  return `${value > 0 ? '+' : MINUS}${text}`;
}

/** A spec's own figure in dB, as written ("78 dB", "84.5 dB"): trailing ".0" dropped. */
export function formatTargetDb(valueDb: number): string {
  return formatDb(valueDb).replace(/\.0 dB$/, ' dB');
}

/** A signed deviation in per cent with one decimal: "+0.9 %", "−1.1 %", "0.0 %". */
export function formatDeviationPercent(valuePercent: number): string {
  const text = Math.abs(valuePercent).toFixed(1);
  if (Number(text) === 0) return '0.0 %';
  return `${valuePercent > 0 ? '+' : MINUS}${text} %`;
}

/** A plain number with `digits` significant digits, zeros kept ("23.0", "6.29", "177"); engineering form past 1000. */
export function formatSignificant(value: number, digits = 3): string {
  if (Math.abs(value) >= 10 ** digits) return formatQuantity(value, '1', digits);
  const text = value.toPrecision(digits);
  return text.startsWith('-') ? `${MINUS}${text.slice(1)}` : text;
}
