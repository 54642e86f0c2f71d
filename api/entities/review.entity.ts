import { EntitySchema } from 'typeorm';
import type { Verdict } from '../../shared/api/proposals';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

export type { Verdict };

export interface Review {
  id: number;
  proposalId: number;
  decisionId: number;
  verdict: Verdict;
  comment: string | null;
  reviewerId: number;
  createdAt: string;
  /** The finished verification job the review relied on (null: none about the decided design). */
  verificationJobId: number | null;
  /** The reviewer signed off although that job simulated another design (said so in the comment). */
  staleVerificationAccepted: boolean;
}

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
