/**
 * The one search, as the navigation's box and the results page ask it: the query, the kinds'
 * words, and where a hit leads. Kept in lib/ because the app frame (the box) and the search
 * feature (the page) both read it.
 */
import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { SearchAnswer, SearchHit, SearchKind } from '#shared/api/search';
import { mayAs, type PersonRoles } from '#shared/workflow/roles';
import { api, paths } from '../config/paths';
import { apiClient } from './api';

export const searchKeys = {
  all: ['search'] as const,
  answer: (q: string, kind: SearchKind | null, page: number, pageSize: number) => ['search', q, kind, page, pageSize] as const,
};

/** How long typing pauses before the box asks, ms. */
export const SEARCH_PAUSE_MS = 150;

/** The answer to a query: every kind's first `pageSize` hits, or one kind's page. */
export const searchQuery = ({ q, kind = null, page = 1, pageSize }: { q: string; kind?: SearchKind | null; page?: number; pageSize: number }) =>
  queryOptions({
    queryKey: searchKeys.answer(q, kind, page, pageSize),
    queryFn: () => apiClient.get<SearchAnswer>(api.search(`?${new URLSearchParams({ q, ...(kind ? { kind } : {}), page: String(page), pageSize: String(pageSize) })}`)),
    placeholderData: keepPreviousData,
  });

/** Each kind's group heading and its count in words. */
export const SEARCH_KIND_WORDS: Record<SearchKind, { title: string; count: (n: number) => string }> = {
  project: { title: 'Projects', count: (n) => `${n} ${n === 1 ? 'project' : 'projects'}` },
  spec: { title: 'Specs', count: (n) => `${n} ${n === 1 ? 'spec' : 'specs'}` },
  proposal: { title: 'Proposals', count: (n) => `${n} ${n === 1 ? 'proposal' : 'proposals'}` },
  person: { title: 'People', count: (n) => `${n} ${n === 1 ? 'person' : 'people'}` },
};

/** The results page's address for a query (and one kind's page). */
export function searchHref(q: string, kind: SearchKind | null = null, page = 1): string {
  const query = new URLSearchParams({ q });
  if (kind) query.set('kind', kind);
  if (page > 1) query.set('page', String(page));
  return paths.search.href(`?${query}`);
}

/**
 * Where a hit leads: the project, spec or proposal page; a person's entry on the people page for
 * whoever manages accounts, else what they did in a project you share, or your own profile.
 */
export function hitHref(hit: SearchHit, viewer: PersonRoles & { id: number }): string {
  switch (hit.kind) {
    case 'project':
      return paths.project.href(hit.id);
    case 'spec':
      return paths.spec.href(hit.id);
    case 'proposal':
      return paths.proposal.href(hit.id);
    case 'person':
      if (mayAs(viewer, null, 'users:manage')) return paths.people.href();
      if (hit.project) return paths.activity.href(hit.project.id, `?person=${hit.id}`);
      return paths.profile.href();
  }
}
