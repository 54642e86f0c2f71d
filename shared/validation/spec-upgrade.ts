/**
 * Older spec documents read as today's, before the schema check (validateSpec): stored versions,
 * exported JSON and API clients written against an earlier schema keep working.
 *
 * - `resistors.tolerance` (a fraction, 0.01 for ±1 %) became `resistors.tolerancePercent` (in
 *   per cent, like the gain tolerance). The fraction is converted (×100, binary noise dropped,
 *   so tolerancePercent / 100 is the very number the fraction was); given together, both must
 *   say the same.
 */
import { specFieldLabel } from './field-labels';
import type { ValidationIssue } from './validation-issue';

type PlainObject = Record<string, unknown>;

const isObject = (value: unknown): value is PlainObject => typeof value === 'object' && value !== null && !Array.isArray(value);

/** A fraction in per cent, without binary noise (0.07 × 100 is 7, not 7.000000000000001). */
export function fractionToPercent(fraction: number): number {
  return Number((fraction * 100).toPrecision(12));
}

/**
 * Rewrites an older spec document in place (it must be the caller's own copy) and answers the
 * problems the rewrite found; fields it does not know are left for the schema to judge.
 */
export function upgradeSpecDocument(document: unknown): ValidationIssue[] {
  if (!isObject(document) || !isObject(document.resistors) || !('tolerance' in document.resistors)) return [];
  const resistors = document.resistors;
  const fraction = resistors.tolerance;
  const percentLabel = specFieldLabel('/resistors/tolerancePercent');
  // Stryker disable next-line ConditionalExpression: equivalent, Number.isFinite is false for every non-number too
  if (typeof fraction !== 'number' || !Number.isFinite(fraction)) {
    return [{ path: '/resistors/tolerance', message: `must be a number, a fraction (0.01 for ±1 %); better give ${percentLabel} in per cent` }];
  }
  const percent = fractionToPercent(fraction);
  if (resistors.tolerancePercent !== undefined && resistors.tolerancePercent !== percent) {
    return [{ path: '/resistors/tolerance', message: `says ±${percent} % while ${percentLabel} says ±${String(resistors.tolerancePercent)} %: give it once, in per cent` }];
  }
  delete resistors.tolerance;
  resistors.tolerancePercent = percent;
  return [];
}
