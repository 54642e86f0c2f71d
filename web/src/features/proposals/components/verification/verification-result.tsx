import { useMemo, useState, type KeyboardEvent } from 'react';
import type { OptionVerification, ProposalVerificationResult, VerificationJobView } from '#shared/verification/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { Verdict } from '../../../../components/ui/verdict';
import type { Proposal } from '#shared/api/proposals';
import { cn } from '../../../../lib/cn';
import { formatDb } from '#shared/units/figures';
import { durationText, optionVerdict, verificationTally, verifiedOptionKey, verifiedOptionName } from '../../lib/verification-format';
import { rejectionComparisonPlot } from '../../lib/verification-plots';
import { When } from '../audit/when';
import { PlotFigure } from '../../../../components/charts/plot-figure';
import { FiguresTable, VerifiedCornersTable } from './figures-table';
import { DifferenceCauses } from './difference-causes';
import { RejectionComparisonChart } from './plots/lazy-verification-charts';
import { FreshnessLabel } from './freshness-label';
import { proposalCurrentDesign, resultFreshness, type ShownDesign } from '../../lib/current-design';
import { resultForDesign, type Freshness } from '#shared/verification/binding';
import { CommentMark } from '../comments/comments-context';

/** Which option the detail opens on: the result about the current design, else the first one listed. */
function firstShown(options: OptionVerification[], current: ShownDesign | null): string | null {
  const pick = (current ? resultForDesign(options, current) : null) ?? options[0];
  return pick ? verifiedOptionKey(pick) : null;
}

/** A finished verification: who asked and with what, an overview of every option, and the selected option's figures, corners and rejection curve. */
export function VerificationResult({ job, result, proposal }: { job: VerificationJobView; result: ProposalVerificationResult; proposal: Proposal }) {
  const [chosen, setChosen] = useState<string | null>(null);
  const current = useMemo(() => proposalCurrentDesign(proposal), [proposal]);
  const selectedKey = chosen ?? firstShown(result.options, current);
  const selected = result.options.find((o) => verifiedOptionKey(o) === selectedKey) ?? null;
  const freshnessOf = (option: OptionVerification) => resultFreshness(option, result.options, current);
  return (
    <div className="space-y-4">
      <JobFacts job={job} result={result} />
      <p className="text-sm">{verificationTally(result.options)}</p>
      <OverviewTable options={result.options} selectedKey={selectedKey} onSelect={setChosen} freshnessOf={freshnessOf} />
      {selected && <OptionVerificationDetail key={verifiedOptionKey(selected)} option={selected} proposal={proposal} freshness={freshnessOf(selected)} jobId={job.id} />}
    </div>
  );
}

/** The simulator's version, who asked, when it ran and how long it took. */
export function JobFacts({ job, result }: { job: VerificationJobView; result: { simulator: string; elapsedMs: number; simulatorStartMs?: number } }) {
  return (
    <dl className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
      <div className="flex gap-1.5">
        <dt className="text-ink-soft dark:text-night-ink-soft">Simulator</dt>
        <dd className="font-medium">{result.simulator}</dd>
      </div>
      <div className="flex gap-1.5">
        <dt className="text-ink-soft dark:text-night-ink-soft">Asked by</dt>
        <dd>{job.requestedBy.displayName}</dd>
      </div>
      <div className="flex gap-1.5">
        <dt className="text-ink-soft dark:text-night-ink-soft">Ran</dt>
        <dd>
          <When iso={job.startedAt ?? job.createdAt} />
          {job.finishedAt && (
            <>
              {' '}
              to <When iso={job.finishedAt} />
            </>
          )}
        </dd>
      </div>
      <div className="flex gap-1.5">
        <dt className="text-ink-soft dark:text-night-ink-soft">Took</dt>
        <dd className="tabular-nums">
          {durationText(result.elapsedMs)}
          {result.simulatorStartMs ? ` (${durationText(result.simulatorStartMs)} starting the simulator)` : ''}
        </dd>
      </div>
    </dl>
  );
}

