/**
 * The results page's view as it lives in the address (`/search?q=80+dB&kind=spec&page=2`): read
 * leniently (an unknown kind means every kind, a bad page the first).
 */
import { SEARCH_KINDS, SEARCH_QUERY_MAX_LENGTH, type SearchKind } from '#shared/api/search';

export interface SearchView {
  q: string;
  kind: SearchKind | null;
  page: number;
}

export function readSearchView(params: URLSearchParams): SearchView {
  const kind = params.get('kind');
  const page = Number(params.get('page') ?? '');
  return {
    q: (params.get('q') ?? '').trim().slice(0, SEARCH_QUERY_MAX_LENGTH),
    kind: SEARCH_KINDS.includes(kind as SearchKind) ? (kind as SearchKind) : null,
    page: Number.isInteger(page) && page >= 1 ? page : 1,
  };
}
