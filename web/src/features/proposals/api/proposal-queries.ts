import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { AuditEvent, Items, Proposal } from '../../../lib/api-types';

export const proposalKeys = {
  all: ['proposals'] as const,
  detail: (id: number) => ['proposals', 'detail', id] as const,
  audit: (id: number) => ['proposals', 'detail', id, 'audit'] as const,
};

export const proposalQuery = (id: number) => queryOptions({ queryKey: proposalKeys.detail(id), queryFn: () => apiClient.get<Proposal>(api.proposal(id)) });
export const proposalAuditQuery = (id: number) => queryOptions({ queryKey: proposalKeys.audit(id), queryFn: () => apiClient.get<Items<AuditEvent>>(api.audit(id)) });
