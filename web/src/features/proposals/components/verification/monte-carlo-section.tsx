import { useId, useState, type FormEvent } from 'react';
import { MONTE_CARLO_RUNS, type MonteCarloVerificationResult, type VerificationJobView, type VerificationStatus } from '#shared/verification/types';
import { Button } from '../../../../components/ui/button';
import type { Proposal } from '#shared/api/proposals';
import type { User } from '#shared/api/users';
import { topologyName } from '../../../../lib/topology-names';
import { useMonteCarloMutation } from '../../api/verification-mutations';
import { isSettled } from '../../../../lib/verification-queries';
import { MutationError } from './mutation-error';
import { JobProblem } from './job-problem';
import { JobProgress } from './job-progress';
import { MonteCarloResult } from './monte-carlo-result';
import { FreshnessLabel } from './freshness-label';
import { proposalCurrentDesign } from '../../lib/current-design';
import { freshness } from '#shared/verification/binding';
import { currentDesignWord } from '#shared/workflow/current-design';
import { WithdrawJob } from './withdraw-job';
import type { TopologyId } from '#shared/engine/types';

const inputClass =
  'rounded-md border border-rule bg-sheet px-2.5 py-1.5 text-sm dark:border-night-rule dark:bg-night-sheet aria-[invalid=true]:border-short dark:aria-[invalid=true]:border-short-bright';

/** Why the runs field cannot be sent, or null. */
function runsProblem(text: string): string | null {
  const runs = Number(text);
  if (text.trim() === '' || !Number.isInteger(runs)) return 'Give a whole number of runs.';
  if (runs < MONTE_CARLO_RUNS.min || runs > MONTE_CARLO_RUNS.max) return `Between ${MONTE_CARLO_RUNS.min} and ${MONTE_CARLO_RUNS.max} runs.`;
  return null;
}

/** The select's value for the decided design (own values); ranked options are `option:<topology>`. */
const DECIDED_KEY = 'decision';
const keyOf = (job: VerificationJobView) => (job.source === 'decision' ? DECIDED_KEY : `option:${job.topology ?? ''}`);

function isMonteCarloResult(result: VerificationJobView['result']): result is MonteCarloVerificationResult {
  return result !== null && 'histogram' in result;
}

/**
 * SPICE Monte Carlo of mismatch for one option: only for a differential output, where pair and
 * load mismatch set the rejection. Pick an option and a number of runs, start, follow the progress,
 * then read ngspice's distribution over the engine's closed form on the same draws.
 */
