import { useState } from 'react';
import type { VerificationJobView } from '#shared/verification/types';
import { mayAs } from '#shared/workflow/roles';
import { Button } from '../../../../components/ui/button';
import type { User } from '#shared/api/users';
import { useWithdrawMutation } from '../../api/verification-mutations';
import { MutationError } from './mutation-error';

/** Whether a person may withdraw a job: the one who asked for it, a reviewer of the project, or an administrator (the server decides the same way). */
export function mayWithdraw(user: User, projectId: number, job: Pick<VerificationJobView, 'requestedBy'>): boolean {
  return job.requestedBy.id === user.id || user.role === 'admin' || mayAs(user, projectId, 'proposals:review');
}

/**
 * Withdrawing a waiting or simulating job, in two steps: the button, then a confirmation saying
 * what is lost. A simulating job stops between two analyses and keeps no result; the same work
 * can be asked for again.
 */
export function WithdrawJob({ proposalId, projectId, job, user, what }: { proposalId: number; projectId: number; job: VerificationJobView; user: User; what: string }) {
  const [confirming, setConfirming] = useState(false);
  const withdraw = useWithdrawMutation(proposalId);
  if (!mayWithdraw(user, projectId, job)) return null;
  const keep = () => {
    withdraw.reset();
    setConfirming(false);
  };
  if (!confirming) {
    return (
      <Button variant="secondary" className="px-2.5 py-1 text-xs" onClick={() => setConfirming(true)}>
        Withdraw…
      </Button>
    );
  }
  const running = job.state === 'simulating';
  const someoneElse = job.requestedBy.id !== user.id;
  return (
    <div role="group" aria-label={`Confirm withdrawing ${what}`} className="w-full space-y-2 rounded-md bg-short-soft p-2 text-xs text-short dark:bg-short/20 dark:text-short-bright">
      <p>
        Withdraw {what}?{' '}
        {running ? `It stops after the analysis under way, and the ${job.done} of ${job.total} done so far are not kept.` : 'It leaves the queue before it starts.'}
        {someoneElse ? ` ${job.requestedBy.displayName} asked for it and will see that you withdrew it.` : ''} It can be asked for again.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button variant="danger" className="px-2 py-1 text-xs" disabled={withdraw.isPending} onClick={() => withdraw.mutate(job.id, { onSuccess: () => setConfirming(false) })}>
          {withdraw.isPending ? 'Withdrawing…' : 'Withdraw'}
        </Button>
        <Button variant="secondary" className="px-2 py-1 text-xs" autoFocus onClick={keep}>
          Keep it
        </Button>
      </div>
      {withdraw.isError && <MutationError error={withdraw.error} what="The job was not withdrawn" />}
    </div>
  );
}
