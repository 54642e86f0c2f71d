import { useId, useRef, useState } from 'react';
import { Button } from '../../../../components/ui/button';
import { ApiError } from '../../../../lib/api';
import type { OptionEvaluation, ReviewInput } from '../../../../lib/api-types';
import { cn } from '../../../../lib/cn';
import type { useReviewMutation } from '../../api/decision-mutations';
import { blockingFailures } from '../decision/decided-option';

/** The reviewer's verdict: a comment (required to return), then approve or return. The comment survives a refused request. */
export function ReviewForm({ option, mutation }: { option: OptionEvaluation | null; mutation: ReturnType<typeof useReviewMutation> }) {
  const [comment, setComment] = useState('');
  const [missingComment, setMissingComment] = useState(false);
  const commentRef = useRef<HTMLTextAreaElement>(null);
  const id = useId();
  const failures = option ? blockingFailures(option) : 0;

  const send = (verdict: ReviewInput['verdict']) => {
    if (verdict === 'return' && comment.trim() === '') {
      setMissingComment(true);
      commentRef.current?.focus();
      return;
    }
    setMissingComment(false);
    mutation.mutate({ verdict, ...(comment.trim() ? { comment: comment.trim() } : {}) });
  };

  const serverCommentError = mutation.error instanceof ApiError ? mutation.error.details.find((d) => d.path === '/comment')?.message : undefined;
  const commentError = missingComment ? 'Say what the designer should change or check: a return needs a comment.' : serverCommentError ? `The server says: ${serverCommentError}` : undefined;

  return (
    <form onSubmit={(e) => e.preventDefault()} noValidate className="space-y-3" aria-label="Review">
      <div className="text-sm">
        <label htmlFor={id} className="mb-1 block font-medium">
          Comment <span className="font-normal text-ink-soft dark:text-night-ink-soft">(required to return, optional to approve)</span>
        </label>
        <textarea
          id={id}
          ref={commentRef}
          value={comment}
          onChange={(e) => {
            setComment(e.target.value);
            if (e.target.value.trim()) setMissingComment(false);
          }}
          rows={3}
          maxLength={4000}
          aria-invalid={commentError ? true : undefined}
          aria-describedby={`${id}-hint`}
          className={cn('w-full rounded-md border bg-sheet px-3 py-2 dark:bg-night', commentError ? 'border-short dark:border-short-bright' : 'border-rule dark:border-night-rule')}
        />
        <p id={`${id}-hint`} className={cn('mt-1 text-xs', commentError ? 'text-short dark:text-short-bright' : 'text-ink-soft dark:text-night-ink-soft')}>
          {commentError ? `✕ ${commentError}` : 'The designer sees it with the proposal; it stays in the audit trail.'}
        </p>
      </div>
      {failures > 0 && (
        <p className="rounded-md bg-note-soft p-2 text-xs text-note dark:bg-note/20 dark:text-note-bright">
          The decided option is short on {failures} blocking check{failures === 1 ? '' : 's'}. Approving records that you accept it anyway; say why in the comment.
        </p>
      )}
      {mutation.error && <ReviewError error={mutation.error} />}
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => send('approve')} disabled={mutation.isPending}>
          {mutation.isPending && mutation.variables?.verdict === 'approve' ? 'Approving…' : 'Approve'}
        </Button>
        <Button variant="secondary" onClick={() => send('return')} disabled={mutation.isPending}>
          {mutation.isPending && mutation.variables?.verdict === 'return' ? 'Returning…' : 'Return to designer'}
        </Button>
      </div>
    </form>
  );
}

function ReviewError({ error }: { error: Error }) {
  const code = error instanceof ApiError ? error.code : '';
  const status = error instanceof ApiError ? error.status : 0;
  const title = code === 'own-decision' ? 'You cannot review this decision' : status === 409 ? 'The proposal cannot take this verdict now' : 'The review was not recorded';
  return (
    <div role="alert" className="rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">{title}</p>
      <p className="mt-1">{error.message}</p>
      <p className="mt-1 text-xs">Your comment is still here.</p>
    </div>
  );
}
