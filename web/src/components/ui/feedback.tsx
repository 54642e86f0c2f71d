import type { ReactNode } from 'react';
import { ApiError } from '../../lib/api';

/** Loading placeholder with a live region for screen readers. */
export function Loading({ what = 'Loading' }: { what?: string }) {
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-3 py-8 text-sm text-ink-soft dark:text-night-ink-soft">
      <span className="h-4 w-4 animate-spin rounded-full border-2 border-rule border-t-fern" aria-hidden="true" />
      {what}…
    </div>
  );
}

/** An error in place, with the server's words and a way to try again. */
export function ErrorPanel({ error, retry }: { error: unknown; retry?: () => void }) {
  const message = error instanceof ApiError || error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <div role="alert" className="rounded-lg border border-short/40 bg-short-soft p-4 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">This could not be shown.</p>
      <p className="mt-1">{message}</p>
      {retry && (
        <button type="button" onClick={retry} className="mt-2 underline">
          Try again
        </button>
      )}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-rule p-6 text-center text-sm text-ink-soft dark:border-night-rule dark:text-night-ink-soft">
      <p className="font-medium text-ink dark:text-night-ink">{title}</p>
      {children && <div className="mt-1">{children}</div>}
    </div>
  );
}
