import type { ReactNode } from 'react';

/** A numbered section of the report, headed at level 2, so the printed packet reads like a document. */
export function ReportSection({ id, number, title, children }: { id: string; number: number; title: string; children: ReactNode }) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="report-section border-t border-rule pt-5 dark:border-night-rule">
      <h2 id={`${id}-title`} className="mb-3 text-lg font-medium tracking-tight">
        <span className="mr-2 text-ink-soft tabular-nums dark:text-night-ink-soft">{number}</span>
        {title}
      </h2>
      {children}
    </section>
  );
}

/** A sub-heading inside a section. */
export function ReportSubheading({ children }: { children: ReactNode }) {
  return <h3 className="mt-5 mb-2 text-sm font-semibold first:mt-0">{children}</h3>;
}

/** A quiet explanatory line. */
export function ReportNote({ children }: { children: ReactNode }) {
  return <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">{children}</p>;
}
