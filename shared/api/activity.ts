/**
 * A project's activity on the wire: GET /api/projects/:id/activity (a page of the audit events of
 * its specs and proposals, newest first) and GET /api/projects/:id/activity.csv (all of them).
 */
import type { ActivityKind } from '../workflow/activity';
import type { AuditEvent } from './admin';
import type { Page, PageQuery } from './lists';

export type { ActivityKind };

/** The records an event's words quote (their text is not in the event's details). */
export interface EventRecords {
  /** The decision a `proposal.decided` event recorded. */
  decision?: { kind: string; topology: string; reason: string | null } | null;
  /** The review a sign-off or send-back recorded. */
  review?: { comment: string | null } | null;
  /** The proposal's ranking recommends nothing (a choice then departs from no recommendation). */
  nothingRecommended?: boolean;
}

/** One event with what a reader needs beside it: who, which spec, and the records it quotes. */
export interface ActivityEvent extends AuditEvent {
  actor: { id: number; displayName: string } | null;
  /** The spec it concerns (a spec's event, or a proposal's spec); null for a whole-file import. */
  spec: { id: number; title: string } | null;
  records: EventRecords;
}

/** `?actor=7&kind=decisions&page=1&pageSize=20`: either filter may be left out. */
export interface ActivityQuery extends PageQuery {
  actor?: number;
  kind?: ActivityKind;
}

/** GET /api/projects/:id/activity.csv takes the same filters, no paging. */
export type ActivityFilter = Omit<ActivityQuery, keyof PageQuery>;

export type ActivityPage = Page<ActivityEvent>;
