/**
 * The proposals table's filter and page as they live in the URL (`?status=decided&page=3`):
 * read leniently (anything unknown means "all" and page 1), written minimally (defaults omitted).
 */
import { PROPOSAL_STATES, type ProposalState } from '#shared/workflow/proposal-states';

export type ProposalFilter = ProposalState | 'all';

/** The segments of the status filter, in the order a proposal lives through them. */
export const PROPOSAL_FILTERS: readonly ProposalFilter[] = ['all', 'ranked', 'decided', 'returned', 'approved', 'superseded', 'withdrawn'];

export interface ProposalView {
  status: ProposalFilter;
  page: number;
}

export function readProposalView(params: URLSearchParams): ProposalView {
  const status = params.get('status');
  const page = Number(params.get('page') ?? '1');
  return {
    status: PROPOSAL_STATES.includes(status as ProposalState) ? (status as ProposalState) : 'all',
    page: Number.isInteger(page) && page >= 1 ? page : 1,
  };
}

/** The search params for a view, keeping any unrelated params. */
export function writeProposalView(params: URLSearchParams, view: ProposalView): URLSearchParams {
  const next = new URLSearchParams(params);
  if (view.status === 'all') next.delete('status');
  else next.set('status', view.status);
  if (view.page === 1) next.delete('page');
  else next.set('page', String(view.page));
  return next;
}
