/**
 * The bench measurement over the estimates, drawn with uPlot in the ranking's look (its theme,
 * axes, legend and marks): measured (solid, with points), the engine's prediction (dashed) and,
 * when a SPICE check finished, ngspice's curve, against log frequency with the spec frequency
 * marked. Loaded lazily (lazy-measurement-chart.tsx), so uPlot stays out of the first route.
 */
import 'uplot/dist/uPlot.min.css';
import { useMemo } from 'react';
import type uPlot from 'uplot';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatDb } from '#shared/units/figures';
import { ChartLegend, type LegendItem } from '../../../../components/charts/chart-legend';
import { frequencyPlotOptions, roomyDbRange, valueAt } from '../../../../components/charts/axes';
import { diamond, horizontalMark, verticalMark } from '../../../../components/charts/draw-marks';
import { UplotBox, useChartTheme, useCursorIndex, type ChartOptions } from '../../../../components/charts/uplot-box';
import type { MeasurementPlot } from '../../lib/measurement-plot';

export function MeasurementChart({ plot, atFrequencyHz, measuredAtDb }: { plot: MeasurementPlot; atFrequencyHz: number | null; measuredAtDb: number | null }) {
  const theme = useChartTheme();
  const [index, onCursor] = useCursorIndex();
  const rejection = plot.kind === 'cmrr';
  const options = useMemo((): ChartOptions => {
    const mark = { font: theme.font, halo: theme.sheet };
    const values = [...plot.measuredDb, ...(plot.predictedDb ?? []), ...(plot.simulatedDb ?? []), plot.predictedGainDb].filter((v): v is number => v !== null && Number.isFinite(v));
    const low = Math.min(...values);
    const high = Math.max(...values);
    const series: uPlot.Series[] = [{}];
    if (plot.predictedDb) series.push({ stroke: theme.note, dash: [8, 4], width: 2, spanGaps: true, points: { show: false } });
    if (plot.simulatedDb) series.push({ stroke: theme.accent, width: 1.5, spanGaps: true, points: { show: false } });
    series.push({ stroke: theme.ink, width: 2, spanGaps: true, points: { show: true, size: 5, fill: theme.ink, stroke: theme.ink } });
    return frequencyPlotOptions(theme, {
      series: series,
      yLabel: rejection ? 'Common-mode rejection (dB)' : 'Gain (dB)',
      yRange: () => roomyDbRange(low, high),
      onCursor,
      draw: (u) => {
        if (plot.predictedGainDb !== null) horizontalMark(u, plot.predictedGainDb, 'y', `predicted ${formatDb(plot.predictedGainDb)}`, { ...mark, colour: theme.note, dash: [8, 4] }, true);
        if (atFrequencyHz !== null) verticalMark(u, atFrequencyHz, `${rejection ? 'spec' : 'compared at'} ${formatQuantity(atFrequencyHz, 'Hz')}`, { ...mark, colour: theme.inkSoft, dash: [2, 3] });
        if (atFrequencyHz !== null && measuredAtDb !== null) diamond(u, atFrequencyHz, measuredAtDb, 'y', theme.ink);
      },
    });
  }, [plot, atFrequencyHz, measuredAtDb, rejection, theme, onCursor]);
  const items: LegendItem[] = [
    ...(plot.predictedDb ? [{ label: 'Engine (predicted)', stroke: theme.note, dash: [8, 4], width: 2, value: valueAt(plot.predictedDb, index, formatDb) }] : []),
    ...(plot.predictedGainDb !== null ? [{ label: 'Engine (predicted)', stroke: theme.note, dash: [8, 4], width: 2, value: formatDb(plot.predictedGainDb) }] : []),
    ...(plot.simulatedDb ? [{ label: 'ngspice (simulated)', stroke: theme.accent, width: 1.5, value: valueAt(plot.simulatedDb, index, formatDb) }] : []),
    { label: 'Bench (measured)', stroke: theme.ink, width: 2, marker: 'filled' as const, value: valueAt(plot.measuredDb, index, formatDb) },
  ];
  return (
    <>
      <UplotBox options={options} data={plot.data as uPlot.AlignedData} height={300} />
      <ChartLegend items={items} at={index === null ? null : formatQuantity(plot.frequencyHz[index], 'Hz')} />
    </>
  );
}
