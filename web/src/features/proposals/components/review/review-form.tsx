import { useId, useRef, useState } from 'react';
import { Button } from '../../../../components/ui/button';
import { ApiError } from '../../../../lib/api';
import type { OptionEvaluation, ReviewInput } from '#shared/api/proposals';
import { cn } from '../../../../lib/cn';
import type { useReviewMutation } from '../../api/decision-mutations';
import { blockingFailures } from '../decision/decided-option';
import { signOffHold } from '../../lib/sign-off';
import type { DesignVerificationState } from '#shared/verification/types';

/**
 * The reviewer's verdict: a comment, then sign off or send back for rework. The sign-off button
 * is held back, with the reason beside it, while the server would refuse it (a design short on a
 * blocking check without a comment; a SPICE check of another design not accepted, or accepted
 * without a comment). The comment survives a refused request.
 */
export function ReviewForm({
  option,
  mutation,
  verification = null,
}: {
  option: OptionEvaluation | null;
  mutation: ReturnType<typeof useReviewMutation>;
  /** How the SPICE check stands for the decided design (null while it is read). */
  verification?: DesignVerificationState | null;
}) {
  const [comment, setComment] = useState('');
  const [missingComment, setMissingComment] = useState(false);
  const [acceptStale, setAcceptStale] = useState(false);
  const commentRef = useRef<HTMLTextAreaElement>(null);
  const id = useId();
  const failures = option ? blockingFailures(option) : 0;
  const staleCheck = verification?.state === 'stale' || verification?.state === 'unbound';
  const hold = signOffHold({ shortfalls: failures, comment, verification: verification?.state ?? null, acceptStale });

  const send = (verdict: ReviewInput['verdict']) => {
    if (verdict === 'return' && comment.trim() === '') {
      setMissingComment(true);
      commentRef.current?.focus();
      return;
    }
    if (verdict === 'approve' && hold) return;
    setMissingComment(false);
    mutation.mutate({ verdict, ...(comment.trim() ? { comment: comment.trim() } : {}), ...(verdict === 'approve' && staleCheck && acceptStale ? { acceptStaleVerification: true } : {}) });
  };

  const serverCommentError = mutation.error instanceof ApiError ? mutation.error.details.find((d) => d.path === '/comment')?.message : undefined;
  const commentError = missingComment ? 'Say what the designer should change or check: sending back needs a comment.' : serverCommentError ? `The server says: ${serverCommentError}` : undefined;

  return (
    <form onSubmit={(e) => e.preventDefault()} noValidate className="space-y-3" aria-label="Review">
      <div className="text-sm">
        <label htmlFor={id} className="mb-1 block font-medium">
          Comment{' '}
          <span className="font-normal text-ink-soft dark:text-night-ink-soft">
            {failures > 0 || (staleCheck && acceptStale) ? '(required to send back and, here, to sign off)' : '(required to send back, optional to sign off)'}
          </span>
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
          The decided design is short on {failures} blocking check{failures === 1 ? '' : 's'}. Signing off records that you accept it anyway; the comment must say why.
        </p>
      )}
      {staleCheck && (
        <label className="flex items-start gap-2 rounded-md border border-note/40 bg-note-soft p-2 text-sm text-note dark:bg-note/20 dark:text-note-bright">
          <input type="checkbox" className="mt-1" checked={acceptStale} onChange={(e) => setAcceptStale(e.target.checked)} />
          <span>
            <span className="font-medium">Sign off on it anyway.</span> The only SPICE check of the decided design{' '}
            {verification?.state === 'stale' ? `(job #${verification.jobId}) simulated another design: ${verification.changes.join('; ')}.` : `(job #${verification?.jobId}) was simulated before results recorded which design they simulated.`}{' '}
            The review records that job and your reason; a fresh run (SPICE check above) needs neither.
          </span>
        </label>
      )}
      {mutation.error && <ReviewError error={mutation.error} />}
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={() => send('approve')} disabled={mutation.isPending || hold !== null} aria-describedby={hold ? `${id}-hold` : undefined}>
          {mutation.isPending && mutation.variables?.verdict === 'approve' ? 'Signing off…' : 'Sign off'}
        </Button>
        <Button variant="secondary" onClick={() => send('return')} disabled={mutation.isPending}>
          {mutation.isPending && mutation.variables?.verdict === 'return' ? 'Sending back…' : 'Send back for rework'}
        </Button>
        {hold && (
          <p id={`${id}-hold`} className="basis-full text-xs text-ink-soft dark:text-night-ink-soft" data-testid="sign-off-hold">
            <span aria-hidden="true">✕ </span>
            Sign off is held: {hold}
          </p>
        )}
      </div>
    </form>
  );
}

function ReviewError({ error }: { error: Error }) {
  const code = error instanceof ApiError ? error.code : '';
  const status = error instanceof ApiError ? error.status : 0;
  const title =
    code === 'own-decision'
      ? 'You cannot review this decision'
      : code === 'verification-stale'
        ? 'The SPICE check is of another design'
        : status === 409
          ? 'The proposal cannot take this verdict now'
          : 'The review was not recorded';
  return (
    <div role="alert" className="rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">{title}</p>
      <p className="mt-1">{error.message}</p>
      <p className="mt-1 text-xs">Your comment is still here.</p>
    </div>
  );
}
