/**
 * `recommend`: a requirement spec in, every tail option of the spec's catalogue out, sized on
 * preferred values, evaluated over the spec's conditions, checked by the rule set, ranked,
 * with the policy's recommendation (ENGINE-CONTRACT.md). The rule set is passed in (rules/
 * loads it), so this module stays free of I/O.
 */
import { nominalCondition } from './conditions';
import { firstNonFinitePath } from './finite';
import { evaluateOption, type ConditionFigures, type OptionCurves } from './option-evaluation';
import { monteCarloDraws, type MonteCarloDraws, type MonteCarloResult } from './mismatch';
import { outputRejection } from './output-rejection';
import type { RejectionLimits } from './rejection-limits';
import { rankOptions, recommendedTopology } from './ranking';
import { sizeTopology, type SizedOption } from './sizing';
import type { CurrentBound, PickedCurrent } from './current-window';
import type { AnalyzeResult, Check, Design, OptionFacts, RuleSet, SelectionPolicy, Spec, TopologyId } from './types';
import { ENGINE_VERSION, ESTIMATE_NOTICE } from './version';
import { recommendationSummary, sizingNote, undecidedReason, wordedFacts } from '../text/engine-notes';

export interface RecommendOption {
  topology: TopologyId;
  rank: number;
  passes: boolean;
  /** Fully sized analyze input at nominal conditions (null only when sizing itself failed). */
  design: Design | null;
  /** The analyze output for that design at nominal conditions (null when it could not be solved). */
  predicted: AnalyzeResult | null;
  checks: Check[];
  /** The rejection that matters for the spec's output at the spec frequency, worst corner, dB. */
  rejectionDb: number | null;
  figures: OptionFacts | null;
  /**
   * Added: what limits the rejection of the spec's output at the spec frequency, each part's
   * share (rejection-limits.ts); null when the option could not be solved or it cannot be told.
   */
  rejectionLimits?: RejectionLimits | null;
  corners: ConditionFigures[];
  curves: OptionCurves | null;
  monteCarlo: MonteCarloResult | null;
  sizingNotes: string[];
  /**
   * Added: the tail-current window the option was sized in; null for a designer's own values and
   * when the spec sets no target that bounds the current (absent from rankings made before it).
   */
  tailCurrentWindow?: TailCurrentWindow | null;
  error?: string;
}

/**
 * The window of tail current the option may run at (current-window.ts) and the current it is
 * sized at, as data for a reader's trade-off view: every bound with the requirement that sets it,
 * the tightest floor and ceiling, whether they collide, the current picked and what set it, and
 * `sizedAtA`, the current the sizing aimed the design at (the pick, or within 2 % of it).
 */
export interface TailCurrentWindow {
  bounds: CurrentBound[];
  lower: CurrentBound | null;
  upper: CurrentBound | null;
  empty: boolean;
  currentA: number;
  setBy: PickedCurrent['setBy'];
  sizedAtA: number;
}

export interface RecommendResult {
  engineVersion: string;
  rulesetVersion: string;
  policy: SelectionPolicy;
  recommended: TopologyId | null;
  /** One sentence on why the recommendation is what it is (the topology itself is `recommended`). */
  summary: string;
  /** Failed advisory checks that are cautions (hazards), repeated here so nobody misses them. */
  cautions: string[];
  notice: string;
  options: RecommendOption[];
}

/** Every rule of the set, undecided, for an option whose stage could not be solved. */
function unsolvedChecks(ruleSet: RuleSet, message: string): Check[] {
  return ruleSet.rules.map(({ rule, severity, title, kind, figure }) => ({
    rule,
    passed: false,
    severity,
    reason: undecidedReason(message),
    margin: null,
    evaluated: false,
    title,
    kind,
    figure,
  }));
}

/** The sizing's window as the option carries it (null when the spec set no bounding target). */
function windowOf(sized: SizedOption): TailCurrentWindow | null {
  if (!sized.window) return null;
  const { window, pick, sizedAtA } = sized.window;
  return { bounds: window.bounds, lower: window.lower, upper: window.upper, empty: window.empty, currentA: pick.currentA, setBy: pick.setBy, sizedAtA: sizedAtA ?? pick.currentA };
}

/**
 * Evaluates and checks one sized design; a stage that cannot be solved becomes an option that
 * fails with every rule undecided and the solver's message.
 */
