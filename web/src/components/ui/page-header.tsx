import type { ReactNode } from 'react';

export function PageHeader({ title, eyebrow, actions, children }: { title: ReactNode; eyebrow?: ReactNode; actions?: ReactNode; children?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div className="min-w-0">
        {eyebrow && <p className="mb-1 text-xs tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">{eyebrow}</p>}
        <h1 className="text-2xl font-medium tracking-tight">{title}</h1>
        {children && <div className="mt-1 text-sm text-ink-soft dark:text-night-ink-soft">{children}</div>}
      </div>
      {actions && <div className="flex flex-wrap items-center gap-2">{actions}</div>}
    </header>
  );
}
