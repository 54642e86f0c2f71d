/**
 * The trade-off figures a spec's optional targets judge (ENGINE-CONTRACT.md, version 2
 * "`recommend` additions"), at every condition the option is evaluated at, and the facts the
 * rules compare: input bias current, input-referred noise at the spec's frequency, differential
 * bandwidth into the load, supply rejection from each rail for the spec's output, linear input
 * range, and the statistical input offset and its drift from the spec's mismatch spreads. Each
 * figure comes from the solved circuit at that condition (analyze.ts, noise.ts,
 * input-transfer.ts); a figure whose target the spec leaves out is not computed.
 *
 * The statistical offset: the mismatches move v(c1) − v(c2) at zero input, to first order
 * Δv = Σ (∂v/∂xᵢ)·xᵢ from one solve at a step of each (the screening solves the differential
 * rejection uses), so VOS = −Δv/Ad = Σ sᵢ·xᵢ. Over the spec's seeded Monte Carlo draws (the same
 * for every option) that gives the offset distribution; its standard deviation times the spec's
 * `sigmas` is the figure judged, and the worst case (every term at `sigmas` standard deviations,
 * adding in magnitude) stands beside it. The hand formula it refines: VOS ≈ VT·(ΔRC/RC + ΔIS/IS)
 * plus RS·IOS through a source resistance (Gray, Hurst, Lewis, Meyer, the emitter-coupled pair's
 * offset; DOMAIN.md). The drift: the same sensitivities at T ± 1 °C at the corner that governs
 * the offset, differenced.
 */
import { differentialBandwidthHzOf, solveCircuit, type SolvedCircuit } from './analyze';
import { readOutput } from './frequency-response';
import { linearInputRangeV, outputDifferenceV } from './input-transfer';
import { MISMATCH_KINDS, MISMATCH_STEPS, sampleMismatchesInto, screeningStages, worstCaseMismatches, type MismatchSigmas, type MonteCarloDraws, type ScreeningStages } from './mismatch';
import { inputNoiseVPerRtHz, stageNoise } from './noise';
import { solvedSlewRateVPerS } from './slew-rate';
import type { OptionFacts, Spec } from './types';

/** One condition's figures for the spec's targets (null where the target is left out or the figure has none). */
export interface TradeoffAtCondition {
  label: string;
  inputBiasCurrentA: number | null;
  noiseVPerRtHz: number | null;
  bandwidthHz: number | null;
  psrrPositiveDb: number | null;
  psrrNegativeDb: number | null;
  linearInputRangeV: number | null;
  slewRateVPerS: number | null;
  /** Offset per unit of each mismatch (V per unit of xᵢ), MISMATCH_KINDS order; null when no offset target. */
  offsetPerMismatchV: number[] | null;
}

/** Which of the spec's trade-off targets are set. */
export interface TradeoffTargets {
  noise: boolean;
  inputBias: boolean;
  offset: boolean;
  drift: boolean;
  bandwidth: boolean;
  psrrPositive: boolean;
  psrrNegative: boolean;
  linearRange: boolean;
  slewRate: boolean;
}

export function tradeoffTargets(spec: Spec): TradeoffTargets {
  return {
    noise: spec.noise?.maxVPerRtHz !== undefined && spec.noise.atFrequencyHz !== undefined,
    inputBias: spec.inputBiasCurrentMaxA !== undefined,
    offset: spec.offset?.maxV !== undefined,
    drift: spec.offset?.driftMaxVPerC !== undefined,
    bandwidth: spec.bandwidthMinHz !== undefined,
    psrrPositive: spec.psrrMinDb?.positive !== undefined,
    psrrNegative: spec.psrrMinDb?.negative !== undefined,
    linearRange: spec.linearInputRangeMinV !== undefined,
    slewRate: spec.slewRateMinVPerS !== undefined,
  };
}

/** Whether any target needs the offset sensitivities (offset or drift). */
function needsOffset(targets: TradeoffTargets): boolean {
  return targets.offset || targets.drift;
}

