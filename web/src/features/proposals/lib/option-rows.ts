/**
 * The ranking table's rows: one flat record per tail option, every figure a plain number (or
 * null when the option could not be solved), and which figures a failing check points at.
 */
import type { RecommendOption, RecommendResult } from '#shared/engine/recommend';
import { outputRejection, REJECTION_KIND_WORDS, type RejectionKind } from '#shared/engine/output-rejection';
import type { Check, OptionFacts, TopologyId } from '#shared/engine/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { topologyName } from '../../../lib/topology-names';
import { formatPercent, formatTargetDb } from '#shared/units/figures';
import { TRADEOFF_FIELDS, tradeoffColumns, type TradeoffField } from './tradeoff-columns';

/**
 * Figures of the table read from the option's facts, each by the fact it shows; a failing check
 * marks the cell of the figure its rule judges (the check's `figure`, from the rule file).
 */
const FACT_FIGURES = {
  cmrrAtFrequencyDb: 'cmrrAtFrequencyDb',
  mismatchWorstCaseDb: 'cmrrDifferentialWorstCaseDb',
  yieldPercent: 'monteCarloYieldPercent',
  gain: 'gainPredicted',
  powerWorstW: 'powerWorstW',
  icmLowMarginV: 'icmLowMarginV',
  icmHighMarginV: 'icmHighMarginV',
  swingMarginV: 'swingMarginV',
  // the trade-off targets' worst-corner figures (each column shown only when the spec sets its target)
  ...(Object.fromEntries(TRADEOFF_FIELDS.map((f) => [f, f])) as { [F in TradeoffField]: F }),
} as const satisfies Record<string, keyof OptionFacts>;

export type RuledFigure = keyof typeof FACT_FIGURES;
/** How a figure stands against its rule: a blocking failure is "short", an advisory one a "note". */
export type FigureStanding = 'short' | 'note';

export interface OptionRow {
  topology: TopologyId;
  name: string;
  rank: number;
  recommended: boolean;
  passes: boolean;
  /** The option could not be solved; its checks are undecided. */
  unsolved: boolean;
  blockingShortCount: number;
  tailImpedanceAtFrequencyOhm: number | null;
  cmrrDcDb: number | null;
  cmrrAtFrequencyDb: number | null;
  mismatchWorstCaseDb: number | null;
  yieldPercent: number | null;
  gain: number | null;
  gainErrorPercent: number | null;
  tailCurrentA: number | null;
  powerWorstW: number | null;
  icmLowMarginV: number | null;
  icmHighMarginV: number | null;
  swingMarginV: number | null;
  /** The trade-off targets' worst-corner figures (null when the spec sets no such target, or the ranking predates them). */
  noiseVPerRtHz: number | null;
  inputBiasCurrentWorstA: number | null;
  offsetAtSigmasV: number | null;
  offsetDriftAtSigmasVPerC: number | null;
  bandwidthWorstHz: number | null;
  slewRateWorstVPerS: number | null;
  psrrPositiveDb: number | null;
  psrrNegativeDb: number | null;
  linearInputRangeWorstV: number | null;
  standing: Partial<Record<RuledFigure, FigureStanding>>;
}

function failing(check: Check): boolean {
  return !check.passed && check.evaluated !== false && check.applicable !== false;
}

/** The number of blocking checks an option falls short on (undecided ones included). */
export function blockingShortCount(option: RecommendOption): number {
  return option.checks.filter((c) => c.severity === 'blocking' && !c.passed).length;
}

/** The figure a check judges, with the rejection of the spec's output read as the column that shows it. */
function figureOf(check: Check, differentialOutput: boolean): string | null | undefined {
  if (check.figure !== 'outputCmrrDb') return check.figure;
  return differentialOutput ? FACT_FIGURES.mismatchWorstCaseDb : FACT_FIGURES.cmrrAtFrequencyDb;
}

function standingOf(checks: Check[], differentialOutput: boolean): OptionRow['standing'] {
  const standing: OptionRow['standing'] = {};
  for (const [field, fact] of Object.entries(FACT_FIGURES) as [RuledFigure, keyof OptionFacts][]) {
    for (const check of checks.filter((c) => figureOf(c, differentialOutput) === fact && failing(c))) {
      if (standing[field] !== 'short') standing[field] = check.severity === 'blocking' ? 'short' : 'note';
    }
  }
  return standing;
}

/** The table's figures read from the facts (null for an unsolved option). */
function factFigures(facts: OptionFacts | null): Record<RuledFigure, number | null> {
  const figures = {} as Record<RuledFigure, number | null>;
  for (const [field, fact] of Object.entries(FACT_FIGURES) as [RuledFigure, keyof OptionFacts][]) {
    // a ranking made before a fact existed lacks it: missing, not zero
    figures[field] = facts ? ((facts[fact] as number | null | undefined) ?? null) : null;
  }
  return figures;
}

