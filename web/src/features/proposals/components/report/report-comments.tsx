/** The report's comment threads: each with its anchor, state, author and time, and its replies, open threads first. */
import type { CommentThread } from '#shared/api/comments';
import type { Proposal } from '#shared/api/proposals';
import { ErrorPanel } from '../../../../components/ui/feedback';
import { formatDateTime } from '../../../../lib/dates';
import { openFirst, threadAnchorWords } from '../../lib/comment-words';
import { ReportNote } from './report-section';

export function ReportComments({ proposal, threads, error }: { proposal: Proposal; threads: CommentThread[] | undefined; error: Error | null }) {
  if (error) return <ErrorPanel error={error} />;
  if (!threads) return <p className="text-sm text-ink-soft dark:text-night-ink-soft">Loading the comments…</p>;
  if (threads.length === 0) return <p className="text-sm">No comments were written on this proposal.</p>;
  const open = threads.filter((t) => t.resolvedAt === null).length;
  return (
    <>
      <p className="mb-3 text-sm">
        {threads.length} thread{threads.length === 1 ? '' : 's'}: {open} open, {threads.length - open} resolved.
      </p>
      <ol className="space-y-3" aria-label="Comment threads, open first">
        {openFirst(threads).map((thread) => (
          <li key={thread.id} className="report-keep rounded-md border border-rule p-3 text-sm dark:border-night-rule">
            <p className="font-medium break-words">
              #{thread.id} on {threadAnchorWords(thread.anchor, proposal.result)}
            </p>
            <p className="text-xs">
              {thread.resolvedAt ? (
                <>
                  <span aria-hidden="true">✓ </span>Resolved by {thread.resolvedBy?.displayName ?? 'someone'}, {formatDateTime(thread.resolvedAt)}
                </>
              ) : (
                <>
                  <span aria-hidden="true">○ </span>Open
                </>
              )}
              {' · '}written on spec version {thread.specVersion}, engine {thread.engineVersion}, rule set {thread.rulesetVersion.slice(0, 12)}
            </p>
            <p className="mt-1">
              <span className="font-medium">{thread.author.displayName}</span>, {formatDateTime(thread.createdAt)}:
            </p>
            <p className="break-words whitespace-pre-line">{thread.body}</p>
            {thread.replies.map((reply) => (
              <div key={reply.id} className="mt-2 border-l-2 border-rule pl-3 dark:border-night-rule">
                <p>
                  <span className="font-medium">{reply.author.displayName}</span>, {formatDateTime(reply.createdAt)}:
                </p>
                <p className="break-words whitespace-pre-line">{reply.body}</p>
              </div>
            ))}
          </li>
        ))}
      </ol>
      <ReportNote>Comments are the team’s notes on the ranking; the figures they discuss are estimates to confirm by simulation and bench measurement.</ReportNote>
    </>
  );
}
