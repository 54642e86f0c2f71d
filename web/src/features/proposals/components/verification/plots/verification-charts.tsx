/**
 * The SPICE check's charts, drawn with uPlot in the ranking's look (its theme, axes, legend and
 * marks). Loaded lazily (lazy-verification-charts.tsx), so uPlot stays out of the first route's
 * JavaScript; the stylesheet is bundled, not injected, as the content security policy forbids inline <style>.
 */
import 'uplot/dist/uPlot.min.css';
import { useMemo } from 'react';
import uPlot from 'uplot';
import { formatQuantity } from '#shared/units/format-quantity';
import { mixHex } from '../../../../../lib/colour-mix';
import { formatDb, formatTargetDb } from '#shared/units/figures';
import type { MonteCarloPlot, RejectionComparisonPlot } from '../../../lib/verification-plots';
import { frequencyPlotOptions, NO_ZOOM, numberAxis, roomyDbRange, valueAt } from '../../../../../components/charts/axes';
import { ChartLegend, type LegendItem } from '../../../../../components/charts/chart-legend';
import { horizontalMark, verticalMark } from '../../../../../components/charts/draw-marks';
import { UplotBox, useChartTheme, useCursorIndex, type ChartOptions } from '../../../../../components/charts/uplot-box';

/** The engine's nominal rejection (dashed) and ngspice's (solid) against log frequency, with the spec's target and frequency. */
export function RejectionComparisonChart({ plot, requiredDb, specFrequencyHz }: { plot: RejectionComparisonPlot; requiredDb: number | null; specFrequencyHz: number | null }) {
  const theme = useChartTheme();
  const [index, onCursor] = useCursorIndex();
  const options = useMemo((): ChartOptions => {
    const mark = { font: theme.font, halo: theme.sheet };
    const values = [...plot.simulatedDb, ...plot.predictedDb.filter((v): v is number => v !== null), ...(requiredDb === null ? [] : [requiredDb])];
    const low = Math.min(...values);
    const high = Math.max(...values);
    return frequencyPlotOptions(theme, {
      series: [{}, { stroke: theme.note, dash: [8, 4], width: 2, points: { show: false } }, { stroke: theme.accent, width: 2, points: { show: false } }],
      yLabel: 'Common-mode rejection (dB)',
      yRange: () => roomyDbRange(low, high),
      onCursor,
      draw: (u) => {
        if (requiredDb !== null) horizontalMark(u, requiredDb, 'y', `${formatTargetDb(requiredDb)} required`, { ...mark, colour: theme.ink, dash: [6, 4] }, true);
        if (specFrequencyHz !== null) verticalMark(u, specFrequencyHz, `spec ${formatQuantity(specFrequencyHz, 'Hz')}`, { ...mark, colour: theme.inkSoft, dash: [2, 3] });
      },
    });
  }, [plot, requiredDb, specFrequencyHz, theme, onCursor]);
  const items: LegendItem[] = [
    { label: 'Engine (predicted)', stroke: theme.note, dash: [8, 4], width: 2, value: valueAt(plot.predictedDb, index, formatDb) },
    { label: 'ngspice (simulated)', stroke: theme.accent, width: 2, value: valueAt(plot.simulatedDb, index, formatDb) },
  ];
  return (
    <>
      <UplotBox options={options} data={plot.data as uPlot.AlignedData} height={300} />
      <ChartLegend items={items} at={index === null ? null : formatQuantity(plot.frequencyHz[index], 'Hz')} />
    </>
  );
}

/** ngspice's Monte Carlo histogram (filled steps) over the engine's closed form on the same draws (dotted steps), with the required line. */
export function MonteCarloComparisonChart({ plot, frequencyHz }: { plot: MonteCarloPlot; frequencyHz: number | null }) {
  const theme = useChartTheme();
  const [index, onCursor] = useCursorIndex();
  const fill = mixHex(theme.accent, theme.sheet, 0.6);
  const options = useMemo((): ChartOptions => {
    const mark = { font: theme.font, halo: theme.sheet };
    const stepped = uPlot.paths.stepped!({ align: 1 });
    return {
      series: [
        {},
        { stroke: theme.accent, fill, width: 1.2, paths: stepped, points: { show: false } },
        { stroke: theme.note, dash: [2, 2], width: 2, paths: stepped, points: { show: false } },
      ],
      cursor: NO_ZOOM,
      scales: { x: { time: false, range: plot.rangeDb }, y: { range: [0, Math.ceil(plot.mostCount * 1.2)] } },
      axes: [
        numberAxis(theme, frequencyHz === null ? 'Rejection (dB)' : `Rejection at ${formatQuantity(frequencyHz, 'Hz')} (dB)`),
        numberAxis(theme, 'Runs per bin', { size: 48 }),
      ],
      hooks: {
        setCursor: [onCursor],
        draw: [(u) => verticalMark(u, plot.requiredDb, `${formatTargetDb(plot.requiredDb)} required`, { ...mark, colour: theme.ink, dash: [6, 4], width: 1.4 })],
      },
    };
  }, [plot, frequencyHz, theme, fill, onCursor]);
  const bin = index === null ? null : Math.min(index, plot.simulatedCounts.length - 1);
  const at = bin === null ? null : `${formatDb(plot.binEdgesDb[bin])} to ${formatDb(plot.binEdgesDb[bin + 1])}`;
  const items: LegendItem[] = [
    { label: 'ngspice runs', stroke: theme.accent, fill, value: bin === null ? null : String(plot.simulatedCounts[bin]) },
    { label: 'Engine closed form, same draws', stroke: theme.note, dash: [2, 2], width: 2, value: bin === null ? null : String(plot.predictedCounts[bin]) },
  ];
  return (
    <>
      <UplotBox options={options} data={plot.data as uPlot.AlignedData} height={260} />
      <ChartLegend items={items} at={at} />
    </>
  );
}
