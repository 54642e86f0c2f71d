import { useQuery } from '@tanstack/react-query';
import { mayAs } from '#shared/workflow/roles';
import { verificationQuery } from '../../../lib/verification-queries';
import { Sheet } from '../../../components/ui/sheet';
import type { Proposal } from '#shared/api/proposals';
import type { User } from '#shared/api/users';
import { useReviewMutation } from '../api/decision-mutations';
import { usePersonName } from './audit/use-person-name';
import { decidedOption, latestDecision } from './decision/decided-option';
import { DecisionSummary } from './decision/decision-summary';
import { CheckList } from './review/check-list';
import { PastReviews } from './review/past-reviews';
import { ReviewForm } from './review/review-form';
import { OpenCommentsNote } from './comments/comments-sheet';

/** The reviewer's verdict on the latest decision: sign off, or send back for rework with a comment. */
export function ReviewPanel({ proposal, user }: { proposal: Proposal; user: User }) {
  const mutation = useReviewMutation(proposal.id);
  const verification = useQuery({ ...verificationQuery(proposal.id), enabled: mayAs(user, proposal.projectId, 'proposals:review') && proposal.allowedEvents.includes('approve') });
  const nameOf = usePersonName(proposal.projectId, user);
  const decision = latestDecision(proposal);
  const canReview = mayAs(user, proposal.projectId, 'proposals:review') && (proposal.allowedEvents.includes('approve') || proposal.allowedEvents.includes('return'));

  if (canReview && decision) {
    const option = decidedOption(proposal, decision);
    return (
      <Sheet title="Review the decided design" aria-label="Review the decided design">
        <div className="space-y-5">
          <DecisionSummary proposal={proposal} decision={decision} nameOf={nameOf} showChecks={false} />
          {option ? (
            <CheckList checks={option.checks} caption={decision.kind === 'override' ? 'Every check of the designer’s values, as the server ran them' : 'Every check of the decided option, as ranked'} />
          ) : (
            <p className="text-sm text-ink-soft">No checks were kept with this decision.</p>
          )}
          <OpenCommentsNote />
          <ReviewForm option={option} mutation={mutation} verification={verification.data?.currentDesign ?? null} />
          {proposal.reviews.length > 0 && (
            <section aria-label="Earlier reviews">
              <h3 className="mb-2 text-sm font-medium">Earlier reviews</h3>
              <PastReviews proposal={proposal} nameOf={nameOf} />
            </section>
          )}
        </div>
      </Sheet>
    );
  }

  if (proposal.reviews.length === 0 && !mutation.isSuccess) return null;
  return (
    <Sheet title="Reviews" aria-label="Reviews">
      {mutation.isSuccess && (
        <p role="status" className="mb-3 rounded-md bg-holds-soft p-2 text-sm text-holds dark:bg-holds/20 dark:text-holds-bright">
          {mutation.data.status === 'approved' ? 'Signed off: the record is closed.' : 'Sent back for rework with your comment.'}
        </p>
      )}
      <PastReviews proposal={proposal} nameOf={nameOf} />
    </Sheet>
  );
}
