/** Import specs: many requirement specs from one CSV or JSON file, checked, saved, ranked, exported. */
import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { data, Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { may, ROLE_TITLES } from '../../../shared/workflow/roles';
import { RouteError } from '../app/route-error';
import { EmptyState } from '../components/ui/feedback';
import { PageHeader } from '../components/ui/page-header';
import { paths } from '../config/paths';
import { meQuery } from '../features/auth/api/auth-queries';
import { BatchImport } from '../features/batch/components/batch-import';
import { projectQuery } from '../features/projects/api/project-queries';

function projectIdFrom(value: string | undefined): number {
  const id = Number(value);
  if (!Number.isInteger(id) || id < 1) throw data('No such project', { status: 404 });
  return id;
}

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(projectQuery(projectIdFrom(params.projectId)));
    return null;
  };

export function Component() {
  const projectId = projectIdFrom(useParams().projectId);
  const { data: user } = useSuspenseQuery(meQuery());
  const { data: project } = useSuspenseQuery(projectQuery(projectId));
  if (!user) return null;
  const eyebrow = (
    <Link to={paths.project.href(project.id)} className="hover:underline">
      {project.name}
    </Link>
  );
  if (!may(user.role, 'specs:write')) {
    return (
      <>
        <PageHeader eyebrow={eyebrow} title="Import specs" />
        <EmptyState title="Specs are imported by systems engineers">
          You are signed in as {ROLE_TITLES[user.role].toLowerCase()}; you can read this project’s specs and, where your role allows, rank them.
        </EmptyState>
      </>
    );
  }
  return (
    <>
      <PageHeader eyebrow={eyebrow} title="Import specs">
        Many requirement specs from one file: check every row, save the valid ones, rank them all, download the results.
      </PageHeader>
      <BatchImport projectId={projectId} canRank={may(user.role, 'proposals:create')} />
    </>
  );
}

export const ErrorBoundary = RouteError;
