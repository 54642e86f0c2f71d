import { Verdict } from '../../../../components/ui/verdict';
import type { Proposal } from '#shared/api/proposals';
import { When } from '../audit/when';

/** Every review so far, newest first: verdict, reviewer, when, comment, and which decision it judged. */
export function PastReviews({ proposal, nameOf }: { proposal: Proposal; nameOf: (id: number | null) => string }) {
  if (proposal.reviews.length === 0) return <p className="text-sm text-ink-soft dark:text-night-ink-soft">No reviews yet.</p>;
  const decisionNumber = (id: number) => proposal.decisions.findIndex((d) => d.id === id) + 1;
  return (
    <ol className="space-y-2" aria-label="Reviews, newest first">
      {[...proposal.reviews].reverse().map((review) => (
        <li key={review.id} className="rounded-md border border-rule p-3 text-sm dark:border-night-rule">
          <p className="flex flex-wrap items-center gap-2">
            {review.verdict === 'approve' ? <Verdict kind="holds" label="Signed off" /> : <Verdict kind="short" label="Sent back for rework" />}
            <span className="font-medium">{nameOf(review.reviewerId)}</span>
            <span className="text-ink-soft dark:text-night-ink-soft">
              <When iso={review.createdAt} /> · on decision {decisionNumber(review.decisionId)}
            </span>
          </p>
          {review.verdict === 'approve' && review.verificationJobId !== undefined && (
            <p className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft" data-testid="relied-on">
              {review.verificationJobId === null
                ? 'Relied on no SPICE check of this design (none had simulated it).'
                : review.staleVerificationAccepted
                  ? `Relied on SPICE job #${review.verificationJobId}, which simulated another design; accepted with the comment below.`
                  : `Relied on SPICE job #${review.verificationJobId}, which simulated exactly this design.`}
            </p>
          )}
          {review.comment ? <blockquote className="mt-1 whitespace-pre-line">{review.comment}</blockquote> : <p className="mt-1 text-ink-soft dark:text-night-ink-soft">No comment.</p>}
        </li>
      ))}
    </ol>
  );
}
