/**
 * The trade-off sweep (POST /api/tradeoff): a ranked option's topology sized at each of a list of
 * tail currents, each point's nominal figures. Stateless and deterministic, so an answer never
 * goes stale; the key holds the spec, the topology and the currents themselves.
 */
import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { TradeoffResponse } from '#shared/api/engine';
import type { TopologyId } from '#shared/engine/types';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';

export const tradeoffKeys = {
  all: ['tradeoff'] as const,
  sweep: (specJson: string, topology: TopologyId, tailCurrentsA: readonly number[]) => ['tradeoff', specJson, topology, tailCurrentsA.join(',')] as const,
};

export const tradeoffQuery = (spec: object, topology: TopologyId, tailCurrentsA: readonly number[]) => {
  const specJson = JSON.stringify(spec);
  return queryOptions({
    queryKey: tradeoffKeys.sweep(specJson, topology, tailCurrentsA),
    queryFn: () => apiClient.post<TradeoffResponse>(api.tradeoff, { spec, topology, tailCurrentsA: [...tailCurrentsA] }),
    staleTime: Infinity,
    gcTime: 5 * 60_000,
    retry: false,
    placeholderData: keepPreviousData,
  });
};
