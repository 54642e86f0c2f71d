import type { QueryClient } from '@tanstack/react-query';
import { useQuery, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { Link, useLocation, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { mayAs } from '#shared/workflow/roles';
import { RouteError } from '../components/layout/route-error';
import { PageHeader } from '../components/ui/page-header';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { projectMembersQuery, projectQuery } from '../features/projects/api/project-queries';
import { saveSpecVersion, specQuery, specSchemaQuery } from '../features/specs/api/spec-queries';
import { RankButton } from '../features/specs/components/rank-button';
import { SpecForm, type SpecDraft } from '../features/specs/components/spec-form';
import { When } from '../features/specs/components/when';
import { specBody } from '../features/specs/lib/spec-body';
import { projectKeys, specKeys, waitingKeys } from '../lib/query-keys';

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await Promise.all([queryClient.ensureQueryData(specQuery(Number(params.specId))), queryClient.ensureQueryData(specSchemaQuery())]);
    return null;
  };

const LINK_BUTTON =
  'inline-flex items-center rounded-md border border-rule bg-sheet px-3.5 py-2 text-sm font-medium hover:bg-paper dark:border-night-rule dark:bg-night-sheet dark:hover:bg-night';

export function Component() {
  const specId = Number(useParams().specId);
  const location = useLocation();
  const { data: spec } = useSuspenseQuery(specQuery(specId));
  const { data: user } = useSuspenseQuery(meQuery());
  const project = useQuery(projectQuery(spec.projectId));
  const members = useQuery(projectMembersQuery(spec.projectId));
  const queryClient = useQueryClient();
  const [dirty, setDirty] = useState(false);
  const [savedVersion, setSavedVersion] = useState<number | null>((location.state as { savedVersion?: number } | null)?.savedVersion ?? null);
  const [unchanged, setUnchanged] = useState(false);
  const [changeNote, setChangeNote] = useState('');
  const noteId = useId();
  if (!user) return null;

  const canWrite = mayAs(user, spec.projectId, 'specs:write');
  const canRank = mayAs(user, spec.projectId, 'proposals:create');
  const author = spec.latest.createdById === user.id ? 'you' : (members.data?.items.find((m) => m.id === spec.latest.createdById)?.displayName ?? `user #${spec.latest.createdById}`);

  const onSave = async (draft: SpecDraft) => {
    const saved = await saveSpecVersion(specId, { ...specBody(draft), ...(changeNote.trim() ? { note: changeNote.trim() } : {}) });
    queryClient.setQueryData(specKeys.detail(specId), saved);
    await Promise.all([
      queryClient.invalidateQueries({ queryKey: specKeys.detail(specId) }),
      queryClient.invalidateQueries({ queryKey: projectKeys.specs(spec.projectId) }),
      queryClient.invalidateQueries({ queryKey: waitingKeys.all }),
    ]);
    setSavedVersion(saved.latestVersion);
    setUnchanged(saved.unchanged === true);
    if (!saved.unchanged) setChangeNote('');
  };
  const note = dirty
    ? 'Unsaved changes.'
    : unchanged
      ? `Nothing differs from version ${spec.latestVersion}, so no new version was saved.`
      : savedVersion === spec.latestVersion
        ? `✓ Saved as version ${savedVersion}.`
        : null;

  return (
    <>
      <PageHeader
        eyebrow={
          <Link to={paths.project.href(spec.projectId)} className="hover:underline">
            {project.data?.name ?? 'Project'}
          </Link>
        }
        title={spec.title}
        actions={
          <div className="flex items-start gap-2">
            <Link to={paths.specHistory.href(specId)} className={LINK_BUTTON}>
              History ({spec.latestVersion} {spec.latestVersion === 1 ? 'version' : 'versions'})
            </Link>
            {canRank && <RankButton specId={specId} version={spec.latestVersion} unsaved={dirty} />}
          </div>
        }
      >
        Version {spec.latestVersion} · saved <When at={spec.latest.createdAt} /> by {author}
        {!canWrite && ' · read-only: specs are edited by systems engineers'}
      </PageHeader>
      {canWrite && (
        <div className="mb-4 rounded-lg border border-rule bg-sheet p-4 text-sm dark:border-night-rule dark:bg-night-sheet">
          <label htmlFor={noteId} className="block font-medium">
            Change note <span className="font-normal text-ink-soft dark:text-night-ink-soft">(optional, kept with the next version)</span>
          </label>
          <input
            id={noteId}
            type="text"
            value={changeNote}
            onChange={(e) => setChangeNote(e.target.value)}
            maxLength={1000}
            aria-describedby={`${noteId}-hint`}
            className="mt-1 w-full rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night"
          />
          <p id={`${noteId}-hint`} className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">
            What changed and why, in one line; shown in the history and beside rankings of older versions. At most 1000 characters.
          </p>
        </div>
      )}
      <SpecForm
        key={specId}
        initial={spec.latest.payload as unknown as SpecDraft}
        onSave={canWrite ? onSave : undefined}
        saveLabel="Save as new version"
        note={note}
        onDirtyChange={setDirty}
        projectId={spec.projectId}
      />
    </>
  );
}

export const ErrorBoundary = RouteError;
