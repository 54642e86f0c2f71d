import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { ActivityPage } from '#shared/api/activity';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import { projectKeys } from '../../../lib/query-keys';
import { activityApiQuery, type ActivityView } from '../lib/activity-view';

/** Events a page. */
export const ACTIVITY_PAGE_SIZE = 25;

/** Under the project's own key, so refreshing a project refreshes its activity. */
export const activityKeys = {
  all: (projectId: number) => [...projectKeys.detail(projectId), 'activity'] as const,
  page: (projectId: number, view: ActivityView) => [...projectKeys.detail(projectId), 'activity', view.person ?? 'everyone', view.kind ?? 'every-kind', view.page] as const,
};

export const activityQuery = (projectId: number, view: ActivityView) =>
  queryOptions({
    queryKey: activityKeys.page(projectId, view),
    queryFn: () => apiClient.get<ActivityPage>(api.projectActivity(projectId, activityApiQuery(view, ACTIVITY_PAGE_SIZE))),
    placeholderData: keepPreviousData,
  });
