import { EntitySchema } from 'typeorm';
import type { VerificationKind, VerificationState } from '../../shared/verification/types';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

/**
 * A SPICE verification job: every option of a proposal, or a Monte Carlo of one option. Claimed
 * by one server instance (`claimToken`), which keeps `heartbeatAt` fresh while it simulates; a
 * job whose claimant stopped is marked `stopped`, never left simulating.
 */
export interface VerificationJob {
  id: number;
  proposalId: number;
  kind: VerificationKind;
  topology: string | null;
  runs: number | null;
  state: VerificationState;
  done: number;
  total: number;
  step: string | null;
  message: string | null;
  /** The result (ProposalVerificationResult or MonteCarloVerificationResult), JSON text. */
  result: string | null;
  requestedById: number;
  claimToken: string | null;
  heartbeatAt: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

const nullableTimestamp = (name: string) => ({ ...timestampColumn(name), nullable: true });

export const VerificationJobEntity = new EntitySchema<VerificationJob>({
  name: 'VerificationJob',
  tableName: 'verification_job',
  columns: {
    id: idColumn,
    proposalId: foreignKeyColumn('proposal_id'),
    kind: shortTextColumn(20),
    topology: shortTextColumn(40, true),
    runs: { type: 'integer', nullable: true },
    state: shortTextColumn(20),
    done: { type: 'integer' },
    total: { type: 'integer' },
    step: shortTextColumn(200, true),
    message: textColumn(true),
    result: textColumn(true),
    requestedById: foreignKeyColumn('requested_by_id'),
    claimToken: { ...shortTextColumn(40, true), name: 'claim_token' },
    heartbeatAt: nullableTimestamp('heartbeat_at'),
    createdAt: timestampColumn('created_at'),
    startedAt: nullableTimestamp('started_at'),
    finishedAt: nullableTimestamp('finished_at'),
  },
});