async function checkedOption(
  spec: Spec,
  topology: TopologyId,
  ruleSet: RuleSet,
  draws: MonteCarloDraws,
  size: () => SizedOption,
): Promise<Omit<RecommendOption, 'rank'>> {
  let design: Design | null = null;
  let notes: string[] = [];
  let tailCurrentWindow: TailCurrentWindow | null = null;
  try {
    const sized = size();
    design = sized.design;
    notes = sized.steps.map(sizingNote);
    tailCurrentWindow = windowOf(sized);
    const evaluation = evaluateOption(spec, design, draws, sized.window ?? null);
    // A figure the option cannot reach (a rejection with no common-mode gain left to divide by)
    // fails the option with its name; it never reaches the answer as NaN or Infinity
    const unreachable = firstNonFinitePath({ figures: evaluation.facts, predicted: evaluation.predicted, corners: evaluation.corners, curves: evaluation.curves, monteCarlo: evaluation.monteCarlo });
    if (unreachable) throw new Error(`the figure at ${unreachable} could not be computed for this design (not a finite number)`);
    const facts = wordedFacts(evaluation.facts);
    const checks = await ruleSet.evaluate(facts);
    return {
      topology,
      passes: checks.every((c) => c.passed || c.severity !== 'blocking'),
      design,
      predicted: evaluation.predicted,
      checks,
      rejectionDb: outputRejection(facts).valueDb,
      figures: facts,
      rejectionLimits: evaluation.rejectionLimits,
      corners: evaluation.corners,
      curves: evaluation.curves,
      monteCarlo: evaluation.monteCarlo,
      sizingNotes: notes,
      tailCurrentWindow,
    };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return {
      topology,
      passes: false,
      design,
      predicted: null,
      checks: unsolvedChecks(ruleSet, message),
      rejectionDb: null,
      figures: null,
      rejectionLimits: null,
      corners: [],
      curves: null,
      monteCarlo: null,
      sizingNotes: notes,
      tailCurrentWindow,
      error: message,
    };
  }
}

/**
 * A designer's own design (an override), analysed as thoroughly as a ranked option: over the
 * spec's conditions with the design's own device, rails and tail capacitance, every rule checked.
 */
export async function evaluateDesign(spec: Spec, design: Design, ruleSet: RuleSet): Promise<RecommendOption> {
  const specForDesign: Spec = {
    ...spec,
    device: { ...spec.device, ...design.device },
    supply: design.supply,
    tailCapacitanceF: design.tailCapacitanceF ?? spec.tailCapacitanceF,
    loadCapacitanceF: design.loadCapacitanceF ?? spec.loadCapacitanceF,
    sourceResistanceOhm: design.sourceResistanceOhm ?? spec.sourceResistanceOhm,
  };
  const draws = monteCarloDraws(spec.monteCarlo.samples, spec.monteCarlo.seed);
  const option = await checkedOption(specForDesign, design.tail.topology, ruleSet, draws, () => ({ design, steps: [{ step: 'designer-values' }] }));
  return { ...option, rank: 0 };
}


/**
 * Sizes, evaluates, checks and ranks every topology the spec lists. `spec` must have passed
 * the schema (defaults applied); `ruleSet` comes from rules/ (loadRuleSet).
 */
export async function recommend(spec: Spec, ruleSet: RuleSet): Promise<RecommendResult> {
  const draws = monteCarloDraws(spec.monteCarlo.samples, spec.monteCarlo.seed);
  const evaluated = [];
  for (const topology of spec.topologies) {
    evaluated.push(await checkedOption(spec, topology, ruleSet, draws, () => sizeTopology(spec, topology, nominalCondition(spec))));
  }
  const rankable = evaluated.map((o) => ({
    ...o,
    tailImpedanceAtFrequencyOhm: o.figures?.tailImpedanceAtFrequencyOhm ?? 0,
    // Stryker disable next-line LogicalOperator,UnaryOperator: equivalent, only an option that could not be solved has no rejection, and it never passes, so the policy never compares this value
    rejectionDb: o.rejectionDb ?? -Infinity,
  }));
  const ranked = rankOptions(rankable);
  const recommended = recommendedTopology(rankable, spec.policy);
  const byTopology = new Map(evaluated.map((o) => [o.topology, o]));
  const options = ranked.map((r, i) => ({ ...byTopology.get(r.topology)!, rank: i + 1 }));
  const cautions = [
    ...new Set(evaluated.flatMap((o) => o.checks.filter((c) => c.kind === 'caution' && !c.passed && c.evaluated !== false).map((c) => c.reason))),
  ];
  return {
    engineVersion: ENGINE_VERSION,
    rulesetVersion: ruleSet.version,
    policy: spec.policy,
    recommended,
    summary: recommendationSummary(recommended !== null, spec.policy, evaluated.filter((o) => o.passes).length, evaluated.length),
    cautions,
    notice: ESTIMATE_NOTICE,
    options,
  };
}
