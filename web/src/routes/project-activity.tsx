import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { RouteError } from '../components/layout/route-error';
import { PageHeader } from '../components/ui/page-header';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { activityQuery } from '../features/activity/api/activity-queries';
import { ActivityPanel } from '../features/activity/components/activity-panel';
import { readActivityView, writeActivityView, type ActivityView } from '../features/activity/lib/activity-view';
import { projectMembersQuery, projectQuery } from '../features/projects/api/project-queries';
import { projectIdFrom } from '../features/projects/utils/project-id';

/** The project, its members (the person filter) and the activity page the address asks for. */
export const loader =
  (queryClient: QueryClient) =>
  async ({ params, request }: LoaderFunctionArgs) => {
    const projectId = projectIdFrom(params.projectId);
    const view = readActivityView(new URL(request.url).searchParams);
    // The events are asked for here but not waited for: a new filter or page shows in the address at
    // once (the previous page stays, dimmed, until its answer comes), so a second choice made
    // meanwhile builds on the first.
    void queryClient.prefetchQuery(activityQuery(projectId, view));
    await Promise.all([queryClient.ensureQueryData(projectQuery(projectId)), queryClient.ensureQueryData(projectMembersQuery(projectId))]);
    return null;
  };

/** A project's activity: what happened to its specs and proposals, who did it, newest first; filtered and paged through the address. */
export function Component() {
  const projectId = projectIdFrom(useParams().projectId);
  const { data: user } = useSuspenseQuery(meQuery());
  const { data: project } = useSuspenseQuery(projectQuery(projectId));
  const { data: members } = useSuspenseQuery(projectMembersQuery(projectId));
  const [params, setParams] = useSearchParams();
  const view = readActivityView(params);
  if (!user) return null;
  const onView = (changes: Partial<ActivityView>) => setParams((current) => writeActivityView(current, { ...readActivityView(current), ...changes }), { preventScrollReset: true });
  return (
    <>
      <PageHeader
        title="Activity"
        eyebrow={
          <Link to={paths.project.href(projectId)} className="hover:underline">
            {project.name}
          </Link>
        }
      >
        Every spec version, ranking, decision, review, SPICE check and bench measurement of this project, with who did it; newest first.
      </PageHeader>
      <ActivityPanel projectId={projectId} view={view} members={members.items} viewerId={user.id} onView={onView} />
    </>
  );
}

export const ErrorBoundary = RouteError;
