import type { QueryClient } from '@tanstack/react-query';
import { keepPreviousData, useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { RouteError } from '../components/layout/route-error';
import { EmptyState, ErrorPanel, Loading } from '../components/ui/feedback';
import { PageHeader } from '../components/ui/page-header';
import { Sheet } from '../components/ui/sheet';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { projectMembersQuery } from '../features/projects/api/project-queries';
import { recentProposalsQuery } from '../features/proposals/api/proposal-queries';
import { compareQuery } from '../features/proposals/lib/compare-address';
import { specDiffQuery, specQuery, specSchemaQuery, specVersionsQuery } from '../features/specs/api/spec-queries';
import { ChangesTable } from '../features/specs/components/changes-table';
import { CompareSentence, VersionPicker } from '../features/specs/components/version-picker';
import type { SchemaNode } from '../features/specs/lib/schema-nodes';
import { readableChanges } from '../features/specs/lib/spec-changes';

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const specId = Number(params.specId);
    await Promise.all([queryClient.ensureQueryData(specQuery(specId)), queryClient.ensureQueryData(specVersionsQuery(specId)), queryClient.ensureQueryData(specSchemaQuery())]);
    return null;
  };

/** A version number from the query string, if it names one of the versions. */
function pickedVersion(text: string | null, known: ReadonlySet<number>, fallback: number): number {
  const n = Number(text);
  return text !== null && known.has(n) ? n : fallback;
}

export function Component() {
  const specId = Number(useParams().specId);
  const { data: spec } = useSuspenseQuery(specQuery(specId));
  const { data: versions } = useSuspenseQuery(specVersionsQuery(specId));
  const { data: schema } = useSuspenseQuery(specSchemaQuery());
  const { data: user } = useSuspenseQuery(meQuery());
  const members = useQuery(projectMembersQuery(spec.projectId));
  const [params, setParams] = useSearchParams();

  const known = useMemo(() => new Set(versions.items.map((v) => v.version)), [versions]);
  const latest = Math.max(...versions.items.map((v) => v.version));
  const to = pickedVersion(params.get('to'), known, latest);
  const from = pickedVersion(params.get('from'), known, Math.max(1, latest - 1));
  const comparable = versions.items.length > 1 && from !== to;
  const diff = useQuery({ ...specDiffQuery(specId, from, to), enabled: comparable, placeholderData: keepPreviousData });

  const rows = useMemo(() => {
    if (!diff.data) return [];
    const payloadOf = (n: number) => versions.items.find((v) => v.version === n)?.payload;
    return readableChanges(schema as SchemaNode, diff.data.changes, payloadOf(diff.data.from), payloadOf(diff.data.to));
  }, [diff.data, versions, schema]);

  // The notes of the versions the comparison spans (after the older side, up to the newer one).
  const notes = versions.items.filter((v) => v.note && v.version > Math.min(from, to) && v.version <= Math.max(from, to)).sort((a, b) => a.version - b.version);
  const authorName = (id: number) => (id === user?.id ? `${user.displayName} (you)` : (members.data?.items.find((m) => m.id === id)?.displayName ?? `User #${id}`));
  // The newest ranking of each compared version, for the side-by-side view of the two rankings.
  const proposals = useQuery({ ...recentProposalsQuery(spec.projectId), enabled: comparable });
  const rankingOf = (version: number) => proposals.data?.items.find((p) => p.specId === specId && p.specVersionNumber === version) ?? null;
  const rankingFrom = rankingOf(Math.min(from, to));
  const rankingTo = rankingOf(Math.max(from, to));
  const onPick = (nextFrom: number, nextTo: number) => setParams({ from: String(nextFrom), to: String(nextTo) }, { replace: true });

  return (
    <>
      <PageHeader
        eyebrow={
          <Link to={paths.spec.href(specId)} className="hover:underline">
            {spec.title}
          </Link>
        }
        title="Version history"
      >
        Every change saved is a new version; nothing is overwritten. Choose two versions to see what changed between them.
      </PageHeader>
      <div className="grid grid-cols-[minmax(0,1fr)] gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <Sheet title="Versions" className="lg:order-1">
          <VersionPicker versions={versions.items} authorName={authorName} from={from} to={to} onPick={onPick} />
        </Sheet>
        <Sheet title="What changed" aria-busy={diff.isFetching || undefined} className="lg:order-2">
          {versions.items.length > 1 && (
            <div className="mb-4">
              <CompareSentence versions={versions.items} from={from} to={to} onPick={onPick} />
            </div>
          )}
          {versions.items.length < 2 ? (
            <EmptyState title="Only one version so far">Save the spec again and the differences between versions show here.</EmptyState>
          ) : from === to ? (
            <EmptyState title="The same version on both sides">Choose another version in one of the two lists.</EmptyState>
          ) : diff.isPending ? (
            <Loading what="Comparing the versions" />
          ) : diff.isError ? (
            <ErrorPanel error={diff.error} retry={() => void diff.refetch()} />
          ) : rows.length === 0 ? (
            <EmptyState title="No differences">Versions {from} and {to} hold the same values.</EmptyState>
          ) : (
            <>
              {notes.length > 0 && (
                <ul aria-label="Change notes" className="mb-3 space-y-1 rounded-md bg-paper px-3 py-2 text-sm dark:bg-night">
                  {notes.map((v) => (
                    <li key={v.id} className="break-words">
                      <span className="text-ink-soft dark:text-night-ink-soft">Version {v.version}:</span> “{v.note}”
                    </li>
                  ))}
                </ul>
              )}
              <ChangesTable rows={rows} from={diff.data.from} to={diff.data.to} />
              {proposals.data && (
                <p className="mt-3 border-t border-rule/60 pt-2 text-sm dark:border-night-rule/60">
                  {rankingFrom && rankingTo ? (
                    <Link to={paths.compare.href(compareQuery({ a: rankingFrom.id, b: rankingTo.id, tailA: null, tailB: null }))} className="font-medium text-fern underline dark:text-fern-bright">
                      Set the rankings of versions {Math.min(from, to)} and {Math.max(from, to)} side by side (proposals #{rankingFrom.id} and #{rankingTo.id})
                    </Link>
                  ) : (
                    <span className="text-ink-soft dark:text-night-ink-soft">
                      {[!rankingFrom && Math.min(from, to), !rankingTo && Math.max(from, to)].filter(Boolean).map((v) => `Version ${v}`).join(' and ')} {rankingFrom || rankingTo ? 'has' : 'have'} no ranking
                      among the project’s newest 100 proposals, so their rankings cannot be set side by side yet.
                    </span>
                  )}
                </p>
              )}
            </>
          )}
        </Sheet>
      </div>
    </>
  );
}

export const ErrorBoundary = RouteError;
