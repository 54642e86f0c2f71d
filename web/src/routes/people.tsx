import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { mayAs } from '#shared/workflow/roles';
import { RouteError } from '../components/layout/route-error';
import { EmptyState } from '../components/ui/feedback';
import { PageHeader } from '../components/ui/page-header';
import { Sheet } from '../components/ui/sheet';
import { paths } from '../config/paths';
import { authKeys, meQuery } from '../lib/auth-queries';
import { userListQuery } from '../features/people/api/user-queries';
import { NewUserForm } from '../features/people/components/new-user-form';
import { UsersTable } from '../features/people/components/users-table';
import { projectListQuery } from '../features/projects/api/project-queries';
import { ProjectMembers } from '../features/projects/components/project-members';
import { projectKeys } from '../lib/query-keys';

/** Accounts and projects for an admin; nobody else is asked for them (the server would refuse). */
export const loader = (queryClient: QueryClient) => async () => {
  const user = await queryClient.ensureQueryData(meQuery());
  if (user && mayAs(user, null, 'users:manage')) {
    await Promise.all([queryClient.ensureQueryData(userListQuery()), queryClient.ensureQueryData(projectListQuery())]);
  }
  return null;
};

export function Component() {
  const { data: user } = useSuspenseQuery(meQuery());
  if (!user) return null;
  if (!mayAs(user, null, 'users:manage')) return <NotAllowed />;
  return <PeopleAdmin currentUserId={user.id} />;
}

function NotAllowed() {
  return (
    <div role="alert" className="mx-auto max-w-xl py-16">
      <h1 className="text-2xl font-medium">Not allowed</h1>
      <p className="mt-2 text-ink-soft dark:text-night-ink-soft">Only an administrator manages accounts, roles and project memberships. Ask one if someone needs access.</p>
      <Link to={paths.home.href()} className="mt-4 inline-block text-fern underline dark:text-fern-bright">
        Back to your projects
      </Link>
    </div>
  );
}

function PeopleAdmin({ currentUserId }: { currentUserId: number }) {
  const queryClient = useQueryClient();
  const { data: users } = useSuspenseQuery(userListQuery());
  const { data: projects } = useSuspenseQuery(projectListQuery());
  // Names and roles also show in member lists and in the header (when you rename yourself).
  const refreshNames = () =>
    Promise.all([queryClient.invalidateQueries({ queryKey: projectKeys.all }), queryClient.invalidateQueries({ queryKey: authKeys.me() })]);
  return (
    <>
      <PageHeader title="People" eyebrow="Administration">
        Accounts and their roles, and who works on which project.
      </PageHeader>
      <Sheet title="Accounts" aria-label="Accounts" actions={<span className="text-sm text-ink-soft dark:text-night-ink-soft">{users.items.length} in all</span>}>
        <UsersTable users={users.items} currentUserId={currentUserId} onUserChanged={refreshNames} />
      </Sheet>
      <div className="mt-6 grid items-start gap-6 lg:grid-cols-[22rem_minmax(0,1fr)]">
        <NewUserForm />
        <section aria-labelledby="memberships-heading">
          <h2 id="memberships-heading" className="mb-3 text-sm font-medium tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">
            Project memberships
          </h2>
          {projects.items.length === 0 ? (
            <EmptyState title="No projects yet">Create a project on the Projects page; its people are managed here.</EmptyState>
          ) : (
            <ul className="grid gap-4 md:grid-cols-2">
              {projects.items.map((project) => (
                <li key={project.id}>
                  <Sheet
                    title={project.name}
                    aria-label={project.name}
                    className="h-full"
                    actions={
                      <Link to={paths.project.href(project.id)} className="text-sm whitespace-nowrap text-fern hover:underline dark:text-fern-bright">
                        Open
                      </Link>
                    }
                  >
                    <ProjectMembers projectId={project.id} manage={{ allUsers: users.items }} />
                  </Sheet>
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
    </>
  );
}

export const ErrorBoundary = RouteError;
