/**
 * Two options side by side, each from its own proposal (two options of one ranking, two rankings,
 * or the rankings of two spec versions): the record each side comes from, every figure, check and
 * margin in two columns with the differences marked, and both rejection curves on one plot. Pure,
 * so it can be tested without the page.
 */
import type { Proposal } from '#shared/api/proposals';
import type { RecommendOption } from '#shared/engine/recommend';
import type { Check, TopologyId } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatDb, formatMargin, formatPercent, formatSignificant } from '#shared/units/figures';
import { checkVerdict, type VerdictKind } from '../../../components/ui/verdict';
import { checkTitle } from '../../../lib/checks';
import { topologyName } from '../../../lib/topology-names';
import { optionRows, rejectionColumns, specTargets, type FigureStanding, type OptionRow, type RuledFigure } from './option-rows';
import { rejectionPlot, type RejectionPlot } from './plot-data';
import { proposalCurrentDesign } from './current-design';
import { formatTradeoff, tradeoffColumns } from './tradeoff-columns';

/** A figure "moved" when the two sides differ by more than this share of the larger magnitude (1 %). */
export const MOVED_FRACTION = 0.01;

export type SideKey = 'a' | 'b';

/** One side of the comparison: an option of a proposal. */
export interface Side {
  key: SideKey;
  proposal: Proposal;
  option: RecommendOption;
}

/** Where one column's figures come from: the record, exactly. */
export interface Provenance {
  key: SideKey;
  proposalId: number;
  specId: number;
  specTitle: string;
  specVersion: number;
  engineVersion: string;
  rulesetVersion: string;
  topology: TopologyId;
  name: string;
  recommended: boolean;
}

/** How a row differs between the sides; each is drawn as a symbol and words, never colour alone. */
export type DifferenceMark =
  | { kind: 'verdict'; from: VerdictKind; to: VerdictKind }
  | { kind: 'moved'; fraction: number }
  | { kind: 'sign'; toSafeSide: boolean }
  | { kind: 'one-side'; missingOn: SideKey };

export interface FigureRow {
  key: string;
  title: string;
  /** What the figure is held to, on side A (the spec's own words). */
  sub: string | null;
  a: number | null;
  b: number | null;
  textA: string | null;
  textB: string | null;
  standingA: FigureStanding | null;
  standingB: FigureStanding | null;
  /** A margin: its sign says which side of the limit the figure is on. */
  margin: boolean;
  marks: DifferenceMark[];
}

export interface CheckRow {
  rule: string;
  title: string;
  severity: string;
  a: Check | null;
  b: Check | null;
  verdictA: VerdictKind | null;
  verdictB: VerdictKind | null;
  marginTextA: string | null;
  marginTextB: string | null;
  marks: DifferenceMark[];
}

/** The option a side shows when the address names none: the proposal's current ranked design, else the recommendation, else the first. */
export function defaultTopology(proposal: Proposal): TopologyId | null {
  const current = proposalCurrentDesign(proposal);
  if (current && !current.ownValues) return current.topology as TopologyId;
  return proposal.result.recommended ?? proposal.result.options[0]?.topology ?? null;
}

/** The side for a proposal and a wanted option (the default when it is absent or not in the ranking). */
export function sideOf(key: SideKey, proposal: Proposal, topology: string | null): Side | null {
  const options = proposal.result.options;
  const option = options.find((o) => o.topology === topology) ?? options.find((o) => o.topology === defaultTopology(proposal));
  return option ? { key, proposal, option } : null;
}

export function provenanceOf(side: Side): Provenance {
  const { proposal, option } = side;
  return {
    key: side.key,
    proposalId: proposal.id,
    specId: proposal.specId,
    specTitle: proposal.specVersion.title,
    specVersion: proposal.specVersion.version,
    engineVersion: proposal.engineVersion,
    rulesetVersion: proposal.rulesetVersion,
    topology: option.topology,
    name: topologyName(option.topology),
    recommended: proposal.result.recommended === option.topology,
  };
}

