/**
 * Reading a check's rule metadata (title, kind), which the rule file gives and each check carries.
 * Checks stored before the rule files carried it have none: they show the rule id and count by
 * their severity alone.
 */
import type { Check } from '#shared/engine/types';

/** The check's readable name ("Power budget"), or its rule id when the check carries none. */
export function checkTitle(check: Pick<Check, 'rule' | 'title'>): string {
  return check.title ?? check.rule;
}

/** A hazard caution: the same for every option, printed once under Cautions. */
export function isCaution(check: Pick<Check, 'kind'>): boolean {
  return check.kind === 'caution';
}
