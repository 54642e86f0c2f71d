import type { QueryClient } from '@tanstack/react-query';
import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { Proposal } from '#shared/api/proposals';
import type { TopologyId } from '#shared/engine/types';
import { RouteError } from '../components/layout/route-error';
import { EmptyState, ErrorPanel, Loading } from '../components/ui/feedback';
import { PageHeader } from '../components/ui/page-header';
import { Sheet } from '../components/ui/sheet';
import { paths } from '../config/paths';
import { ComparisonView } from '../features/proposals/components/compare/comparison-view';
import { compareQuery, readCompareState, type CompareState } from '../features/proposals/lib/compare-address';
import { comparisonKind, sideOf, type Side } from '../features/proposals/lib/comparison';
import { proposalQuery } from '../features/proposals/api/proposal-queries';
import { specDiffQuery, specSchemaQuery } from '../features/specs/api/spec-queries';
import { ChangesTable } from '../features/specs/components/changes-table';
import type { SchemaNode } from '../features/specs/lib/schema-nodes';
import { readableChanges } from '../features/specs/lib/spec-changes';
import { topologyName } from '../lib/topology-names';

/** Both proposals (each through its project's visibility: no access answers as on the proposal page), and the spec schema for a spec's changes. */
export const loader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const state = readCompareState(new URL(request.url).searchParams);
    if (!state) return null;
    const [a, b] = await Promise.all([queryClient.ensureQueryData(proposalQuery(state.a)), queryClient.ensureQueryData(proposalQuery(state.b))]);
    if (a.specId === b.specId && a.specVersion.version !== b.specVersion.version) await queryClient.ensureQueryData(specSchemaQuery());
    return null;
  };

export function Component() {
  const [params, setParams] = useSearchParams();
  const state = readCompareState(params);
  if (!state) {
    return (
      <>
        <PageHeader title="Side by side" />
        <EmptyState title="Nothing to compare yet">
          Open a proposal and choose two of its options, or another proposal of the project, under “Side by side”; or compare the rankings of two spec versions from the spec’s version history.
        </EmptyState>
      </>
    );
  }
  return <Comparison state={state} onState={(next) => setParams(new URLSearchParams(compareQuery(next)), { replace: true })} />;
}

function Comparison({ state, onState }: { state: CompareState; onState: (next: CompareState) => void }) {
  const { data: proposalA } = useSuspenseQuery(proposalQuery(state.a));
  const { data: proposalB } = useSuspenseQuery(proposalQuery(state.b));
  const a = useMemo(() => sideOf('a', proposalA, state.tailA), [proposalA, state.tailA]);
  const b = useMemo(() => sideOf('b', proposalB, state.tailB), [proposalB, state.tailB]);
  if (!a || !b) {
    return (
      <>
        <PageHeader title="Side by side" />
        <EmptyState title="Nothing to compare">{!a ? `Proposal #${proposalA.id}` : `Proposal #${proposalB.id}`} holds no tail options.</EmptyState>
      </>
    );
  }
  const kind = comparisonKind(a, b);
  const onTail = (key: Side['key'], topology: TopologyId) => onState({ ...state, [key === 'a' ? 'tailA' : 'tailB']: topology, a: state.a, b: state.b });
  const swap = compareQuery({ a: state.b, b: state.a, tailA: b.option.topology, tailB: a.option.topology });
  return (
    <>
      <PageHeader
        eyebrow={<span>Side by side · {kind === 'options' ? `two options of proposal #${a.proposal.id}` : kind === 'versions' ? `spec versions ${a.proposal.specVersion.version} and ${b.proposal.specVersion.version}` : `proposals #${a.proposal.id} and #${b.proposal.id}`}</span>}
        title={`${topologyName(a.option.topology)} beside ${topologyName(b.option.topology)}`}
        actions={
          <Link to={paths.compare.href(swap)} replace className="rounded-md border border-rule px-2.5 py-1 text-sm hover:bg-paper dark:border-night-rule dark:hover:bg-night">
            Swap sides
          </Link>
        }
      >
        The address holds this view: copy it to share exactly these two options.
      </PageHeader>
      <div className="space-y-5">
        <ComparisonView a={a} b={b} onTail={onTail} />
        {kind === 'versions' && <SpecChanges from={a.proposal} to={b.proposal} />}
      </div>
    </>
  );
}

/** The spec's changes between the two sides' versions, field by field with units (the version history's table). */
function SpecChanges({ from, to }: { from: Proposal; to: Proposal }) {
  const { data: schema } = useSuspenseQuery(specSchemaQuery());
  const diff = useQuery(specDiffQuery(from.specId, from.specVersion.version, to.specVersion.version));
  const rows = useMemo(
    () => (diff.data ? readableChanges(schema as SchemaNode, diff.data.changes, from.specVersion.payload, to.specVersion.payload) : []),
    [diff.data, schema, from, to],
  );
  return (
    <Sheet title={`What the spec changed from version ${from.specVersion.version} to version ${to.specVersion.version}`} aria-label="What the spec changed">
      {diff.isPending ? (
        <Loading what="Comparing the versions" />
      ) : diff.isError ? (
        <ErrorPanel error={diff.error} retry={() => void diff.refetch()} />
      ) : rows.length === 0 ? (
        <EmptyState title="No differences">The two versions hold the same values.</EmptyState>
      ) : (
        <ChangesTable rows={rows} from={from.specVersion.version} to={to.specVersion.version} />
      )}
    </Sheet>
  );
}

export const ErrorBoundary = RouteError;
