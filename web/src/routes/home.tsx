import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { EmptyState } from '../components/ui/feedback';
import { PageHeader } from '../components/ui/page-header';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { projectListQuery } from '../features/projects/api/project-queries';
import { NewProjectForm } from '../features/projects/components/new-project-form';
import { heldRoles, heldRoleTitles, mayAs, projectRoleOf, ROLE_TITLES } from '#shared/workflow/roles';
import { roleHint } from '../features/projects/utils/role-hint';
import { waitingListQuery } from '../features/waiting/api/waiting-queries';
import { WaitingList } from '../features/waiting/components/waiting-list';
import { mayWait, waitingCountsQuery } from '../lib/waiting-queries';

/** What waits for the person, then their projects. The waiting lists are asked for beside the projects; a failure there shows in its own panel, never as the page's error. */
async function prefetchWaiting(queryClient: QueryClient) {
  const counts = await queryClient.fetchQuery(waitingCountsQuery()).catch(() => null);
  await Promise.all((counts?.kinds ?? []).filter((kind) => counts!.counts[kind] > 0).map((kind) => queryClient.prefetchQuery(waitingListQuery(kind, 1))));
}

export const loader = (queryClient: QueryClient) => async () => {
  const user = await queryClient.ensureQueryData(meQuery());
  await Promise.all([queryClient.ensureQueryData(projectListQuery()), mayWait(user) ? prefetchWaiting(queryClient) : null]);
  return null;
};

export function Component() {
  const { data: user } = useSuspenseQuery(meQuery());
  const { data } = useSuspenseQuery(projectListQuery());
  if (!user) return null;
  return (
    <>
      <PageHeader title="Projects" eyebrow={heldRoleTitles(user).join(' · ') || 'Member'}>
        {roleHint(heldRoles(user)) || 'An administrator adds you to a project with your role in it; it then appears here.'}
      </PageHeader>
      {mayWait(user) && <WaitingList />}
      <section aria-labelledby="projects-heading">
        <h2 id="projects-heading" className="mb-3 text-sm font-medium tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">
          Your projects
        </h2>
        {data.items.length === 0 ? (
          <EmptyState title="No projects yet">
            {mayAs(user, null, 'projects:create') ? 'Create the first one below.' : 'An administrator adds you to a project; it then appears here.'}
          </EmptyState>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {data.items.map((project) => (
              <li key={project.id}>
                <Link
                  to={paths.project.href(project.id)}
                  className="block h-full rounded-lg border border-rule bg-sheet p-4 hover:border-fern dark:border-night-rule dark:bg-night-sheet dark:hover:border-fern-soft"
                >
                  <span className="block font-medium">{project.name}</span>
                  {projectRoleOf(user.projectRoles, project.id) && (
                    <span className="mt-0.5 block text-xs text-fern dark:text-fern-bright">You: {ROLE_TITLES[projectRoleOf(user.projectRoles, project.id)!].toLowerCase()}</span>
                  )}
                  <span className="mt-1 block text-sm text-ink-soft dark:text-night-ink-soft">{project.description || 'No description.'}</span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      {mayAs(user, null, 'projects:create') && <NewProjectForm />}
    </>
  );
}