/** One row per option, in the engine's ranking order. */
export function optionRows(result: RecommendResult): OptionRow[] {
  return result.options.map((option) => {
    const f = option.figures;
    return {
      topology: option.topology,
      name: topologyName(option.topology),
      rank: option.rank,
      recommended: option.topology === result.recommended,
      passes: option.passes,
      unsolved: option.predicted === null,
      blockingShortCount: blockingShortCount(option),
      tailImpedanceAtFrequencyOhm: f?.tailImpedanceAtFrequencyOhm ?? null,
      cmrrDcDb: option.predicted?.cmrrDb.singleEnded ?? null,
      ...factFigures(f),
      gainErrorPercent: f?.gainErrorPercent ?? null,
      tailCurrentA: option.predicted?.tailCurrentA ?? null,
      standing: standingOf(option.checks, f?.isDifferentialOutput ?? false),
    };
  });
}

/** Whether a row matches the topology filter text (readable name or id, any case). */
export function matchesTopologyText(row: Pick<OptionRow, 'topology' | 'name'>, text: string): boolean {
  const needle = text.trim().toLowerCase();
  if (needle === '') return true;
  return row.name.toLowerCase().includes(needle) || row.topology.includes(needle);
}

/** The figures the spec asks of every option, read from the first solved option's facts. */
export function specTargets(result: RecommendResult) {
  const f = result.options.find((o) => o.figures)?.figures ?? null;
  if (!f) return null;
  const output = outputRejection(f);
  return {
    frequencyHz: f.cmrrFrequencyHz,
    requiredDb: f.cmrrRequiredDb,
    marginDb: f.cmrrMarginRequiredDb,
    requiredYieldPercent: f.requiredYieldPercent,
    gainTarget: f.gainTarget,
    gainTolerancePercent: f.gainTolerancePercent,
    powerBudgetW: f.powerBudgetW,
    differential: f.isDifferentialOutput,
    temperatureMinC: f.temperatureMinC,
    temperatureMaxC: f.temperatureMaxC,
    /** The rejection for the spec's output and its target (shared/engine/output-rejection). */
    output: { kind: output.kind, requiredDb: output.requiredDb, field: (output.kind === 'differential' ? 'mismatchWorstCaseDb' : 'cmrrAtFrequencyDb') as RejectionField },
    /** One column per trade-off target the spec sets (lib/tradeoff-columns.ts); empty when it sets none. */
    tradeoffs: tradeoffColumns(f),
  };
}

export type SpecTargets = NonNullable<ReturnType<typeof specTargets>>;

export type RejectionField = 'cmrrDcDb' | 'cmrrAtFrequencyDb' | 'mismatchWorstCaseDb' | 'yieldPercent';

/** One rejection column of the ranking table, as the page and the report both draw it. */
export interface RejectionColumn {
  field: RejectionField;
  title: string;
  /** What the figure is and what it is held to, e.g. "worst, ≥ 84.5". */
  sub: string;
  /** The unit of the column's figures. */
  unit: 'dB' | '%';
  /** The figure that matters for the spec's output (the one the recommendation weighs). */
  forOutput: boolean;
  kind: RejectionKind | null;
}

const bare = (text: string) => text.replace(/ (dB|%)$/, '');

/**
 * The rejection columns of the ranking table: DC (nominal), the single-ended figure at the spec
 * frequency against the required figure plus margin, and for differential outputs the
 * mismatch-limited worst case (against the required figure plus margin: the rejection target of
 * a differential output) and the Monte Carlo yield. The
 * targets come from outputRejection, so the page and the report print the same figures against
 * the same targets.
 */
export function rejectionColumns(targets: SpecTargets | null): RejectionColumn[] {
  const f = targets ? formatQuantity(targets.frequencyHz, 'Hz') : 'spec f';
  const singleEndedTarget = targets ? targets.requiredDb + targets.marginDb : null;
  const columns: RejectionColumn[] = [
    { field: 'cmrrDcDb', title: 'DC', sub: 'nominal', unit: 'dB', forOutput: false, kind: null },
    {
      field: 'cmrrAtFrequencyDb',
      title: f,
      sub: singleEndedTarget === null ? 'worst corner' : `worst, ≥\u00a0${bare(formatTargetDb(singleEndedTarget))}`,
      unit: 'dB',
      forOutput: targets?.output.field === 'cmrrAtFrequencyDb',
      kind: 'single-ended',
    },
  ];
  if (targets?.differential) {
    columns.push(
      { field: 'mismatchWorstCaseDb', title: 'Mismatch', sub: `worst, ≥\u00a0${bare(formatTargetDb(targets.output.kind === 'differential' ? targets.output.requiredDb : targets.requiredDb))}`, unit: 'dB', forOutput: targets.output.field === 'mismatchWorstCaseDb', kind: 'differential' },
      { field: 'yieldPercent', title: 'Yield %', sub: `MC, ≥\u00a0${bare(formatPercent(targets.requiredYieldPercent))}`, unit: '%', forOutput: false, kind: 'differential' },
    );
  }
  return columns;
}

/** The sentence under a ranking table that says which rejection figure serves the spec's output. */
export function outputRejectionNote(targets: SpecTargets | null): string | null {
  if (!targets) return null;
  const f = formatQuantity(targets.frequencyHz, 'Hz');
  const output = targets.output.kind === 'differential' ? 'a differential output' : 'a single-ended output';
  return `The spec asks for ${output}: the rejection that matters is the ${REJECTION_KIND_WORDS[targets.output.kind]} figure at ${f}, held to ≥ ${formatTargetDb(targets.output.requiredDb)} (marked ●).`;
}
