/**
 * The figures a spec's optional targets judge (noise, bias current, offset and its drift,
 * bandwidth, slew rate, supply rejection per rail, linear input range), as the ranking table, the
 * printed report and the trade-off view show them: one descriptor per target with the fact it
 * reads (the worst-corner figure its rule judges, the rule file's `figure`), the fact saying
 * whether the spec sets the target, its limit, its unit and which side is safe. A target the
 * spec leaves out has no column (rankings made before these targets existed set none).
 */
import type { OptionFacts } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatDb, formatTargetDb } from '#shared/units/figures';

/** The worst-corner figures of the trade-off targets, by the fact each rule judges. */
export const TRADEOFF_FIELDS = [
  'noiseVPerRtHz',
  'inputBiasCurrentWorstA',
  'offsetAtSigmasV',
  'offsetDriftAtSigmasVPerC',
  'bandwidthWorstHz',
  'slewRateWorstVPerS',
  'psrrPositiveDb',
  'psrrNegativeDb',
  'linearInputRangeWorstV',
] as const satisfies readonly (keyof OptionFacts)[];

export type TradeoffField = (typeof TRADEOFF_FIELDS)[number];

type SetFact = 'noiseTargetSet' | 'inputBiasTargetSet' | 'offsetTargetSet' | 'driftTargetSet' | 'bandwidthTargetSet' | 'slewRateTargetSet' | 'psrrPositiveTargetSet' | 'psrrNegativeTargetSet' | 'linearRangeTargetSet';
type LimitFact = 'noiseMaxVPerRtHz' | 'inputBiasCurrentMaxA' | 'offsetMaxV' | 'offsetDriftMaxVPerC' | 'bandwidthMinHz' | 'slewRateMinVPerS' | 'psrrPositiveMinDb' | 'psrrNegativeMinDb' | 'linearInputRangeMinV';

interface TradeoffTarget {
  field: TradeoffField;
  set: SetFact;
  limit: LimitFact;
  title: string;
  /** SI unit of the figure ('dB' printed to one decimal). */
  unit: string;
  /** 'max': the figure must stay at or below the limit; 'min': at or above it. */
  side: 'max' | 'min';
}

const TARGETS: readonly TradeoffTarget[] = [
  { field: 'noiseVPerRtHz', set: 'noiseTargetSet', limit: 'noiseMaxVPerRtHz', title: 'Noise', unit: 'V/√Hz', side: 'max' },
  { field: 'inputBiasCurrentWorstA', set: 'inputBiasTargetSet', limit: 'inputBiasCurrentMaxA', title: 'Bias current', unit: 'A', side: 'max' },
  { field: 'offsetAtSigmasV', set: 'offsetTargetSet', limit: 'offsetMaxV', title: 'Offset', unit: 'V', side: 'max' },
  { field: 'offsetDriftAtSigmasVPerC', set: 'driftTargetSet', limit: 'offsetDriftMaxVPerC', title: 'Offset drift', unit: 'V/°C', side: 'max' },
  { field: 'bandwidthWorstHz', set: 'bandwidthTargetSet', limit: 'bandwidthMinHz', title: 'Bandwidth', unit: 'Hz', side: 'min' },
  { field: 'slewRateWorstVPerS', set: 'slewRateTargetSet', limit: 'slewRateMinVPerS', title: 'Slew rate', unit: 'V/s', side: 'min' },
  { field: 'psrrPositiveDb', set: 'psrrPositiveTargetSet', limit: 'psrrPositiveMinDb', title: 'PSRR +', unit: 'dB', side: 'min' },
  { field: 'psrrNegativeDb', set: 'psrrNegativeTargetSet', limit: 'psrrNegativeMinDb', title: 'PSRR −', unit: 'dB', side: 'min' },
  { field: 'linearInputRangeWorstV', set: 'linearRangeTargetSet', limit: 'linearInputRangeMinV', title: 'Linear range', unit: 'V', side: 'min' },
];

/** A trade-off column of a ranking: the target's figure, its limit and the words under its heading. */
export interface TradeoffColumn extends TradeoffTarget {
  limitValue: number;
  /** What the figure is held to, e.g. "≤ 10 nV/√Hz at 1 kHz". */
  sub: string;
}

/** A figure in the column's unit ("12.3 nV/√Hz", "62.0 dB"). */
export function formatTradeoff(value: number, unit: string): string {
  return unit === 'dB' ? formatDb(value) : formatQuantity(value, unit);
}

/** Whether a figure meets its limit on the column's safe side. */
export function meetsLimit(column: Pick<TradeoffColumn, 'side' | 'limitValue'>, value: number): boolean {
  return column.side === 'max' ? value <= column.limitValue : value >= column.limitValue;
}

function subOf(target: TradeoffTarget, limit: number, facts: Partial<OptionFacts>): string {
  const bound = `${target.side === 'max' ? '≤' : '≥'}\u00a0${target.unit === 'dB' ? formatTargetDb(limit) : formatQuantity(limit, target.unit)}`;
  if (target.field === 'noiseVPerRtHz' && typeof facts.noiseFrequencyHz === 'number') return `${bound} at ${formatQuantity(facts.noiseFrequencyHz, 'Hz')}`;
  if ((target.field === 'offsetAtSigmasV' || target.field === 'offsetDriftAtSigmasVPerC') && typeof facts.offsetSigmas === 'number') return `${facts.offsetSigmas} σ, ${bound}`;
  return bound;
}

/** The trade-off columns of a ranking: one per target the spec sets, read from a solved option's facts (none from an older ranking). */
export function tradeoffColumns(facts: Partial<OptionFacts> | null): TradeoffColumn[] {
  if (!facts) return [];
  return TARGETS.flatMap((target) => {
    const limit = facts[target.limit];
    if (facts[target.set] !== true || typeof limit !== 'number') return [];
    return [{ ...target, limitValue: limit, sub: subOf(target, limit, facts) }];
  });
}
