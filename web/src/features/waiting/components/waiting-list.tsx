import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import { useLocation } from 'react-router-dom';
import { ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { waitingCountsQuery, waitingTotal } from '../../../lib/waiting-queries';
import { WaitingGroup } from './waiting-group';

/**
 * "Waiting for you" on the home page: across every project the person belongs to, what waits for
 * the role they hold in each, one group per kind their roles can wait on, each oldest first. Shows
 * nothing for someone who holds no project role. The navigation's count links to `#waiting`.
 */
export function WaitingList() {
  const counts = useQuery(waitingCountsQuery());
  const heading = useRef<HTMLHeadingElement>(null);
  const { hash } = useLocation();
  const ready = counts.isSuccess;
  useEffect(() => {
    if (hash !== '#waiting' || !ready) return;
    heading.current?.scrollIntoView?.({ block: 'start' });
    heading.current?.focus({ preventScroll: true });
  }, [hash, ready]);
  if (counts.isSuccess && counts.data.kinds.length === 0) return null;
  const total = counts.isSuccess ? waitingTotal(counts.data) : null;
  return (
    <Sheet id="waiting" aria-labelledby="waiting-heading" className="mb-6">
      <header className="mb-3 flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1">
        <h2 id="waiting-heading" ref={heading} tabIndex={-1} className="text-base font-medium outline-none">
          Waiting for you{total !== null && <span className="ml-2 text-sm font-normal text-ink-soft tabular-nums dark:text-night-ink-soft">{total === 0 ? 'nothing right now' : `${total} in all`}</span>}
        </h2>
        <p className="text-xs text-ink-soft dark:text-night-ink-soft">Across your projects, by the role you hold in each; longest waiting first.</p>
      </header>
      {counts.isPending ? (
        <Loading what="Counting what waits for you" />
      ) : counts.isError ? (
        <ErrorPanel error={counts.error} retry={() => void counts.refetch()} />
      ) : (
        <div className="space-y-3">
          {counts.data.kinds.map((kind) => (
            <WaitingGroup key={kind} kind={kind} count={counts.data.counts[kind]} />
          ))}
        </div>
      )}
    </Sheet>
  );
}
