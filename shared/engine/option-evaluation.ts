/**
 * Evaluating one sized option over the spec's conditions: nominal, four corners, a temperature
 * sweep, the mismatch worst case and Monte Carlo for differential outputs, and the facts its
 * checks are decided on (worst corner taken, margins computed; rules only compare).
 */
import { cornerConditions, nominalCondition, shiftedCondition, temperatureSweep, type Condition } from './conditions';
import { activeDimensions, NO_SHIFT, SHIFT_DIMENSIONS, type CornerShift, type ShiftSigns } from './sign-off-corners';
import { solveCircuit, solveCondition, solvedTailCurrentA, solveStage, singleEndedCmrrDbAt, transfersAt, type ConditionSolution, type OperatingPointProblem, type SolvedCircuit, type StageSolution } from './analyze';
import { magnitude } from './small-signal';
import { firstNonFinitePath } from './finite';
import { cardOf, cardStoresCharge } from './bjt-parameters';
import { rejectionLimits, tailImpedanceOhm, type RejectionLimits } from './rejection-limits';
import {
  mismatchSensitivity,
  mismatchStages,
  monteCarloCmrr,
  monteCarloDraws,
  mismatchSigmas,
  mismatchedDesign,
  screeningSensitivity,
  screeningStages,
  worstCaseMismatchCmrrDb,
  worstCaseMismatchShares,
  worstCaseMismatches,
  type MismatchSensitivity,
  type MismatchVector,
  type MismatchShares,
  type MonteCarloDraws,
  type MonteCarloResult,
  type ScreeningStages,
} from './mismatch';
import { designAt, outputGain, swingPeakPerCollectorV, type SizedOption } from './sizing';
import { swingCompression } from './large-signal';
import type { AnalyzeResult, Design, OptionFacts, Spec } from './types';
import { TOPOLOGY_CATALOGUE } from './topologies';
import { stageFamily } from './circuit';
import { ZERO_CELSIUS_K } from './constants';
import { driftSensitivitiesVPerC, mismatchSpread, offsetStatistics, tradeoffAtCondition, tradeoffFacts, tradeoffTargets, type ConditionEntry, type OffsetFigures, type TradeoffAtCondition } from './tradeoff-figures';

/** Usual safe-to-touch limit for DC rails [IEC62368]. */
export const HAZARDOUS_VOLTAGE_LIMIT_V = 60;
/** Points per decade and range of the rejection-versus-frequency curve. */
const CURVE_POINTS_PER_DECADE = 4;
const CURVE_START_HZ = 1;
/**
 * The grid runs to 1 GHz (past the transit frequency of small-signal NPNs, a few hundred MHz),
 * and each option's curve stops at the last point where its differential gain is within
 * CURVE_GAIN_DROP_DB of its low-frequency value: the range where the engine is held to ngspice
 * (tests/reference/frequency-agreement.test.ts) and where a quasi-static transistor model still
 * describes a real one.
 */
const CURVE_STOP_HZ = 1e9;
const CURVE_GAIN_DROP_DB = 20;
/** A device whose card gives no capacitance (CJE, CJC, CJS, TF, TR all 0) has its curve stop at 10 MHz: above, the figures would lack the capacitances every real transistor has. */
const CURVE_STOP_WITHOUT_DEVICE_CHARGE_HZ = 1e7;

export interface ConditionFigures {
  label: string;
  inputCommonModeV: number;
  temperatureC: number;
  /** Rails, current gain and resistor tempco moved off nominal at this corner (sign-off-corners.ts); absent at a base corner. */
  shift?: CornerShift;
  tailCurrentA: number;
  gain: number;
  cmrrAtFrequencyDb: number;
  /** Differential output: mismatch worst case, second-order model at the governing corner, first-order screening elsewhere. */
  cmrrDifferentialWorstCaseDb: number | null;
  powerW: number;
  tailComplianceMarginV: number;
  pairSaturationMarginV: number;
  warnings: string[];
  operatingPointProblems: string[];
}

export interface OptionCurves {
  /**
   * Rejection against frequency: single-ended at nominal conditions; for a differential output
   * also the mismatch worst case at the corner that governs it (the second-order model's corner).
   */
  cmrrVsFrequency: { frequencyHz: number; singleEndedDb: number; differentialWorstCaseDb: number | null }[];
  /** Tail current and gain against temperature at the nominal input common mode. */
  temperatureSweep: { temperatureC: number; tailCurrentA: number; gain: number }[];
}

/** What would hold the gain over the spec's range (worded at the edge, shared/text/engine-notes.ts). */
export type GainRemedy = 'degeneration-or-rising-tail-current' | 'ptat-or-more-degeneration' | 'more-degeneration' | 'beyond-ptat' | 'current-source-tail' | 'higher-resistance-tail';

