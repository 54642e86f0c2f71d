/**
 * Preferred-number series E24, E96 and E192 for resistors [IEC60063], one decade each (values in
 * [1, 10)), and snapping a value to the nearest member across decades.
 */
import type { ResistorSeries } from '../engine/types';

/**
 * One decade of each series [IEC60063]. E24 keeps its historical values (2.7 ... 9.1), which
 * differ from round(10^(i/24), 1); E96 and E192 are round(10^(i/n), 2), except E192's 9.20
 * where the formula gives 9.19. Written out as data so a reviewer can compare with the standard.
 */
export const E_SERIES: Readonly<Record<ResistorSeries, readonly number[]>> = {
  E24: [
    1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0,
    3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
  ],
  E96: [
    1.00, 1.02, 1.05, 1.07, 1.10, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.30,
    1.33, 1.37, 1.40, 1.43, 1.47, 1.50, 1.54, 1.58, 1.62, 1.65, 1.69, 1.74,
    1.78, 1.82, 1.87, 1.91, 1.96, 2.00, 2.05, 2.10, 2.15, 2.21, 2.26, 2.32,
    2.37, 2.43, 2.49, 2.55, 2.61, 2.67, 2.74, 2.80, 2.87, 2.94, 3.01, 3.09,
    3.16, 3.24, 3.32, 3.40, 3.48, 3.57, 3.65, 3.74, 3.83, 3.92, 4.02, 4.12,
    4.22, 4.32, 4.42, 4.53, 4.64, 4.75, 4.87, 4.99, 5.11, 5.23, 5.36, 5.49,
    5.62, 5.76, 5.90, 6.04, 6.19, 6.34, 6.49, 6.65, 6.81, 6.98, 7.15, 7.32,
    7.50, 7.68, 7.87, 8.06, 8.25, 8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76,
  ],
  E192: [
    1.00, 1.01, 1.02, 1.04, 1.05, 1.06, 1.07, 1.09, 1.10, 1.11, 1.13, 1.14,
    1.15, 1.17, 1.18, 1.20, 1.21, 1.23, 1.24, 1.26, 1.27, 1.29, 1.30, 1.32,
    1.33, 1.35, 1.37, 1.38, 1.40, 1.42, 1.43, 1.45, 1.47, 1.49, 1.50, 1.52,
    1.54, 1.56, 1.58, 1.60, 1.62, 1.64, 1.65, 1.67, 1.69, 1.72, 1.74, 1.76,
    1.78, 1.80, 1.82, 1.84, 1.87, 1.89, 1.91, 1.93, 1.96, 1.98, 2.00, 2.03,
    2.05, 2.08, 2.10, 2.13, 2.15, 2.18, 2.21, 2.23, 2.26, 2.29, 2.32, 2.34,
    2.37, 2.40, 2.43, 2.46, 2.49, 2.52, 2.55, 2.58, 2.61, 2.64, 2.67, 2.71,
    2.74, 2.77, 2.80, 2.84, 2.87, 2.91, 2.94, 2.98, 3.01, 3.05, 3.09, 3.12,
    3.16, 3.20, 3.24, 3.28, 3.32, 3.36, 3.40, 3.44, 3.48, 3.52, 3.57, 3.61,
    3.65, 3.70, 3.74, 3.79, 3.83, 3.88, 3.92, 3.97, 4.02, 4.07, 4.12, 4.17,
    4.22, 4.27, 4.32, 4.37, 4.42, 4.48, 4.53, 4.59, 4.64, 4.70, 4.75, 4.81,
    4.87, 4.93, 4.99, 5.05, 5.11, 5.17, 5.23, 5.30, 5.36, 5.42, 5.49, 5.56,
    5.62, 5.69, 5.76, 5.83, 5.90, 5.97, 6.04, 6.12, 6.19, 6.26, 6.34, 6.42,
    6.49, 6.57, 6.65, 6.73, 6.81, 6.90, 6.98, 7.06, 7.15, 7.23, 7.32, 7.41,
    7.50, 7.59, 7.68, 7.77, 7.87, 7.96, 8.06, 8.16, 8.25, 8.35, 8.45, 8.56,
    8.66, 8.76, 8.87, 8.98, 9.09, 9.20, 9.31, 9.42, 9.53, 9.65, 9.76, 9.88,
  ],
};

/** Usual tolerance of resistors sold in each series, as a fraction (common practice). */
const SERIES_TOLERANCE: Readonly<Record<ResistorSeries, number>> = { E24: 0.05, E96: 0.01, E192: 0.005 };

/** Tolerance usually paired with a series, as a fraction: E24 0.05, E96 0.01, E192 0.005 (common practice). */
export function seriesTolerance(series: ResistorSeries): number {
  return SERIES_TOLERANCE[series];
}

/**
 * The series member nearest to `valueOhm` in the logarithmic sense (smallest |ln(member/value)|),
 * searching the value's decade and the next decade's 1.0; ties go to the lower member.
 * Throws RangeError unless `valueOhm` is positive and finite. Result in ohms.
 */
export function snapToSeries(valueOhm: number, series: ResistorSeries): number {
  if (!(valueOhm > 0) || !Number.isFinite(valueOhm)) {
    throw new RangeError(`snapToSeries needs a positive finite value, got ${valueOhm}`);
  }
  const decade = decadeOf(valueOhm);
  const mantissas = E_SERIES[series];
  const target = valueOhm / 10 ** decade;
  // First member above the value's mantissa (binary search); the nearest is it or the one below.
  let lo = 0;
  let hi = mantissas.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    // Stryker disable next-line EqualityOperator: equivalent, a mantissa equal to a member is then "above", at distance 0, and chosen the same
    if (mantissas[mid] <= target) lo = mid + 1;
    else hi = mid;
  }
  const below = mantissas[Math.max(lo - 1, 0)];
  const above = lo < mantissas.length ? mantissas[lo] : 10;
  const mantissa = Math.abs(Math.log(below / target)) <= Math.abs(Math.log(above / target)) ? below : above;
  // Decimal text keeps 4.7e3 exactly 4700 (4.7 * 1000 could carry a rounding error)
  return Number(`${mantissa}e${decade}`);
}

/** Whether `valueOhm` is a member of the series (any decade), within a relative tolerance. */
export function isOnSeries(valueOhm: number, series: ResistorSeries, relTol = 1e-9): boolean {
  if (!(valueOhm > 0) || !Number.isFinite(valueOhm)) return false;
  return Math.abs(snapToSeries(valueOhm, series) - valueOhm) <= relTol * valueOhm;
}

/** The power of ten d with 10^d <= value < 10^(d+1), robust to log10 rounding. */
function decadeOf(value: number): number {
  let decade = Math.floor(Math.log10(value));
  // Stryker disable all: equivalent for snapping, which is this function's one use: one decade off
  // (possible only next to a power of ten) leaves a mantissa at 1 or 10, which snaps to that power
  // of ten all the same; and each correction undoes the other's mutants.
  if (Number(`1e${decade}`) > value) decade -= 1;
  if (Number(`1e${decade + 1}`) <= value) decade += 1;
  // Stryker restore all
  return decade;
}
