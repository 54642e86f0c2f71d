import { useSuspenseQuery } from '@tanstack/react-query';
import { EmptyState } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { STATE_LABELS } from '../../../components/ui/state-badge';
import type { Spec } from '#shared/api/specs';
import { cn } from '../../../lib/cn';
import { projectProposalsQuery } from '../api/project-queries';
import { useProposalView } from '../hooks/use-proposal-view';
import { Pagination } from '../../../components/ui/pagination';
import { ProposalsTable } from './proposals-table';
import { StatusFilter } from './status-filter';

/** The project's proposals, newest first, filtered by state and paged through the URL. */
export function ProposalsSection({ projectId, specs }: { projectId: number; specs: readonly Spec[] }) {
  const view = useProposalView();
  const { data } = useSuspenseQuery(projectProposalsQuery(projectId, view.status, view.page));
  return (
    <Sheet id="proposals" title="Proposals" aria-label="Proposals">
      <div className="mb-3">
        <StatusFilter value={view.status} onChange={view.setStatus} />
      </div>
      <div aria-busy={view.pending} className={cn('transition-opacity', view.pending && 'opacity-60')}>
        {data.items.length === 0 && view.page === 1 ? (
          <EmptyState title={view.status === 'all' ? 'No proposals yet' : `Nothing is “${STATE_LABELS[view.status].label.toLowerCase()}”`}>
            {view.status === 'all' ? 'Proposals appear here once someone asks the engine to rank a spec.' : 'Choose another state above, or All.'}
          </EmptyState>
        ) : data.items.length === 0 ? (
          <EmptyState title="This page is past the end">
            <button type="button" className="text-fern underline dark:text-fern-bright" onClick={() => view.setPage(1)}>
              Go to the first page
            </button>
          </EmptyState>
        ) : (
          <ProposalsTable projectId={projectId} proposals={data.items} specs={specs} />
        )}
        {data.total > 0 && <Pagination page={view.page} pageSize={data.pageSize} total={data.total} onPage={view.setPage} />}
      </div>
    </Sheet>
  );
}
