/**
 * The ranking's charts, drawn with uPlot. This module is loaded lazily (lazy-charts.tsx), so uPlot
 * and its stylesheet stay out of the first route's JavaScript; the stylesheet is bundled, not
 * injected, as the content security policy forbids inline <style>.
 */
import 'uplot/dist/uPlot.min.css';
import { useMemo } from 'react';
import uPlot from 'uplot';
import type { TopologyId } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { mixHex } from '../../../../../lib/colour-mix';
import { formatDb, formatTargetDb } from '#shared/units/figures';
import type { HistogramPlot, RejectionPlot, TemperaturePlot } from '../../../lib/plot-data';
import { tickLabels } from '../../../../../lib/plot-axes';
import { axis, frequencyPlotOptions, NO_ZOOM, numberAxis, valueAt } from '../../../../../components/charts/axes';
import { ChartLegend, type LegendItem } from '../../../../../components/charts/chart-legend';
import { diamond, horizontalMark, pointLabel, verticalMark } from '../../../../../components/charts/draw-marks';
import { UplotBox, useChartTheme, useCursorIndex, type ChartOptions } from '../../../../../components/charts/uplot-box';

/** Decimals that show an axis step of `increment` without trailing noise (a step of 0.02 -> 2). */
function decimalsFor(increment: number): number {
  return Math.max(0, Math.min(6, -Math.floor(Math.log10(increment) + 1e-9)));
}

/** A curve's width: its own when the plot sets one, else heavier for the selected option. */
const lineWidth = (s: RejectionPlot['series'][number], selected: TopologyId | null) => s.width ?? (s.topology === selected ? 3 : 1.5);

/** Rejection against frequency for every option, log frequency, with the spec's target lines and frequency. */
export function RejectionChart({ plot, selected }: { plot: RejectionPlot; selected: TopologyId | null }) {
  const theme = useChartTheme();
  const [index, onCursor] = useCursorIndex();
  const options = useMemo((): ChartOptions => {
    const mark = { font: theme.font, halo: theme.sheet };
    const style = (t: TopologyId) => theme.topology[t];
    const series: uPlot.Series[] = [
      {},
      ...plot.series.map((s) => ({ stroke: style(s.topology).stroke, dash: s.dash ?? style(s.topology).dash, width: lineWidth(s, selected), points: { show: false } })),
    ];
    if (plot.mismatch) series.push({ stroke: style(plot.mismatch.topology).stroke, dash: [1, 3], width: 1.6, points: { show: false } });
    const low = Math.min(plot.requiredDb, ...plot.series.flatMap((s) => s.valuesDb.filter((v): v is number => v !== null)));
    return frequencyPlotOptions(theme, {
      series: series,
      yLabel: 'Common-mode rejection (dB)',
      yRange: (_u, _min, max) => [Math.floor((low - 5) / 20) * 20, Math.ceil((Math.max(max, plot.requiredWithMarginDb) + 5) / 20) * 20],
      onCursor,
      draw: (u) => {
        horizontalMark(u, plot.requiredWithMarginDb, 'y', `${formatTargetDb(plot.requiredWithMarginDb)} with margin`, { ...mark, colour: theme.ink, width: 1.2 });
        horizontalMark(u, plot.requiredDb, 'y', `${formatTargetDb(plot.requiredDb)} required`, { ...mark, colour: theme.ink, dash: [6, 4] }, true);
        verticalMark(u, plot.specFrequencyHz, `spec ${formatQuantity(plot.specFrequencyHz, 'Hz')}`, { ...mark, colour: theme.inkSoft, dash: [2, 3] });
        for (const s of plot.series) {
          if (s.worstAtFrequencyDb !== null) diamond(u, plot.specFrequencyHz, s.worstAtFrequencyDb, 'y', style(s.topology).stroke);
        }
      },
    });
  }, [plot, selected, theme, onCursor]);
  const items: LegendItem[] = plot.series.map((s) => ({
    label: s.name,
    note: s.passes ? undefined : 'falls short',
    ...theme.topology[s.topology],
    ...(s.dash ? { dash: s.dash } : {}),
    width: lineWidth(s, selected),
    value: valueAt(s.valuesDb, index, formatDb),
  }));
  if (plot.mismatch) items.push({ label: `${plot.mismatch.name}, mismatch worst case`, stroke: theme.topology[plot.mismatch.topology].stroke, dash: [1, 3], value: valueAt(plot.mismatch.valuesDb, index, formatDb) });
  return (
    <>
      <UplotBox options={options} data={plot.data as uPlot.AlignedData} height={340} />
      <ChartLegend items={items} at={index === null ? null : formatQuantity(plot.frequencyHz[index], 'Hz')} />
    </>
  );
}

