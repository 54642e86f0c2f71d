/**
 * Comments on the proposal page: the provider holds the proposal's threads and which anchor's
 * panel is open; `CommentMark` is the small button beside a check row, a figure or a SPICE result
 * (the count of open threads in words), which opens the thread panel for its anchor. Outside a
 * provider (the report, the side-by-side view) the mark draws nothing.
 */
import {
  createContext,
  useCallback,
  useContext,
  useMemo,
  useRef,
  useState,
  type ReactNode,
} from "react";
import { useQuery } from "@tanstack/react-query";
import type { CommentAnchor, CommentThread } from "#shared/api/comments";
import type { Proposal } from "#shared/api/proposals";
import type { User } from "#shared/api/users";
import { mayAs } from "#shared/workflow/roles";
import { CLOSED_STATES } from "#shared/workflow/proposal-states";
import { anchorKey } from "#shared/workflow/comments";
import { cn } from "../../../../lib/cn";
import { commentsQuery } from "../../api/comment-queries";
import { threadAnchorWords, threadsOn } from "../../lib/comment-words";
import { ThreadPanel } from "./thread-panel";

interface CommentsState {
  proposal: Proposal;
  threads: CommentThread[];
  /** The person may write here (a designer or reviewer of the project, on an open proposal). */
  canWrite: boolean;
  /** Why not, in words, when the person may not. */
  readOnlyReason: string | null;
  open: (anchor: CommentAnchor, opener: HTMLElement | null) => void;
}

const CommentsContext = createContext<CommentsState | null>(null);

/** The proposal's comment threads and the panel state (null outside a provider). */
export function useComments(): CommentsState | null {
  return useContext(CommentsContext);
}

export function CommentsProvider({
  proposal,
  user,
  children,
}: {
  proposal: Proposal;
  user: User;
  children: ReactNode;
}) {
  const query = useQuery(commentsQuery(proposal.id));
  const [anchor, setAnchor] = useState<CommentAnchor | null>(null);
  const opener = useRef<HTMLElement | null>(null);
  const closed = CLOSED_STATES.includes(proposal.status);
  const mayComment = mayAs(user, proposal.projectId, "proposals:comment");
  const open = useCallback((next: CommentAnchor, from: HTMLElement | null) => {
    opener.current = from;
    setAnchor(next);
  }, []);
  const close = useCallback(() => {
    setAnchor(null);
    opener.current?.focus();
  }, []);
  const threads = query.data?.items;
  const state = useMemo<CommentsState>(
    () => ({
      proposal,
      threads: threads ?? [],
      canWrite: mayComment && !closed,
      readOnlyReason: closed
        ? "This proposal’s record is closed: its comments can be read, not changed."
        : mayComment
          ? null
          : "Designers and reviewers of this project can comment.",
      open,
    }),
    [proposal, threads, mayComment, closed, open],
  );
  return (
    <CommentsContext.Provider value={state}>
      {children}
      {anchor && (
        <ThreadPanel key={anchorKey(anchor)} anchor={anchor} onClose={close} />
      )}
    </CommentsContext.Provider>
  );
}

/** The comment button beside one anchor: "Comment", or how many threads are open there. */
export function CommentMark({
  anchor,
  className,
}: {
  anchor: CommentAnchor;
  className?: string;
}) {
  const comments = useComments();
  if (!comments) return null;
  const { threads, open } = threadsOn(comments.threads, anchor);
  if (threads.length === 0 && !comments.canWrite) return null;
  const where = threadAnchorWords(anchor, comments.proposal.result);
  const words =
    open > 0
      ? `${open} open`
      : threads.length > 0
        ? `${threads.length} resolved`
        : "Comment";
  const label =
    threads.length === 0
      ? `Comment on ${where}`
      : `Comments on ${where}: ${open} open, ${threads.length - open} resolved`;
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      data-comment-anchor={anchorKey(anchor)}
      onClick={(event) => comments.open(anchor, event.currentTarget)}
      className={cn(
        "inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs whitespace-nowrap print:hidden",
        open > 0
          ? "border-note/50 bg-note-soft text-note dark:bg-note/20 dark:text-note-bright"
          : "border-rule text-ink-soft hover:bg-paper dark:border-night-rule dark:text-night-ink-soft dark:hover:bg-night",
        className,
      )}
    >
      <span aria-hidden="true">✎</span>
      {words}
    </button>
  );
}