/** What kind of comparison the two sides make, in words for the page's title. */
export function comparisonKind(a: Side, b: Side): 'options' | 'versions' | 'rankings' {
  if (a.proposal.id === b.proposal.id) return 'options';
  if (a.proposal.specId === b.proposal.specId && a.proposal.specVersion.version !== b.proposal.specVersion.version) return 'versions';
  return 'rankings';
}

/**
 * The plain warnings above the table: figures of different engine or rule-set versions may differ
 * for that reason alone; a different spec version holds the options to other targets.
 */
export function provenanceWarnings(a: Side, b: Side): string[] {
  const warnings: string[] = [];
  if (a.proposal.engineVersion !== b.proposal.engineVersion) {
    warnings.push(
      `The two sides were computed by different engine versions (A: ${a.proposal.engineVersion}, B: ${b.proposal.engineVersion}): their figures may differ for that reason alone, with the same spec and the same values.`,
    );
  }
  if (a.proposal.rulesetVersion !== b.proposal.rulesetVersion) {
    warnings.push(
      `The two sides were checked by different rule sets (A: ${a.proposal.rulesetVersion.slice(0, 12)}, B: ${b.proposal.rulesetVersion.slice(0, 12)}): a verdict or margin may differ because a rule changed, not the design.`,
    );
  }
  if (a.proposal.specId !== b.proposal.specId) {
    warnings.push('The two sides rank different specs: each option is held to its own spec’s targets.');
  } else if (a.proposal.specVersion.version !== b.proposal.specVersion.version) {
    warnings.push(`The two sides rank different versions of the spec (A: version ${a.proposal.specVersion.version}, B: version ${b.proposal.specVersion.version}): each option is held to its own version’s targets.`);
  }
  return warnings;
}

function rowOf(side: Side): OptionRow {
  return optionRows(side.proposal.result).find((r) => r.topology === side.option.topology)!;
}

/** The marks of two figures: one side missing, a margin that changed sign, a figure that moved beyond MOVED_FRACTION. */
export function figureMarks(a: number | null, b: number | null, margin: boolean): DifferenceMark[] {
  if (a === null && b === null) return [];
  if (a === null) return [{ kind: 'one-side', missingOn: 'a' }];
  if (b === null) return [{ kind: 'one-side', missingOn: 'b' }];
  const marks: DifferenceMark[] = [];
  if (margin && a >= 0 !== b >= 0) marks.push({ kind: 'sign', toSafeSide: b >= 0 });
  const larger = Math.max(Math.abs(a), Math.abs(b));
  if (larger > 0 && Math.abs(b - a) > MOVED_FRACTION * larger) marks.push({ kind: 'moved', fraction: a === 0 ? Math.sign(b - a) : (b - a) / Math.abs(a) });
  return marks;
}

interface FigureSpec {
  key: string;
  title: string;
  sub: string | null;
  read: (row: OptionRow) => number | null;
  format: (v: number) => string;
  standing?: RuledFigure;
  margin?: boolean;
}

