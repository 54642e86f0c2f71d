/**
 * Comments on the wire: GET /api/proposals/:id/comments (every thread), POST …/comments (a new
 * thread on one anchor), POST …/comments/:commentId/replies (a reply) and PATCH
 * …/comments/:commentId (resolve or reopen a thread). Anchors and words: shared/workflow/comments.ts.
 */
import type { CommentAnchor, CommentAnchorKind, CommentFigureKey } from '../workflow/comments';
import type { TopologyId } from '../engine/types';

export type { CommentAnchor, CommentAnchorKind, CommentFigureKey };

/** A reply in a thread. */
export interface CommentReply {
  id: number;
  body: string;
  author: { id: number; displayName: string };
  createdAt: string;
}

/** A thread: its first comment, where it hangs, what it belongs to, its state and its replies (oldest first). */
export interface CommentThread {
  id: number;
  proposalId: number;
  anchor: CommentAnchor;
  /** The record the comment was written against: the proposal's spec version, engine and rule set. */
  specVersionId: number;
  specVersion: number;
  engineVersion: string;
  rulesetVersion: string;
  body: string;
  author: { id: number; displayName: string };
  createdAt: string;
  /** Resolved: when and by whom (null while open). */
  resolvedAt: string | null;
  resolvedBy: { id: number; displayName: string } | null;
  replies: CommentReply[];
}

/** POST /api/proposals/:id/comments: the anchor (an option and one of a check, a figure or a SPICE job) and the text. */
export interface CommentInput {
  anchorKind: CommentAnchorKind;
  topology: TopologyId;
  /** A check: the rule id of one of the option's checks. */
  checkId?: string;
  /** A figure: one of COMMENT_FIGURE_KEYS. */
  figureKey?: CommentFigureKey;
  /** A SPICE result: a finished SPICE check (job) of this proposal that simulated the option. */
  jobId?: number;
  body: string;
}

/** POST /api/proposals/:id/comments/:commentId/replies. */
export interface ReplyInput {
  body: string;
}

/** PATCH /api/proposals/:id/comments/:commentId: resolve (true) or reopen (false) the thread. */
export interface ThreadStateInput {
  resolved: boolean;
}
