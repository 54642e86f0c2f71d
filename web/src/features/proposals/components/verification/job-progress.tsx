import { useId, type ReactNode } from 'react';
import type { VerificationJobView } from '#shared/verification/types';
import { When } from '../audit/when';

/**
 * A job that has not settled: a progress bar (done of total), what is being simulated now, who
 * asked, and (`withdraw`) the way to call it off. A native <progress>, so assistive technology
 * reads its value; the step is announced politely.
 */
export function JobProgress({ job, label, withdraw }: { job: VerificationJobView; label: string; withdraw?: ReactNode }) {
  const id = useId();
  const total = Math.max(0, job.total);
  const done = Math.min(Math.max(0, job.done), total);
  const waiting = job.state === 'waiting';
  return (
    <div className="space-y-2 rounded-md border border-rule p-3 dark:border-night-rule">
      <div className="flex flex-wrap items-baseline justify-between gap-2 text-sm">
        <p id={`${id}-label`} className="font-medium">
          <span aria-hidden="true" className="mr-1.5 text-fern dark:text-fern-bright">
            {waiting ? '⧗' : '⟳'}
          </span>
          {label}: {waiting ? 'waiting for the simulator' : 'simulating'}
        </p>
        <p className="text-ink-soft tabular-nums dark:text-night-ink-soft">
          {done} of {total} done
        </p>
      </div>
      <progress
        aria-labelledby={`${id}-label`}
        aria-valuetext={`${done} of ${total} done`}
        value={total > 0 ? done : undefined}
        max={total > 0 ? total : undefined}
        className="block h-2 w-full appearance-none overflow-hidden rounded-full bg-paper dark:bg-night [&::-moz-progress-bar]:bg-fern [&::-webkit-progress-bar]:bg-paper [&::-webkit-progress-value]:bg-fern dark:[&::-moz-progress-bar]:bg-fern-soft dark:[&::-webkit-progress-bar]:bg-night dark:[&::-webkit-progress-value]:bg-fern-soft"
      />
      <p role="status" aria-live="polite" className="text-sm text-ink-soft dark:text-night-ink-soft">
        {job.step ?? (waiting ? 'Queued: the simulator takes turns between people, so it starts soon by itself.' : 'Starting the simulator…')}
      </p>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-xs text-ink-soft dark:text-night-ink-soft">
          Asked by {job.requestedBy.displayName} on <When iso={job.createdAt} />. This page follows it by itself.
        </p>
        {withdraw}
      </div>
    </div>
  );
}
