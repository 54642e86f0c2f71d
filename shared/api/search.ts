/**
 * The one search on the wire: GET /api/search?q=&kind=&page=&pageSize= finds projects, specs
 * (by title and by any field value, "80 dB"), proposals (number, topology, state) and people,
 * only among what the signed-in person may see.
 */
import type { ProposalState } from '../workflow/proposal-states';
import type { Page, PageQuery } from './lists';

/** What a hit can be, in the order the groups are shown. */
export const SEARCH_KINDS = ['project', 'spec', 'proposal', 'person'] as const;
export type SearchKind = (typeof SEARCH_KINDS)[number];

/** The longest query the search takes, in characters. */
export const SEARCH_QUERY_MAX_LENGTH = 200;

/**
 * Text with the words that matched marked: the pieces in order, each plain or marked. The reader
 * shows `text` as text (never as markup); `marked` pieces are the query's words.
 */
export type MarkedText = { text: string; marked: boolean }[];

/** One thing found. */
export interface SearchHit {
  kind: SearchKind;
  /** The record's id: a project's, a spec's, a proposal's (its number) or a person's. */
  id: number;
  /** Its name (a proposal: "#number spec title"), the matched words marked. */
  title: MarkedText;
  /** Why it matched beyond the title: the line of its text where the words are (a field and its value), or null when the title says it. */
  excerpt: MarkedText | null;
  /** The project it belongs to (a spec's, a proposal's), or for a person one project the searcher shares with them; null for a project itself. */
  project: { id: number; name: string } | null;
  /** A proposal's state; null for the other kinds. */
  state: ProposalState | null;
}

/** One kind's page of hits, best match first. */
export interface SearchGroup extends Page<SearchHit> {
  kind: SearchKind;
}

/** `?q=80 dB&kind=spec&page=1&pageSize=20`; without `kind`, the first page of every kind that has hits. */
export interface SearchQuery extends PageQuery {
  q: string;
  kind?: SearchKind;
}

/** The answer: how many hits of each kind, and the groups asked for (every kind with hits, or the one `kind`). */
export interface SearchAnswer {
  /** The words searched for, as the search read them (lower case, accents and punctuation dropped); empty when the query holds none. */
  words: string[];
  counts: Record<SearchKind, number>;
  groups: SearchGroup[];
}