/** Offset per unit of each mismatch at a condition, V: −(∂v(c1,c2)/∂xᵢ)/Ad from the screening solves at zero input. */
export function offsetSensitivitiesV(stages: ScreeningStages): number[] {
  const matched = stages.matched;
  const gain = matched.stage.low.differentialGain.re;
  const base = outputDifferenceV(matched.op);
  return stages.plus.map((s, i) => -(outputDifferenceV(s.op) - base) / (MISMATCH_STEPS[i] * gain));
}

/**
 * Supply rejection from one rail to a differential output of a matched design: the mismatches
 * turn the rail's common push into a difference, to first order Σ (∂A_rail/∂xᵢ)·xᵢ; at the
 * worst-case extremes every term adds in magnitude, as the differential CMRR's worst case does.
 */
function differentialPsrrWorstCaseDb(stages: ScreeningStages, rail: 'positive' | 'negative', worst: readonly number[]): number {
  const { matched } = stages;
  const between = matched.stage.outputs.betweenCollectors;
  const base = readOutput(matched.stage.supply[rail], between);
  let leak = Math.abs(base);
  stages.plus.forEach((s, i) => {
    leak += Math.abs((readOutput(s.stage.supply[rail], between) - base) / MISMATCH_STEPS[i]) * Math.abs(worst[i]);
  });
  return 20 * Math.log10(Math.abs(matched.stage.low.differentialGain.re) / leak);
}

/**
 * The trade-off figures of one condition's solution. `screening`: its screening solves when the
 * caller made them (a differential output); made here when a target needs them.
 * `linearRangeHintV`: the linear range at a nearby condition, where its search starts.
 */
export function tradeoffAtCondition(
  spec: Spec,
  label: string,
  solution: SolvedCircuit & { result: { inputBiasCurrentA: number; psrrDb: { positive: { singleEnded: number }; negative: { singleEnded: number } } } },
  screening: ScreeningStages | null,
  sigmas: MismatchSigmas,
  only?: keyof Omit<TradeoffAtCondition, 'label'>,
  except?: keyof Omit<TradeoffAtCondition, 'label'>,
  linearRangeHintV: number | null = null,
): TradeoffAtCondition {
  const targets = tradeoffTargets(spec);
  const want = (key: keyof Omit<TradeoffAtCondition, 'label'>) => (only === undefined || only === key) && key !== except;
  const differential = spec.gain.output === 'differential';
  const temperatureC = solution.design.temperatureC ?? 27;
  const psrrSet = (targets.psrrPositive && want('psrrPositiveDb')) || (targets.psrrNegative && want('psrrNegativeDb'));
  const offsetWanted = needsOffset(targets) && want('offsetPerMismatchV');
  const needsScreening = offsetWanted || (differential && psrrSet);
  const stages = needsScreening ? (screening ?? screeningStages(solution)) : null;
  const worst = worstCaseMismatches(sigmas, solution.model.thermalVoltageV);
  const psrr = (rail: 'positive' | 'negative', set: boolean): number | null => {
    if (!set) return null;
    return differential ? differentialPsrrWorstCaseDb(stages!, rail, worst) : solution.result.psrrDb[rail].singleEnded;
  };
  let noiseVPerRtHz: number | null = null;
  if (targets.noise && want('noiseVPerRtHz')) noiseVPerRtHz = inputNoiseVPerRtHz(stageNoise(solution.op, solution.model, temperatureC), solution.stage, spec.noise!.atFrequencyHz!);
  const operatingPoint = { model: solution.model, op: solution.op, driveNodes: solution.stage.driveNodes };
  return {
    label,
    inputBiasCurrentA: targets.inputBias && want('inputBiasCurrentA') ? solution.result.inputBiasCurrentA : null,
    noiseVPerRtHz,
    bandwidthHz: targets.bandwidth && want('bandwidthHz') ? differentialBandwidthHzOf(solution.stage) : null,
    psrrPositiveDb: psrr('positive', targets.psrrPositive && want('psrrPositiveDb')),
    psrrNegativeDb: psrr('negative', targets.psrrNegative && want('psrrNegativeDb')),
    linearInputRangeV: targets.linearRange && want('linearInputRangeV') ? linearInputRangeV(solution.design, operatingPoint, solution.stage.low.differentialGain.re, linearRangeHintV) : null,
    // the transient's own failure (null) counts as no slew at all: the check then fails
    slewRateVPerS: targets.slewRate && want('slewRateVPerS') ? (solvedSlewRateVPerS(solution) ?? 0) : null,
    offsetPerMismatchV: stages && offsetWanted ? offsetSensitivitiesV(stages) : null,
  };
}

