/**
 * How many of each kind of work wait for the signed-in person across their projects: the
 * navigation's count and the home page's headings read this one query. Asked again every minute
 * while the app is open (others' decisions change it), and at once after any workflow write
 * (`waitingKeys.all`).
 */
import { queryOptions } from '@tanstack/react-query';
import type { WaitingCounts } from '#shared/api/waiting';
import { WAITING_WORDS, waitingKindsFor } from '#shared/workflow/waiting';
import type { ProjectRoleOf } from '#shared/workflow/roles';
import { api } from '../config/paths';
import { apiClient } from './api';
import { waitingKeys } from './query-keys';

export const WAITING_REFRESH_MS = 60_000;

export const waitingCountsQuery = () =>
  queryOptions({
    queryKey: waitingKeys.counts(),
    queryFn: () => apiClient.get<WaitingCounts>(api.waitingCounts),
    refetchInterval: WAITING_REFRESH_MS,
  });

/** Everything waiting, added up. */
export function waitingTotal(counts: WaitingCounts): number {
  return counts.kinds.reduce((sum, kind) => sum + counts.counts[kind], 0);
}

/** The counts in words, for a label: "2 rankings to decide, 1 decision to review" (or that nothing waits). */
export function waitingSentence(counts: WaitingCounts): string {
  const parts = counts.kinds.filter((kind) => counts.counts[kind] > 0).map((kind) => WAITING_WORDS[kind].count(counts.counts[kind]));
  return parts.length ? parts.join(', ') : 'nothing waits for you';
}

/** Whether anything can wait for the person at all: a role in some project that some kind waits on (the administrator's account role alone: no). */
export function mayWait(person: { projectRoles?: readonly ProjectRoleOf[] } | null | undefined): boolean {
  return (person?.projectRoles ?? []).some((membership) => waitingKindsFor(membership.role).length > 0);
}