export function MonteCarloSection({ proposal, status, canVerify, user }: { proposal: Proposal; status: VerificationStatus | undefined; canVerify: boolean; user: User }) {
  const id = useId();
  const differential = proposal.specVersion.payload?.gain?.output === 'differential';
  const options = proposal.result.options.filter((o) => o.design);
  const jobs = status?.monteCarlo ?? [];
  const current = proposalCurrentDesign(proposal);
  // The designer's own values are not a ranked option: they get their own entry, first.
  const ownValues = current?.basis === 'decision' && current.ownValues && current.design ? current : null;
  const [chosen, setChosen] = useState<string | null>(null);
  const [runsText, setRunsText] = useState(String(MONTE_CARLO_RUNS.default));
  const [tried, setTried] = useState(false);
  const mutation = useMonteCarloMutation(proposal.id);
  const firstJob = jobs[0] ? keyOf(jobs[0]) : null;
  const key = chosen ?? (ownValues ? DECIDED_KEY : null) ?? firstJob ?? (current ? `option:${current.topology}` : null) ?? (options[0] ? `option:${options[0].topology}` : null);
  const job = jobs.find((j) => keyOf(j) === key) ?? null;
  const topology = key === DECIDED_KEY ? (ownValues?.topology ?? null) : (key?.slice('option:'.length) ?? null);
  const running = job !== null && !isSettled(job);
  const problem = runsProblem(runsText);
  const name = key === DECIDED_KEY ? `decided design (${topologyName(topology ?? '')}, own values)` : topologyName(topology ?? '');
  const freshnessState = job && isMonteCarloResult(job.result) && current && (key === DECIDED_KEY || (!current.ownValues && topology === current.topology))
    ? freshness(job.result.binding, current.binding, currentDesignWord(current))
    : null;

  const start = (event: FormEvent) => {
    event.preventDefault();
    setTried(true);
    if (problem || !key || running) return;
    // An `option:` key names a ranked option's topology (the server refuses any other).
    mutation.mutate(key === DECIDED_KEY ? { source: 'decision', runs: Number(runsText) } : { topology: (topology ?? undefined) as TopologyId | undefined, runs: Number(runsText) });
  };

  return (
    <section aria-labelledby={`${id}-title`} className="space-y-3 border-t border-rule pt-4 dark:border-night-rule">
      <header>
        <h3 id={`${id}-title`} className="text-base font-medium">
          Mismatch Monte Carlo in SPICE
        </h3>
        <p className="text-sm text-ink-soft dark:text-night-ink-soft">
          One option simulated many times with its pair and load resistors and VBE drawn from the spec’s tolerances, beside the engine’s closed form on the same draws.
        </p>
      </header>
      {!differential ? (
        <p className="rounded-md border border-dashed border-rule p-3 text-sm text-ink-soft dark:border-night-rule dark:text-night-ink-soft">
          Not offered for this proposal: the spec asks for a single-ended output, so the rejection is set by the tail, not by mismatch between the two halves. The comparison above already covers it.
        </p>
      ) : options.length === 0 ? (
        <p className="text-sm text-ink-soft dark:text-night-ink-soft">No option was sized, so there is nothing to simulate.</p>
      ) : (
        <>
          <form onSubmit={start} noValidate className="flex flex-wrap items-end gap-3">
            <label className="flex min-w-0 max-w-full flex-col gap-1 text-sm">
              <span>Option</span>
              <select
                className={`${inputClass} max-w-full`}
                value={key ?? ''}
                onChange={(event) => {
                  setChosen(event.target.value);
                  mutation.reset();
                }}
              >
                {ownValues && (
                  <option value={DECIDED_KEY}>
                    Decided design: own values ({topologyName(ownValues.topology)})
                    {(() => {
                      const existing = jobs.find((j) => keyOf(j) === DECIDED_KEY);
                      return existing ? ` — ${existing.state === 'finished' ? `simulated, ${existing.runs ?? '?'} runs` : existing.state}` : '';
                    })()}
                  </option>
                )}
                {options.map((o) => {
                  const existing = jobs.find((j) => keyOf(j) === `option:${o.topology}`);
                  return (
                    <option key={o.topology} value={`option:${o.topology}`}>
                      {topologyName(o.topology)}
                      {existing ? ` — ${existing.state === 'finished' ? `simulated, ${existing.runs ?? '?'} runs` : existing.state}` : ''}
                    </option>
                  );
                })}
              </select>
            </label>
            {canVerify && (
              <>
                <label className="flex flex-col gap-1 text-sm">
                  <span>Runs</span>
                  <input
                    type="number"
                    inputMode="numeric"
                    min={MONTE_CARLO_RUNS.min}
                    max={MONTE_CARLO_RUNS.max}
                    step={1}
                    value={runsText}
                    onChange={(event) => setRunsText(event.target.value)}
                    aria-invalid={tried && problem !== null}
                    aria-describedby={`${id}-runs-help`}
                    className={`${inputClass} w-28 tabular-nums`}
                  />
                </label>
                <Button type="submit" disabled={running || mutation.isPending}>
                  {mutation.isPending ? 'Asking…' : running ? 'Simulating…' : job ? 'Run it again' : 'Start the Monte Carlo'}
                </Button>
                <p id={`${id}-runs-help`} className={tried && problem ? 'basis-full text-xs text-short dark:text-short-bright' : 'basis-full text-xs text-ink-soft dark:text-night-ink-soft'}>
                  {tried && problem ? problem : `${MONTE_CARLO_RUNS.min} to ${MONTE_CARLO_RUNS.max} runs; each takes a few milliseconds in the simulator.`}
                </p>
              </>
            )}
          </form>
          {mutation.isError && <MutationError error={mutation.error} what="The Monte Carlo was not started" />}
          {!job ? (
            <p className="text-sm text-ink-soft dark:text-night-ink-soft">
              No SPICE Monte Carlo of the {topology ? name : 'option'} yet{canVerify ? '.' : '; a designer or reviewer can ask for one.'}
            </p>
          ) : running ? (
            <JobProgress
              job={job}
              label={`Monte Carlo of the ${name}, ${job.runs ?? '?'} runs`}
              withdraw={<WithdrawJob proposalId={proposal.id} projectId={proposal.projectId} job={job} user={user} what={`the Monte Carlo of the ${name}`} />}
            />
          ) : job.state !== 'finished' ? (
            <JobProblem job={job} what="The Monte Carlo" />
          ) : isMonteCarloResult(job.result) ? (
            <>
              {freshnessState && freshnessState.state !== 'current' && <FreshnessLabel state={freshnessState} />}
              <MonteCarloResult job={job} result={job.result} requiredYieldPercent={proposal.specVersion.payload?.cmrr?.minYieldPercent ?? null} frequencyHz={proposal.specVersion.payload?.cmrr?.atFrequencyHz ?? null} />
            </>
          ) : (
            <p className="text-sm text-ink-soft">This Monte Carlo finished without a result.</p>
          )}
        </>
      )}
    </section>
  );
}
