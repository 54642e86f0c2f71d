import { queryOptions } from '@tanstack/react-query';
import { SETTLED_VERIFICATION_STATES, type VerificationStatus } from '#shared/verification/types';
import { api } from '../../../config/paths';
import { ApiError, apiClient } from '../../../lib/api';
import { proposalKeys } from '../../../lib/query-keys';

/** Nothing verified: what a server without the verification route amounts to. */
export const NO_VERIFICATION: VerificationStatus = { verification: null, monteCarlo: [] };

export const reportKeys = {
  /** Under the proposal's key, so whatever refreshes a proposal refreshes its report too. */
  verification: (proposalId: number) => [...proposalKeys.detail(proposalId), 'report', 'verification'] as const,
};

/**
 * The proposal's SPICE verification for the report. A server that has no verification route yet
 * answers 404 route-not-found: that reads as "not verified yet", so the report works either way.
 */
export const reportVerificationQuery = (proposalId: number) =>
  queryOptions({
    queryKey: reportKeys.verification(proposalId),
    queryFn: async () => {
      try {
        return await apiClient.get<VerificationStatus>(api.verification(proposalId));
      } catch (error) {
        if (error instanceof ApiError && error.status === 404 && error.code === 'route-not-found') return NO_VERIFICATION;
        throw error;
      }
    },
    // While a job runs, the report follows it (every few seconds), so a print waits for nothing stale.
    refetchInterval: (query) => (isRunning(query.state.data) ? 3000 : false),
  });

function isRunning(status: VerificationStatus | undefined): boolean {
  if (!status) return false;
  return [status.verification, ...status.monteCarlo].some((job) => job !== null && !SETTLED_VERIFICATION_STATES.includes(job.state));
}
