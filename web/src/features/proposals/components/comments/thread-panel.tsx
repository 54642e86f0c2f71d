/**
 * The thread panel: every thread on one anchor (open first), each with its replies, a reply field
 * and Resolve / Reopen, and a field for a new thread. A side panel on a desktop, a sheet from the
 * bottom on a phone; it takes the focus when it opens, Escape or Close gives it back to the mark.
 * Comment text is plain text, shown as written (React escapes it).
 */
import { useEffect, useId, useRef, useState, type FormEvent } from "react";
import type { CommentAnchor, CommentThread } from "#shared/api/comments";
import { COMMENT_MAX_LENGTH } from "#shared/workflow/comments";
import type { TopologyId } from "#shared/engine/types";
import { Button } from "../../../../components/ui/button";
import { ApiError } from "../../../../lib/api";
import { cn } from "../../../../lib/cn";
import {
  usePostComment,
  useReplyToComment,
  useThreadState,
} from "../../api/comment-queries";
import {
  openFirst,
  threadAnchorWords,
  threadsOn,
} from "../../lib/comment-words";
import { When } from "../audit/when";
import { useComments } from "./comments-context";

export function ThreadPanel({
  anchor,
  onClose,
}: {
  anchor: CommentAnchor;
  onClose: () => void;
}) {
  const comments = useComments();
  const headingId = useId();
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => heading.current?.focus(), []);
  // Escape closes the panel wherever the focus is (a button disabled while it sends drops the focus to the page).
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.key === "Escape" && !event.defaultPrevented) onClose();
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [onClose]);
  if (!comments) return null;
  const { threads } = threadsOn(comments.threads, anchor);
  const where = threadAnchorWords(anchor, comments.proposal.result);
  return (
    <section
      role="dialog"
      aria-modal="false"
      aria-labelledby={headingId}
      className="fixed inset-x-0 bottom-0 z-40 flex max-h-[85vh] flex-col rounded-t-lg border border-rule bg-sheet shadow-lg sm:inset-x-auto sm:top-0 sm:right-0 sm:bottom-0 sm:max-h-none sm:w-[28rem] sm:rounded-none sm:border-y-0 sm:border-r-0 dark:border-night-rule dark:bg-night-sheet print:hidden"
    >
      <header className="flex items-start justify-between gap-3 border-b border-rule p-4 dark:border-night-rule">
        <div className="min-w-0">
          <h2
            id={headingId}
            ref={heading}
            tabIndex={-1}
            className="text-base font-medium outline-none"
          >
            Comments
          </h2>
          <p className="text-sm break-words text-ink-soft dark:text-night-ink-soft">
            On {where}
          </p>
        </div>
        <Button variant="secondary" onClick={onClose} className="px-2.5 py-1">
          Close
        </Button>
      </header>
      <div className="min-h-0 flex-1 space-y-4 overflow-y-auto p-4">
        {threads.length === 0 ? (
          <p className="text-sm text-ink-soft dark:text-night-ink-soft">
            No comments here yet.
          </p>
        ) : (
          <ol className="space-y-4" aria-label="Threads, open first">
            {openFirst(threads).map((thread) => (
              <li key={thread.id}>
                <Thread thread={thread} />
              </li>
            ))}
          </ol>
        )}
        {comments.canWrite ? (
          <NewThread anchor={anchor} />
        ) : (
          comments.readOnlyReason && (
            <p className="text-xs text-ink-soft dark:text-night-ink-soft">
              {comments.readOnlyReason}
            </p>
          )
        )}
      </div>
    </section>
  );
}

/** An open or resolved thread in words and a glyph, never colour alone. */
export function ThreadState({ thread }: { thread: CommentThread }) {
  return thread.resolvedAt ? (
    <span className="inline-flex items-center gap-1 text-xs text-holds dark:text-holds-bright">
      <span aria-hidden="true">✓</span>Resolved
      {thread.resolvedBy ? ` by ${thread.resolvedBy.displayName}` : ""},{" "}
      <When iso={thread.resolvedAt} />
    </span>
  ) : (
    <span className="inline-flex items-center gap-1 text-xs font-medium text-note dark:text-note-bright">
      <span aria-hidden="true">○</span>Open
    </span>
  );
}

