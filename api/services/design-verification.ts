/**
 * How the SPICE verification stands for a proposal's current design: the finished whole-proposal
 * jobs, newest first, are searched for a result that simulated exactly that design (equal
 * fingerprints); failing that, the newest result that stood for it tells what changed since.
 * Shown with the verification, exported, and checked before a sign-off.
 */
import type { DataSource, EntityManager } from 'typeorm';
import { VerificationJobEntity } from '../entities/verification-job.entity';
import { freshness, resultForDesign, type DesignBinding, type DesignToMatch } from '#shared/verification/binding';
import type { DesignVerificationState, ProposalVerificationResult } from '#shared/verification/types';

/** How many finished jobs are searched (newest first) for one that simulated the current design. */
const JOBS_SEARCHED = 50;

export async function designVerificationState(
  manager: DataSource | EntityManager,
  proposalId: number,
  design: (DesignToMatch & { basis: 'decision' | 'recommendation' }) | null,
): Promise<DesignVerificationState> {
  if (!design) return { state: 'none', jobId: null, changes: [] };
  const jobs = await manager.getRepository(VerificationJobEntity).find({
    select: { id: true, result: true },
    where: { proposalId, kind: 'proposal', state: 'finished' },
    order: { id: 'DESC' },
    take: JOBS_SEARCHED,
  });
  let nearest: DesignVerificationState | null = null;
  for (const job of jobs) {
    if (!job.result) continue;
    const result = job.result as ProposalVerificationResult;
    const entry = resultForDesign(result.options ?? [], design);
    if (!entry) continue;
    const state = freshness(entry.binding as DesignBinding | undefined, design.binding, design.basis === 'decision' ? 'decided' : 'recommended');
    if (state.state === 'current') return { state: 'current', jobId: job.id, changes: [] };
    nearest ??= { state: state.state, jobId: job.id, changes: state.state === 'stale' ? state.changes : [] };
  }
  return nearest ?? { state: 'none', jobId: null, changes: [] };
}
