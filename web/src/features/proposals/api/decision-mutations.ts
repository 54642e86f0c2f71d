/**
 * The workflow's writes (decide, review, withdraw), the what-if analysis behind the override editor and the
 * full check of own values. Decide and review answer with the whole proposal: it goes into the
 * cache, then every proposal query and what waits for the person (the navigation's count) are
 * invalidated and awaited so the page shows the new state before the mutation settles. The full check records nothing, so it touches no cache.
 */
import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { Design } from '#shared/engine/types';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { AnalyzeResponse } from '#shared/api/engine';
import type { DecisionInput, OptionEvaluation, Proposal, ReviewInput } from '#shared/api/proposals';
import { proposalKeys, waitingKeys } from '../../../lib/query-keys';

/** What-if keys hold the design itself (as JSON), so a changed value is a new query and a stale answer is never shown for it. */
export const whatIfKeys = {
  all: ['what-if'] as const,
  design: (designJson: string) => ['what-if', 'design', designJson] as const,
};

/** The engine's nominal figures for a design; the engine is deterministic, so an answer never goes stale. */
export const whatIfQuery = (designJson: string) =>
  queryOptions({
    queryKey: whatIfKeys.design(designJson),
    queryFn: () => apiClient.post<AnalyzeResponse>(api.analyze, JSON.parse(designJson) as Design),
    staleTime: Infinity,
    gcTime: 60_000,
    retry: false,
    placeholderData: keepPreviousData,
  });

export function decideProposal(proposalId: number, body: DecisionInput): Promise<Proposal> {
  return apiClient.post<Proposal>(api.decision(proposalId), body);
}

/** Every rule over the spec's corners, Monte Carlo included, for own values: what an override of this design would be recorded with. */
export function evaluateOverride(proposalId: number, design: Design): Promise<OptionEvaluation> {
  return apiClient.post<OptionEvaluation>(api.evaluation(proposalId), { design });
}

export function reviewProposal(proposalId: number, body: ReviewInput): Promise<Proposal> {
  return apiClient.post<Proposal>(api.review(proposalId), body);
}

export function withdrawProposal(proposalId: number, reason: string): Promise<Proposal> {
  return apiClient.post<Proposal>(api.withdrawal(proposalId), { reason });
}

/** Puts the server's answer in the cache, then refreshes every proposal query (the audit trail included) and what waits for the person (the navigation's count). */
function useSettleProposal(proposalId: number) {
  const queryClient = useQueryClient();
  return async (proposal: Proposal) => {
    queryClient.setQueryData(proposalKeys.detail(proposalId), proposal);
    await Promise.all([queryClient.invalidateQueries({ queryKey: proposalKeys.all }), queryClient.invalidateQueries({ queryKey: waitingKeys.all })]);
  };
}

export function useDecideMutation(proposalId: number) {
  const settle = useSettleProposal(proposalId);
  return useMutation({ mutationFn: (body: DecisionInput) => decideProposal(proposalId, body), onSuccess: settle });
}

export function useReviewMutation(proposalId: number) {
  const settle = useSettleProposal(proposalId);
  return useMutation({ mutationFn: (body: ReviewInput) => reviewProposal(proposalId, body), onSuccess: settle });
}

export function useWithdrawMutation(proposalId: number) {
  const settle = useSettleProposal(proposalId);
  return useMutation({ mutationFn: (reason: string) => withdrawProposal(proposalId, reason), onSuccess: settle });
}

/** The full check of own values; a POST because the engine works for seconds, not because anything is written. */
export function useOverrideCheckMutation(proposalId: number) {
  return useMutation({ mutationFn: (design: Design) => evaluateOverride(proposalId, design) });
}
