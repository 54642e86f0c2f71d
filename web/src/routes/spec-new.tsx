import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { RouteError } from '../components/layout/route-error';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { projectQuery } from '../features/projects/api/project-queries';
import { createSpec, specSchemaQuery } from '../features/specs/api/spec-queries';
import { SpecForm, type SpecDraft } from '../features/specs/components/spec-form';
import { ProjectPageHeader, SpecWritersOnly } from '../features/specs/components/spec-writers-only';
import { specBody } from '../features/specs/lib/spec-body';
import { exampleFromSchema } from '../features/specs/lib/spec-example';
import type { SchemaNode } from '../features/specs/lib/schema-nodes';
import { projectKeys, specKeys, waitingKeys } from '../lib/query-keys';

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const projectId = Number(params.projectId);
    await Promise.all([queryClient.ensureQueryData(projectQuery(projectId)), queryClient.ensureQueryData(specSchemaQuery())]);
    return null;
  };

export function Component() {
  const projectId = Number(useParams().projectId);
  const { data: user } = useSuspenseQuery(meQuery());
  const { data: project } = useSuspenseQuery(projectQuery(projectId));
  const { data: schema } = useSuspenseQuery(specSchemaQuery());
  const initial = useMemo(() => exampleFromSchema(schema as SchemaNode), [schema]);
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  if (!user) return null;

  const onSave = async (draft: SpecDraft) => {
    const spec = await createSpec(projectId, specBody(draft));
    queryClient.setQueryData(specKeys.detail(spec.id), spec);
    await Promise.all([queryClient.invalidateQueries({ queryKey: projectKeys.specs(projectId) }), queryClient.invalidateQueries({ queryKey: waitingKeys.all })]);
    navigate(paths.spec.href(spec.id), { state: { savedVersion: spec.latestVersion } });
  };

  return (
    <SpecWritersOnly user={user} project={project} title="New spec" refusal="Specs are written by systems engineers">
      <ProjectPageHeader project={project} title="New spec">
        Starts from the defaults with an example for the required figures. Type quantities as you would write them: 4k7, 10u, 2 pF, −12 V.
      </ProjectPageHeader>
      <SpecForm initial={initial} onSave={onSave} saveLabel="Create spec" savingLabel="Creating…" projectId={projectId} />
    </SpecWritersOnly>
  );
}

export const ErrorBoundary = RouteError;