/** One row per simulated option (and the override): its verdict; the name selects it for the detail. Arrow keys move the selection. */
function OverviewTable({
  options,
  selectedKey,
  onSelect,
  freshnessOf,
}: {
  options: OptionVerification[];
  selectedKey: string | null;
  onSelect: (key: string) => void;
  freshnessOf: (option: OptionVerification) => Freshness | null;
}) {
  const move = (event: KeyboardEvent<HTMLButtonElement>, index: number) => {
    const step = event.key === 'ArrowDown' ? 1 : event.key === 'ArrowUp' ? -1 : 0;
    const next = options[index + step];
    if (step === 0 || !next) return;
    event.preventDefault();
    onSelect(verifiedOptionKey(next));
    event.currentTarget.closest('tbody')?.querySelectorAll<HTMLButtonElement>('button[data-verified-option]')[index + step]?.focus();
  };
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">Every simulated option; choose one to see its figures.</caption>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <th scope="col" className="py-1 pr-3 text-left font-normal">
              Option
            </th>
            <th scope="col" className="py-1 pr-3 text-left font-normal">
              Against the engine
            </th>
            <th scope="col" className="py-1 text-right font-normal">
              Simulation time
            </th>
          </tr>
        </thead>
        <tbody>
          {options.map((option, index) => {
            const key = verifiedOptionKey(option);
            const selected = key === selectedKey;
            const verdict = optionVerdict(option);
            return (
              <tr key={key} className={cn('border-b border-rule/60 align-top last:border-0 dark:border-night-rule/60', selected && 'bg-fern-soft/50 dark:bg-night')}>
                <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                  <button
                    type="button"
                    data-verified-option
                    aria-pressed={selected}
                    onClick={() => onSelect(key)}
                    onKeyDown={(event) => move(event, index)}
                    className={cn('rounded text-left hover:text-fern hover:underline dark:hover:text-fern-soft', selected && 'font-medium')}
                  >
                    {selected && (
                      <span aria-hidden="true" className="mr-1 text-fern dark:text-fern-bright">
                        ▸
                      </span>
                    )}
                    {verifiedOptionName(option)}
                  </button>
                  {freshnessOf(option) && <FreshnessLabel state={freshnessOf(option)!} className="mt-0.5" />}
                </th>
                <td className="py-1.5 pr-3">
                  <Verdict kind={verdict.kind} label={verdict.label} />
                  {option.outcome === 'error' && option.error && <span className="mt-0.5 block text-xs text-ink-soft dark:text-night-ink-soft">{option.error}</span>}
                </td>
                <td className="py-1.5 text-right whitespace-nowrap tabular-nums">{durationText(option.elapsedMs)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/** The selected option: ngspice's error, or its nominal figures, corners and rejection curve beside the engine's. */
function OptionVerificationDetail({ option, proposal, freshness, jobId }: { option: OptionVerification; proposal: Proposal; freshness: Freshness | null; jobId: number }) {
  const name = verifiedOptionName(option);
  const verdict = optionVerdict(option);
  return (
    <section aria-label={`SPICE check of ${name}`} className="space-y-4 rounded-md border border-rule p-3 dark:border-night-rule">
      <header className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <h3 className="text-base font-medium">{name}</h3>
        <Verdict kind={verdict.kind} label={verdict.label} />
        {/* Comments hang on a ranked option's result (the designer's own values are no option of the ranking). */}
        {option.source === 'option' && <CommentMark anchor={{ kind: 'spice', topology: option.topology, jobId }} />}
        {freshness && <FreshnessLabel state={freshness} className="basis-full" />}
      </header>
      {option.outcome === 'error' ? (
        <div role="alert" className="rounded-md border border-note/40 bg-note-soft p-3 text-sm text-note dark:bg-note/20 dark:text-note-bright">
          <p className="font-medium">
            <span aria-hidden="true" className="mr-1.5">
              !
            </span>
            ngspice could not simulate this option, so there are no figures to compare.
          </p>
          <p className="mt-1 text-ink dark:text-night-ink">{option.error ?? 'The simulator gave no reason.'}</p>
        </div>
      ) : (
        <>
          {option.nominal ? <FiguresTable condition={option.nominal} caption={`${name} at nominal conditions`} /> : <p className="text-sm text-ink-soft">No figures at nominal conditions.</p>}
          {option.corners.length > 0 && (
            <section>
              <h4 className="mb-1 text-sm font-medium">At the corners</h4>
              <VerifiedCornersTable corners={option.corners} />
            </section>
          )}
          <DifferenceCauses option={option} />
          <RejectionComparison option={option} name={name} proposal={proposal} />
        </>
      )}
    </section>
  );
}

function RejectionComparison({ option, name, proposal }: { option: OptionVerification; name: string; proposal: Proposal }) {
  const plot = useMemo(() => rejectionComparisonPlot(option), [option]);
  if (!plot) return <p className="text-sm text-ink-soft dark:text-night-ink-soft">No rejection curve was simulated for this option.</p>;
  const cmrr = proposal.specVersion.payload?.cmrr;
  const gap = plot.largestGap ? `The curves differ by at most ${formatDb(plot.largestGap.db)} (at ${formatQuantity(plot.largestGap.atHz, 'Hz')}).` : 'The engine has no curve over this range.';
  const tail = plot.simulatedOnlyFromHz !== null ? ` From ${formatQuantity(plot.simulatedOnlyFromHz, 'Hz')} up only ngspice’s curve is drawn (the engine’s stops there).` : '';
  return (
    <PlotFigure title="Rejection against frequency: engine and ngspice" summary={`${name}, single-ended rejection at nominal conditions. ${gap}${tail}`}>
      <RejectionComparisonChart plot={plot} requiredDb={cmrr?.minDb ?? null} specFrequencyHz={cmrr?.atFrequencyHz ?? null} />
    </PlotFigure>
  );
}
