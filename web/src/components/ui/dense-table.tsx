import type { HTMLAttributes, ReactNode, TdHTMLAttributes, ThHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';

/** A dense, ruled table for lists of records; scrolls sideways on narrow screens. */
export function DenseTable({ caption, className, children, ...props }: HTMLAttributes<HTMLTableElement> & { caption: string }) {
  return (
    <div className="relative overflow-x-auto">
      <table className={cn('w-full border-collapse text-sm', className)} {...props}>
        <caption className="sr-only">{caption}</caption>
        {children}
      </table>
    </div>
  );
}

export function Th({ className, ...props }: ThHTMLAttributes<HTMLTableCellElement>) {
  return (
    <th
      scope="col"
      className={cn('border-b border-rule px-2.5 py-1.5 text-left text-xs font-medium tracking-wide whitespace-nowrap text-ink-soft uppercase dark:border-night-rule dark:text-night-ink-soft', className)}
      {...props}
    />
  );
}

export function Td({ className, ...props }: TdHTMLAttributes<HTMLTableCellElement>) {
  return <td className={cn('border-b border-rule/70 px-2.5 py-1.5 align-middle dark:border-night-rule/70', className)} {...props} />;
}

/** A row the pointer can highlight; a link inside with `rowLink` covers the whole row. */
export function Tr({ className, children }: { className?: string; children: ReactNode }) {
  return <tr className={cn('relative hover:bg-paper dark:hover:bg-night', className)}>{children}</tr>;
}

/** Classes for the one link that stands for a whole row (its hit area stretches over the row). */
export const rowLink = 'font-medium text-fern hover:underline dark:text-fern-bright after:absolute after:inset-0 after:content-[""]';
