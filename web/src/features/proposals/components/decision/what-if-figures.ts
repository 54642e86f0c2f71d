/**
 * The key figures a designer weighs when editing values, as data: how to read each from an
 * analysis, its unit, and how its change is best stated (per cent for ratios of magnitudes,
 * plain difference for dB and margins in volts).
 */
import type { AnalyzeResult, OutputKind } from '#shared/engine/types';
import { formatSignedQuantity } from '#shared/units/figures';
import { formatQuantity } from '#shared/units/index';

export interface WhatIfFigure {
  id: string;
  label: string;
  unit: string;
  read: (result: AnalyzeResult) => number | null;
  change: 'relative' | 'difference';
}

export function whatIfFigures(output: OutputKind): WhatIfFigure[] {
  return [
    { id: 'tail-current', label: 'Tail current', unit: 'A', read: (r) => r.tailCurrentA, change: 'relative' },
    {
      id: 'gain',
      label: output === 'differential' ? 'Gain, differential output (magnitude)' : 'Gain, single-ended output (magnitude)',
      unit: 'V/V',
      read: (r) => Math.abs(output === 'differential' ? r.differentialGain : r.singleEndedGain),
      change: 'relative',
    },
    { id: 'cmrr', label: 'CMRR at DC, single-ended (tail-limited)', unit: 'dB', read: (r) => r.cmrrDb.singleEnded, change: 'difference' },
    { id: 'rout', label: 'Tail output resistance', unit: 'Ω', read: (r) => r.tailOutputResistanceOhm, change: 'relative' },
    { id: 'power', label: 'Supply power', unit: 'W', read: (r) => r.powerW, change: 'relative' },
    { id: 'compliance', label: 'Tail compliance margin', unit: 'V', read: (r) => r.tailComplianceMarginV, change: 'difference' },
    { id: 'pair-saturation', label: 'Pair saturation margin', unit: 'V', read: (r) => r.pairSaturationMarginV, change: 'difference' },
  ];
}

/**
 * "+12.3 %", "−4.1 dB", "no change"; null when either side is missing. Values that print the
 * same at the table's three digits count as unchanged, so solver noise never reads as a change.
 */
export function changeText(figure: WhatIfFigure, ranked: number | null, edited: number | null): string | null {
  if (ranked === null || edited === null || !Number.isFinite(ranked) || !Number.isFinite(edited)) return null;
  if (formatQuantity(ranked, figure.unit) === formatQuantity(edited, figure.unit)) return 'no change';
  if (figure.change === 'relative') {
    if (ranked === 0) return null;
    return formatSignedQuantity(((edited - ranked) / Math.abs(ranked)) * 100, '%');
  }
  return formatSignedQuantity(edited - ranked, figure.unit);
}
