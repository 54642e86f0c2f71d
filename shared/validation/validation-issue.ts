/** One validation problem, located by the JSON pointer of the offending field. */

/** A problem with one field: `path` is a JSON pointer ("/supply/negativeV", "" for the whole input). */
export interface ValidationIssue {
  path: string;
  message: string;
}

/** The validated value (defaults applied) or every problem found. */
export type ValidationResult<T> = { ok: true; value: T } | { ok: false; errors: ValidationIssue[] };

/** "/supply/negativeV: must be < supply.positiveV (12 V), got 14 V" — the one-line form the CLI and API print. */
export function formatIssue(issue: ValidationIssue): string {
  return `${issue.path === '' ? '/' : issue.path}: ${issue.message}`;
}

/** Escapes a property name for a JSON pointer (RFC 6901: "~" -> "~0", "/" -> "~1"). */
export function pointerSegment(name: string): string {
  return name.replace(/~/g, '~0').replace(/\//g, '~1');
}