/** The trade-off figures searched over the sign-off corners: the figure, its target, whether higher is worse, and the value a null (no figure) counts as. */
type SearchedTradeoff = 'inputBiasCurrentA' | 'noiseVPerRtHz' | 'bandwidthHz' | 'psrrPositiveDb' | 'psrrNegativeDb' | 'linearInputRangeV' | 'slewRateVPerS';
const SEARCHED_TRADEOFFS: readonly (readonly [SearchedTradeoff, keyof ReturnType<typeof tradeoffTargets>, boolean, number])[] = [
  ['inputBiasCurrentA', 'inputBias', true, Number.POSITIVE_INFINITY],
  ['noiseVPerRtHz', 'noise', true, Number.POSITIVE_INFINITY],
  ['bandwidthHz', 'bandwidth', false, Number.POSITIVE_INFINITY],
  ['psrrPositiveDb', 'psrrPositive', false, Number.POSITIVE_INFINITY],
  ['psrrNegativeDb', 'psrrNegative', false, Number.POSITIVE_INFINITY],
  ['linearInputRangeV', 'linearRange', false, Number.POSITIVE_INFINITY],
  ['slewRateVPerS', 'slewRate', false, 0],
];

/** A base corner's trade-off figures without the slew rate (left undefined: computed on demand by its search). */
function withoutSlew(entry: TradeoffAtCondition): ConditionEntry {
  const { slewRateVPerS: _slew, ...rest } = entry;
  return rest;
}

/** The facts whose value is a sentence: written at the edge from the figures beside them. */
export type WordedFact =
  | 'gainOverConditionsRemedy'
  | 'tailOutputResistanceNote'
  | 'cmrrDifferentialLimitNote'
  | 'outputCmrrBasis'
  | 'tailCurrentWindowNote'
  | 'icmLowHeadroom'
  | 'icmLowShortfall'
  | 'icmHighHeadroom'
  | 'icmHighShortfall';

/** What limits the input common-mode range at one end: the tail source's compliance, or the pair's saturation. */
export type HeadroomLimit = 'tail-compliance' | 'pair-saturation';

/** An operating-point problem and the condition it appears at. */
export interface ProblemAt {
  conditionLabel: string;
  problem: OperatingPointProblem;
}

/** The facts as the engine computes them: figures and ids, the remedy as an id, the problems as figures. */
export type MeasuredFacts = Omit<OptionFacts, WordedFact | 'operatingPointProblems'> & {
  gainOverConditionsRemedyId: GainRemedy;
  /** What limits each end of the input common-mode range (an NPN stage: the tail at the low end; a PNP stage: the pair there). */
  icmLowLimitId: HeadroomLimit;
  icmHighLimitId: HeadroomLimit;
  operatingPointProblemsAt: ProblemAt[];
  /** Each mismatch's share of the differential worst case's common-mode gain, per cent (null when single-ended). */
  cmrrDifferentialSharesPercent: MismatchShares | null;
  /** The tail-current window sizing picked the current in (null: the spec sets no bounding target, or the design is a designer's own). */
  tailCurrentWindow: SizedOption['window'] | null;
};

export interface OptionEvaluation {
  predicted: AnalyzeResult;
  /** What limits the spec output's rejection at the spec frequency, at the condition that governs it (null when it cannot be told). */
  rejectionLimits: RejectionLimits | null;
  facts: MeasuredFacts;
  corners: ConditionFigures[];
  curves: OptionCurves;
  monteCarlo: MonteCarloResult | null;
}

/** The sized design at a condition (a cold start: another bias is too far for a warm one). */
function designAtCondition(spec: Spec, design: Design, condition: Condition): Design {
  const values = { tail: design.tail, collectorResistanceOhm: design.collectorResistanceOhm, pairEmitterResistanceOhm: design.pairEmitterResistanceOhm ?? 0 };
  return designAt(spec, condition, values);
}

/** The sized design solved at another condition, without the corner searches (only the nominal solve's corners are read). */
function at(spec: Spec, design: Design, condition: Condition): ConditionSolution {
  return solveCondition(designAtCondition(spec, design, condition));
}

/**
 * Whether temperature or input common mode moves the gain more at the governing corner: the
 * gain change to the corner with the other temperature (same common mode) against the change to
 * the corner with the other common mode (same temperature).
 */
