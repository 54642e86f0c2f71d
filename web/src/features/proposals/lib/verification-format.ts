/**
 * Words and numbers for the SPICE check: figures, signed differences in the figure's own delta
 * unit and tolerances (all through shared/units/figures.ts), and the verdict of a figure or an option in the app's status language.
 */
import { formatQuantity } from '#shared/units/format-quantity';
import { FIGURE_GROUPS, type FigureGroup, type OptionVerification, type VerifiedFigure } from '#shared/verification/types';
import type { VerdictKind } from '../../../components/ui/verdict';
import { topologyName } from '../../../lib/topology-names';
import { formatDb, formatFigure, formatFixed, formatPercent, formatSignedQuantity, formatTolerance } from '#shared/units/figures';

/** A stored unit as the formatter knows it: "" (a ratio) prints as a plain number. */
function unitOf(unit: string): string {
  return unit === '' ? '1' : unit;
}

/** The unit each kind of difference is printed in. */
const DELTA_UNITS: Record<Exclude<VerifiedFigure['deltaKind'], 'absolute'>, string> = { percent: '%', db: 'dB', volts: 'V' };

/** A predicted or simulated figure: "960 µA", "101.8 dB", "2.32 kΩ"; an em dash when missing. */
export function figureText(value: number | null, unit: string): string {
  if (value === null || !Number.isFinite(value)) return '—';
  return formatFigure(value, unitOf(unit));
}

/** The engine minus ngspice: "+0.9 %", "−0.4 dB", "+12 mV", "+3 µV"; an em dash when either side is missing. */
export function deltaText(figure: Pick<VerifiedFigure, 'delta' | 'deltaKind'> & { unit?: string }): string {
  const { delta, deltaKind } = figure;
  if (delta === null || !Number.isFinite(delta)) return '—';
  if (deltaKind === 'volts') return formatSignedQuantity(delta, 'V');
  if (deltaKind === 'absolute') return formatSignedQuantity(delta, unitOf(figure.unit ?? ''));
  if (deltaKind === 'percent') return formatPercent(delta, { sign: 'exceptZero', trimZeros: false });
  return formatDb(delta, { sign: 'exceptZero' });
}

/** The tolerance a difference is held to: "±3 %", "±1.5 dB", "±50 mV", "±20 µV". */
export function toleranceText(figure: Pick<VerifiedFigure, 'tolerance' | 'deltaKind'> & { unit?: string }): string {
  return formatTolerance(figure.tolerance, figure.deltaKind === 'absolute' ? unitOf(figure.unit ?? '') : DELTA_UNITS[figure.deltaKind]);
}

/** Why a listed figure has no verdict, in words; null when it was compared (or could not be, for want of a side). */
export function notComparedText(figure: Pick<VerifiedFigure, 'notCompared'>): string | null {
  if (figure.notCompared === 'not-predicted') return 'Not predicted by the engine version that made this proposal: ngspice’s value alone.';
  if (figure.notCompared === 'matched-pair') return 'The pair is matched, so this is zero by symmetry and nothing was simulated; its spread is in the SPICE Monte Carlo.';
  return null;
}

export interface VerdictLook {
  kind: VerdictKind;
  label: string;
}

/** One figure: within tolerance, outside it, or not compared (a side is missing, not predicted, or a matched pair's zero). */
export function figureVerdict(agrees: boolean | null, notCompared?: VerifiedFigure['notCompared']): VerdictLook {
  if (notCompared === 'not-predicted') return { kind: 'not-applicable', label: 'Not predicted' };
  if (notCompared === 'matched-pair') return { kind: 'not-applicable', label: 'Zero by symmetry' };
  if (agrees === null) return { kind: 'not-applicable', label: 'Not compared' };
  return agrees ? { kind: 'holds', label: 'Agrees' } : { kind: 'short', label: 'Disagrees' };
}

/** One option: every figure agrees, some do not (how many), or ngspice could not simulate it. */
export function optionVerdict(option: Pick<OptionVerification, 'outcome' | 'agrees' | 'disagreements'>): VerdictLook {
  if (option.outcome === 'error') return { kind: 'note', label: 'Not simulated' };
  if (option.agrees && option.disagreements === 0) return { kind: 'holds', label: 'Agrees' };
  const n = Math.max(option.disagreements, 1);
  return { kind: 'short', label: `${n} figure${n === 1 ? '' : 's'} outside tolerance` };
}