/** The Monte Carlo distribution of one option's rejection, as stepped bars, with the required line. */
export function HistogramChart({ plot, frequencyHz }: { plot: HistogramPlot; frequencyHz: number }) {
  const theme = useChartTheme();
  const [index, onCursor] = useCursorIndex();
  const fill = mixHex(theme.accent, theme.sheet, 0.6);
  const options = useMemo((): ChartOptions => {
    const mark = { font: theme.font, halo: theme.sheet };
    const most = Math.max(...plot.bars.map((b) => b.count), 1);
    const last = plot.bars[plot.bars.length - 1];
    return {
      series: [{}, { stroke: theme.accent, fill, width: 1.2, paths: uPlot.paths.stepped!({ align: 1 }), points: { show: false } }],
      cursor: NO_ZOOM,
      scales: { x: { time: false, range: plot.rangeDb }, y: { range: [0, Math.ceil(most * 1.2)] } },
      axes: [
        numberAxis(theme, `Rejection at ${formatQuantity(frequencyHz, 'Hz')} (dB)`),
        numberAxis(theme, 'Samples per bin', { size: 48 }),
      ],
      hooks: {
        setCursor: [onCursor],
        draw: [
          (u) => {
            verticalMark(u, plot.requiredDb, `${formatTargetDb(plot.requiredDb)} required`, { ...mark, colour: theme.ink, dash: [6, 4], width: 1.4 });
            verticalMark(u, plot.percentilesDb.p1, '1st percentile', { ...mark, colour: theme.inkSoft, dash: [2, 3] }, 'right');
            if (last?.andAbove) pointLabel(u, (last.fromDb + last.toDb) / 2, last.count, 'y', '+ above', { ...mark, colour: theme.inkSoft });
          },
        ],
      },
    };
  }, [plot, frequencyHz, theme, fill, onCursor]);
  const bar = index === null ? null : plot.bars[Math.min(index, plot.bars.length - 1)];
  const at = bar ? `${formatDb(bar.fromDb)} to ${bar.andAbove ? 'above' : formatDb(bar.toDb)}` : null;
  return (
    <>
      <UplotBox options={options} data={plot.data as uPlot.AlignedData} height={260} />
      <ChartLegend items={[{ label: `Samples per bin (of ${plot.samples})`, stroke: theme.accent, fill, value: bar ? String(bar.count) : null }]} at={at} />
    </>
  );
}

/** Tail current (left axis, solid, filled markers) and gain (right axis, dashed, hollow markers) over temperature. */
export function TemperatureChart({ plot }: { plot: TemperaturePlot }) {
  const theme = useChartTheme();
  const [index, onCursor] = useCursorIndex();
  const options = useMemo(
    (): ChartOptions => ({
      series: [
        {},
        { scale: 'A', stroke: theme.accent, width: 2, points: { show: true, size: 7, fill: theme.accent } },
        { scale: 'gain', stroke: theme.note, dash: [6, 4], width: 2, points: { show: true, size: 7, fill: theme.sheet } },
      ],
      cursor: NO_ZOOM,
      scales: { x: { time: false }, A: {}, gain: {} },
      axes: [
        axis(theme, 'Temperature (°C)', (_u, splits) => tickLabels(splits, (v) => formatQuantity(v, '°C'))),
        axis(theme, 'Tail current (A)', (_u, splits) => tickLabels(splits, (v) => formatQuantity(v, 'A', 4)), { scale: 'A', size: 68 }),
        axis(theme, 'Gain (V/V)', (_u, splits, _axis, _space, increment) => tickLabels(splits, (v) => v.toFixed(decimalsFor(increment))), { scale: 'gain', side: 1, size: 48, grid: { show: false } }),
      ],
      hooks: { setCursor: [onCursor] },
    }),
    [theme, onCursor],
  );
  const items: LegendItem[] = [
    { label: 'Tail current', stroke: theme.accent, width: 2, marker: 'filled', value: valueAt(plot.tailCurrentA, index, (v) => formatQuantity(v, 'A')) },
    { label: 'Gain', stroke: theme.note, dash: [6, 4], width: 2, marker: 'hollow', value: valueAt(plot.gain, index, (v) => formatQuantity(v, 'V/V')) },
  ];
  return (
    <>
      <UplotBox options={options} data={plot.data as uPlot.AlignedData} height={260} />
      <ChartLegend items={items} at={index === null ? null : formatQuantity(plot.temperatureC[index], '°C')} />
    </>
  );
}
