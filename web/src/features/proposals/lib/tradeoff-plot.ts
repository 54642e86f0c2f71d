/**
 * The trade-off view's data, without the chart library so it can be tested: the currents to
 * sweep around an option's own (log-spaced, a tenth to ten times it), one chart per figure (power
 * and gain always, and each figure the spec sets a target for) with its limit and safe side, the
 * feasible window to shade (the option's stored tail-current window), and the what-if point's
 * figures against each limit.
 */
import type { RecommendOption } from '#shared/engine/recommend';
import type { TradeoffSweepFigures, TradeoffSweepPoint } from '#shared/engine/tradeoff-sweep';
import type { OptionFacts } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatPercent } from '#shared/units/figures';
import { formatTradeoff, meetsLimit, tradeoffColumns, type TradeoffField } from './tradeoff-columns';

/** Points of the sweep (one request; each point is a sizing and a solve, tens of ms). */
export const SWEEP_POINTS = 25;
/** How far the sweep reaches either side of the option's current, as a factor. */
export const SWEEP_SPAN = 10;
/** The currents the sizing works at, A (the spec schema's bounds for a fixed tail current). */
export const SWEEP_MIN_A = 1e-7;
export const SWEEP_MAX_A = 0.1;

/** The option's own tail current: the one the sizing aimed at when it had a window, else the solved nominal current (null: not sized). */
export function ownCurrentA(option: Pick<RecommendOption, 'tailCurrentWindow' | 'predicted'>): number | null {
  return option.tailCurrentWindow?.sizedAtA ?? option.predicted?.tailCurrentA ?? null;
}

/** `count` currents evenly spaced on a log axis from centre/span to centre·span, kept inside what the sizing works at; rounded to 4 digits so the request repeats exactly. */
export function sweepCurrentsA(centreA: number, count = SWEEP_POINTS, span = SWEEP_SPAN): number[] {
  const low = Math.max(centreA / span, SWEEP_MIN_A);
  const high = Math.min(centreA * span, SWEEP_MAX_A);
  const step = Math.log10(high / low) / (count - 1);
  return Array.from({ length: count }, (_, i) => Number((low * 10 ** (i * step)).toPrecision(4)));
}

/** The figure of a sweep point a chart reads. */
type SweepField = Exclude<keyof TradeoffSweepFigures, 'tailCurrentA' | 'solvedTailCurrentA'>;

/** Each trade-off target's sweep figure (the sweep is nominal; the column's figure is the worst corner). */
const SWEEP_FIELD: Record<TradeoffField, SweepField> = {
  noiseVPerRtHz: 'noiseVPerRtHz',
  inputBiasCurrentWorstA: 'inputBiasCurrentA',
  offsetAtSigmasV: 'offsetAtSigmasV',
  offsetDriftAtSigmasVPerC: 'offsetDriftAtSigmasVPerC',
  bandwidthWorstHz: 'bandwidthHz',
  slewRateWorstVPerS: 'slewRateVPerS',
  psrrPositiveDb: 'psrrPositiveDb',
  psrrNegativeDb: 'psrrNegativeDb',
  linearInputRangeWorstV: 'linearInputRangeV',
};

/** One chart: a figure against tail current, its limit and which side of it is safe. */
export interface TradeoffChart {
  id: SweepField;
  title: string;
  unit: string;
  /** The figure at each swept current (null where the point has none). */
  values: (number | null)[];
  /** The line to draw; for the gain, the target (its band is `band`). */
  limit: number | null;
  /** For the gain: the tolerance band around the target. */
  band: [number, number] | null;
  side: 'max' | 'min' | 'band';
  /** What the line means, e.g. "≤ 10 nV/√Hz". */
  limitText: string;
  /** A log y axis (quantities that span decades with the current). */
  logY: boolean;
}

/** The spec's own figures a chart needs, read from a solved option's facts. */
type SpecFacts = Pick<OptionFacts, 'powerBudgetW' | 'gainTarget' | 'gainTolerancePercent'> & Partial<OptionFacts>;

const valuesOf = (points: readonly TradeoffSweepPoint[], field: SweepField) => points.map((p) => (p.ok ? (p[field] as number | null) : null));

/** Every chart of the view, in order: each target the spec sets (the table's order), then power and gain. */
export function tradeoffCharts(points: readonly TradeoffSweepPoint[], facts: SpecFacts): TradeoffChart[] {
  const targets: TradeoffChart[] = tradeoffColumns(facts).map((column) => {
    const values = valuesOf(points, SWEEP_FIELD[column.field]);
    return {
      id: SWEEP_FIELD[column.field],
      title: column.title,
      unit: column.unit,
      values,
      limit: column.limitValue,
      band: null,
      side: column.side,
      limitText: column.sub,
      logY: column.unit !== 'dB' && values.every((v) => v === null || v > 0),
    };
  });
  const { gainTarget, gainTolerancePercent, powerBudgetW } = facts;
  const tolerance = (gainTarget * gainTolerancePercent) / 100;
  return [
    ...targets,
    { id: 'powerW', title: 'Power', unit: 'W', values: valuesOf(points, 'powerW'), limit: powerBudgetW, band: null, side: 'max', limitText: `≤ ${formatQuantity(powerBudgetW, 'W')} budget`, logY: true },
    {
      id: 'gain',
      title: 'Gain',
      unit: 'V/V',
      values: valuesOf(points, 'gain'),
      limit: gainTarget,
      band: [gainTarget - tolerance, gainTarget + tolerance],
      side: 'band',
      limitText: `${formatQuantity(gainTarget, 'V/V')} ± ${formatPercent(gainTolerancePercent)}`,
      logY: false,
    },
  ];
}

/** The stretch of current to shade as feasible: from the window's floor to its ceiling (an open end reaches the plot's edge); null when there is no window or it is empty. */
export function feasibleBand(option: Pick<RecommendOption, 'tailCurrentWindow'>): { fromA: number | null; toA: number | null } | null {
  const window = option.tailCurrentWindow;
  if (!window || window.empty) return null;
  const fromA = window.lower && Number.isFinite(window.lower.currentA) ? window.lower.currentA : null;
  const toA = window.upper && Number.isFinite(window.upper.currentA) ? window.upper.currentA : null;
  return { fromA, toA };
}

/** One figure of the what-if point against its limit. */
export interface WhatIfRow {
  id: SweepField;
  title: string;
  text: string;
  limitText: string;
  /** Whether the nominal figure meets the limit (null: no figure). */
  meets: boolean | null;
}

/** The what-if point's figures, one row per chart, each against its limit. */
export function whatIfRows(charts: readonly TradeoffChart[], point: TradeoffSweepFigures): WhatIfRow[] {
  return charts.map((chart) => {
    const value = point[chart.id] as number | null;
    // no bandwidth or linear-range figure means beyond the search's top: it meets any minimum, as the checks count it
    let meets: boolean | null = value === null && (chart.id === 'bandwidthHz' || chart.id === 'linearInputRangeV') ? true : null;
    if (value !== null && chart.limit !== null) {
      meets = chart.side === 'band' ? value >= chart.band![0] && value <= chart.band![1] : meetsLimit({ side: chart.side, limitValue: chart.limit }, value);
    }
    return { id: chart.id, title: chart.title, text: value === null ? noFigureText(chart.id) : formatTradeoff(value, chart.unit), limitText: chart.limitText, meets };
  });
}

/** Why a figure is missing at a point that was solved. */
function noFigureText(id: SweepField): string {
  if (id === 'bandwidthHz') return 'above 10 GHz';
  if (id === 'linearInputRangeV') return 'beyond twice the rails';
  return 'not computed';
}