/** The option's name as the check lists it; the override is named as the designer's own values. */
export function verifiedOptionName(option: Pick<OptionVerification, 'topology' | 'source'>): string {
  const name = topologyName(option.topology);
  return option.source === 'decision' ? `Designer’s own values (${name})` : name;
}

/** A stable key for an option of a verification (a topology can appear as a ranked option and as the override). */
export function verifiedOptionKey(option: Pick<OptionVerification, 'topology' | 'source'>): string {
  return `${option.source}:${option.topology}`;
}

/** A duration: "4.2 s", "350 ms", "2.1 min" past two minutes. */
export function durationText(ms: number): string {
  if (ms >= 120_000) return `${formatFixed(ms / 60_000, 1)} min`;
  return formatQuantity(ms / 1000, 's', 2);
}

/** "5 of 6 agree with the engine within tolerance; 1 has figures outside it; 1 could not be simulated." */
export function verificationTally(options: Pick<OptionVerification, 'outcome' | 'agrees' | 'disagreements'>[]): string {
  const kinds = options.map((o) => optionVerdict(o).kind);
  const agree = kinds.filter((k) => k === 'holds').length;
  const differ = kinds.filter((k) => k === 'short').length;
  const errors = kinds.filter((k) => k === 'note').length;
  const parts = [`${agree} of ${options.length} agree with the engine within tolerance`];
  if (differ > 0) parts.push(`${differ} ${differ === 1 ? 'has' : 'have'} figures outside it`);
  if (errors > 0) parts.push(`${errors} could not be simulated`);
  return `${parts.join('; ')}.`;
}

/** The nominal table's group headings. */
export const FIGURE_GROUP_LABELS: Record<FigureGroup, string> = {
  bias: 'Operating point',
  gain: 'Gain and common-mode rejection',
  input: 'Input',
  supply: 'Supply rejection',
  speed: 'Bandwidth, slew rate and noise',
};

/** Figures in their groups, in the table's order; one untitled group for results stored without groups. */
export function figureGroups<F extends Pick<VerifiedFigure, 'group'>>(figures: readonly F[]): { heading: string | null; figures: F[] }[] {
  if (!figures.some((f) => f.group)) return [{ heading: null, figures: [...figures] }];
  const groups = FIGURE_GROUPS.map((group) => ({ heading: FIGURE_GROUP_LABELS[group], figures: figures.filter((f) => f.group === group) }));
  const ungrouped = figures.filter((f) => !f.group);
  return [...groups, { heading: 'Other', figures: ungrouped }].filter((g) => g.figures.length > 0);
}

/**
 * The notes under a table: why rows are listed without a verdict, and how the floored tolerances
 * (offset, drift) were set, each said once.
 */
export function figureNotes(figures: readonly Pick<VerifiedFigure, 'key' | 'notCompared' | 'toleranceBasis' | 'label' | 'agrees' | 'predicted' | 'simulated'>[]): string[] {
  const notes: string[] = [];
  const notPredicted = figures.filter((f) => f.notCompared === 'not-predicted');
  if (notPredicted.length > 0) {
    notes.push(`Not predicted (${notPredicted.map((f) => f.label).join(', ')}): the engine version that made this proposal did not predict ${notPredicted.length === 1 ? 'this figure' : 'these figures'}, so only ngspice’s value is shown; nothing is recomputed now in its place.`);
  }
  const matched = figures.filter((f) => f.notCompared === 'matched-pair');
  if (matched.length > 0) {
    notes.push(`Zero by symmetry (${matched.map((f) => f.label).join(', ')}): this design’s pair is matched, so the engine and ngspice both give zero and nothing was simulated; the spread from mismatch is in the SPICE Monte Carlo.`);
  }
  for (const f of figures) if (f.toleranceBasis && f.agrees !== null) notes.push(`${f.label}: tolerance ${f.toleranceBasis}.`);
  const bandwidth = figures.find((f) => f.key === 'differentialBandwidthHz');
  if (bandwidth && !bandwidth.notCompared && bandwidth.predicted === null && bandwidth.simulated === null) {
    notes.push(`${bandwidth.label}: neither the engine (to 10 GHz) nor ngspice’s sweep finds the gain 3 dB down: nothing in this circuit stores enough charge to slow it there.`);
  }
  return notes;
}
