/**
 * Waits for a SPICE check or Monte Carlo job through the API, as a page would: polls the
 * proposal's verification status until the picked job has finished, stopped or failed.
 */
import type { VerificationJobView, VerificationStatus } from '#shared/verification/types';
import type { ApiClient } from './api-app';

export type JobPick = (status: VerificationStatus) => VerificationJobView | null | undefined;

/** The job once settled, and every state of it seen on the way (oldest first). */
export async function settledJob(
  client: ApiClient,
  proposalId: number,
  pick: JobPick = (s) => s.verification,
  { timeoutMs = 120_000, pollMs = 50 } = {},
): Promise<{ job: VerificationJobView; seen: VerificationJobView[] }> {
  const t0 = Date.now();
  const seen: VerificationJobView[] = [];
  for (;;) {
    const status = (await client.get(`/api/proposals/${proposalId}/verification`).expect(200)).body as VerificationStatus;
    const job = pick(status);
    if (job) seen.push(job);
    if (job && ['finished', 'stopped', 'failed'].includes(job.state)) return { job, seen };
    if (Date.now() - t0 > timeoutMs) throw new Error(`job not settled: ${JSON.stringify(job)}`);
    await new Promise((r) => setTimeout(r, pollMs));
  }
}