function gainSpreadCause(corners: readonly ConditionFigures[], worstLabel: string): 'temperature' | 'input common mode' {
  const worst = corners.find((c) => c.label === worstLabel) as ConditionFigures;
  const otherTemperature = corners.find((c) => c.inputCommonModeV === worst.inputCommonModeV && c.temperatureC !== worst.temperatureC);
  const otherCommonMode = corners.find((c) => c.temperatureC === worst.temperatureC && c.inputCommonModeV !== worst.inputCommonModeV);
  const byTemperature = otherTemperature ? Math.abs(worst.gain - otherTemperature.gain) : 0;
  const byCommonMode = otherCommonMode ? Math.abs(worst.gain - otherCommonMode.gain) : 0;
  return byCommonMode > byTemperature ? 'input common mode' : 'temperature';
}

/**
 * What would hold the gain over the spec's range. Temperature: |Ad| = IC·RC/VT falls as VT rises
 * unless IC rises with T (a PTAT tail, e.g. a ΔVBE cell [GM]), or pair emitter degeneration makes
 * the gain lean on RC/RE rather than on gm. Common mode: the tail current follows the input through
 * a resistor tail, and through a current source's finite output resistance. A pair already
 * degenerated needs more of it (or the PTAT tail); with the PTAT tail what is left over
 * temperature is what it does not cancel (the resistors' tempco, the current gain's drift).
 */
function gainRemedy(cause: 'temperature' | 'input common mode', design: Design): GainRemedy {
  if (cause === 'temperature') {
    if (TOPOLOGY_CATALOGUE[design.tail.topology].currentLaw === 'ptat') return 'beyond-ptat';
    // a PNP pair has no PTAT tail (its ΔVBE cell's mirror would be the opposite device)
    if (stageFamily(design) === 'pnp') return 'more-degeneration';
    return (design.pairEmitterResistanceOhm ?? 0) > 0 ? 'ptat-or-more-degeneration' : 'degeneration-or-rising-tail-current';
  }
  return design.tail.topology === 'resistor' ? 'current-source-tail' : 'higher-resistance-tail';
}

/**
 * The mismatches at their worst-case extremes, each with the sign that makes its first-order
 * term add to the largest one (as far as real signs can: the worst case adds them in magnitude).
 */
function alignedWorstCaseMismatches(sensitivity: MismatchSensitivity, sigmas: ReturnType<typeof mismatchSigmas>): MismatchVector {
  const x = worstCaseMismatches(sigmas, sensitivity.thermalVoltageV);
  const terms = sensitivity.linear.map((z, i) => ({ re: z.re * x[i], im: z.im * x[i] }));
  const largest = terms.reduce((a, b) => (magnitude(b) > magnitude(a) ? b : a));
  const sign = terms.map((z) => (z.re * largest.re + z.im * largest.im < 0 ? -1 : 1));
  return [x[0] * sign[0], x[1] * sign[1], x[2] * sign[2], x[3] * sign[3]];
}

/**
 * What limits the output's rejection at the spec frequency: on c1 for a single-ended output, on
 * c1 − c2 with every mismatch at its worst-case extreme for a differential one. Null when a
 * figure of it is not finite (it is a diagnosis: the option's checks never depend on it).
 */
function limitsOf(solved: SolvedCircuit, frequencyHz: number, output: Spec['gain']['output'], label: string): RejectionLimits | null {
  try {
    const limits = rejectionLimits(solved, frequencyHz, output, label);
    return firstNonFinitePath(limits) === null ? limits : null;
  } catch {
    return null;
  }
}

function frequencyGrid(): number[] {
  // Stryker disable next-line ArithmeticOperator: equivalent while the curve starts at 1 Hz (stop × 1 = stop ÷ 1)
  const decades = Math.log10(CURVE_STOP_HZ / CURVE_START_HZ);
  return Array.from({ length: decades * CURVE_POINTS_PER_DECADE + 1 }, (_, i) => CURVE_START_HZ * 10 ** (i / CURVE_POINTS_PER_DECADE));
}

/** The grid up to the last point where the stage's differential gain is within CURVE_GAIN_DROP_DB of its low-frequency value. */
function curveGrid(solution: Pick<StageSolution, 'stage' | 'design'>): number[] {
  const grid = frequencyGrid();
  if (!cardStoresCharge(cardOf(solution.design.device))) return grid.filter((f) => f <= CURVE_STOP_WITHOUT_DEVICE_CHARGE_HZ * (1 + 1e-9));
  if (!solution.stage.frequency) return grid;
  const lowDb = 20 * Math.log10(magnitude(transfersAt(solution, 0).differentialGain));
  const kept: number[] = [];
  for (const frequencyHz of grid) {
    if (20 * Math.log10(magnitude(transfersAt(solution, frequencyHz).differentialGain)) < lowDb - CURVE_GAIN_DROP_DB) break;
    kept.push(frequencyHz);
  }
  return kept;
}

