import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { ProposalState } from '#shared/workflow/proposal-states';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { ProjectRole } from '#shared/workflow/roles';
import type { Items, Page } from '#shared/api/lists';
import type { Project, ProjectMember } from '#shared/api/projects';
import type { ProposalSummary } from '#shared/api/proposals';
import type { Spec } from '#shared/api/specs';
import { projectKeys } from '../../../lib/query-keys';

export const projectListQuery = () => queryOptions({ queryKey: projectKeys.list(), queryFn: () => apiClient.get<Items<Project>>(api.projects) });
export const projectQuery = (id: number) => queryOptions({ queryKey: projectKeys.detail(id), queryFn: () => apiClient.get<Project>(api.project(id)) });
export const projectSpecsQuery = (id: number) => queryOptions({ queryKey: projectKeys.specs(id), queryFn: () => apiClient.get<Items<Spec>>(api.projectSpecs(id)) });
export const projectMembersQuery = (id: number) => queryOptions({ queryKey: projectKeys.members(id), queryFn: () => apiClient.get<Items<ProjectMember>>(api.members(id)) });

export const PROPOSAL_PAGE_SIZE = 20;

export const projectProposalsQuery = (id: number, status: ProposalState | 'all', page: number) =>
  queryOptions({
    queryKey: projectKeys.proposals(id, status, page),
    queryFn: () => {
      const query = new URLSearchParams({ page: String(page), pageSize: String(PROPOSAL_PAGE_SIZE) });
      if (status !== 'all') query.set('status', status);
      return apiClient.get<Page<ProposalSummary>>(api.projectProposals(id, `?${query}`));
    },
    placeholderData: keepPreviousData,
  });

export function createProject(body: { name: string; description: string }): Promise<Project> {
  return apiClient.post<Project>(api.projects, body);
}

/** How many proposals of a project are in a state: one row asked for, `total` read (the "what needs you" hint). */
export const projectProposalCountQuery = (id: number, status: ProposalState) =>
  queryOptions({
    queryKey: projectKeys.proposalCount(id, status),
    queryFn: async () => {
      const query = new URLSearchParams({ status, page: '1', pageSize: '1' });
      return (await apiClient.get<Page<ProposalSummary>>(api.projectProposals(id, `?${query}`))).total;
    },
  });

/** Adds the person with the role they hold in this project, or changes that role when they are a member already. */
export function addMember(projectId: number, userId: number, role: ProjectRole): Promise<unknown> {
  return apiClient.post(api.members(projectId), { userId, role });
}

export function removeMember(projectId: number, userId: number): Promise<void> {
  return apiClient.delete<void>(api.member(projectId, userId));
}
