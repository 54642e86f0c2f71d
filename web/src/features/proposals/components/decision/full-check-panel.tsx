import { useId } from 'react';
import { Button } from '../../../../components/ui/button';
import { OptionVerdict, Verdict } from '../../../../components/ui/verdict';
import { ApiError } from '../../../../lib/api';
import type { OptionEvaluation } from '#shared/api/proposals';
import { cn } from '../../../../lib/cn';
import { CheckList } from '../review/check-list';
import { blockingFailures } from './decided-option';
import { fieldKeyOfPath } from './override-draft';
import { RejectionFigures } from './rejection-figures';
import type { FullCheck } from './use-full-check';

/**
 * The full check of own values, on request: every rule over the spec's temperature and
 * common-mode corners, Monte Carlo included, exactly as recording the override would run it,
 * with nothing recorded. An answer for values since changed stays readable, marked out of date.
 */
export function FullCheckPanel({ check, ranked }: { check: FullCheck; ranked: OptionEvaluation | null }) {
  const id = useId();
  const { outcome, current, checking } = check;
  const status = checking
    ? 'Checking your values at every corner… this takes a few seconds.'
    : outcome && !current
      ? 'Values changed since this check: check again for the verdict on the values now in the fields.'
      : outcome
        ? 'Up to date with the values in the fields.'
        : check.canRun
          ? 'Not checked yet.'
          : 'Fix the marked values to check them.';
  return (
    <section aria-labelledby={`${id}-title`} className="rounded-md border border-rule p-3 dark:border-night-rule">
      <header className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h3 id={`${id}-title`} className="text-sm font-medium">
          Full check: your values against every rule, at every corner
        </h3>
        <Button variant="secondary" data-full-check onClick={check.run} disabled={!check.canRun} aria-describedby={`${id}-about`}>
          {checking ? 'Checking…' : outcome ? 'Check again at every corner' : 'Check every rule at every corner'}
        </Button>
      </header>
      <p id={`${id}-about`} className="text-xs text-ink-soft dark:text-night-ink-soft">
        Runs the rule set over the spec’s temperature and input common-mode corners, Monte Carlo included, as recording the override would. Nothing is recorded.
      </p>
      <p role="status" aria-live="polite" className="mt-1 flex flex-wrap items-center gap-2 text-xs text-ink-soft dark:text-night-ink-soft">
        {outcome && !current && !checking && <Verdict kind="note" label="Out of date" />}
        {status}
      </p>
      {outcome?.error && <CheckError error={outcome.error} />}
      {outcome?.result && <CheckResult option={outcome.result} ranked={ranked} current={current} />}
    </section>
  );
}

function CheckResult({ option, ranked, current }: { option: OptionEvaluation; ranked: OptionEvaluation | null; current: boolean }) {
  const failures = blockingFailures(option);
  return (
    <div className={cn('mt-3 space-y-3', !current && 'text-ink-soft dark:text-night-ink-soft')} aria-label={current ? 'Full check result' : 'Full check result, out of date'} role="group">
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <OptionVerdict option={{ passes: option.passes, blockingShortCount: failures, unsolved: !option.figures }} form="sentence" />
        <span>{current ? 'as the server would record this override' : 'for the values as they were when checked'}</span>
      </p>
      {option.error && <p className="text-sm">{option.error}</p>}
      <RejectionFigures option={option} ranked={ranked} />
      <CheckList checks={option.checks} caption={current ? 'Every check of your values' : 'Every check of the values as they were (values changed since this check)'} />
    </div>
  );
}

/** A refused or failed check in place: field paths are marked on the fields; the rest are listed here. */
function CheckError({ error }: { error: Error }) {
  const apiError = error instanceof ApiError ? error : null;
  const status = apiError?.status ?? 0;
  const unplaced = apiError && status === 400 ? apiError.details.filter((d) => !fieldKeyOfPath(d.path)) : [];
  const title =
    status === 400 ? 'The server refused these values' : status === 403 ? 'Only designers can check own values' : status === 404 ? 'This proposal is not in your projects' : 'The full check could not be run';
  return (
    <div role="alert" className="mt-3 rounded-md bg-short-soft p-3 text-sm text-short dark:bg-short/20 dark:text-short-bright">
      <p className="font-medium">{title}</p>
      <p className="mt-1">{error.message}</p>
      {status === 400 && unplaced.length < (apiError?.details.length ?? 0) && <p className="mt-1">The values it names are marked in the fields above.</p>}
      {unplaced.length > 0 && (
        <ul className="mt-1 list-inside list-disc">
          {unplaced.map((d) => (
            <li key={`${d.path}${d.message}`}>
              <code>{d.path || '(design)'}</code>: {d.message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
