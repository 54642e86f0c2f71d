/**
 * Asking for SPICE work: a verification of every option, or a Monte Carlo run of one option. The
 * server answers 202 with the job (a new one, or the one already queued for the same work); it
 * goes into the cached status at once, so the progress shows and polling starts without waiting
 * for the next read, then the status is refreshed. Withdrawing a job answers it `withdrawn`, put
 * in place the same way.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VerificationJobView, VerificationStatus } from '#shared/verification/types';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import { verificationKeys } from '../../../lib/verification-queries';
import type { MonteCarloInput } from '#shared/api/verification';

export type { MonteCarloInput };

export function requestVerification(proposalId: number): Promise<VerificationJobView> {
  return apiClient.post<VerificationJobView>(api.verification(proposalId));
}

export function requestMonteCarlo(proposalId: number, body: MonteCarloInput): Promise<VerificationJobView> {
  return apiClient.post<VerificationJobView>(api.monteCarlo(proposalId), body);
}

/** The status with a job put in its place: the proposal's verification, or the newest Monte Carlo job of its option. */
export function withJob(status: VerificationStatus | undefined, job: VerificationJobView): VerificationStatus {
  const current: VerificationStatus = status ?? { verification: null, monteCarlo: [] };
  if (job.kind === 'proposal') return { ...current, verification: job };
  return { ...current, monteCarlo: [job, ...current.monteCarlo.filter((j) => j.topology !== job.topology || (j.source ?? 'option') !== (job.source ?? 'option'))] };
}

function useSettleJob(proposalId: number) {
  const queryClient = useQueryClient();
  const key = verificationKeys.status(proposalId);
  return async (job: VerificationJobView) => {
    queryClient.setQueryData<VerificationStatus>(key, (status) => withJob(status, job));
    await queryClient.invalidateQueries({ queryKey: key });
  };
}

export function useVerifyMutation(proposalId: number) {
  const settle = useSettleJob(proposalId);
  return useMutation({ mutationFn: () => requestVerification(proposalId), onSuccess: settle });
}

export function useMonteCarloMutation(proposalId: number) {
  const settle = useSettleJob(proposalId);
  return useMutation({ mutationFn: (body: MonteCarloInput) => requestMonteCarlo(proposalId, body), onSuccess: settle });
}

export function withdrawJob(proposalId: number, jobId: number): Promise<VerificationJobView> {
  return apiClient.delete<VerificationJobView>(api.verificationJob(proposalId, jobId));
}

export function useWithdrawMutation(proposalId: number) {
  const settle = useSettleJob(proposalId);
  return useMutation({ mutationFn: (jobId: number) => withdrawJob(proposalId, jobId), onSuccess: settle });
}
