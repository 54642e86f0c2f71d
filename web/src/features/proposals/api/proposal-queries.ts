import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { AuditEvent } from '#shared/api/admin';
import type { Items, Page } from '#shared/api/lists';
import type { Proposal, ProposalSummary } from '#shared/api/proposals';
import type { User } from '#shared/api/users';
import { projectKeys, proposalKeys } from '../../../lib/query-keys';

export const proposalQuery = (id: number) => queryOptions({ queryKey: proposalKeys.detail(id), queryFn: () => apiClient.get<Proposal>(api.proposal(id)) });
export const proposalAuditQuery = (id: number) => queryOptions({ queryKey: proposalKeys.audit(id), queryFn: () => apiClient.get<Items<AuditEvent>>(api.audit(id)) });

/** The project's members, to put names to the actors of a proposal's decisions, reviews and audit trail. */
export const proposalPeopleQuery = (projectId: number) =>
  queryOptions({ queryKey: proposalKeys.people(projectId), queryFn: () => apiClient.get<Items<User>>(api.members(projectId)), staleTime: 5 * 60_000 });

/** The project's newest proposals (the list's largest page, newest first): the choices to set beside a proposal, or a spec version's rankings. */
export const recentProposalsQuery = (projectId: number) =>
  queryOptions({
    queryKey: projectKeys.recentProposals(projectId),
    queryFn: () => apiClient.get<Page<ProposalSummary>>(api.projectProposals(projectId, '?page=1&pageSize=100')),
  });
