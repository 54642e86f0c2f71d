import type { HTMLAttributes, ReactNode } from 'react';
import { cn } from '../../lib/cn';

/** A panel of content on the paper background; on a narrow screen its actions wrap under the title, each kept on one line. */
export function Sheet({ title, actions, className, children, ...props }: Omit<HTMLAttributes<HTMLElement>, 'title'> & { title?: ReactNode; actions?: ReactNode }) {
  return (
    <section className={cn('rounded-lg border border-rule bg-sheet p-4 dark:border-night-rule dark:bg-night-sheet', className)} {...props}>
      {(title || actions) && (
        <header className="mb-3 flex flex-wrap items-center justify-between gap-x-3 gap-y-2">
          {title && <h2 className="text-base font-medium">{title}</h2>}
          {actions && <div className="flex flex-wrap items-center gap-2 *:whitespace-nowrap">{actions}</div>}
        </header>
      )}
      {children}
    </section>
  );
}
