import type { MonteCarloVerificationResult, OptionVerification, ProposalVerificationResult, VerificationJobView, VerificationStatus, VerifiedCondition, VerifiedFigure } from '#shared/verification/types';
import { Verdict } from '../../../../components/ui/verdict';
import type { Proposal } from '#shared/api/proposals';
import { topologyName } from '../../../../lib/topology-names';
import { formatDb, formatFigure, formatFixed, formatPercent, formatTargetDb } from '#shared/units/figures';
import { deltaText, toleranceText, verifiedValue } from '../../lib/report-format';
import { figureGroups, figureNotes } from '../../lib/verification-format';
import { ReportNote, ReportSubheading } from './report-section';
import { freshness, freshnessText, UNBOUND_WORDS, type Freshness } from '#shared/verification/binding';
import type { DesignVerificationState } from '#shared/verification/types';
import { currentDesignName, currentDesignWord } from '#shared/workflow/current-design';
import { proposalCurrentDesign, resultFreshness, type ShownDesign } from '../../lib/current-design';
import { formatDateTime } from '../../../../lib/dates';
import { DifferenceCauses } from '../verification/difference-causes';

const isProposalResult = (result: VerificationJobView['result']): result is ProposalVerificationResult => result !== null && 'options' in result;
const isMonteCarloResult = (result: VerificationJobView['result']): result is MonteCarloVerificationResult => result !== null && 'histogram' in result;

/** Why there is nothing to show: no job, or one that has not finished (or could not). */
function notVerifiedWhy(job: VerificationJobView | null): string {
  if (!job) return 'Nobody has asked for a SPICE verification of this proposal.';
  const who = `asked for by ${job.requestedBy.displayName} on ${formatDateTime(job.createdAt, { seconds: true })}`;
  switch (job.state) {
    case 'waiting':
      return `A verification was ${who} and is waiting to run.`;
    case 'simulating':
      return `A verification was ${who} and is running (${job.done} of ${job.total} done).`;
    case 'stopped':
      return `A verification was ${who} but stopped before it finished${job.message ? `: ${job.message}` : '.'}`;
    case 'failed':
      return `A verification was ${who} but could not run${job.message ? `: ${job.message}` : '.'}`;
    case 'withdrawn':
      return `A verification was ${who} but withdrawn before it finished${job.message ? `: ${job.message}` : '.'}`;
    default:
      return `A verification was ${who} but has no result.`;
  }
}

function AgreementVerdict({ agrees, notCompared }: { agrees: boolean | null; notCompared?: VerifiedFigure['notCompared'] }) {
  if (notCompared === 'not-predicted') return <Verdict kind="not-applicable" label="Not predicted" />;
  if (notCompared === 'matched-pair') return <Verdict kind="not-applicable" label="By symmetry" />;
  if (agrees === null) return <Verdict kind="not-applicable" label="Not compared" />;
  return agrees ? <Verdict kind="holds" label="Agrees" /> : <Verdict kind="short" label="Outside" />;
}