/** The figures compared, in the ranking table's order and words (the targets' columns of either side). */
function figureSpecs(a: Side, b: Side): FigureSpec[] {
  const targetsA = specTargets(a.proposal.result);
  const targetsB = specTargets(b.proposal.result);
  const f = targetsA ? formatQuantity(targetsA.frequencyHz, 'Hz') : 'spec f';
  // A differential output on either side brings the mismatch and yield columns.
  const rejection = (targetsB?.differential && !targetsA?.differential ? rejectionColumns(targetsB) : rejectionColumns(targetsA)).map(
    (c): FigureSpec => ({
      key: c.field,
      title: `CM rejection, ${c.title === 'Yield %' ? 'Monte Carlo yield' : c.title}${c.forOutput ? ' ●' : ''}`,
      sub: c.sub,
      read: (row) => row[c.field],
      format: c.unit === '%' ? (v) => formatPercent(v) : (v) => formatDb(v),
      standing: c.field === 'cmrrDcDb' ? undefined : c.field,
    }),
  );
  const tradeoffs = new Map([...tradeoffColumns(a.option.figures ?? null), ...tradeoffColumns(b.option.figures ?? null)].map((c) => [c.field, c]));
  return [
    { key: 'tailImpedanceAtFrequencyOhm', title: 'Tail |Z|', sub: `at ${f}`, read: (r) => r.tailImpedanceAtFrequencyOhm, format: (v) => formatQuantity(v, 'Ohm') },
    ...rejection,
    {
      key: 'gain',
      title: 'Gain',
      sub: targetsA ? `${formatQuantity(targetsA.gainTarget, 'V/V')} ±${formatPercent(targetsA.gainTolerancePercent)}` : null,
      read: (r) => r.gain,
      format: (v) => `${formatSignificant(v)} V/V`,
      standing: 'gain',
    },
    { key: 'tailCurrentA', title: 'Tail current', sub: 'nominal', read: (r) => r.tailCurrentA, format: (v) => formatQuantity(v, 'A') },
    { key: 'powerWorstW', title: 'Power', sub: targetsA ? `worst, ≤ ${formatQuantity(targetsA.powerBudgetW, 'W')}` : 'worst corner', read: (r) => r.powerWorstW, format: (v) => formatQuantity(v, 'W'), standing: 'powerWorstW' },
    ...[...tradeoffs.values()].map((c): FigureSpec => ({ key: c.field, title: c.title, sub: c.sub, read: (r) => r[c.field], format: (v) => formatTradeoff(v, c.unit), standing: c.field })),
    { key: 'icmLowMarginV', title: 'Headroom margin, ICM low', sub: '+ on the safe side', read: (r) => r.icmLowMarginV, format: (v) => formatMargin(v, 'V'), standing: 'icmLowMarginV', margin: true },
    { key: 'icmHighMarginV', title: 'Headroom margin, ICM high', sub: '+ on the safe side', read: (r) => r.icmHighMarginV, format: (v) => formatMargin(v, 'V'), standing: 'icmHighMarginV', margin: true },
    { key: 'swingMarginV', title: 'Headroom margin, swing', sub: '+ on the safe side', read: (r) => r.swingMarginV, format: (v) => formatMargin(v, 'V'), standing: 'swingMarginV', margin: true },
  ];
}

/** Every figure of the two options, side by side, with what differs marked. */
export function figureRows(a: Side, b: Side): FigureRow[] {
  const rowA = rowOf(a);
  const rowB = rowOf(b);
  return figureSpecs(a, b).map((spec) => {
    const va = spec.read(rowA);
    const vb = spec.read(rowB);
    return {
      key: spec.key,
      title: spec.title,
      sub: spec.sub,
      a: va,
      b: vb,
      textA: va === null ? null : spec.format(va),
      textB: vb === null ? null : spec.format(vb),
      standingA: spec.standing ? (rowA.standing[spec.standing] ?? null) : null,
      standingB: spec.standing ? (rowB.standing[spec.standing] ?? null) : null,
      margin: spec.margin ?? false,
      marks: figureMarks(va, vb, spec.margin ?? false),
    };
  });
}

const marginText = (check: Check | null) => (check && check.margin !== null && check.margin !== undefined ? formatMargin(check.margin, check.marginUnit) : null);

/**
 * Every check of either option, by rule, with a changed verdict and a margin that changed sign
 * marked; the rows that differ first, each group in side A's order.
 */
export function checkRows(a: Side, b: Side): CheckRow[] {
  const rules = [...new Set([...a.option.checks.map((c) => c.rule), ...b.option.checks.map((c) => c.rule)])];
  const rows = rules.map((rule): CheckRow => {
    const ca = a.option.checks.find((c) => c.rule === rule) ?? null;
    const cb = b.option.checks.find((c) => c.rule === rule) ?? null;
    const verdictA = ca ? checkVerdict(ca) : null;
    const verdictB = cb ? checkVerdict(cb) : null;
    const marks: DifferenceMark[] = [];
    if (!ca) marks.push({ kind: 'one-side', missingOn: 'a' });
    else if (!cb) marks.push({ kind: 'one-side', missingOn: 'b' });
    else {
      if (verdictA !== verdictB) marks.push({ kind: 'verdict', from: verdictA!, to: verdictB! });
      const ma = ca.margin ?? null;
      const mb = cb.margin ?? null;
      if (ma !== null && mb !== null && ma >= 0 !== mb >= 0) marks.push({ kind: 'sign', toSafeSide: mb >= 0 });
    }
    const check = (ca ?? cb)!;
    return { rule, title: checkTitle(check), severity: check.severity, a: ca, b: cb, verdictA, verdictB, marginTextA: marginText(ca), marginTextB: marginText(cb), marks };
  });
  return [...rows.filter((r) => r.marks.length > 0), ...rows.filter((r) => r.marks.length === 0)];
}

