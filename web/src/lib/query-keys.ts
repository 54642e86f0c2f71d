/**
 * The query keys of the resources other parts of the app nest their own keys under or refresh:
 * projects, specs, proposals, and what waits for the signed-in person (which every workflow write
 * refreshes). A key's prefix is what invalidation matches, so a proposal's
 * measurements and report live under the proposal's key and a project's device library under the
 * project's. Each feature's own keys stay with its queries.
 */
import type { ProposalState } from '#shared/workflow/proposal-states';
import type { WaitingKind } from '#shared/workflow/waiting';

export const projectKeys = {
  all: ['projects'] as const,
  list: () => ['projects', 'list'] as const,
  detail: (id: number) => ['projects', 'detail', id] as const,
  specs: (id: number) => ['projects', 'detail', id, 'specs'] as const,
  members: (id: number) => ['projects', 'detail', id, 'members'] as const,
  proposals: (id: number, status: ProposalState | 'all', page: number) => ['projects', 'detail', id, 'proposals', status, page] as const,
  /** The newest proposals of a project, for choosing one to set beside another (side by side). */
  recentProposals: (id: number) => ['projects', 'detail', id, 'proposals', 'recent'] as const,
  proposalCount: (id: number, status: ProposalState) => ['projects', 'detail', id, 'proposal-count', status] as const,
};

export const specKeys = {
  all: ['specs'] as const,
  schema: () => ['specs', 'schema'] as const,
  detail: (id: number) => ['specs', 'detail', id] as const,
  versions: (id: number) => ['specs', 'detail', id, 'versions'] as const,
  diff: (id: number, from: number, to: number) => ['specs', 'detail', id, 'diff', from, to] as const,
};

export const proposalKeys = {
  all: ['proposals'] as const,
  detail: (id: number) => ['proposals', 'detail', id] as const,
  audit: (id: number) => ['proposals', 'detail', id, 'audit'] as const,
  comments: (id: number) => ['proposals', 'detail', id, 'comments'] as const,
  people: (projectId: number) => ['proposals', 'people', projectId] as const,
};

/** What waits for the signed-in person: the navigation's counts and the home page's lists; every workflow write invalidates `all`. */
export const waitingKeys = {
  all: ['waiting'] as const,
  counts: () => ['waiting', 'counts'] as const,
  list: (kind: WaitingKind, page: number) => ['waiting', 'list', kind, page] as const,
};
