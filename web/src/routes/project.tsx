import type { QueryClient } from '@tanstack/react-query';
import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '../config/paths';
import { mayAs, projectRoleOf } from '#shared/workflow/roles';
import { RouteError } from '../components/layout/route-error';
import { PageHeader } from '../components/ui/page-header';
import { Sheet } from '../components/ui/sheet';
import { meQuery } from '../lib/auth-queries';
import { DeviceLibrary } from '../features/devices/components/device-library';
import { userListQuery } from '../features/people/api/user-queries';
import { projectProposalsQuery, projectQuery, projectSpecsQuery } from '../features/projects/api/project-queries';
import { NeedsYou } from '../features/projects/components/needs-you';
import { ProjectMembers } from '../features/projects/components/project-members';
import { ProposalsSection } from '../features/projects/components/proposals-section';
import { SpecsSection } from '../features/projects/components/specs-section';
import { useProposalView } from '../features/projects/hooks/use-proposal-view';
import { projectIdFrom } from '../features/projects/utils/project-id';
import { readProposalView, type ProposalFilter } from '../features/projects/utils/proposal-filter';

/** The project, its specs and the proposals page the URL asks for, fetched before the page shows. */
export const loader =
  (queryClient: QueryClient) =>
  async ({ params, request }: LoaderFunctionArgs) => {
    const projectId = projectIdFrom(params.projectId);
    const view = readProposalView(new URL(request.url).searchParams);
    await Promise.all([
      queryClient.ensureQueryData(projectQuery(projectId)),
      queryClient.ensureQueryData(projectSpecsQuery(projectId)),
      queryClient.ensureQueryData(projectProposalsQuery(projectId, view.status, view.page)),
    ]);
    return null;
  };

export function Component() {
  const projectId = projectIdFrom(useParams().projectId);
  const { data: user } = useSuspenseQuery(meQuery());
  const { data: project } = useSuspenseQuery(projectQuery(projectId));
  const { data: specs } = useSuspenseQuery(projectSpecsQuery(projectId));
  const canManage = user !== null && mayAs(user, null, 'members:manage');
  const allUsers = useQuery({ ...userListQuery(), enabled: canManage });
  const view = useProposalView();
  if (!user) return null;
  const showProposals = (status: ProposalFilter) => {
    view.setStatus(status);
    document.getElementById('proposals')?.scrollIntoView?.({ block: 'start', behavior: 'smooth' });
  };
  return (
    <>
      <PageHeader
        title={project.name}
        eyebrow="Project"
        actions={
          <Link to={paths.activity.href(projectId)} className="rounded-md border border-rule px-2.5 py-1 text-sm hover:bg-paper dark:border-night-rule dark:hover:bg-night">
            Activity
          </Link>
        }
      >
        {project.description || 'No description.'}
      </PageHeader>
      <NeedsYou projectId={projectId} role={projectRoleOf(user.projectRoles, projectId) ?? (user.role === 'admin' ? 'admin' : null)} onShow={showProposals} />
      <div className="mb-6 grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <SpecsSection projectId={projectId} specs={specs.items} canWrite={mayAs(user, projectId, 'specs:write')} />
        <Sheet title="People on this project" aria-label="People on this project">
          <ProjectMembers projectId={projectId} manage={canManage ? { allUsers: allUsers.data?.items, allUsersError: allUsers.error } : undefined} />
        </Sheet>
      </div>
      <DeviceLibrary projectId={projectId} canUpload={mayAs(user, projectId, 'devices:write')} />
      <ProposalsSection projectId={projectId} specs={specs.items} />
    </>
  );
}

export const ErrorBoundary = RouteError;
