/**
 * Server errors stay beside their fields until the field is edited: a message about a value
 * the person has since changed would be about something no longer there.
 */
import type { ErrorSchema } from '@rjsf/utils';

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
const child = (value: unknown, key: string): unknown => (typeof value === 'object' && value !== null ? (value as Record<string, unknown>)[key] : undefined);

/** `errors` without the messages of fields whose value differs between `before` and `after`; the root's own messages stay. */
export function withoutEditedFieldErrors(errors: ErrorSchema, before: unknown, after: unknown, isRoot = true): ErrorSchema {
  const kept: Record<string, unknown> = {};
  if (errors.__errors?.length && (isRoot || same(before, after))) kept.__errors = errors.__errors;
  for (const [key, value] of Object.entries(errors)) {
    if (key === '__errors' || typeof value !== 'object' || value === null) continue;
    const inner = withoutEditedFieldErrors(value as ErrorSchema, child(before, key), child(after, key), false);
    if (Object.keys(inner).length > 0) kept[key] = inner;
  }
  return kept as ErrorSchema;
}

/** How many messages an ErrorSchema holds. */
export function errorCount(errors: ErrorSchema): number {
  return Object.entries(errors).reduce((sum, [key, value]) => {
    if (key === '__errors') return sum + (Array.isArray(value) ? value.length : 0);
    return typeof value === 'object' && value !== null ? sum + errorCount(value as ErrorSchema) : sum;
  }, 0);
}
