import type { ReactNode } from 'react';
import type { VerificationJobView } from '#shared/verification/types';
import { When } from '../audit/when';

/**
 * A job that stopped (the server went down while it ran), was withdrawn by a person, or failed as
 * a whole: its message, and the way to run it again when there is one.
 */
export function JobProblem({ job, what, action }: { job: VerificationJobView; what: string; action?: ReactNode }) {
  if (job.state === 'withdrawn') return <JobWithdrawn job={job} what={what} action={action} />;
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

/** A withdrawn job is a person's choice, not a fault: said plainly, in the note colour, with who and when. */
function JobWithdrawn({ job, what, action }: { job: VerificationJobView; what: string; action?: ReactNode }) {
  return (
    <div role="status" className="space-y-2 rounded-md border border-note/40 bg-note-soft p-3 text-sm text-note dark:bg-note/20 dark:text-note-bright">
      <p className="font-medium">
        <span aria-hidden="true" className="mr-1.5">
          !
        </span>
        {what} was withdrawn before it finished
      </p>
      <p className="text-ink dark:text-night-ink">{job.message ?? 'It was withdrawn.'}</p>
      <p className="text-xs">
        Asked by {job.requestedBy.displayName} on <When iso={job.createdAt} />
        {job.finishedAt && (
          <>
            ; withdrawn <When iso={job.finishedAt} />
          </>
        )}
        . No result was kept; run it again when it is wanted.
      </p>
      {action}
    </div>
  );
}
