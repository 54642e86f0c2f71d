/**
 * The axes every uPlot chart shares: themed axes, log frequency with ticks at the decades, a plain
 * number axis, the roomy dB range, and the options of a plot against log frequency. Imported only
 * by the lazily loaded chart modules, so uPlot stays out of the first route's JavaScript.
 */
import type uPlot from 'uplot';
import { formatQuantity } from '#shared/units/format-quantity';
import { axisSizeForLabels, decadeTicksHz, tickLabels } from '../../lib/plot-axes';
import type { ChartTheme } from './chart-theme';
import type { ChartOptions } from './uplot-box';

export function axis(theme: ChartTheme, label: string, values: uPlot.Axis['values'], extra: Partial<uPlot.Axis> = {}): uPlot.Axis {
  return {
    label,
    values,
    stroke: theme.inkSoft,
    font: theme.font,
    labelFont: theme.labelFont,
    grid: { stroke: theme.rule, width: 1 },
    ticks: { stroke: theme.rule, width: 1, size: 4 },
    ...extra,
  };
}

/** Room kept between an axis's widest tick label and its title, CSS px. */
const LABEL_CLEARANCE_PX = 6;

/**
 * An axis `size` as wide as its longest tick label with some room before the axis title, never
 * under `min` (uPlot measures nothing itself). uPlot asks again while the labels change the layout; after two rounds it keeps the size
 * it has, so a label list that flips between two widths cannot keep it redrawing.
 */
export function sizeToLabels(min: number): uPlot.Axis.Size {
  return (self, values, axisIdx, cycleNum) => {
    // after init uPlot holds the font as [font scaled to the device pixels, size, CSS size]
    const axis = self.axes[axisIdx] as Omit<uPlot.Axis, 'font'> & { font?: string | [string, number, number]; _size?: number };
    if (cycleNum > 1 && axis._size) return axis._size;
    if (!values || !axis.font) return min;
    self.ctx.font = typeof axis.font === 'string' ? axis.font : axis.font[0];
    const ratio = typeof devicePixelRatio === 'number' && devicePixelRatio > 0 ? devicePixelRatio : 1;
    return axisSizeForLabels(values, (text) => self.ctx.measureText(text).width / ratio, { tick: axis.ticks?.size ?? 10, gap: (axis.gap ?? 5) + LABEL_CLEARANCE_PX, min });
  };
}

/** Log frequency along x, as every plot against frequency has it (a fresh object for each chart). */
const logFrequencyScale = (): uPlot.Scale => ({ time: false, distr: 3, log: 10 });

/** The x axis of a plot against log frequency: hertz with SI prefixes, ticks at the decades. */
const frequencyAxis = (theme: ChartTheme): uPlot.Axis =>
  axis(theme, 'Frequency (Hz)', (_u, splits) => tickLabels(splits, (v) => formatQuantity(v, 'Hz')), { splits: (u) => decadeTicksHz(u.scales.x.min!, u.scales.x.max!) });

/** An axis of plain numbers (dB, counts). */
export const numberAxis = (theme: ChartTheme, label: string, extra: Partial<uPlot.Axis> = {}): uPlot.Axis => axis(theme, label, (_u, splits) => tickLabels(splits, String), extra);

/** A y range on whole 10 dB steps leaving at least 5 dB of room below `low` and above `high`. */
export const roomyDbRange = (low: number, high: number): [number, number] => [Math.floor((low - 5) / 10) * 10, Math.ceil((high + 5) / 10) * 10];

/**
 * uPlot options of a plot against log frequency: no zoom, frequency ticks at the decades, a
 * numeric y axis, the cursor reported to the legend and the marks drawn over the curves.
 */
export function frequencyPlotOptions(
  theme: ChartTheme,
  { series, yLabel, yRange, onCursor, draw }: { series: uPlot.Series[]; yLabel: string; yRange: uPlot.Scale['range']; onCursor: (u: uPlot) => void; draw: (u: uPlot) => void },
): ChartOptions {
  return {
    series,
    cursor: NO_ZOOM,
    scales: { x: logFrequencyScale(), y: { range: yRange } },
    axes: [frequencyAxis(theme), numberAxis(theme, yLabel, { size: 56 })],
    hooks: { setCursor: [onCursor], draw: [draw] },
  };
}

/** No drag-zoom (the figures are read, not explored) and no horizontal hair: the legend reads the values. */
export const NO_ZOOM: uPlot.Cursor = { drag: { x: false, y: false }, y: false };
export const valueAt = (values: (number | null)[], index: number | null, format: (v: number) => string) => {
  const v = index === null ? null : values[index];
  return v === null || v === undefined ? null : format(v);
};
