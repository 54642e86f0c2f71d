import { mayAs } from '#shared/workflow/roles';
import { EmptyState } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import type { Proposal } from '#shared/api/proposals';
import type { User } from '#shared/api/users';
import { useDecideMutation } from '../api/decision-mutations';
import { usePersonName } from './audit/use-person-name';
import { When } from './audit/when';
import { decisionKindWords, latestDecision } from './decision/decided-option';
import { DecisionForm } from './decision/decision-form';
import { DecisionSummary } from './decision/decision-summary';
import { topologyName } from '../../../lib/topology-names';

/** The designer's decision: accept, choose another option, or override with own values (with a live what-if). */
export function DecisionPanel({ proposal, user }: { proposal: Proposal; user: User }) {
  const mutation = useDecideMutation(proposal.id);
  const nameOf = usePersonName(proposal.projectId, user);
  const decision = latestDecision(proposal);
  const canDecide = mayAs(user, proposal.projectId, 'proposals:decide') && proposal.allowedEvents.includes('decide');
  const reviewsNow = mayAs(user, proposal.projectId, 'proposals:review') && proposal.allowedEvents.includes('approve');

  if (canDecide) {
    return (
      <Sheet title={proposal.status === 'returned' ? 'Decide again' : 'Your decision'} aria-label="Your decision">
        {proposal.status === 'returned' && decision && <ReturnedNote proposal={proposal} nameOf={nameOf} />}
        <DecisionForm key={proposal.decisions.length} proposal={proposal} mutation={mutation} />
      </Sheet>
    );
  }

  return (
    <Sheet title="Decision" aria-label="Decision">
      {mutation.isSuccess && (
        <p role="status" className="mb-3 rounded-md bg-holds-soft p-2 text-sm text-holds dark:bg-holds/20 dark:text-holds-bright">
          Decision recorded. The proposal now waits for a reviewer.
        </p>
      )}
      {!decision ? (
        <EmptyState title="No decision yet">The proposal waits for a designer to accept the recommendation, choose another option or use own values.</EmptyState>
      ) : reviewsNow ? (
        <p className="text-sm">
          {nameOf(decision.decidedById)} {decisionKindWords(decision.kind, proposal)} ({topologyName(decision.topology)}) on <When iso={decision.createdAt} />. It is yours to review below.
        </p>
      ) : (
        <DecisionSummary proposal={proposal} decision={decision} nameOf={nameOf} />
      )}
    </Sheet>
  );
}

/** Why the proposal came back, and the decision that was sent back, before the designer decides again. */
function ReturnedNote({ proposal, nameOf }: { proposal: Proposal; nameOf: (id: number | null) => string }) {
  const review = [...proposal.reviews].reverse().find((r) => r.verdict === 'return');
  const decision = latestDecision(proposal)!;
  return (
    <div className="mb-4 space-y-2">
      {review && (
        <div className="rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
          <p className="font-medium">
            Sent back for rework by {nameOf(review.reviewerId)} on <When iso={review.createdAt} />
          </p>
          <blockquote className="mt-1 whitespace-pre-line text-ink dark:text-night-ink">{review.comment}</blockquote>
        </div>
      )}
      <details className="rounded-md border border-rule p-3 text-sm dark:border-night-rule">
        <summary className="cursor-pointer font-medium">The decision that was returned</summary>
        <div className="mt-3">
          <DecisionSummary proposal={proposal} decision={decision} nameOf={nameOf} />
        </div>
      </details>
    </div>
  );
}
