import { mayAs } from '#shared/workflow/roles';
import type { Proposal } from '#shared/api/proposals';
import type { User } from '#shared/api/users';

/**
 * What this proposal waits for, at the top of the page: a returned proposal's comment, and a
 * jump to the decision or the review when it is this user's turn (the panels sit below the ranking).
 */
export function NextStep({ proposal, user }: { proposal: Proposal; user: User }) {
  const lastReview = proposal.reviews.at(-1);
  const canDecide = mayAs(user, proposal.projectId, 'proposals:decide') && proposal.allowedEvents.includes('decide');
  const canReview = mayAs(user, proposal.projectId, 'proposals:review') && proposal.allowedEvents.includes('approve');
  const returned = proposal.status === 'returned' && lastReview?.verdict === 'return';
  if (!returned && !canDecide && !canReview) return null;
  return (
    <aside
      aria-label="Next step"
      className="mb-6 rounded-lg border border-fern/40 bg-fern-soft/60 px-4 py-3 text-sm dark:border-fern-soft/30 dark:bg-night-sheet"
    >
      {returned && lastReview && (
        <p className="mb-1">
          <span className="font-medium">Sent back for rework by the reviewer:</span> “{lastReview.comment}”
        </p>
      )}
      {canDecide && (
        <p>
          {returned ? 'A new decision is needed.' : 'This proposal waits for your decision.'}{' '}
          <a href="#decision" className="font-medium text-fern underline dark:text-fern-bright">
            Go to the decision
          </a>
        </p>
      )}
      {canReview && (
        <p>
          A designer has decided; this waits for your review.{' '}
          <a href="#review" className="font-medium text-fern underline dark:text-fern-bright">
            Go to the review
          </a>
        </p>
      )}
    </aside>
  );
}
