import { useNavigation, useSearchParams } from 'react-router-dom';
import { readProposalView, writeProposalView, type ProposalFilter } from '../utils/proposal-filter';

/**
 * The proposals view (status, page) kept in the URL, so a filtered page can be shared and the
 * back button walks through it; changing the status goes back to page 1. `pending` is true while
 * the route's loader fetches the page just asked for.
 */
export function useProposalView() {
  const [params, setParams] = useSearchParams();
  const navigation = useNavigation();
  const view = readProposalView(params);
  const go = (next: { status?: ProposalFilter; page?: number }) =>
    setParams((current) => writeProposalView(current, { status: next.status ?? view.status, page: next.page ?? (next.status ? 1 : view.page) }), {
      preventScrollReset: true,
    });
  return {
    ...view,
    setStatus: (status: ProposalFilter) => go({ status }),
    setPage: (page: number) => go({ page }),
    pending: navigation.state === 'loading',
  };
}
