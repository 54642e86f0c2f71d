/**
 * The trade-off charts, drawn with uPlot (loaded lazily by lazy-tradeoff-chart.tsx, so uPlot stays
 * out of the first route's JavaScript): one figure against tail current on a log axis, the spec's
 * limit as a line (the gain's tolerance as a band), the feasible window shaded, the current the
 * option is sized at and the what-if current marked.
 */
import 'uplot/dist/uPlot.min.css';
import { useMemo } from 'react';
import type uPlot from 'uplot';
import { formatQuantity } from '#shared/units/format-quantity';
import { mixHex } from '../../../../lib/colour-mix';
import { tickLabels } from '../../../../lib/plot-axes';
import { axis, NO_ZOOM, sizeToLabels, valueAt } from '../../../../components/charts/axes';
import { horizontalMark, verticalMark, xBand, yBand } from '../../../../components/charts/draw-marks';
import { UplotBox, useChartTheme, useCursorIndex, type ChartOptions } from '../../../../components/charts/uplot-box';
import { formatTradeoff } from '../../lib/tradeoff-columns';
import type { TradeoffChart } from '../../lib/tradeoff-plot';

/** Ticks at each decade and its 2 and 5, within the range (a current axis spanning two decades). */
function decadeSplits(min: number, max: number): number[] {
  const ticks: number[] = [];
  for (let d = Math.floor(Math.log10(min)); d <= Math.ceil(Math.log10(max)); d += 1) {
    for (const m of [1, 2, 5]) {
      const v = Number(`${m}e${d}`);
      if (v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9)) ticks.push(v);
    }
  }
  return ticks;
}

/** The y range: the figures and the limit with some room (a factor on a log axis, a share of the span on a linear one). */
function yRange(chart: TradeoffChart): [number, number] {
  const values = chart.values.filter((v): v is number => v !== null);
  const all = [...values, ...(chart.limit !== null ? [chart.limit] : []), ...(chart.band ?? [])];
  if (all.length === 0) return chart.logY ? [1e-12, 1] : [0, 1];
  const low = Math.min(...all);
  const high = Math.max(...all);
  if (chart.logY) return [low / 1.6, high * 1.6];
  const room = Math.max((high - low) * 0.15, Math.abs(high) * 0.02, 1e-12);
  return [low - room, high + room];
}

export function TradeoffChartView({
  chart,
  currentsA,
  feasible,
  sizedA,
  whatIfA,
}: {
  chart: TradeoffChart;
  currentsA: number[];
  feasible: { fromA: number | null; toA: number | null } | null;
  sizedA: number;
  whatIfA: number | null;
}) {
  const theme = useChartTheme();
  const [index, onCursor] = useCursorIndex();
  const shade = mixHex(theme.accent, theme.sheet, 0.86);
  const gainShade = mixHex(theme.note, theme.sheet, 0.85);
  const options = useMemo((): ChartOptions => {
    const mark = { font: theme.font, halo: theme.sheet };
    const [low, high] = yRange(chart);
    return {
      series: [{}, { stroke: theme.accent, width: 2, points: { show: true, size: 4, fill: theme.accent }, spanGaps: false }],
      cursor: NO_ZOOM,
      // the x axis spans exactly the swept currents
      scales: { x: { time: false, distr: 3, log: 10, range: () => [currentsA[0], currentsA[currentsA.length - 1]] }, y: chart.logY ? { distr: 3, log: 10, range: [low, high] } : { range: [low, high] } },
      axes: [
        axis(theme, 'Tail current (A)', (_u, splits) => tickLabels(splits, (v) => formatQuantity(v, 'A', 2)), { splits: (u) => decadeSplits(u.scales.x.min!, u.scales.x.max!) }),
        axis(theme, chart.unit === 'dB' ? 'dB' : chart.unit, (_u, splits) => tickLabels(splits, (v) => formatTradeoff(v, chart.unit).replace(/ ?(dB)$/, '')), { size: sizeToLabels(64), ...(chart.logY ? { splits: (u: uPlot) => decadeSplits(u.scales.y.min!, u.scales.y.max!) } : {}) }),
      ],
      hooks: {
        setCursor: [onCursor],
        drawAxes: [
          (u) => {
            if (feasible) xBand(u, feasible.fromA, feasible.toA, shade);
            if (chart.band) yBand(u, chart.band[0], chart.band[1], 'y', gainShade);
          },
        ],
        draw: [
          (u) => {
            if (chart.limit !== null) horizontalMark(u, chart.limit, 'y', chart.side === 'band' ? `target ${chart.limitText}` : chart.limitText, { ...mark, colour: theme.ink, dash: [6, 4], width: 1.2 }, chart.side === 'min');
            // the current marks label at the bottom, clear of the limit's label along its line; the two labels
            // face away from each other, and a label near a plot edge faces inward
            const inward = (value: number, away: CanvasTextAlign): CanvasTextAlign => {
              const x = u.valToPos(value, 'x', true);
              const near = 60 * devicePixelRatio;
              if (x - u.bbox.left < near) return 'left';
              if (u.bbox.left + u.bbox.width - x < near) return 'right';
              return away;
            };
            const apart = whatIfA !== null && Math.abs(whatIfA / sizedA - 1) > 1e-6;
            verticalMark(u, sizedA, 'sized', { ...mark, colour: theme.ink, width: 1.4 }, inward(sizedA, apart && whatIfA! > sizedA ? 'right' : 'left'), 'bottom');
            if (apart) verticalMark(u, whatIfA!, 'what-if', { ...mark, colour: theme.note, dash: [2, 3], width: 1.6 }, inward(whatIfA!, whatIfA! < sizedA ? 'right' : 'left'), 'bottom');
          },
        ],
      },
    };
  }, [chart, currentsA, feasible, sizedA, whatIfA, theme, shade, gainShade, onCursor]);
  const data = useMemo(() => [currentsA, chart.values] as unknown as uPlot.AlignedData, [currentsA, chart.values]);
  const value = valueAt(chart.values, index, (v) => formatTradeoff(v, chart.unit));
  return (
    <>
      <UplotBox options={options} data={data} height={190} />
      {/* one line under the plot: the figure under the cursor (the what-if list beside the charts reads any current exactly) */}
      <p className="min-h-4 text-xs text-ink-soft tabular-nums dark:text-night-ink-soft">
        {index === null ? '\u00a0' : `${chart.title} ${value ?? 'not solved'} at ${formatQuantity(currentsA[index], 'A')}`}
      </p>
    </>
  );
}