function FiguresTable({ condition, caption }: { condition: VerifiedCondition; caption: string }) {
  const notes = figureNotes(condition.figures);
  return (
    <>
      <table className="w-full table-fixed text-sm">
        <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">{caption}</caption>
        <colgroup>
          <col className="w-[28%]" />
          <col span={4} className="w-[14%]" />
          <col className="w-[16%]" />
        </colgroup>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <th scope="col" className="py-1 pr-2 text-left font-medium">Figure</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Predicted</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Simulated</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Difference</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Tolerance</th>
            <th scope="col" className="py-1 pl-1.5 text-left font-medium">Agreement</th>
          </tr>
        </thead>
        {figureGroups(condition.figures).map((group) => (
          <tbody key={group.heading ?? 'figures'}>
            {group.heading && (
              <tr className="border-b border-rule dark:border-night-rule">
                <th scope="colgroup" colSpan={6} className="pt-2 pb-0.5 text-left text-xs font-medium text-ink-soft dark:text-night-ink-soft">{group.heading}</th>
              </tr>
            )}
            {group.figures.map((figure) => (
              <tr key={figure.key} className="border-b border-rule/60 dark:border-night-rule/60">
                <th scope="row" className="py-1 pr-2 text-left font-normal">{figure.label}</th>
                <td className="px-1.5 py-1 text-right whitespace-nowrap tabular-nums">{figure.notCompared === 'not-predicted' ? 'not predicted' : verifiedValue(figure.predicted, figure)}</td>
                <td className="px-1.5 py-1 text-right whitespace-nowrap tabular-nums">{figure.notCompared === 'matched-pair' ? 'not simulated' : verifiedValue(figure.simulated, figure)}</td>
                <td className="px-1.5 py-1 text-right whitespace-nowrap tabular-nums">{deltaText(figure)}</td>
                <td className="px-1.5 py-1 text-right whitespace-nowrap tabular-nums">{toleranceText(figure)}</td>
                <td className="py-1 pl-1.5">
                  <AgreementVerdict agrees={figure.agrees} notCompared={figure.notCompared} />
                </td>
              </tr>
            ))}
          </tbody>
        ))}
      </table>
      {notes.length > 0 && (
        <ul className="mt-1 space-y-0.5 text-xs text-ink-soft dark:text-night-ink-soft">
          {notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      )}
    </>
  );
}

/** Whether a result is of the current design, in words that print (not colour alone). */
function FreshnessLine({ state }: { state: Freshness }) {
  if (state.state === 'current') return <p className="mb-1 text-xs" data-freshness="current">✓ Simulated exactly the current design.</p>;
  return (
    <p className="mb-1 text-sm font-medium text-short dark:text-short-bright" data-freshness={state.state}>
      {state.state === 'stale' ? `Stale: ${state.changes.join('; ')}. These figures are not of the current design.` : UNBOUND_WORDS}
    </p>
  );
}

/** How the verification stands for the current design, as the server judged it. */
function DesignCheckLine({ state, name, word }: { state: DesignVerificationState; name: string; word: string }) {
  const text =
    state.state === 'current'
      ? `SPICE job #${state.jobId} simulated exactly the ${word} design (${name}).`
      : state.state === 'stale'
        ? `Stale for the ${word} design (${name}): job #${state.jobId} ${state.changes.join('; ')}. A fresh run is needed for figures of this design.`
        : state.state === 'unbound'
          ? `The only verification of the ${word} design (${name}), job #${state.jobId}, is not bound to a design: simulated before fingerprints were recorded.`
          : `The ${word} design (${name}) has not been simulated.`;
  return (
    <p className={state.state === 'current' ? 'text-sm' : 'text-sm font-medium'} data-design-check={state.state}>
      {text}
    </p>
  );
}

/** One line per corner: how many figures were compared and which fell outside. */
function CornerLines({ corners }: { corners: VerifiedCondition[] }) {
  if (corners.length === 0) return null;
  return (
    <ul className="mt-2 space-y-0.5 text-xs">
      {corners.map((corner) => {
        const compared = corner.figures.filter((f) => f.agrees !== null);
        const outside = compared.filter((f) => f.agrees === false);
        return (
          <li key={corner.label}>
            <span className="font-medium">{corner.label}</span>: {outside.length === 0 ? `all ${compared.length} compared figures agree` : `outside tolerance: ${outside.map((f) => `${f.label} (${deltaText(f)})`).join(', ')}`}
          </li>
        );
      })}
    </ul>
  );
}

function OptionBlock({ option, rank, freshness }: { option: OptionVerification; rank: number | null; freshness: Freshness | null }) {
  const name = `${rank !== null && option.source === 'option' ? `#${rank} ` : ''}${topologyName(option.topology)}${option.source === 'decision' ? ', the designer’s own values' : ''}`;
  return (
    <div className="report-keep mt-5">
      <ReportSubheading>
        <span className="inline-flex flex-wrap items-center gap-2">
          {name}
          {option.outcome === 'error' ? (
            <Verdict kind="undecided" label="Not simulated" />
          ) : option.agrees ? (
            <Verdict kind="holds" label="Agrees within tolerance" />
          ) : (
            <Verdict kind="short" label={`${option.disagreements} figure${option.disagreements === 1 ? '' : 's'} outside tolerance`} />
          )}
        </span>
      </ReportSubheading>
      {freshness && <FreshnessLine state={freshness} />}
      {option.outcome === 'error' ? (
        <p className="text-sm">The simulation failed: {option.error ?? 'no message'}.</p>
      ) : (
        <>
          {option.nominal && <FiguresTable condition={option.nominal} caption={`${option.nominal.label}: engine prediction beside ngspice`} />}
          <CornerLines corners={option.corners} />
          <div className="mt-2">
            <DifferenceCauses option={option} compact />
          </div>
        </>
      )}
    </div>
  );
}

function MonteCarloTable({ jobs, current }: { jobs: VerificationJobView[]; current: ShownDesign | null }) {
  const finished = jobs.filter((j) => j.state === 'finished' && isMonteCarloResult(j.result));
  if (finished.length === 0) return null;
  return (
    <>
      <ReportSubheading>SPICE Monte Carlo of the differential rejection</ReportSubheading>
      <table className="w-full text-sm">
        <caption className="sr-only">SPICE Monte Carlo beside the engine&rsquo;s on the same draws</caption>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <th scope="col" className="py-1 pr-2 text-left font-medium">Tail</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Runs</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Required</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Yield, simulated</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Yield, predicted</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">1st percentile, simulated / predicted</th>
            <th scope="col" className="px-1.5 py-1 text-right font-medium">Offset σ, simulated / stored</th>
          </tr>
        </thead>
        <tbody>
          {finished.map((job) => {
            const r = job.result as MonteCarloVerificationResult;
            const aboutCurrent = current && (r.source === 'decision' || (!current.ownValues && r.topology === current.topology));
            const state = aboutCurrent ? freshness(r.binding, current.binding, currentDesignWord(current)) : null;
            return (
              <tr key={job.id} className="border-b border-rule/60 dark:border-night-rule/60">
                <th scope="row" className="py-1 pr-2 text-left font-normal">
                  {topologyName(r.topology)}
                  {r.source === 'decision' ? ', decided design' : ''}
                  {state && state.state !== 'current' && <span className="block text-xs font-medium text-short dark:text-short-bright">{freshnessText(state)}</span>}
                </th>
                <td className="px-1.5 py-1 text-right tabular-nums">
                  {r.runs}
                  {r.failedRuns > 0 && ` (${r.failedRuns} failed)`}
                </td>
                <td className="px-1.5 py-1 text-right tabular-nums">≥ {formatTargetDb(r.requiredDb)}</td>
                <td className="px-1.5 py-1 text-right tabular-nums">{formatPercent(r.simulated.yieldPercent)}</td>
                <td className="px-1.5 py-1 text-right tabular-nums">{formatPercent(r.predicted.yieldPercent)}</td>
                <td className="px-1.5 py-1 text-right tabular-nums">
                  {formatFixed(r.simulated.percentilesDb.p1, 1)} / {formatDb(r.predicted.percentilesDb.p1)}
                </td>
                <td className="px-1.5 py-1 text-right tabular-nums">
                  {r.offset ? `${formatFigure(r.offset.simulated.standardDeviationV, 'V')} / ${r.offset.predicted?.standardDeviationV != null ? formatFigure(r.offset.predicted.standardDeviationV, 'V') : 'absent'}` : '—'}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </>
  );
}

/** The engine's figures beside ngspice's for every option, or why there are none yet. */
export function ReportVerification({ proposal, status, error }: { proposal: Proposal; status: VerificationStatus | undefined; error: Error | null }) {
  if (error) return <p className="text-sm">Not verified yet as far as this report can tell: the verification could not be read ({error.message}).</p>;
  if (!status) return <p className="text-sm">Reading the verification…</p>;
  const job = status.verification;
  const result = job?.state === 'finished' && isProposalResult(job.result) ? job.result : null;
  const rankOf = (topology: string) => proposal.result.options.find((o) => o.topology === topology)?.rank ?? null;
  const current = proposalCurrentDesign(proposal);
  return (
    <div>
      {current && status.currentDesign && <DesignCheckLine state={status.currentDesign} name={currentDesignName(current)} word={currentDesignWord(current)} />}
      {result && job ? (
        <>
          <p className="text-sm">
            Simulated with {result.simulator} on the netlists Longtail exports; asked for by {job.requestedBy.displayName}, finished {job.finishedAt ? formatDateTime(job.finishedAt, { seconds: true }) : ''}.{' '}
            {result.options.every((o) => o.outcome === 'verified' && o.agrees) ? 'Every figure agrees within its tolerance.' : 'Some figures fall outside their tolerance or could not be simulated: see below.'}
          </p>
          {[...result.options]
            .sort((a, b) => (a.source === b.source ? (rankOf(a.topology) ?? 99) - (rankOf(b.topology) ?? 99) : a.source === 'decision' ? -1 : 1))
            .map((option) => (
              <OptionBlock key={`${option.source}-${option.topology}`} option={option} rank={rankOf(option.topology)} freshness={resultFreshness(option, result.options, current)} />
            ))}
          <ReportNote>
            Difference is predicted − simulated: per cent of the simulated value for currents, gains, resistances, frequencies and power; dB for rejection; volts for node voltages.
            The tolerances are the engine&rsquo;s agreement targets.
          </ReportNote>
        </>
      ) : (
        <>
          <p className="text-sm font-medium">Not verified yet.</p>
          <p className="text-sm">{notVerifiedWhy(job)} Until a verification finishes, every figure in this report is the engine&rsquo;s estimate alone.</p>
        </>
      )}
      <MonteCarloTable jobs={status.monteCarlo} current={current} />
    </div>
  );
}
