/**
 * SPICE verification of a proposal: the latest whole-proposal job and the latest Monte Carlo job
 * per option, in one query. It polls once a second while any job is waiting or simulating and
 * stops as soon as every job has settled (finished, stopped or failed).
 */
import { queryOptions } from '@tanstack/react-query';
import { SETTLED_VERIFICATION_STATES, type VerificationJobView, type VerificationStatus } from '#shared/verification/types';
import { api } from '../config/paths';
import { apiClient } from './api';
import { proposalKeys } from './query-keys';

/** How often a running job is asked about, ms. */
export const VERIFICATION_POLL_MS = 1000;

export const verificationKeys = {
  /** Under the proposal's own key, so refreshing a proposal refreshes its verification too. */
  status: (proposalId: number) => [...proposalKeys.detail(proposalId), 'verification'] as const,
};

/** Whether a job will not change any more (or there is none). */
export function isSettled(job: VerificationJobView | null | undefined): boolean {
  return !job || SETTLED_VERIFICATION_STATES.includes(job.state);
}

/** Whether any job of the status is still waiting or simulating. */
export function hasRunningJob(status: VerificationStatus | undefined): boolean {
  if (!status) return false;
  return !isSettled(status.verification) || status.monteCarlo.some((job) => !isSettled(job));
}

export const verificationQuery = (proposalId: number) =>
  queryOptions({
    queryKey: verificationKeys.status(proposalId),
    queryFn: () => apiClient.get<VerificationStatus>(api.verification(proposalId)),
    refetchInterval: (query) => (hasRunningJob(query.state.data) ? VERIFICATION_POLL_MS : false),
  });
