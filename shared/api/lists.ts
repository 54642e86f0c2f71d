/** The two list envelopes of the API. */

/** A whole list (`{ items }`). */
export interface Items<T> {
  items: T[];
}

/** One page of a paged list; pages count from 1. */
export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** `?page=1&pageSize=20` of every paged list (at most 100 a page). */
export interface PageQuery {
  page: number;
  pageSize: number;
}
