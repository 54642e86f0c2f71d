import { Button } from './button';

/** "21–40 of 134" with previous and next; pages count from 1. `label` names the list for assistive technology. */
export function Pagination({ page, pageSize, total, onPage, label = 'Proposal pages' }: { page: number; pageSize: number; total: number; onPage: (page: number) => void; label?: string }) {
  const first = (page - 1) * pageSize + 1;
  const last = Math.min(page * pageSize, total);
  const lastPage = Math.max(1, Math.ceil(total / pageSize));
  return (
    <nav aria-label={label} className="flex items-center justify-end gap-3 pt-3 text-sm">
      <p aria-live="polite" className="text-ink-soft tabular-nums dark:text-night-ink-soft">
        {total === 0 ? 'None' : first > total ? `Past the end (${total} in all)` : `${first}–${last} of ${total}`}
      </p>
      <Button variant="secondary" className="px-2.5 py-1 disabled:opacity-45" disabled={page <= 1} onClick={() => onPage(Math.min(page - 1, lastPage))}>
        <span aria-hidden="true">←</span> Previous
      </Button>
      <Button variant="secondary" className="px-2.5 py-1 disabled:opacity-45" disabled={page >= lastPage} onClick={() => onPage(page + 1)}>
        Next <span aria-hidden="true">→</span>
      </Button>
    </nav>
  );
}
