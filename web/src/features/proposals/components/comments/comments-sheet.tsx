/**
 * Every comment thread of the proposal in one list (open first): where it hangs, its state, who
 * wrote it and when, how many replies; each opens its anchor's thread panel. And the open threads
 * as the reviewer sees them before sending a decision back.
 */
import type { CommentThread } from "#shared/api/comments";
import { Sheet } from "../../../../components/ui/sheet";
import { openFirst, threadAnchorWords } from "../../lib/comment-words";
import { When } from "../audit/when";
import { useComments } from "./comments-context";
import { ThreadState } from "./thread-panel";

export function CommentsSheet() {
  const comments = useComments();
  if (!comments) return null;
  const { threads } = comments;
  const open = threads.filter((t) => t.resolvedAt === null).length;
  return (
    <Sheet title="Comments" aria-label="Comments">
      {threads.length === 0 ? (
        <p className="text-sm text-ink-soft dark:text-night-ink-soft">
          No comments yet.
          {comments.canWrite
            ? " Use ✎ Comment beside a check, a figure or a SPICE result of an option to start one."
            : ""}
        </p>
      ) : (
        <>
          <p className="mb-2 text-sm">
            {open} open, {threads.length - open} resolved.
          </p>
          <ThreadList threads={openFirst(threads)} />
        </>
      )}
    </Sheet>
  );
}

function ThreadList({ threads }: { threads: CommentThread[] }) {
  const comments = useComments()!;
  return (
    <ul className="divide-y divide-rule/60 text-sm dark:divide-night-rule/60">
      {threads.map((thread) => (
        <li
          key={thread.id}
          className="flex flex-wrap items-start justify-between gap-x-3 gap-y-1 py-2"
        >
          <div className="min-w-0 flex-1">
            <p className="break-words">
              <span className="font-medium">#{thread.id}</span> on{" "}
              {threadAnchorWords(thread.anchor, comments.proposal.result)}
            </p>
            <p className="text-xs text-ink-soft dark:text-night-ink-soft">
              {thread.author.displayName}, <When iso={thread.createdAt} />
              {thread.replies.length > 0 &&
                ` · ${thread.replies.length} ${thread.replies.length === 1 ? "reply" : "replies"}`}
            </p>
            <p className="mt-0.5 line-clamp-2 break-words whitespace-pre-line">
              {thread.body}
            </p>
          </div>
          <div className="flex flex-col items-end gap-1">
            <ThreadState thread={thread} />
            <button
              type="button"
              onClick={(event) =>
                comments.open(thread.anchor, event.currentTarget)
              }
              className="rounded text-xs text-fern underline-offset-2 hover:underline dark:text-fern-bright"
              aria-label={`Open thread #${thread.id}`}
            >
              Open thread
            </button>
          </div>
        </li>
      ))}
    </ul>
  );
}

/** The open threads, listed where the reviewer decides (sending back lists them in the record and the designer's e-mail). */
export function OpenCommentsNote() {
  const comments = useComments();
  if (!comments) return null;
  const open = openFirst(comments.threads).filter((t) => t.resolvedAt === null);
  if (open.length === 0) return null;
  return (
    <section
      aria-label="Open comments"
      className="rounded-md border border-note/40 bg-note-soft p-3 text-sm dark:bg-note/20"
    >
      <h3 className="font-medium text-note dark:text-note-bright">
        <span aria-hidden="true">○ </span>
        {open.length} open comment{open.length === 1 ? "" : "s"}
      </h3>
      <p className="mb-1 text-xs">
        Sending back lists them in the record and in the designer’s e-mail;
        signing off leaves them open in the record.
      </p>
      <ThreadList threads={open} />
    </section>
  );
}
