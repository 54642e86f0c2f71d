/**
 * How a proposal's record ends besides approval: closed because a newer spec version was ranked,
 * or withdrawn with a reason. Shows the closing, or (to its author and to designers, while it is
 * open) the way to withdraw it with a reason.
 */
import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { mayAs } from '#shared/workflow/roles';
import { Button } from '../../../components/ui/button';
import { paths } from '../../../config/paths';
import { ApiError } from '../../../lib/api';
import type { Proposal } from '#shared/api/proposals';
import type { User } from '#shared/api/users';
import { cn } from '../../../lib/cn';
import { useWithdrawMutation } from '../api/decision-mutations';
import { usePersonName } from './audit/use-person-name';
import { When } from './audit/when';

const CLOSED = 'rounded-lg border border-rule bg-paper px-4 py-3 text-sm dark:border-night-rule dark:bg-night';

export function LifecyclePanel({ proposal, user }: { proposal: Proposal; user: User }) {
  const nameOf = usePersonName(proposal.projectId, user);
  if (proposal.status === 'superseded')
    return (
      <aside aria-label="Closed" className={CLOSED}>
        <p className="font-medium">Closed: the spec moved on.</p>
        <p className="mt-0.5">
          A newer version of the spec was ranked while this one still waited for a decision
          {proposal.closedAt && (
            <>
              {' '}
              (<When iso={proposal.closedAt} />)
            </>
          )}
          .{' '}
          {proposal.supersededById && (
            <Link to={paths.proposal.href(proposal.supersededById)} className="font-medium text-fern underline dark:text-fern-bright">
              Open proposal #{proposal.supersededById}
            </Link>
          )}
        </p>
      </aside>
    );
  if (proposal.status === 'withdrawn')
    return (
      <aside aria-label="Withdrawn" className={CLOSED}>
        <p>
          <span className="font-medium">Withdrawn</span> by {nameOf(proposal.closedById)}
          {proposal.closedAt && (
            <>
              {' '}
              · <When iso={proposal.closedAt} />
            </>
          )}
        </p>
        {proposal.closedReason && <p className="mt-1 break-words whitespace-pre-line">“{proposal.closedReason}”</p>}
      </aside>
    );
  const mayWithdraw = proposal.allowedEvents.includes('withdraw') && mayAs(user, proposal.projectId, 'proposals:withdraw') && (mayAs(user, proposal.projectId, 'proposals:decide') || proposal.createdById === user.id);
  return mayWithdraw ? <WithdrawForm proposalId={proposal.id} /> : null;
}

/** A quiet disclosure: the reason first, then the button that withdraws. The reason survives a refused request. */
function WithdrawForm({ proposalId }: { proposalId: number }) {
  const mutation = useWithdrawMutation(proposalId);
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  const [missing, setMissing] = useState(false);
  const id = useId();
  const serverError = mutation.error instanceof ApiError ? (mutation.error.details.find((d) => d.path === '/reason')?.message ?? mutation.error.message) : mutation.error?.message;
  const error = missing ? 'Say why: a withdrawal needs a reason.' : serverError;
  if (!open)
    return (
      <div className="text-right">
        <Button variant="quiet" onClick={() => setOpen(true)} aria-expanded={false}>
          Withdraw this proposal…
        </Button>
      </div>
    );
  return (
    <form
      aria-label="Withdraw this proposal"
      noValidate
      className="space-y-2 rounded-lg border border-rule bg-sheet p-4 text-sm dark:border-night-rule dark:bg-night-sheet"
      onSubmit={(e) => {
        e.preventDefault();
        if (!reason.trim()) return setMissing(true);
        mutation.mutate(reason.trim());
      }}
    >
      <p className="font-medium">Withdraw this proposal</p>
      <p className="text-ink-soft dark:text-night-ink-soft">The record stays readable, with its decisions and reviews; nobody can decide or review it afterwards.</p>
      <label htmlFor={id} className="block font-medium">
        Reason <span className="font-normal text-ink-soft dark:text-night-ink-soft">(required)</span>
      </label>
      <textarea
        id={id}
        value={reason}
        onChange={(e) => {
          setReason(e.target.value);
          if (e.target.value.trim()) setMissing(false);
        }}
        rows={2}
        maxLength={4000}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-hint`}
        className={cn('w-full rounded-md border bg-sheet px-3 py-2 dark:bg-night', error ? 'border-short dark:border-short-bright' : 'border-rule dark:border-night-rule')}
      />
      <p id={`${id}-hint`} className={cn('text-xs', error ? 'text-short dark:text-short-bright' : 'text-ink-soft dark:text-night-ink-soft')}>
        {error ? `✕ ${error}` : 'Kept in the audit trail and shown on this page.'}
      </p>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" variant="danger" disabled={mutation.isPending}>
          {mutation.isPending ? 'Withdrawing…' : 'Withdraw with this reason'}
        </Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>
          Keep it open
        </Button>
      </div>
    </form>
  );
}