/**
 * Evaluates a sized design against its spec. `draws`: the spec's Monte Carlo draws, shared by
 * every option of one recommendation (made here when absent); `window`: the tail-current window
 * sizing picked its current in, when it did.
 */
export function evaluateOption(spec: Spec, design: Design, draws?: MonteCarloDraws, window: SizedOption['window'] | null = null): OptionEvaluation {
  const f = spec.cmrr.atFrequencyHz;
  const differentialOutput = spec.gain.output === 'differential';
  const sigmas = mismatchSigmas(spec);
  const nominal = nominalCondition(spec);
  // the prediction at nominal keeps the design's own `ac` frequencies (the spec's noise frequency)
  const nominalDesign = designAtCondition(spec, design, nominal);
  const nominalSolution = solveStage(design.frequenciesHz ? { ...nominalDesign, frequenciesHz: design.frequenciesHz } : nominalDesign);
  const predicted = nominalSolution.result;

  // One corner: its solution, figures, and (for a differential output's base corners) the screening solves
  const cornerRecord = (condition: Condition, screen: boolean) => {
    const solution = at(spec, design, condition);
    const screening = screen ? screeningStages(solution) : null;
    const sensitivity = screening ? screeningSensitivity(screening, f) : null;
    const figures: ConditionFigures = {
      label: condition.label,
      inputCommonModeV: condition.inputCommonModeV,
      temperatureC: condition.temperatureC,
      ...(condition.shift ? { shift: condition.shift } : {}),
      tailCurrentA: solution.result.tailCurrentA,
      gain: outputGain(spec, solution.result),
      cmrrAtFrequencyDb: singleEndedCmrrDbAt(solution, f),
      cmrrDifferentialWorstCaseDb: sensitivity ? worstCaseMismatchCmrrDb(sensitivity, sigmas) : null,
      powerW: solution.result.powerW,
      tailComplianceMarginV: solution.result.tailComplianceMarginV,
      pairSaturationMarginV: solution.result.pairSaturationMarginV,
      warnings: solution.result.warnings,
      operatingPointProblems: solution.result.operatingPointProblems,
    };
    // The common mode each collector keeps, against the differential signal (for the next stage)
    const transfers = transfersAt(solution, f);
    const commonModeGain = magnitude(transfers.commonModeGain);
    const commonModeRejectionDb = 20 * Math.log10(magnitude(transfers.differentialGain) / commonModeGain);
    return { condition, figures, solution, screening, problems: solution.problems, commonModeGain, commonModeRejectionDb };
  };
  type CornerRecord = ReturnType<typeof cornerRecord>;

  // Differential output: a first-order mismatch model at every base corner finds the governing one,
  // where the second-order model then gives the worst case, the Monte Carlo and the curve.
  const baseCorners = cornerConditions(spec).map((condition) => cornerRecord(condition, differentialOutput));

  // The sign-off search (sign-off-corners.ts): for each figure, from the base corner where it is
  // worst, each rail, the current gain and the resistors' tempco moved alone to one end show which
  // end worsens it; the corner with all of them there is solved and kept when it is worse still.
  const perturbed = new Map<string, CornerRecord>();
  const combined = new Map<string, CornerRecord>();
  // by the base corner and the sign vector (each sign vector names one condition): the condition
  // and its worded label are built only for a corner not solved yet
  const recordAt = (cache: Map<string, CornerRecord>, base: CornerRecord, signs: ShiftSigns): CornerRecord => {
    const key = `${base.condition.label}|${SHIFT_DIMENSIONS.map((d) => signs[d]).join()}`;
    let record = cache.get(key);
    if (!record) {
      record = cornerRecord(shiftedCondition(spec, base.condition, signs), false);
      cache.set(key, record);
    }
    return record;
  };
  function signOffWorst(
    candidates: readonly CornerRecord[],
    read: (c: CornerRecord) => number,
    higherIsWorse: boolean,
    direction: (c: CornerRecord) => number = read,
  ): CornerRecord {
    const worse = (a: number, b: number) => (higherIsWorse ? b > a : b < a);
    // the base corner where the figure is worst (by its direction's proxy where the figure is dear to compute)
    const base = candidates.reduce((a, b) => (worse(direction(a), direction(b)) ? b : a));
    const dimensions = activeDimensions(spec, base.condition.temperatureC);
    if (dimensions.length === 0) return base;
    const signs: Record<string, -1 | 0 | 1> = { ...NO_SHIFT };
    const here = direction(base);
    for (const dimension of dimensions) {
      const moved = recordAt(perturbed, base, { ...NO_SHIFT, [dimension]: 1 });
      signs[dimension] = worse(here, direction(moved)) ? 1 : -1;
    }
    const corner = recordAt(combined, base, signs as unknown as ShiftSigns);
    return worse(read(base), read(corner)) ? corner : base;
  }
  const lowIcm = baseCorners.filter((c) => c.condition.inputCommonModeV === spec.inputCommonMode.minV);
  const highIcm = baseCorners.filter((c) => c.condition.inputCommonModeV === spec.inputCommonMode.maxV);
  // A PNP stage is the mirror image: its tail runs out of compliance at the highest input (the
  // tail node, VICM + VEB, nearest the positive rail) and its pair saturates at the lowest (its
  // emitters nearest its collectors, which hang from the negative rail)
  const pnpStage = stageFamily(design) === 'pnp';
  const [tailComplianceIcm, pairSaturationIcm] = pnpStage ? [highIcm, lowIcm] : [lowIcm, highIcm];
  const found = [
    signOffWorst(baseCorners, (c) => c.figures.gain, true),
    signOffWorst(baseCorners, (c) => c.figures.gain, false),
    signOffWorst(baseCorners, (c) => c.figures.cmrrAtFrequencyDb, false),
    signOffWorst(baseCorners, (c) => c.figures.powerW, true),
    signOffWorst(baseCorners, (c) => c.commonModeRejectionDb, false),
    signOffWorst(tailComplianceIcm.length ? tailComplianceIcm : baseCorners, (c) => c.figures.tailComplianceMarginV, false),
    signOffWorst(pairSaturationIcm.length ? pairSaturationIcm : baseCorners, (c) => c.figures.pairSaturationMarginV, false),
  ];
  const corners: CornerRecord[] = [...baseCorners];
  for (const record of found) if (!corners.includes(record)) corners.push(record);
  const cornerFigures = corners.map((c) => c.figures);

  // The spec's trade-off targets at every base corner (only those it sets are computed), then
  // each one's own sign-off search; the slew rate's direction is read from the tail current it
  // follows (2·Itail/CL), so the transient runs only at the corners it is judged at
  const targets = tradeoffTargets(spec);
  const anyTarget = Object.values(targets).some(Boolean);
  const shared = draws ?? (anyTarget || differentialOutput ? monteCarloDraws(spec.monteCarlo.samples, spec.monteCarlo.seed) : null);
  // the slew rate (a transient) only where its search needs it: not at every base corner
  const tradeoffs: ConditionEntry[] = anyTarget
    ? baseCorners.map((c) => withoutSlew(tradeoffAtCondition(spec, c.figures.label, c.solution, c.screening, sigmas, undefined, 'slewRateVPerS', predicted.linearInputRangeV)))
    : [];
  const searched: ConditionEntry[] = [];
  if (anyTarget) {
    const tradeoffCache = new Map<CornerRecord, ConditionEntry>();
    baseCorners.forEach((c, i) => tradeoffCache.set(c, tradeoffs[i]));
    const figureAt = (key: SearchedTradeoff, record: CornerRecord): number => {
      let entry = tradeoffCache.get(record);
      if (!entry) {
        entry = { label: record.figures.label };
        tradeoffCache.set(record, entry);
      }
      if (entry[key] === undefined) {
        // a shifted corner's search starts from its base corner's linear range; its screening solves serve both rails' rejection
        const baseIndex = baseCorners.findIndex((c) => c.condition.temperatureC === record.condition.temperatureC && c.condition.inputCommonModeV === record.condition.inputCommonModeV);
        const hint = baseIndex >= 0 ? (tradeoffs[baseIndex].linearInputRangeV ?? null) : predicted.linearInputRangeV;
        const needsScreening = differentialOutput && (key === 'psrrPositiveDb' || key === 'psrrNegativeDb');
        if (needsScreening) record.screening ??= screeningStages(record.solution);
        entry[key] = tradeoffAtCondition(spec, record.figures.label, record.solution, record.screening, sigmas, key, undefined, hint)[key];
      }
      return entry[key] as number;
    };
    for (const [key, set, higherIsWorse, nullAs] of SEARCHED_TRADEOFFS) {
      if (!targets[set]) continue;
      const read = (c: CornerRecord) => figureAt(key, c) ?? nullAs;
      const direction = key === 'slewRateVPerS' ? (c: CornerRecord) => c.figures.tailCurrentA : read;
      const worst = signOffWorst(baseCorners, read, higherIsWorse, direction);
      if (!baseCorners.includes(worst)) searched.push({ label: worst.figures.label, [key]: figureAt(key, worst) });
    }
  }
  let offsetFigures: OffsetFigures | null = null;
  if (targets.offset || targets.drift) {
    const sigmaCount = spec.offset?.sigmas ?? 3;
    // the governing corner by the offset's spread (the root of the sum of each mismatch's share
    // squared), then the Monte Carlo draws there
    const spreadAt = (i: number) => Math.hypot(...tradeoffs[i].offsetPerMismatchV!.map((x, k) => x * mismatchSpread(sigmas, baseCorners[i].solution.model.thermalVoltageV, k)));
    const governing = baseCorners.reduce((best, _, i) => (spreadAt(i) > spreadAt(best) ? i : best), 0);
    const solution = baseCorners[governing].solution;
    const offset = offsetStatistics(tradeoffs[governing].offsetPerMismatchV!, shared!, sigmas, solution.model.thermalVoltageV, sigmaCount);
    const drift = targets.drift ? offsetStatistics(driftSensitivitiesVPerC(solution), shared!, sigmas, solution.model.thermalVoltageV, sigmaCount) : null;
    offsetFigures = { offset, drift, label: baseCorners[governing].figures.label };
  }
  const worstCommonMode = corners.reduce((a, b) => (b.commonModeRejectionDb < a.commonModeRejectionDb ? b : a));
  const worstSingle = cornerFigures.reduce((a, b) => (b.cmrrAtFrequencyDb < a.cmrrAtFrequencyDb ? b : a));

  let monteCarlo: MonteCarloResult | null = null;
  let worstDifferential: number | null = null;
  let governingMismatch: ReturnType<typeof mismatchStages> | null = null;
  let shares: MismatchShares | null = null;
  let limits: RejectionLimits | null = null;
  if (differentialOutput) {
    const worst = baseCorners.reduce((a, b) => (b.figures.cmrrDifferentialWorstCaseDb! < a.figures.cmrrDifferentialWorstCaseDb! ? b : a));
    governingMismatch = mismatchStages(worst.screening as ScreeningStages);
    const sensitivity = mismatchSensitivity(governingMismatch, f);
    worstDifferential = worstCaseMismatchCmrrDb(sensitivity, sigmas);
    shares = worstCaseMismatchShares(sensitivity, sigmas);
    worst.figures.cmrrDifferentialWorstCaseDb = worstDifferential;
    monteCarlo = monteCarloCmrr(sensitivity, shared!, sigmas, spec.cmrr.minDb);
    const matched = governingMismatch.matched;
    const mismatched = solveCircuit(mismatchedDesign(matched.design, alignedWorstCaseMismatches(sensitivity, sigmas)), matched);
    limits = limitsOf(mismatched, f, 'differential', worst.figures.label);
  } else {
    const governing = corners.find((c) => c.figures === worstSingle)!;
    limits = limitsOf(governing.solution, f, 'single-ended', worstSingle.label);
  }

  const sweepConditions = temperatureSweep(spec);
  const sweep = sweepConditions.map((condition) => at(spec, design, condition).result);
  // a PTAT tail's current is meant to rise as T: its drift is the departure from I·T0/T
  const ptat = TOPOLOGY_CATALOGUE[design.tail.topology].currentLaw === 'ptat';
  const nominalK = nominal.temperatureC + ZERO_CELSIUS_K;
  const lawOf = (currents: number[]) => (ptat ? currents.map((i, k) => (i * nominalK) / (sweepConditions[k].temperatureC + ZERO_CELSIUS_K)) : currents);
  const spreadPercent = (currents: number[]) => {
    const judged = lawOf(currents);
    return ((Math.max(...judged) - Math.min(...judged)) / predicted.tailCurrentA) * 100;
  };
  // the tail resistors' tempco at either sign moves the tail current with temperature too: the larger drift counts
  const tempcoSweeps = (spec.resistors.tempcoPpmPerC ?? 0) > 0
    ? ([-1, 1] as const).map((sign) => sweepConditions.map((c) => solvedTailCurrentA(designAtCondition(spec, design, shiftedCondition(spec, c, { ...NO_SHIFT, tailTempco: sign })))))
    : [];
  const driftPercent = Math.max(spreadPercent(sweep.map((r) => r.tailCurrentA)), ...tempcoSweeps.map(spreadPercent));
  const icmLow = at(spec, design, { ...nominal, inputCommonModeV: spec.inputCommonMode.minV }).result;
  const icmHigh = at(spec, design, { ...nominal, inputCommonModeV: spec.inputCommonMode.maxV }).result;
  const gainNominal = outputGain(spec, predicted);
  const gainVsIcmPercent = (Math.abs(outputGain(spec, icmHigh) - outputGain(spec, icmLow)) / gainNominal) * 100;
  const gainErrorPercent = ((gainNominal - spec.gain.target) / spec.gain.target) * 100;
  const cornerGainErrors = cornerFigures.map((c) => ({ label: c.label, errorPercent: ((c.gain - spec.gain.target) / spec.gain.target) * 100 }));
  const worstGain = cornerGainErrors.reduce((a, b) => (Math.abs(b.errorPercent) > Math.abs(a.errorPercent) ? b : a));
  const gainCause = gainSpreadCause(cornerFigures, worstGain.label);

  const swingPeakV = swingPeakPerCollectorV(spec);
  // Stryker disable next-line MethodExpression: equivalent, at either temperature the tail's compliance margin is least at the lowest input (the tail node, VICM − VBE, sits lowest there), so the least of all four corners is a low corner's
  const lowCorners = cornerFigures.filter((c) => c.inputCommonModeV === spec.inputCommonMode.minV);
  // Stryker disable next-line MethodExpression: equivalent, at either temperature the pair's saturation margin is least at the highest input (its emitters sit highest there), so the least of all four corners is a high corner's
  const highCorners = cornerFigures.filter((c) => c.inputCommonModeV === spec.inputCommonMode.maxV);
  // the PNP stage's ends the other way round, as in the sign-off search above
  const tailComplianceCorners = pnpStage ? highCorners : lowCorners;
  const pairSaturationCorners = pnpStage ? lowCorners : highCorners;
  const tailComplianceMarginV = Math.min(...tailComplianceCorners.map((c) => c.tailComplianceMarginV));
  const pairSaturationMarginV = Math.min(...pairSaturationCorners.map((c) => c.pairSaturationMarginV)) - swingPeakV;
  // Stryker disable next-line MethodExpression: equivalent, the design is evaluated matched (designAt carries no mismatch), so both collectors sit at one voltage
  const upRoomV = pnpStage
    ? Math.min(predicted.collectorVoltageV, predicted.collector2VoltageV) - spec.supply.negativeV
    : spec.supply.positiveV - Math.max(predicted.collectorVoltageV, predicted.collector2VoltageV);
  const swingMarginV = Math.min(upRoomV - swingPeakV, predicted.pairSaturationMarginV - swingPeakV);
  // the swing's peak on the output the spec names, against the pair's large-signal transfer at nominal
  const compression = swingCompression(nominalSolution, spec.gain.output, spec.outputSwingVpp / 2, outputGain(spec, predicted));
  const compressionLimit = spec.outputSwingMaxCompressionPercent;
  const powerWorstW = Math.max(predicted.powerW, ...cornerFigures.map((c) => c.powerW));
  const problems: ProblemAt[] = [
    ...nominalSolution.problems.map((problem) => ({ conditionLabel: nominal.label, problem })),
    ...corners.flatMap((c) => c.problems.map((problem) => ({ conditionLabel: c.figures.label, problem }))),
  ];
  const rout = predicted.tailOutputResistanceOhm;
  const driftLimit = spec.gain.tolerancePercent;
  const cmrrRequired = spec.cmrr.minDb;
  const yieldPercent = monteCarlo ? monteCarlo.yieldPercent : null;
  // The target applies to the output the spec names: the differential output's rejection is its mismatch-limited worst case
  const outputCmrrDb = differentialOutput ? (worstDifferential as number) : worstSingle.cmrrAtFrequencyDb;

  const facts: MeasuredFacts = {
    topology: design.tail.topology,
    output: spec.gain.output,
    isDifferentialOutput: differentialOutput,
    isResistorTail: design.tail.topology === 'resistor',
    cmrrAtFrequencyDb: worstSingle.cmrrAtFrequencyDb,
    cmrrFrequencyHz: f,
    cmrrRequiredDb: cmrrRequired,
    cmrrMarginRequiredDb: spec.cmrr.marginDb,
    cmrrMarginDb: worstSingle.cmrrAtFrequencyDb - (cmrrRequired + spec.cmrr.marginDb),
    worstCmrrCorner: worstSingle.label,
    outputCmrrDb,
    outputCmrrMarginDb: outputCmrrDb - (cmrrRequired + spec.cmrr.marginDb),
    outputCommonModeGain: worstCommonMode.commonModeGain,
    outputCommonModeRejectionDb: worstCommonMode.commonModeRejectionDb,
    outputCommonModeMarginDb: worstCommonMode.commonModeRejectionDb - cmrrRequired,
    outputCommonModeCorner: worstCommonMode.figures.label,
    cmrrDifferentialWorstCaseDb: worstDifferential,
    cmrrDifferentialWorstCaseMarginDb: worstDifferential === null ? null : worstDifferential - cmrrRequired,
    cmrrDifferentialSharesPercent: shares,
    monteCarloYieldPercent: yieldPercent,
    monteCarloSamples: spec.monteCarlo.samples,
    requiredYieldPercent: spec.cmrr.minYieldPercent,
    yieldMarginPercent: yieldPercent === null ? null : yieldPercent - spec.cmrr.minYieldPercent,
    gainPredicted: gainNominal,
    gainTarget: spec.gain.target,
    gainErrorPercent,
    gainTolerancePercent: spec.gain.tolerancePercent,
    gainMarginPercent: spec.gain.tolerancePercent - Math.abs(gainErrorPercent),
    gainWorstCornerErrorPercent: worstGain.errorPercent,
    gainWorstCorner: worstGain.label,
    gainOverConditionsMarginPercent: spec.gain.tolerancePercent - Math.abs(worstGain.errorPercent),
    gainOverConditionsCause: gainCause,
    gainOverConditionsRemedyId: gainRemedy(gainCause, design),
    icmLowMarginV: pnpStage ? pairSaturationMarginV : tailComplianceMarginV,
    icmLowV: spec.inputCommonMode.minV,
    icmLowLimitId: pnpStage ? 'pair-saturation' : 'tail-compliance',
    icmHighMarginV: pnpStage ? tailComplianceMarginV : pairSaturationMarginV,
    icmHighLimitId: pnpStage ? 'tail-compliance' : 'pair-saturation',
    icmHighV: spec.inputCommonMode.maxV,
    swingMarginV,
    swingPeakPerCollectorV: swingPeakV,
    outputSwingVpp: spec.outputSwingVpp,
    swingCompressionPercent: compression.compressionPercent,
    swingCompressionLimitPercent: compressionLimit,
    swingCompressionMarginPercent: compressionLimit - compression.compressionPercent,
    swingPeakInputV: compression.peakInputV,
    swingLinearInputV: compression.linearInputV,
    powerWorstW,
    powerBudgetW: spec.powerBudgetW,
    powerMarginW: spec.powerBudgetW - powerWorstW,
    tailCurrentDriftPercent: driftPercent,
    tailCurrentDriftBasis: ptat ? ' beyond its rise in proportion to absolute temperature (the PTAT law, which holds gm)' : '',
    tailCurrentDriftLimitPercent: driftLimit,
    tailCurrentDriftMarginPercent: driftLimit - driftPercent,
    temperatureMinC: spec.temperatureC.min,
    temperatureMaxC: spec.temperatureC.max,
    gainVsCommonModePercent: gainVsIcmPercent,
    gainVsCommonModeLimitPercent: spec.gain.tolerancePercent,
    gainVsCommonModeMarginPercent: spec.gain.tolerancePercent - gainVsIcmPercent,
    railSpanV: spec.supply.positiveV - spec.supply.negativeV,
    hazardousVoltageLimitV: HAZARDOUS_VOLTAGE_LIMIT_V,
    hazardousVoltageMarginV: HAZARDOUS_VOLTAGE_LIMIT_V - (spec.supply.positiveV - spec.supply.negativeV),
    patientConnected: spec.hazards.patientConnected,
    mainsReferenced: spec.hazards.mainsReferenced,
    operatingPointProblemsAt: problems,
    operatingPointProblemCount: problems.length,
    tailImpedanceAtFrequencyOhm: tailImpedanceOhm(nominalSolution, f),
    tailOutputResistanceOhm: rout,
    tailOutputResistanceClosedFormOhm: predicted.tailOutputResistanceClosedForm.valueOhm,
    tailOutputResistanceFormula: predicted.tailOutputResistanceClosedForm.formula,
    ...tradeoffFacts(spec, [...tradeoffs, ...searched], offsetFigures),
    tailCurrentWindowSet: window !== null,
    tailCurrentWindowEmpty: window?.window.empty ?? false,
    tailCurrentWindow: window,
  };


  const curves: OptionCurves = {
    cmrrVsFrequency: curveGrid(nominalSolution).map((frequencyHz) => ({
      frequencyHz,
      singleEndedDb: singleEndedCmrrDbAt(nominalSolution, frequencyHz),
      differentialWorstCaseDb: governingMismatch ? worstCaseMismatchCmrrDb(mismatchSensitivity(governingMismatch, frequencyHz), sigmas) : null,
    })),
    temperatureSweep: sweep.map((r, i) => ({ temperatureC: sweepConditions[i].temperatureC, tailCurrentA: r.tailCurrentA, gain: outputGain(spec, r) })),
  };
  return { predicted, rejectionLimits: limits, facts, corners: cornerFigures, curves, monteCarlo };
}

