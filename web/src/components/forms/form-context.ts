/**
 * What the form templates and widgets may read from rjsf's `formContext`: a way for a widget to
 * say "this text cannot be read" (so the form owning it refuses to submit), and the words shown
 * beside the submit button.
 */
import type { ReactNode } from 'react';

export interface FormContext {
  /** A widget reports that its text cannot be read (`message`) or can again (`null`). */
  reportUnreadable?: (id: string, message: string | null) => void;
  /** Shown beside the submit button: progress or the result of the last save. */
  submitNote?: ReactNode;
}

/** The form context from rjsf's registry, typed. */
export function formContextOf(registry: { formContext?: unknown }): FormContext {
  return (registry.formContext ?? {}) as FormContext;
}
