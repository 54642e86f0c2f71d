import { EntitySchema } from 'typeorm';
import type { Review as WireReview, Verdict } from '#shared/api/proposals';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

export type { Verdict };

/** A review as stored: the wire shape, with the fields older answers may lack always present in the row. */
export type Review = Required<WireReview>;

export const ReviewEntity = new EntitySchema<Review>({
  name: 'Review',
  tableName: 'review',
  columns: {
    id: idColumn,
    proposalId: foreignKeyColumn('proposal_id'),
    decisionId: foreignKeyColumn('decision_id'),
    verdict: shortTextColumn(20),
    comment: textColumn(true),
    reviewerId: foreignKeyColumn('reviewer_id'),
    createdAt: timestampColumn('created_at'),
    verificationJobId: foreignKeyColumn('verification_job_id', true),
    staleVerificationAccepted: { type: 'boolean', name: 'stale_verification_accepted', default: false },
  },
});
