/**
 * The ranking table's rows: one flat record per tail option, every figure a plain number (or
 * null when the option could not be solved), and which figures a failing check points at.
 */
import type { RecommendOption, RecommendResult } from '../../../../../shared/engine/recommend';
import type { Check, TopologyId } from '../../../../../shared/engine/types';
import { topologyName } from '../../../lib/topology-names';

/** Figures of the table that one rule decides, so a failing check can mark its cell. */
export const FIGURE_RULES = {
  cmrrAtFrequencyDb: 'cmrr-target',
  mismatchWorstCaseDb: 'cmrr-differential-worst-case',
  yieldPercent: 'cmrr-yield',
  gain: 'gain-tolerance',
  powerWorstW: 'power-budget',
  icmLowMarginV: 'input-common-mode-low',
  icmHighMarginV: 'input-common-mode-high',
  swingMarginV: 'output-swing',
} as const;

export type RuledFigure = keyof typeof FIGURE_RULES;
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
  standing: Partial<Record<RuledFigure, FigureStanding>>;
}

function failing(check: Check): boolean {
  return !check.passed && check.evaluated !== false && check.applicable !== false;
}

/** The number of blocking checks an option falls short on (undecided ones included). */
export function blockingShortCount(option: RecommendOption): number {
  return option.checks.filter((c) => c.severity === 'blocking' && !c.passed).length;
}

function standingOf(checks: Check[]): OptionRow['standing'] {
  const standing: OptionRow['standing'] = {};
  for (const [figure, rule] of Object.entries(FIGURE_RULES) as [RuledFigure, string][]) {
    const check = checks.find((c) => c.rule === rule);
    if (check && failing(check)) standing[figure] = check.severity === 'blocking' ? 'short' : 'note';
  }
  return standing;
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
      cmrrAtFrequencyDb: f?.cmrrAtFrequencyDb ?? null,
      mismatchWorstCaseDb: f?.cmrrDifferentialWorstCaseDb ?? null,
      yieldPercent: f?.monteCarloYieldPercent ?? null,
      gain: f?.gainPredicted ?? null,
      gainErrorPercent: f?.gainErrorPercent ?? null,
      tailCurrentA: option.predicted?.tailCurrentA ?? null,
      powerWorstW: f?.powerWorstW ?? null,
      icmLowMarginV: f?.icmLowMarginV ?? null,
      icmHighMarginV: f?.icmHighMarginV ?? null,
      swingMarginV: f?.swingMarginV ?? null,
      standing: standingOf(option.checks),
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
  };
}

export type SpecTargets = NonNullable<ReturnType<typeof specTargets>>;
