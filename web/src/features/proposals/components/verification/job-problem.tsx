import type { ReactNode } from 'react';
import type { VerificationJobView } from '../../../../../../shared/verification/types';
import { When } from '../audit/when';

/** A job that stopped (the server went down while it ran) or failed as a whole: its message, and the way to run it again when there is one. */
export function JobProblem({ job, what, action }: { job: VerificationJobView; what: string; action?: ReactNode }) {
  const stopped = job.state === 'stopped';
  return (
    <div role="alert" className="space-y-2 rounded-md border border-short/40 bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">
        <span aria-hidden="true" className="mr-1.5">
          ✕
        </span>
        {stopped ? `${what} stopped before it finished` : `${what} could not run`}
      </p>
      <p className="text-ink dark:text-night-ink">{job.message ?? (stopped ? 'The server stopped while it ran.' : 'The server gave no reason.')}</p>
      <p className="text-xs">
        Asked by {job.requestedBy.displayName} on <When iso={job.createdAt} />
        {job.finishedAt && (
          <>
            ; ended <When iso={job.finishedAt} />
          </>
        )}
        . {stopped ? 'Run it again for complete results.' : 'Run it again once the cause is dealt with.'}
      </p>
      {action}
    </div>
  );
}