/**
 * The standard deviation of mismatch k as the Monte Carlo draws it (monteCarloSample): the load
 * ratio of two resistors each with σ = tolerance/3, about √2·tolerance/3; δ = exp(ΔVBE/VT) − 1,
 * about σVBE/VT; BF and VAF as given.
 */
export function mismatchSpread(sigmas: MismatchSigmas, thermalVoltageV: number, k: number): number {
  return [(Math.SQRT2 * sigmas.resistorTolerance) / 3, sigmas.vbeSigmaV / thermalVoltageV, sigmas.betaSigma, sigmas.earlyVoltageSigma][k];
}

/** The spread (one standard deviation) of each mismatch xᵢ the Monte Carlo draws, MISMATCH_KINDS order. */
function mismatchSpreads(draws: MonteCarloDraws, sigmas: MismatchSigmas, thermalVoltageV: number): number[] {
  const sums = MISMATCH_KINDS.map(() => 0);
  const x = [0, 0, 0, 0];
  for (let k = 0; k < draws.samples; k += 1) {
    sampleMismatchesInto(draws, k, sigmas, thermalVoltageV, x);
    for (let i = 0; i < x.length; i += 1) sums[i] += x[i] * x[i];
  }
  return sums.map((s) => Math.sqrt(s / draws.samples));
}

/** A statistical offset (or drift): the Monte Carlo's standard deviation, that times the spec's sigmas, and the worst case. */
export interface OffsetStatistics {
  /** Standard deviation over the Monte Carlo draws. */
  sigma: number;
  /** `sigmas` × the standard deviation: the figure judged. */
  atSigmas: number;
  /** Every mismatch at `sigmas` standard deviations, each adding in magnitude. */
  worstCase: number;
}

/**
 * The distribution of Σ sᵢ·xᵢ over the draws (mean removed: the draws are zero-mean), and the
 * worst case Σ |sᵢ|·sigmas·σᵢ with σᵢ each mismatch's spread over the same draws.
 */
export function offsetStatistics(perMismatch: readonly number[], draws: MonteCarloDraws, sigmas: MismatchSigmas, thermalVoltageV: number, sigmaCount: number): OffsetStatistics {
  let sum = 0;
  let sumSquares = 0;
  const x = [0, 0, 0, 0];
  for (let k = 0; k < draws.samples; k += 1) {
    sampleMismatchesInto(draws, k, sigmas, thermalVoltageV, x);
    let value = 0;
    for (let i = 0; i < perMismatch.length; i += 1) value += perMismatch[i] * x[i];
    sum += value;
    sumSquares += value * value;
  }
  const mean = sum / draws.samples;
  const sigma = Math.sqrt(Math.max(sumSquares / draws.samples - mean * mean, 0));
  const spreads = mismatchSpreads(draws, sigmas, thermalVoltageV);
  const worstCase = perMismatch.reduce((total, s, i) => total + Math.abs(s) * sigmaCount * spreads[i], 0);
  return { sigma, atSigmas: sigmaCount * sigma, worstCase };
}

/**
 * The offset's drift per unit of each mismatch at a condition, V/°C: the offset sensitivities at
 * T + 1 °C and T − 1 °C (screening solves of the same design there), differenced over 2 °C.
 */
export function driftSensitivitiesVPerC(solution: SolvedCircuit): number[] {
  const at = (deltaC: number) => {
    const design = { ...solution.design, temperatureC: (solution.design.temperatureC ?? 27) + deltaC };
    return offsetSensitivitiesV(screeningStages(solveCircuit(design, solution)));
  };
  const above = at(1);
  const below = at(-1);
  return above.map((a, i) => (a - below[i]) / 2);
}

