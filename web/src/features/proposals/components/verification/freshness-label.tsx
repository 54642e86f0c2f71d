import type { Freshness } from '#shared/verification/binding';
import { UNBOUND_WORDS } from '#shared/verification/binding';
import type { DesignVerificationState } from '#shared/verification/types';
import { Button } from '../../../../components/ui/button';
import { cn } from '../../../../lib/cn';

/**
 * Whether a simulated result is of the current design: "of the current design", or "stale" with
 * what changed, or "not bound to a design" for results stored before fingerprints were recorded.
 */
export function FreshnessLabel({ state, className }: { state: Freshness; className?: string }) {
  if (state.state === 'current') {
    return (
      <span className={cn('inline-flex items-center gap-1 text-xs text-holds dark:text-holds-bright', className)} data-freshness="current">
        <span aria-hidden="true">●</span> of the current design
      </span>
    );
  }
  if (state.state === 'unbound') {
    return (
      <span className={cn('block text-xs text-note dark:text-note-bright', className)} data-freshness="unbound">
        <span aria-hidden="true">! </span>
        {UNBOUND_WORDS}
      </span>
    );
  }
  return (
    <span className={cn('block text-xs text-short dark:text-short-bright', className)} data-freshness="stale">
      <span className="mr-1 rounded-sm border border-current px-1 font-semibold tracking-wide uppercase">Stale</span>
      {state.changes.join('; ')}
    </span>
  );
}

/**
 * How the SPICE check stands for the current design, as the server judged it (the same rule a
 * sign-off is held to), with a fresh run offered when it is stale, unbound or missing.
 */
export function DesignCheckNote({
  state,
  designName,
  word,
  onRun,
  running,
  canVerify,
}: {
  state: DesignVerificationState;
  designName: string;
  word: string;
  onRun: () => void;
  running: boolean;
  canVerify: boolean;
}) {
  if (state.state === 'current') {
    return (
      <p className="rounded-md border border-holds/40 bg-holds-soft p-2 text-sm text-holds dark:bg-holds/20 dark:text-holds-bright" data-design-check="current">
        <span aria-hidden="true">✓ </span>
        SPICE job #{state.jobId} simulated exactly the {word} design ({designName}).
      </p>
    );
  }
  const text =
    state.state === 'stale'
      ? `Stale for the ${word} design (${designName}): job #${state.jobId} ${state.changes.join('; ')}.`
      : state.state === 'unbound'
        ? `Job #${state.jobId} is the only SPICE check of the ${word} design (${designName}), and it is not bound to a design: it was simulated before fingerprints were recorded.`
        : `The ${word} design (${designName}) is in no SPICE check yet.`;
  return (
    <div role="status" className="flex flex-wrap items-center gap-3 rounded-md border border-note/40 bg-note-soft p-2 text-sm text-note dark:bg-note/20 dark:text-note-bright" data-design-check={state.state}>
      <p className="min-w-0 flex-1">
        <span aria-hidden="true">! </span>
        {text}{' '}
        {state.state === 'stale'
          ? 'Its figures belong to another design; a sign-off on it alone must say why in the comment.'
          : state.state === 'unbound'
            ? 'It cannot show which design it simulated; a sign-off on it alone must say why in the comment.'
            : ''}
      </p>
      {canVerify && (
        <Button onClick={onRun} disabled={running}>
          {running ? 'Simulating…' : `Run a fresh SPICE check of the ${word} design`}
        </Button>
      )}
    </div>
  );
}
