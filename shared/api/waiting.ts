/**
 * What waits for the signed-in person across every project they belong to, by the role they hold
 * in each (shared/workflow/waiting.ts): GET /api/waiting/counts and GET /api/waiting?kind=.
 */
import type { WaitingKind } from '../workflow/waiting';
import type { Page, PageQuery } from './lists';

export type { WaitingKind };

/** GET /api/waiting/counts: how many of each kind wait, and which kinds the person's roles can wait on at all (in the table's order). */
export interface WaitingCounts {
  counts: Record<WaitingKind, number>;
  kinds: WaitingKind[];
}

/** Someone named beside a waiting item. */
export interface WaitingPerson {
  id: number;
  displayName: string;
}

/** One thing waiting: the proposal (or, for a spec to rank, the spec version) and since when. */
export interface WaitingItem {
  kind: WaitingKind;
  /** When it began to wait: the ranking, the decision, the send-back, or the spec version written (ISO). */
  since: string;
  project: { id: number; name: string };
  spec: { id: number; title: string; version: number };
  /** The proposal to open; null for a spec to rank (open the spec). */
  proposalId: number | null;
  /** Who put it there: asked for the ranking, made the decision, sent it back, or wrote the version. */
  by: WaitingPerson | null;
  /** Rework: whether the decision sent back is the person's own. */
  yours: boolean;
}

/** GET /api/waiting?kind=decide&page=1&pageSize=20: oldest first (what has waited longest on top). */
export interface WaitingQuery extends PageQuery {
  kind: WaitingKind;
}

export type WaitingPage = Page<WaitingItem>;