/** The facts of the trade-off targets (OptionFacts' fields of that name); null and '' where a target is left out. */
export type TradeoffFacts = Pick<
  OptionFacts,
  | 'noiseTargetSet' | 'noiseVPerRtHz' | 'noiseMaxVPerRtHz' | 'noiseFrequencyHz' | 'noiseMarginVPerRtHz' | 'noiseCorner'
  | 'inputBiasTargetSet' | 'inputBiasCurrentWorstA' | 'inputBiasCurrentMaxA' | 'inputBiasCurrentMarginA' | 'inputBiasCorner'
  | 'offsetTargetSet' | 'offsetAtSigmasV' | 'offsetWorstCaseV' | 'offsetMaxV' | 'offsetMarginV' | 'offsetSigmas' | 'offsetCorner'
  | 'driftTargetSet' | 'offsetDriftAtSigmasVPerC' | 'offsetDriftWorstCaseVPerC' | 'offsetDriftMaxVPerC' | 'offsetDriftMarginVPerC'
  | 'bandwidthTargetSet' | 'bandwidthWorstHz' | 'bandwidthMinHz' | 'bandwidthMarginHz' | 'bandwidthCorner'
  | 'psrrPositiveTargetSet' | 'psrrPositiveDb' | 'psrrPositiveMinDb' | 'psrrPositiveMarginDb' | 'psrrPositiveCorner'
  | 'psrrNegativeTargetSet' | 'psrrNegativeDb' | 'psrrNegativeMinDb' | 'psrrNegativeMarginDb' | 'psrrNegativeCorner'
  | 'linearRangeTargetSet' | 'linearInputRangeWorstV' | 'linearInputRangeMinV' | 'linearInputRangeMarginV' | 'linearRangeCorner'
  | 'slewRateTargetSet' | 'slewRateWorstVPerS' | 'slewRateMinVPerS' | 'slewRateMarginVPerS' | 'slewRateCorner'
>;

/** The condition where a figure is worst (largest when `largestIsWorst`), skipping nulls; a null figure counts as `nullAs`. */
function worstOf(conditions: readonly ConditionEntry[], figure: (c: ConditionEntry) => number | null | undefined, largestIsWorst: boolean, nullAs: number): { value: number; label: string } {
  let best: { value: number; label: string } | null = null;
  for (const c of conditions) {
    const raw = figure(c);
    // undefined: not computed at this condition (a searched corner holds only its own figure)
    if (raw === undefined) continue;
    const value = raw ?? nullAs;
    if (!best || (largestIsWorst ? value > best.value : value < best.value)) best = { value, label: c.label };
  }
  return best!;
}

/** A condition's trade-off figures: every figure at a base corner, only its own at a searched one (the others undefined). */
export type ConditionEntry = Partial<TradeoffAtCondition> & { label: string };

/** A bandwidth above the corner searches' top counts as that top, Hz (the figure is "above 10 GHz"). */
const BANDWIDTH_CEILING_HZ = 1e10;

/** The statistical offset and drift, with the condition that governs the offset. */
export interface OffsetFigures {
  offset: OffsetStatistics;
  drift: OffsetStatistics | null;
  label: string;
}

/**
 * The trade-off facts from every condition's figures: each target's figure at the condition
 * where it is worst, that condition's label, and the margin (positive when the target is met).
 */