function Thread({ thread }: { thread: CommentThread }) {
  const comments = useComments()!;
  const state = useThreadState(comments.proposal.id);
  return (
    <article
      aria-label={`Comment #${thread.id} by ${thread.author.displayName}`}
      className={cn(
        "rounded-md border p-3",
        thread.resolvedAt
          ? "border-rule/70 dark:border-night-rule/70"
          : "border-note/40 dark:border-note/40",
      )}
    >
      <header className="mb-1 flex flex-wrap items-center justify-between gap-x-3 gap-y-1">
        <p className="text-sm">
          <span className="font-medium">{thread.author.displayName}</span>{" "}
          <span className="text-xs text-ink-soft dark:text-night-ink-soft">
            #{thread.id} · <When iso={thread.createdAt} />
          </span>
        </p>
        <ThreadState thread={thread} />
      </header>
      <p className="text-sm break-words whitespace-pre-line">{thread.body}</p>
      {thread.replies.length > 0 && (
        <ol
          className="mt-2 space-y-2 border-l-2 border-rule pl-3 dark:border-night-rule"
          aria-label="Replies"
        >
          {thread.replies.map((reply) => (
            <li key={reply.id}>
              <p className="text-sm">
                <span className="font-medium">{reply.author.displayName}</span>{" "}
                <span className="text-xs text-ink-soft dark:text-night-ink-soft">
                  <When iso={reply.createdAt} />
                </span>
              </p>
              <p className="text-sm break-words whitespace-pre-line">
                {reply.body}
              </p>
            </li>
          ))}
        </ol>
      )}
      <p className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">
        Written on spec version {thread.specVersion}, engine{" "}
        {thread.engineVersion}, rule set {thread.rulesetVersion.slice(0, 12)}.
      </p>
      {comments.canWrite && (
        <div className="mt-2 space-y-2">
          {!thread.resolvedAt && <ReplyForm threadId={thread.id} />}
          <div className="flex flex-wrap items-center gap-2">
            <Button
              variant="secondary"
              className="px-2.5 py-1"
              // aria-disabled rather than disabled while it sends, so the focus stays on the button.
              aria-disabled={state.isPending}
              onClick={() =>
                !state.isPending &&
                state.mutate({
                  threadId: thread.id,
                  resolved: thread.resolvedAt === null,
                })
              }
            >
              {thread.resolvedAt ? "Reopen" : "Resolve"}
            </Button>
            {state.error && <WriteError error={state.error} />}
          </div>
        </div>
      )}
    </article>
  );
}

/** A multi-line text field with its label, length limit and the count left. */
function TextField({
  label,
  value,
  onChange,
  rows = 3,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  rows?: number;
}) {
  const id = useId();
  const left = COMMENT_MAX_LENGTH - value.length;
  return (
    <div className="text-sm">
      <label htmlFor={id} className="mb-1 block font-medium">
        {label}
      </label>
      <textarea
        id={id}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        rows={rows}
        maxLength={COMMENT_MAX_LENGTH}
        aria-describedby={`${id}-count`}
        className="w-full rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night"
      />
      <p
        id={`${id}-count`}
        className="text-xs text-ink-soft dark:text-night-ink-soft"
      >
        {left < 400
          ? `${left} characters left`
          : `Plain text, up to ${COMMENT_MAX_LENGTH} characters.`}
      </p>
    </div>
  );
}

function ReplyForm({ threadId }: { threadId: number }) {
  const comments = useComments()!;
  const reply = useReplyToComment(comments.proposal.id);
  const [body, setBody] = useState("");
  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!body.trim()) return;
    reply.mutate(
      { threadId, body: body.replace(/\r\n?/g, "\n").trim() },
      { onSuccess: () => setBody("") },
    );
  };
  return (
    <form
      onSubmit={submit}
      className="space-y-1"
      aria-label={`Reply to comment #${threadId}`}
    >
      <TextField label="Reply" value={body} onChange={setBody} rows={2} />
      {reply.error && <WriteError error={reply.error} />}
      <Button
        type="submit"
        className="px-2.5 py-1"
        disabled={reply.isPending || !body.trim()}
      >
        {reply.isPending ? "Replying…" : "Reply"}
      </Button>
    </form>
  );
}

function NewThread({ anchor }: { anchor: CommentAnchor }) {
  const comments = useComments()!;
  const post = usePostComment(comments.proposal.id);
  const [body, setBody] = useState("");
  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!body.trim()) return;
    const where =
      anchor.kind === "check"
        ? { checkId: anchor.checkId }
        : anchor.kind === "figure"
          ? { figureKey: anchor.figureKey }
          : { jobId: anchor.jobId };
    post.mutate(
      {
        anchorKind: anchor.kind,
        topology: anchor.topology as TopologyId,
        ...where,
        body: body.replace(/\r\n?/g, "\n").trim(),
      },
      { onSuccess: () => setBody("") },
    );
  };
  return (
    <form
      onSubmit={submit}
      className="space-y-1 border-t border-rule pt-3 dark:border-night-rule"
      aria-label="Start a thread here"
    >
      <TextField label="New comment" value={body} onChange={setBody} />
      {post.error && <WriteError error={post.error} />}
      <Button type="submit" disabled={post.isPending || !body.trim()}>
        {post.isPending ? "Posting…" : "Post comment"}
      </Button>
    </form>
  );
}

function WriteError({ error }: { error: Error }) {
  const detail =
    error instanceof ApiError ? error.details[0]?.message : undefined;
  return (
    <p role="alert" className="text-xs text-short dark:text-short-bright">
      <span aria-hidden="true">✕ </span>
      {error.message}
      {detail ? ` (${detail})` : ""}
    </p>
  );
}
