/**
 * Comments on a proposal: each thread hangs on one anchor of one ranked option (a check, a
 * figure, or that option's result in a SPICE check), with replies one level deep, and is open or
 * resolved. Pure data and words, read by the server, the app, the report and the audit words.
 */
import { topologyName } from '../engine/topologies';

export const COMMENT_ANCHOR_KINDS = ['check', 'figure', 'spice'] as const;
export type CommentAnchorKind = (typeof COMMENT_ANCHOR_KINDS)[number];

/** The figures of an option a comment may hang on (the proposal page's plots), with their names. */
export const COMMENT_FIGURES = {
  rejection: 'Rejection against frequency',
  'monte-carlo': 'Monte Carlo rejection',
  temperature: 'Tail current and gain over temperature',
} as const;
export type CommentFigureKey = keyof typeof COMMENT_FIGURES;
export const COMMENT_FIGURE_KEYS = Object.keys(COMMENT_FIGURES) as CommentFigureKey[];

/** Longest comment or reply, characters. */
export const COMMENT_MAX_LENGTH = 4000;

/** Where a thread hangs: one option and exactly one of a check, a figure or a SPICE check (job) of it. */
export type CommentAnchor =
  | { kind: 'check'; topology: string; checkId: string }
  | { kind: 'figure'; topology: string; figureKey: CommentFigureKey }
  | { kind: 'spice'; topology: string; jobId: number };

/** A stable key of an anchor, to count and find threads ("check:wilson:cmrr-min"). */
export function anchorKey(anchor: CommentAnchor): string {
  switch (anchor.kind) {
    case 'check':
      return `check:${anchor.topology}:${anchor.checkId}`;
    case 'figure':
      return `figure:${anchor.topology}:${anchor.figureKey}`;
    case 'spice':
      return `spice:${anchor.topology}:${anchor.jobId}`;
  }
}

/** An anchor in words: "check cmrr-min of the Wilson mirror"; `checkTitle` names a check when the caller knows its title. */
export function anchorWords(anchor: CommentAnchor, checkTitle?: string): string {
  const option = topologyName(anchor.topology);
  switch (anchor.kind) {
    case 'check':
      return `the check “${checkTitle ?? anchor.checkId}” of the ${option}`;
    case 'figure':
      return `the figure “${COMMENT_FIGURES[anchor.figureKey] ?? anchor.figureKey}” of the ${option}`;
    case 'spice':
      return `the SPICE result of the ${option} (job #${anchor.jobId})`;
  }
}

/** The anchor an audit event's details carry (null when they name none). */
export function anchorOfDetails(details: Record<string, unknown>): CommentAnchor | null {
  const topology = typeof details.topology === 'string' ? details.topology : null;
  if (!topology) return null;
  if (details.anchorKind === 'check' && typeof details.checkId === 'string') return { kind: 'check', topology, checkId: details.checkId };
  if (details.anchorKind === 'figure' && typeof details.figureKey === 'string' && details.figureKey in COMMENT_FIGURES) return { kind: 'figure', topology, figureKey: details.figureKey as CommentFigureKey };
  if (details.anchorKind === 'spice' && typeof details.jobId === 'number') return { kind: 'spice', topology, jobId: details.jobId };
  return null;
}