export function tradeoffFacts(spec: Spec, conditions: readonly ConditionEntry[], offset: OffsetFigures | null): TradeoffFacts {
  const targets = tradeoffTargets(spec);
  const railSpanV = spec.supply.positiveV - spec.supply.negativeV;
  const noise = targets.noise ? worstOf(conditions, (c) => c.noiseVPerRtHz, true, Number.POSITIVE_INFINITY) : null;
  const bias = targets.inputBias ? worstOf(conditions, (c) => c.inputBiasCurrentA, true, Number.POSITIVE_INFINITY) : null;
  const bandwidth = targets.bandwidth ? worstOf(conditions, (c) => c.bandwidthHz, false, BANDWIDTH_CEILING_HZ) : null;
  const psrrPositive = targets.psrrPositive ? worstOf(conditions, (c) => c.psrrPositiveDb, false, Number.POSITIVE_INFINITY) : null;
  const psrrNegative = targets.psrrNegative ? worstOf(conditions, (c) => c.psrrNegativeDb, false, Number.POSITIVE_INFINITY) : null;
  // a transfer linear to 1 % over twice the rails' span counts as that span
  const linear = targets.linearRange ? worstOf(conditions, (c) => c.linearInputRangeV, false, 2 * railSpanV) : null;
  const slew = targets.slewRate ? worstOf(conditions, (c) => c.slewRateVPerS, false, 0) : null;
  const offsetMaxV = spec.offset?.maxV ?? null;
  const driftMaxVPerC = spec.offset?.driftMaxVPerC ?? null;
  return {
    noiseTargetSet: targets.noise,
    noiseVPerRtHz: noise?.value ?? null,
    noiseMaxVPerRtHz: spec.noise?.maxVPerRtHz ?? null,
    noiseFrequencyHz: spec.noise?.atFrequencyHz ?? null,
    noiseMarginVPerRtHz: noise ? spec.noise!.maxVPerRtHz! - noise.value : null,
    noiseCorner: noise?.label ?? '',
    inputBiasTargetSet: targets.inputBias,
    inputBiasCurrentWorstA: bias?.value ?? null,
    inputBiasCurrentMaxA: spec.inputBiasCurrentMaxA ?? null,
    inputBiasCurrentMarginA: bias ? spec.inputBiasCurrentMaxA! - bias.value : null,
    inputBiasCorner: bias?.label ?? '',
    offsetTargetSet: targets.offset,
    offsetAtSigmasV: offset ? offset.offset.atSigmas : null,
    offsetWorstCaseV: offset ? offset.offset.worstCase : null,
    offsetMaxV,
    offsetMarginV: offset && offsetMaxV !== null ? offsetMaxV - offset.offset.atSigmas : null,
    offsetSigmas: spec.offset?.sigmas ?? null,
    offsetCorner: offset?.label ?? '',
    driftTargetSet: targets.drift,
    offsetDriftAtSigmasVPerC: offset?.drift ? offset.drift.atSigmas : null,
    offsetDriftWorstCaseVPerC: offset?.drift ? offset.drift.worstCase : null,
    offsetDriftMaxVPerC: driftMaxVPerC,
    offsetDriftMarginVPerC: offset?.drift && driftMaxVPerC !== null ? driftMaxVPerC - offset.drift.atSigmas : null,
    bandwidthTargetSet: targets.bandwidth,
    bandwidthWorstHz: bandwidth?.value ?? null,
    bandwidthMinHz: spec.bandwidthMinHz ?? null,
    bandwidthMarginHz: bandwidth ? bandwidth.value - spec.bandwidthMinHz! : null,
    bandwidthCorner: bandwidth?.label ?? '',
    psrrPositiveTargetSet: targets.psrrPositive,
    psrrPositiveDb: psrrPositive?.value ?? null,
    psrrPositiveMinDb: spec.psrrMinDb?.positive ?? null,
    psrrPositiveMarginDb: psrrPositive ? psrrPositive.value - spec.psrrMinDb!.positive! : null,
    psrrPositiveCorner: psrrPositive?.label ?? '',
    psrrNegativeTargetSet: targets.psrrNegative,
    psrrNegativeDb: psrrNegative?.value ?? null,
    psrrNegativeMinDb: spec.psrrMinDb?.negative ?? null,
    psrrNegativeMarginDb: psrrNegative ? psrrNegative.value - spec.psrrMinDb!.negative! : null,
    psrrNegativeCorner: psrrNegative?.label ?? '',
    linearRangeTargetSet: targets.linearRange,
    linearInputRangeWorstV: linear?.value ?? null,
    linearInputRangeMinV: spec.linearInputRangeMinV ?? null,
    linearInputRangeMarginV: linear ? linear.value - spec.linearInputRangeMinV! : null,
    linearRangeCorner: linear?.label ?? '',
    slewRateTargetSet: targets.slewRate,
    slewRateWorstVPerS: slew?.value ?? null,
    slewRateMinVPerS: spec.slewRateMinVPerS ?? null,
    slewRateMarginVPerS: slew ? slew.value - spec.slewRateMinVPerS! : null,
    slewRateCorner: slew?.label ?? '',
  };
}
