import { useMemo } from 'react';
import type { RecommendOption } from '#shared/engine/recommend';
import { histogramPlot, temperaturePlot } from '../../../lib/plot-data';
import { histogramSummary, temperatureSummary } from '../../../lib/plot-summaries';
import { topologyName } from '../../../../../lib/topology-names';
import { HistogramChart, TemperatureChart } from './lazy-charts';
import { PlotFigure } from '../../../../../components/charts/plot-figure';
import { CommentMark } from '../../comments/comments-context';

/** The selected option's Monte Carlo histogram (differential outputs) and its temperature sweep. */
export function OptionPlots({ option }: { option: RecommendOption }) {
  const histogram = useMemo(() => histogramPlot(option), [option]);
  const temperature = useMemo(() => temperaturePlot(option), [option]);
  const name = topologyName(option.topology);
  const f = option.figures;
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      {histogram && f ? (
        <div className="min-w-0">
          <PlotFigure title="Monte Carlo rejection (pair and load mismatch)" summary={histogramSummary(name, histogram, f.requiredYieldPercent)}>
            <HistogramChart plot={histogram} frequencyHz={f.cmrrFrequencyHz} />
          </PlotFigure>
          <CommentMark anchor={{ kind: 'figure', topology: option.topology, figureKey: 'monte-carlo' }} className="mt-1" />
        </div>
      ) : (
        <figure className="min-w-0">
          <figcaption className="mb-2 text-sm font-medium">Monte Carlo rejection</figcaption>
          <p className="rounded-md border border-dashed border-rule p-4 text-sm text-ink-soft dark:border-night-rule dark:text-night-ink-soft">
            {f && !f.isDifferentialOutput
              ? 'The spec asks for a single-ended output, so rejection is set by the tail, not by pair mismatch: there is no Monte Carlo study. The rejection plot above holds.'
              : 'No Monte Carlo result for this option (it could not be solved).'}
          </p>
        </figure>
      )}
      {temperature ? (
        <div className="min-w-0">
          <PlotFigure title="Tail current and gain over temperature" summary={temperatureSummary(name, temperature)}>
            <TemperatureChart plot={temperature} />
          </PlotFigure>
          <CommentMark anchor={{ kind: 'figure', topology: option.topology, figureKey: 'temperature' }} className="mt-1" />
        </div>
      ) : null}
    </div>
  );
}
