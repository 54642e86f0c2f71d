/** A comment's anchor in the page's words: the check by its title where the ranking carries one. */
import type { RecommendResult } from "#shared/engine/recommend";
import {
  anchorKey,
  anchorWords,
  type CommentAnchor,
} from "#shared/workflow/comments";
import type { CommentThread } from "#shared/api/comments";
import { checkTitle } from "../../../lib/checks";

export function threadAnchorWords(
  anchor: CommentAnchor,
  result: RecommendResult | undefined,
): string {
  if (anchor.kind !== "check") return anchorWords(anchor);
  const check = result?.options
    .find((o) => o.topology === anchor.topology)
    ?.checks.find((c) => c.rule === anchor.checkId);
  return anchorWords(anchor, check ? checkTitle(check) : undefined);
}

/** The threads on one anchor, and how many of them are open. */
export function threadsOn(
  threads: readonly CommentThread[],
  anchor: CommentAnchor,
): { threads: CommentThread[]; open: number } {
  const key = anchorKey(anchor);
  const on = threads.filter((t) => anchorKey(t.anchor) === key);
  return { threads: on, open: on.filter((t) => t.resolvedAt === null).length };
}

/** Open threads first (oldest first within each state). */
export function openFirst(threads: readonly CommentThread[]): CommentThread[] {
  return [...threads].sort(
    (a, b) =>
      Number(a.resolvedAt !== null) - Number(b.resolvedAt !== null) ||
      a.id - b.id,
  );
}
