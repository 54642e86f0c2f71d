import type { ReactNode } from 'react';
import { useId } from 'react';

/** A titled group of fields in a form: a compact card that never breaks across columns. */
export function FormCard({ title, note, children }: { title: string; note?: string; children: ReactNode }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="mb-4 break-inside-avoid rounded-lg border border-rule bg-sheet p-3.5 dark:border-night-rule dark:bg-night-sheet">
      <h2 id={id} className="text-sm font-semibold tracking-wide text-fern uppercase dark:text-fern-bright">
        {title}
      </h2>
      {note && <p className="mt-0.5 text-xs text-ink-soft dark:text-night-ink-soft">{note}</p>}
      <div className="mt-3">{children}</div>
    </section>
  );
}
