import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { WAITING_WORDS, type WaitingKind } from '#shared/workflow/waiting';
import { ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Pagination } from '../../../components/ui/pagination';
import { cn } from '../../../lib/cn';
import { waitingListQuery, WAITING_PAGE_SIZE } from '../api/waiting-queries';
import { KindMark, kindTone } from './kind-mark';
import { WaitingRow } from './waiting-row';

/** One kind of what waits for the person: its heading with the count, its items oldest first, paged. */
export function WaitingGroup({ kind, count }: { kind: WaitingKind; count: number }) {
  const [chosenPage, setPage] = useState(1);
  // Once others' work has shortened the list, a page past its end becomes its last page.
  const page = Math.min(chosenPage, Math.max(1, Math.ceil(count / WAITING_PAGE_SIZE)));
  const list = useQuery({ ...waitingListQuery(kind, page), enabled: count > 0 });
  const words = WAITING_WORDS[kind];
  const headingId = `waiting-${kind}`;
  return (
    <section aria-labelledby={headingId} data-waiting={kind} className="border-t border-rule pt-3 first:border-t-0 first:pt-0 dark:border-night-rule">
      <h3 id={headingId} className={cn('mb-1 flex items-center gap-2 border-l-[3px] pl-2 text-sm font-medium', kindTone(kind))}>
        <KindMark kind={kind} />
        {words.title}
        <span className="rounded-sm bg-paper px-1.5 text-xs text-ink tabular-nums dark:bg-night dark:text-night-ink">
          <span className="sr-only">: </span>
          {count}
        </span>
      </h3>
      {count === 0 ? (
        <p className="py-1 pl-3 text-sm text-ink-soft dark:text-night-ink-soft">
          <span aria-hidden="true" className="mr-1">
            ✓
          </span>
          {words.empty}
        </p>
      ) : list.isPending ? (
        <Loading what={`Fetching the ${words.title.toLowerCase()}`} />
      ) : list.isError ? (
        <ErrorPanel error={list.error} retry={() => void list.refetch()} />
      ) : (
        <div aria-busy={list.isPlaceholderData} className={cn('transition-opacity', list.isPlaceholderData && 'opacity-60')}>
          <ol aria-label={words.title}>
            {list.data.items.map((item) => (
              <WaitingRow key={`${item.kind}-${item.proposalId ?? `spec-${item.spec.id}`}`} item={item} />
            ))}
          </ol>
          {list.data.total > WAITING_PAGE_SIZE && <Pagination page={page} pageSize={WAITING_PAGE_SIZE} total={list.data.total} onPage={setPage} label={`${words.title}: pages`} />}
        </div>
      )}
    </section>
  );
}