const VERDICT_WORDS: Record<VerdictKind, string> = { holds: 'holds', short: 'short', note: 'note', 'not-applicable': 'n/a', undecided: 'undecided' };

/** A mark as its symbol and its words, e.g. { symbol: '≠', words: 'verdict changed: holds → short' }. */
export function markWords(mark: DifferenceMark): { symbol: string; words: string } {
  switch (mark.kind) {
    case 'verdict':
      return { symbol: '≠', words: `verdict changed: ${VERDICT_WORDS[mark.from]} → ${VERDICT_WORDS[mark.to]}` };
    case 'moved':
      return { symbol: 'Δ', words: `moved ${formatPercent(mark.fraction * 100, { sign: 'exceptZero' })}` };
    case 'sign':
      return { symbol: '⇅', words: mark.toSafeSide ? 'margin changed sign: now on the safe side' : 'margin changed sign: now short' };
    case 'one-side':
      return { symbol: '∅', words: `only on side ${mark.missingOn === 'a' ? 'B' : 'A'}` };
  }
}

/** How many rows differ, for the summary above the tables. */
export function differenceCount(rows: readonly { marks: DifferenceMark[] }[]): number {
  return rows.filter((r) => r.marks.length > 0).length;
}

/** The series name of a side on the plot and in its legend: "A · Wilson mirror, #12 v3". */
export function sideLabel(side: Side): string {
  return `${side.key.toUpperCase()} · ${topologyName(side.option.topology)}, #${side.proposal.id} v${side.proposal.specVersion.version}`;
}

/**
 * Both options' rejection curves on one plot (the ranking's plot data, one series per side): A
 * solid and heavier, B dashed, each in its topology's tone. The spec's lines are side A's; the
 * `targetsDiffer` flag says when side B is held to another target.
 */
export function comparisonPlot(a: Side, b: Side): { plot: RejectionPlot; targetsDiffer: boolean } | null {
  const pa = rejectionPlot({ ...a.proposal.result, options: [a.option] });
  const pb = rejectionPlot({ ...b.proposal.result, options: [b.option] });
  if (!pa && !pb) return null;
  const grid = [...new Set([...(pa?.frequencyHz ?? []), ...(pb?.frequencyHz ?? [])])].sort((x, y) => x - y);
  const onGrid = (p: RejectionPlot) => {
    const byFrequency = new Map(p.frequencyHz.map((f, i) => [f, p.series[0].valuesDb[i]]));
    return grid.map((f) => byFrequency.get(f) ?? null);
  };
  // Side A solid (an empty dash) whatever its topology's own dash; side B dashed.
  const series = [
    ...(pa ? [{ ...pa.series[0], name: sideLabel(a), valuesDb: onGrid(pa), width: 3, dash: [] }] : []),
    ...(pb ? [{ ...pb.series[0], name: sideLabel(b), valuesDb: onGrid(pb), width: 2, dash: [9, 5] }] : []),
  ];
  const base = (pa ?? pb)!;
  const targetsDiffer = Boolean(pa && pb && (pa.requiredDb !== pb.requiredDb || pa.requiredWithMarginDb !== pb.requiredWithMarginDb || pa.specFrequencyHz !== pb.specFrequencyHz));
  return {
    plot: { ...base, frequencyHz: grid, series, mismatch: null, data: [grid, ...series.map((s) => s.valuesDb)] },
    targetsDiffer,
  };
}
