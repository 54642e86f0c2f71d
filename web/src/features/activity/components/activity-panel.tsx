import { useQuery } from '@tanstack/react-query';
import type { ProjectMember } from '#shared/api/projects';
import { EmptyState, ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Pagination } from '../../../components/ui/pagination';
import { Sheet } from '../../../components/ui/sheet';
import { api } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import { ACTIVITY_PAGE_SIZE, activityQuery } from '../api/activity-queries';
import { activityApiQuery, type ActivityView } from '../lib/activity-view';
import { ActivityEntry } from './activity-entry';
import { ActivityFilter } from './activity-filter';

const downloadLink = 'rounded-md border border-rule px-2.5 py-1 text-sm hover:bg-paper dark:border-night-rule dark:hover:bg-night';

/** The project's activity, newest first: the filter sentence, the CSV of what it keeps, the events, the pages. */
export function ActivityPanel({ projectId, view, members, viewerId, onView }: { projectId: number; view: ActivityView; members: readonly ProjectMember[]; viewerId: number; onView: (changes: Partial<ActivityView>) => void }) {
  const activity = useQuery(activityQuery(projectId, view));
  const filtered = view.person !== null || view.kind !== null;
  return (
    <Sheet aria-label="Events">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-x-4 gap-y-2">
        <ActivityFilter view={view} members={members} onChange={(changes) => onView({ ...changes, page: 1 })} />
        <a href={api.projectActivityCsv(projectId, activityApiQuery(view))} download className={`${downloadLink} whitespace-nowrap`}>
          {filtered ? 'These events as CSV' : 'Every event as CSV'}
        </a>
      </div>
      {activity.isPending ? (
        <Loading what="Fetching the activity" />
      ) : activity.isError ? (
        <ErrorPanel error={activity.error} retry={() => void activity.refetch()} />
      ) : (
        <div aria-busy={activity.isPlaceholderData} className={cn('transition-opacity', activity.isPlaceholderData && 'opacity-60')}>
          {activity.data.items.length === 0 ? (
            <EmptyState title={view.page > 1 ? 'This page is past the end' : filtered ? 'No event matches' : 'Nothing has happened here yet'}>
              {view.page > 1 ? 'Go back to the first page.' : filtered ? 'Choose another kind of event or person above.' : 'Specs written and proposals asked for, decided and reviewed appear here.'}
            </EmptyState>
          ) : (
            <ol aria-label="Events, newest first">
              {activity.data.items.map((event) => (
                <ActivityEntry key={event.id} event={event} viewerId={viewerId} />
              ))}
            </ol>
          )}
          {activity.data.total > 0 && <Pagination page={view.page} pageSize={ACTIVITY_PAGE_SIZE} total={activity.data.total} onPage={(page) => onView({ page })} label="Activity pages" />}
        </div>
      )}
    </Sheet>
  );
}
