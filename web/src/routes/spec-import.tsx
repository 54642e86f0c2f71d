/** Import specs: many requirement specs from one CSV or JSON file, checked, saved, ranked, exported. */
import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { mayAs } from '#shared/workflow/roles';
import { RouteError } from '../components/layout/route-error';
import { meQuery } from '../lib/auth-queries';
import { BatchImport } from '../features/batch/components/batch-import';
import { projectQuery } from '../features/projects/api/project-queries';
import { projectIdFrom } from '../features/projects/utils/project-id';
import { ProjectPageHeader, SpecWritersOnly } from '../features/specs/components/spec-writers-only';

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
  return (
    <SpecWritersOnly user={user} project={project} title="Import specs" refusal="Specs are imported by systems engineers">
      <ProjectPageHeader project={project} title="Import specs">
        Many requirement specs from one file: check every row, save the valid ones, rank them all, download the results.
      </ProjectPageHeader>
      <BatchImport projectId={projectId} canRank={mayAs(user, projectId, 'proposals:create')} />
    </SpecWritersOnly>
  );
}

export const ErrorBoundary = RouteError;
