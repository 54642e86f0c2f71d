import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { WaitingKind, WaitingPage } from '#shared/api/waiting';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import { waitingKeys } from '../../../lib/query-keys';

/** Items a page of the home page's lists. */
export const WAITING_PAGE_SIZE = 10;

/** One page of one kind of what waits for the signed-in person, oldest first. */
export const waitingListQuery = (kind: WaitingKind, page: number) =>
  queryOptions({
    queryKey: waitingKeys.list(kind, page),
    queryFn: () => apiClient.get<WaitingPage>(api.waiting(`?${new URLSearchParams({ kind, page: String(page), pageSize: String(WAITING_PAGE_SIZE) })}`)),
    placeholderData: keepPreviousData,
  });
