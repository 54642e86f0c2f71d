import { useMemo, type ReactNode } from 'react';
import type { MonteCarloOffset, MonteCarloVerificationResult, VerificationJobView } from '#shared/verification/types';
import { Verdict } from '../../../../components/ui/verdict';
import { topologyName } from '../../../../lib/topology-names';
import { formatDb, formatFigure, formatPercent, formatTargetDb } from '#shared/units/figures';
import { monteCarloPlot } from '../../lib/verification-plots';
import { PlotFigure } from '../../../../components/charts/plot-figure';
import { JobFacts } from './verification-result';
import { MonteCarloComparisonChart } from './plots/lazy-verification-charts';

type Statistics = MonteCarloVerificationResult['simulated'];

const ROWS: { label: string; value: (s: Statistics) => string }[] = [
  { label: '1st percentile', value: (s) => formatDb(s.percentilesDb.p1) },
  { label: '5th percentile', value: (s) => formatDb(s.percentilesDb.p5) },
  { label: 'Median', value: (s) => formatDb(s.percentilesDb.p50) },
  { label: '95th percentile', value: (s) => formatDb(s.percentilesDb.p95) },
];

function Cell({ children }: { children: ReactNode }) {
  return <td className="px-2 py-1.5 text-right whitespace-nowrap tabular-nums">{children}</td>;
}

/** A yield beside the spec's required yield, in the status language; the bare figure when the spec gives none. */
function YieldCell({ yieldPercent, requiredYieldPercent }: { yieldPercent: number; requiredYieldPercent: number | null }) {
  return (
    <Cell>
      <span className="mr-2">{formatPercent(yieldPercent)}</span>
      {requiredYieldPercent !== null &&
        (yieldPercent >= requiredYieldPercent ? <Verdict kind="holds" label="Reaches it" /> : <Verdict kind="short" label="Falls short" />)}
    </Cell>
  );
}

/** A finished SPICE Monte Carlo: yields and percentiles side by side, then both histograms on the shared bins. */
export function MonteCarloResult({
  job,
  result,
  requiredYieldPercent,
  frequencyHz,
}: {
  job: VerificationJobView;
  result: MonteCarloVerificationResult;
  requiredYieldPercent: number | null;
  frequencyHz: number | null;
}) {
  const plot = useMemo(() => monteCarloPlot(result), [result]);
  const name = topologyName(result.topology);
  const counted = result.runs - result.failedRuns;
  const required = formatTargetDb(result.requiredDb);
  return (
    <div className="space-y-4">
      <JobFacts job={job} result={result} />
      <div className="relative overflow-x-auto">
        <table className="w-full max-w-xl text-sm">
          <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">
            {name}: differential rejection at {result.condition} (the corner that governs its mismatch worst case) over {counted} of {result.runs} runs (seed {result.seed}); yield is the share at or above {required}
            {requiredYieldPercent !== null ? `, ${formatPercent(requiredYieldPercent)} required` : ''}.
          </caption>
          <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
            <tr className="border-b border-rule dark:border-night-rule">
              <th scope="col" className="py-1 pr-3 text-left font-normal">
                Figure
              </th>
              <th scope="col" className="px-2 py-1 text-right font-normal">
                ngspice
              </th>
              <th scope="col" className="px-2 py-1 text-right font-normal">
                Engine, closed form
              </th>
            </tr>
          </thead>
          <tbody>
            <tr className="border-b border-rule/60 dark:border-night-rule/60">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                Yield at {required}
              </th>
              <YieldCell yieldPercent={result.simulated.yieldPercent} requiredYieldPercent={requiredYieldPercent} />
              <YieldCell yieldPercent={result.predicted.yieldPercent} requiredYieldPercent={requiredYieldPercent} />
            </tr>
            {ROWS.map((row) => (
              <tr key={row.label} className="border-b border-rule/60 last:border-0 dark:border-night-rule/60">
                <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                  {row.label}
                </th>
                <Cell>{row.value(result.simulated)}</Cell>
                <Cell>{row.value(result.predicted)}</Cell>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {result.failedRuns > 0 && (
        <p className="text-sm text-note dark:text-note-bright">
          <span aria-hidden="true">! </span>
          {result.failedRuns} of {result.runs} runs did not converge in ngspice and are left out of its figures.
        </p>
      )}
      {result.offset && <OffsetTable offset={result.offset} runs={result.runs} name={name} />}
      {plot && (
        <PlotFigure
          title="Monte Carlo rejection: ngspice and the engine"
          summary={
            `${name}: ${formatPercent(result.simulated.yieldPercent)} of ngspice’s ${counted} runs reach ${required} against ${formatPercent(result.predicted.yieldPercent)} by the engine’s closed form; ` +
            `medians ${formatDb(result.simulated.percentilesDb.p50)} and ${formatDb(result.predicted.percentilesDb.p50)}. Both histograms share their bins; the vertical line marks the required rejection.`
          }
        >
          <MonteCarloComparisonChart plot={plot} frequencyHz={frequencyHz} />
        </PlotFigure>
      )}
    </div>
  );
}

const volts = (value: number | null | undefined) => (value === null || value === undefined || !Number.isFinite(value) ? '—' : formatFigure(value, 'V'));

/**
 * The runs' input offset voltages: their spread (σ) and its value at the spec's sigmas beside the
 * engine's stored statistical offset, or the SPICE distribution alone when the proposal stores none.
 */
function OffsetTable({ offset, runs, name }: { offset: MonteCarloOffset; runs: number; name: string }) {
  const counted = runs - offset.failedRuns;
  const rows: { label: string; simulated: number; predicted: number | null | undefined }[] = [
    { label: 'Standard deviation σ', simulated: offset.simulated.standardDeviationV, predicted: offset.predicted?.standardDeviationV },
    { label: `At ${offset.sigmas} σ`, simulated: offset.simulated.atSigmasV, predicted: offset.predicted?.atSigmasV },
    { label: 'Mean', simulated: offset.simulated.meanV, predicted: undefined },
  ];
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full max-w-xl text-sm">
        <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">
          {name}: input offset voltage at {offset.condition} over {counted} of {runs} runs, the same draws at the nominal condition; each run’s offset is the zero of v(c1) − v(c2) in a .dc sweep of the differential input.
        </caption>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <th scope="col" className="py-1 pr-3 text-left font-normal">
              Offset
            </th>
            <th scope="col" className="px-2 py-1 text-right font-normal">
              ngspice
            </th>
            <th scope="col" className="px-2 py-1 text-right font-normal">
              Engine, stored
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.label} className="border-b border-rule/60 last:border-0 dark:border-night-rule/60">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                {row.label}
              </th>
              <Cell>{volts(row.simulated)}</Cell>
              <Cell>{offset.predicted ? volts(row.predicted) : <span className="text-ink-soft dark:text-night-ink-soft">absent</span>}</Cell>
            </tr>
          ))}
        </tbody>
      </table>
      {offset.predictedAbsent && <p className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">{offset.predictedAbsent}</p>}
      {offset.failedRuns > 0 && (
        <p className="mt-1 text-sm text-note dark:text-note-bright">
          <span aria-hidden="true">! </span>
          {offset.failedRuns} of {runs} runs gave no offset in ngspice and are left out of it.
        </p>
      )}
    </div>
  );
}
