import { useSuspenseQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { StateBadge } from '../components/ui/state-badge';
import { PageHeader } from '../components/ui/page-header';
import { AfterFirstPaint } from '../components/ui/deferred';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { proposalQuery } from '../features/proposals/api/proposal-queries';
import { AuditTimeline } from '../features/proposals/components/audit-timeline';
import { DecisionPanel } from '../features/proposals/components/decision-panel';
import { RankingView } from '../features/proposals/components/ranking-view';
import { ReviewPanel } from '../features/proposals/components/review-panel';
import { VerificationPanel } from '../features/proposals/components/verification-panel';
import { MeasurementsPanel } from '../features/measurements/components/measurements-panel';
import { NextStep } from '../features/proposals/components/next-step';
import { LifecyclePanel } from '../features/proposals/components/lifecycle-panel';
import { specSchemaQuery } from '../features/specs/api/spec-queries';
import { SpecMovedOn } from '../features/specs/components/spec-moved-on';
import type { SchemaNode } from '../features/specs/lib/schema-nodes';
import type { Proposal } from '#shared/api/proposals';
import { RouteError } from '../components/layout/route-error';
import { proposalCurrentDesign } from '../features/proposals/lib/current-design';
import { currentDesignName, currentDesignRole } from '#shared/workflow/current-design';
import { formatDateTime } from '../lib/dates';
import { CommentsProvider } from '../features/proposals/components/comments/comments-context';
import { CommentsSheet } from '../features/proposals/components/comments/comments-sheet';

/** The ranking page; its loader is in ./proposal-loader.ts, which the router keeps in the entry chunk. */
export function Component() {
  const proposalId = Number(useParams().proposalId);
  const { data: proposal } = useSuspenseQuery(proposalQuery(proposalId));
  const { data: user } = useSuspenseQuery(meQuery());
  if (!user) return null;
  const current = proposalCurrentDesign(proposal);
  return (
    <CommentsProvider proposal={proposal} user={user}>
      <PageHeader
        eyebrow={
          <Link to={paths.spec.href(proposal.specId)} className="hover:underline">
            {proposal.specVersion.title} · version {proposal.specVersion.version}
          </Link>
        }
        title={`Proposal #${proposal.id}`}
        actions={
          <>
            <StateBadge state={proposal.status} />
            <Link to={paths.report.href(proposal.id)} className="rounded-md border border-rule px-2.5 py-1 text-sm hover:bg-paper dark:border-night-rule dark:hover:bg-night">
              Review report
            </Link>
          </>
        }
      >
        {current && (
          <span data-testid="header-design">
            {currentDesignRole(current, proposal.status)}: <span className="font-medium text-ink dark:text-night-ink">{currentDesignName(current)}</span> ·{' '}
          </span>
        )}
        Engine {proposal.engineVersion} · rule set {proposal.rulesetVersion.slice(0, 12)} · {formatDateTime(proposal.createdAt)}
      </PageHeader>
      <div className="mb-6 space-y-3 empty:hidden">
        <LifecyclePanel proposal={proposal} user={user} />
        {proposal.specMovedOn && <ProposalSpecMovedOn proposal={proposal} movedOn={proposal.specMovedOn} />}
      </div>
      <NextStep proposal={proposal} user={user} />
      <div className="space-y-6">
        <RankingView proposal={proposal} detailAfterFirstPaint />
        {/* The ranking table paints first; the option's detail and the panels below follow a frame later. */}
        <AfterFirstPaint>
          <div id="verification" className="scroll-mt-4">
            <VerificationPanel proposal={proposal} user={user} />
          </div>
          <div id="measurements" className="scroll-mt-4">
            <MeasurementsPanel proposal={proposal} user={user} />
          </div>
          <div id="decision" className="scroll-mt-4">
            <DecisionPanel proposal={proposal} user={user} />
          </div>
          <div id="review" className="scroll-mt-4">
            <ReviewPanel proposal={proposal} user={user} />
          </div>
          <div id="comments" className="scroll-mt-4">
            <CommentsSheet />
          </div>
          <AuditTimeline proposalId={proposal.id} />
        </AfterFirstPaint>
      </div>
    </CommentsProvider>
  );
}

/** The notice of a newer spec version, with the changes since the ranked one (the loader has fetched the spec schema). */
function ProposalSpecMovedOn({ proposal, movedOn }: { proposal: Proposal; movedOn: NonNullable<Proposal['specMovedOn']> }) {
  const { data: schema } = useSuspenseQuery(specSchemaQuery());
  return (
    <SpecMovedOn
      specId={proposal.specId}
      rankedVersion={proposal.specVersion.version}
      rankedPayload={proposal.specVersion.payload}
      movedOn={movedOn}
      schema={schema as SchemaNode}
      advice={movedOnAdvice(proposal)}
    />
  );
}

/** What the reader can do about a newer spec version, by the proposal's state. */
function movedOnAdvice(proposal: Proposal): string {
  if (proposal.status === 'approved') return 'The sign-off stands for the version ranked here; rank the latest version to check the design against it.';
  if (proposal.status === 'decided') return 'Check whether the decision still holds against the latest version before signing it off.';
  if (proposal.status === 'superseded' && proposal.supersededById) return `Proposal #${proposal.supersededById} ranks a later version.`;
  return 'Rank the latest version to see the options against it.';
}

export const ErrorBoundary = RouteError;
