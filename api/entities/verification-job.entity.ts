import { EntitySchema } from 'typeorm';
import type { VerificationJobView } from '#shared/verification/types';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

/**
 * A SPICE verification job: every option of a proposal, or a Monte Carlo of one option. Claimed
 * by one server instance (`claimToken`), which keeps `heartbeatAt` fresh while it simulates; a
 * job whose claimant stopped is marked `stopped`, never left simulating. Its fields are the API's
 * view of a job (shared/verification/types.ts) but for the result, stored as JSON text, and the
 * requester, stored by id. The result is JSON text in the row.
 */
export interface VerificationJob extends Omit<VerificationJobView, 'requestedBy'> {
  requestedById: number;
  claimToken: string | null;
  heartbeatAt: string | null;
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
    source: { ...shortTextColumn(20), name: 'design_source', default: 'option' },
    state: shortTextColumn(20),
    done: { type: 'integer' },
    total: { type: 'integer' },
    step: shortTextColumn(200, true),
    message: textColumn(true),
    result: jsonColumn(true),
    requestedById: foreignKeyColumn('requested_by_id'),
    claimToken: { ...shortTextColumn(40, true), name: 'claim_token' },
    heartbeatAt: nullableTimestamp('heartbeat_at'),
    createdAt: timestampColumn('created_at'),
    startedAt: nullableTimestamp('started_at'),
    finishedAt: nullableTimestamp('finished_at'),
  },
});
