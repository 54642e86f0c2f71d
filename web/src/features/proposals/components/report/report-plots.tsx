/**
 * Where the report's plots sit: rejection against frequency under the ranked table, the Monte
 * Carlo of the reported design (and its SPICE Monte Carlo, once finished) under the design.
 */
import type { MonteCarloVerificationResult, VerificationJobView } from '#shared/verification/types';
import type { Proposal } from '#shared/api/proposals';
import { topologyName, topologyNameInText } from '../../../../lib/topology-names';
import { histogramPlot, rejectionPlot } from '../../lib/plot-data';
import type { ReportSubject } from '../../lib/report-subject';
import { EngineMonteCarloSvg, RejectionPlotSvg, SpiceMonteCarloSvg } from './plots/report-plots';

const isMonteCarloResult = (result: VerificationJobView['result']): result is MonteCarloVerificationResult => result !== null && 'histogram' in result;

/** Rejection against frequency for every ranked option; the reported design heavier (an override's own curve added). */
export function RankingPlot({ proposal, subject }: { proposal: Proposal; subject: ReportSubject }) {
  const override = subject.decision?.kind === 'override';
  const plot = rejectionPlot(proposal.result, override ? undefined : (subject.topology ?? undefined) as never);
  if (!plot) return null;
  const own = override && subject.option?.curves ? new Map(subject.option.curves.cmrrVsFrequency.map((p) => [p.frequencyHz, p.singleEndedDb])) : null;
  const ownValues = own && subject.topology ? { name: `${topologyName(subject.topology)}, the designer’s own values`, valuesDb: plot.frequencyHz.map((f) => own.get(f) ?? null) } : null;
  return (
    <div className="mt-5">
      <RejectionPlotSvg plot={plot} subject={override ? null : (subject.topology as never)} ownValues={ownValues} />
    </div>
  );
}

/** The engine's Monte Carlo of the reported design and the latest finished SPICE Monte Carlo of its topology. */
export function DesignMonteCarlo({ subject, monteCarlo }: { subject: ReportSubject; monteCarlo: VerificationJobView[] | undefined }) {
  const option = subject.option;
  if (!option || !subject.topology) return null;
  const name = topologyNameInText(subject.topology);
  const engine = histogramPlot(option);
  const spice = (monteCarlo ?? []).find((j) => j.state === 'finished' && j.topology === subject.topology && isMonteCarloResult(j.result));
  if (!engine && !spice) {
    return option.figures && !option.figures.isDifferentialOutput ? (
      <p className="text-xs text-ink-soft dark:text-night-ink-soft">The spec asks for a single-ended output: rejection is set by the tail, not by pair mismatch, so there is no Monte Carlo study to plot.</p>
    ) : null;
  }
  return (
    <div className="grid gap-6 md:grid-cols-2 print:grid-cols-1">
      {engine && option.figures && <EngineMonteCarloSvg plot={engine} name={name} requiredYieldPercent={option.figures.requiredYieldPercent} />}
      {spice && isMonteCarloResult(spice.result) && <SpiceMonteCarloSvg result={spice.result} name={name} />}
    </div>
  );
}
