/**
 * Public shapes of the engine: the `analyze` input (a fully sized design), its output, and the
 * `recommend` output. These are the command line's public interface (ENGINE-CONTRACT.md):
 * fields may be added, never renamed. Every quantity is SI; names carry their unit.
 */
import type { Spec } from '../schema/spec.generated';

/** Tail topologies (ids in order of simplicity, the tail's design type): the catalogue, topologies.ts. */
export { TOPOLOGIES, type TailDesign, type TopologyId } from './topologies';
import type { TopologyId } from './topologies';

/**
 * `Design` (the `analyze` input: one fully sized emitter-coupled pair with its tail; its tail is a
 * TailDesign of the catalogue, whose branches the design schema is written from) and its parts
 * are generated from shared/schema/design.schema.json (scripts/generate-types.ts): every quantity
 * SI, the documented defaults (collectorMismatch, pairEmitterResistanceOhm,
 * pairSaturationCurrentMismatch, inputCommonModeV 0, temperatureC 27, tailCapacitanceF 0) applied
 * by the engine where a field is absent.
 */
export type { Design, DeviceParams, Supply } from '../schema/design.generated';

export type Region = 'forward-active' | 'saturated' | 'cut-off';

/** Operating point of one transistor (added field of the analyze output). */
export interface TransistorOperatingPoint {
  name: string;
  collectorCurrentA: number;
  baseCurrentA: number;
  vbeV: number;
  vceV: number;
  vcbV: number;
  /**
   * Saturated when its current gain is more than 5 % below the forward-active value, cut off when
   * its base–emitter junction drives under 0.1 nA (analyze.ts, docs/device-and-formulas.md).
   */
  region: Region;
  /** 1 − hfe/β0: how far the small-signal current gain has fallen below its forward-active value (a fraction). */
  currentGainLossFraction: number;
}

/** One `ac` entry of the analyze output: gains as magnitudes at that frequency, definitions as at low frequency. */
export interface AcEntry {
  frequencyHz: number;
  differentialGain: number;
  singleEndedGain: number;
  commonModeGain: number;
  differentialCommonModeGain: number;
  cmrrDb: { singleEnded: number; differential: number | null };
  /**
   * Input-referred noise density, V/√Hz: the output noise density at v(c1) − v(c2) over
   * |differentialGain|² at this frequency, square-rooted, as ngspice's `.noise v(c1,c2)` on the
   * differential drive (shared/engine/noise.ts); null only where that gain is zero.
   */
  inputNoiseVPerRtHz: number | null;
}

/** Supply rejection from one rail, dB: single-ended (to c1) and differential (to c1 − c2, null where that gain is zero). */
export interface RailRejection {
  singleEnded: number;
  differential: number | null;
}

export interface AnalyzeResult {
  tailCurrentA: number;
  collectorCurrentA: number;
  collectorVoltageV: number;
  tailNodeVoltageV: number;
  transconductanceS: number;
  tailOutputResistanceOhm: number;
  differentialGain: number;
  singleEndedGain: number;
  commonModeGain: number;
  differentialCommonModeGain: number;
  cmrrDb: { singleEnded: number; differential: number | null };
  /** Frequency where the single-ended CMRR has fallen 3 dB, from the whole circuit; null when nothing limits it below 10 GHz. */
  cmrrCornerHz: number | null;
  /** Lowest frequency where |differentialGain| is 3 dB below its low-frequency value; null above 10 GHz. */
  differentialBandwidthHz: number | null;
  /**
   * Largest |d v(c1,c2)/dt| after the differential drive steps from −1 V to +1 V in 1 ns, V/s,
   * from a transient solve of the stage (slew-rate.ts); null when that solve does not converge.
   */
  slewRateVPerS: number | null;
  /** One entry per `frequenciesHz` of the design. */
  ac: AcEntry[];
  /** Mean of the DC currents the drive sends into in1 and in2, A. */
  inputBiasCurrentA: number;
  /** DC current into in1 minus into in2 with the input offset voltage applied, A. */
  inputOffsetCurrentA: number;
  /** The differential DC input (v(in1) − v(in2), at the drive) that makes v(c1) = v(c2), V. */
  inputOffsetVoltageV: number;
  /** (offset at T + 1 °C − offset at T − 1 °C)/2, V/°C. */
  offsetDriftVPerC: number;
  /**
   * On the design without its mismatches: the largest differential DC amplitude at which
   * v(c1,c2) stays within 1 % of differentialGain × input, V; null when it stays within 1 % up
   * to twice the rails' span, or when an operating point on the way cannot be solved.
   */
  linearInputRangeV: number | null;
  /** Supply rejection from each rail at low frequency, dB: |gain| over the gain from the rail to v(c1) (single-ended) or v(c1,c2) (differential); null where that gain is zero. */
  psrrDb: { positive: RailRejection; negative: RailRejection };
  /** Small-signal differential input resistance seen by the drive at low frequency (source resistors excluded), ohms. */
  inputResistanceOhm: number;
  powerW: number;
  warnings: string[];
  /** Added: the textbook limit of the tail's output resistance and its formula. */
  tailOutputResistanceClosedForm: { valueOhm: number | null; formula: string };
  /** Added: every transistor's operating point. */
  transistors: TransistorOperatingPoint[];
  /** Added: Q2's collector voltage, volts. */
  collector2VoltageV: number;
  /** Added: current drawn by reference branches (mirror inputs), amperes. */
  referenceCurrentA: number;
  /** Added: VCE − VCE(sat) of the tail's output transistor (collector at t); V(t) − V− for a resistor, volts. */
  tailComplianceMarginV: number;
  /** Added: Q1/Q2 smallest VCE − VCE(sat), volts. */
  pairSaturationMarginV: number;
  /** Added: the warnings that are about the operating point (a transistor saturated or cut off). */
  operatingPointProblems: string[];
}

export type Severity = 'blocking' | 'advisory';
/** How a rule counts: blocking and advisory as their severity; a caution is advisory, a hazard repeated for every option. */
export type RuleKind = Severity | 'caution';

/** The severity a rule of this kind gives its checks. */
export function severityOfKind(kind: RuleKind): Severity {
  return kind === 'blocking' ? 'blocking' : 'advisory';
}

/** What a rule file says about its check besides the decision (rules/<rule-id>.json), carried on each check. */
export interface RuleMeta {
  rule: string;
  /** Short readable name, e.g. "Power budget". */
  title: string;
  kind: RuleKind;
  /** The fact holding the figure the rule judges; null when it judges a spec flag. */
  figure: keyof OptionFacts | null;
}

export interface Check {
  rule: string;
  passed: boolean;
  severity: Severity;
  reason: string;
  /** Added: the rule's readable name (absent on checks stored before rule files carried it). */
  title?: string;
  /** Added: the rule's kind (absent on checks stored before rule files carried it). */
  kind?: RuleKind;
  /** Added: the fact holding the figure the rule judges, or null (absent on checks stored before rule files carried it). */
  figure?: keyof OptionFacts | null;
  /** Added: the margin the rule compared, in the unit named by `marginUnit`. */
  margin?: number | null;
  marginUnit?: string;
  /** Added: false when the check does not apply to this option (it then passes). */
  applicable?: boolean;
  /** Added: false when the option could not be solved, so the rule could not be decided (it then fails). */
  evaluated?: boolean;
  /** Added: the check passes by less than its rule's `thinMarginBelow` (e.g. a rejection under 1 dB above target). */
  thinMargin?: boolean;
}

export type ResistorSeries = Spec['resistors']['series'];
export type OutputKind = Spec['gain']['output'];
export type SelectionPolicy = Spec['policy'];

/**
 * A requirement spec after schema validation (defaults applied, so every defaulted field is
 * present), generated from shared/schema/spec.schema.json (scripts/generate-types.ts).
 * `resistors.tolerancePercent` is in per cent: 1 means ±1 % (engine code takes `resistorToleranceFraction(spec)`).
 */
export type { Spec } from '../schema/spec.generated';

/**
 * The facts one option's checks are decided on: the engine's figures, worst corner already
 * taken and margins already computed, so rules only compare (rules/README in DEVELOPERS.md).
 * Margins are "how far on the good side", negative when failing.
 */
export interface OptionFacts {
  topology: TopologyId;
  output: OutputKind;
  isDifferentialOutput: boolean;
  isResistorTail: boolean;
  /** Single-ended (tail-limited) rejection at the spec frequency, worst corner, dB. */
  cmrrAtFrequencyDb: number;
  cmrrFrequencyHz: number;
  cmrrRequiredDb: number;
  cmrrMarginRequiredDb: number;
  /** cmrrAtFrequencyDb − (cmrrRequiredDb + cmrrMarginRequiredDb). */
  cmrrMarginDb: number;
  /**
   * The rejection of the output the spec names, at the spec frequency: the single-ended
   * (tail-limited) CMRR at the worst corner for a single-ended output, the mismatch-limited
   * worst case for a differential one, dB (what the rejection target judges).
   */
  outputCmrrDb: number;
  /** outputCmrrDb − (cmrrRequiredDb + cmrrMarginRequiredDb). */
  outputCmrrMarginDb: number;
  /** Which figure outputCmrrDb is and where it was taken, in words (written at the edge). */
  outputCmrrBasis: string;
  /**
   * The common mode each collector still carries at the spec frequency, |commonModeGain| (V/V),
   * at the corner where it is largest against the differential gain.
   */
  outputCommonModeGain: number;
  /** 20·log10|differentialGain / commonModeGain| at the spec frequency, at that corner, dB. */
  outputCommonModeRejectionDb: number;
  /** outputCommonModeRejectionDb − cmrrRequiredDb. */
  outputCommonModeMarginDb: number;
  /** The corner of outputCommonModeGain. */
  outputCommonModeCorner: string;
  worstCmrrCorner: string;
  /** Differential output only (null otherwise): mismatch-limited worst case at the spec frequency. */
  cmrrDifferentialWorstCaseDb: number | null;
  /** cmrrDifferentialWorstCaseDb − cmrrRequiredDb (null when single-ended). */
  cmrrDifferentialWorstCaseMarginDb: number | null;
  /**
   * What sets the differential worst case (each mismatch's share), and, above 120 dB, that the
   * figure is limited only by the model; empty when single-ended.
   */
  cmrrDifferentialLimitNote: string;
  /** Monte Carlo yield against cmrrRequiredDb, per cent (null when single-ended). */
  monteCarloYieldPercent: number | null;
  monteCarloSamples: number;
  requiredYieldPercent: number;
  /** monteCarloYieldPercent − requiredYieldPercent (null when single-ended). */
  yieldMarginPercent: number | null;
  /** Gain at nominal conditions for the spec's output kind, magnitude, V/V. */
  gainPredicted: number;
  gainTarget: number;
  gainErrorPercent: number;
  gainTolerancePercent: number;
  /** gainTolerancePercent − |gainErrorPercent|. */
  gainMarginPercent: number;
  /** Largest gain error over the four corners, per cent of the target (signed), and where. */
  gainWorstCornerErrorPercent: number;
  gainWorstCorner: string;
  /** gainTolerancePercent − |gainWorstCornerErrorPercent|. */
  gainOverConditionsMarginPercent: number;
  /** What moves the gain most at the governing corner: "temperature" or "input common mode". */
  gainOverConditionsCause: string;
  /** Plain words for what would hold the gain over the range, for that cause and tail. */
  gainOverConditionsRemedy: string;
  /**
   * Headroom at the lowest input common-mode voltage (worst temperature), V: an NPN stage's tail
   * compliance; a PNP stage's pair out of saturation with the swing's positive peak (the mirror image).
   */
  icmLowMarginV: number;
  icmLowV: number;
  /** Which headroom that is, in words ("the tail source's compliance headroom"), and what a shortfall means. */
  icmLowHeadroom: string;
  icmLowShortfall: string;
  /**
   * Headroom at the highest input common-mode voltage (worst temperature), V: an NPN stage's pair
   * out of saturation with the swing's negative peak; a PNP stage's tail compliance.
   */
  icmHighMarginV: number;
  icmHighV: number;
  icmHighHeadroom: string;
  icmHighShortfall: string;
  /** Output swing margin at nominal input common mode: min of upward and downward room, V. */
  swingMarginV: number;
  swingPeakPerCollectorV: number;
  outputSwingVpp: number;
  /**
   * The swing's peak (half of outputSwingVpp, on the spec's output) on the pair's large-signal
   * transfer at nominal: gain compression there, 1 − peak/(|A|·input), per cent (100 when the
   * output cannot reach the peak), its limit and the margin, limit − compression.
   */
  swingCompressionPercent: number;
  swingCompressionLimitPercent: number;
  swingCompressionMarginPercent: number;
  /** Differential input that reaches the peak, V (null when none does), and what the small-signal gain predicts. */
  swingPeakInputV: number | null;
  swingLinearInputV: number;

  /** Highest supply power over the corners, W. */
  powerWorstW: number;
  powerBudgetW: number;
  powerMarginW: number;
  /** Tail-current change over the temperature range, per cent of the nominal. */
  tailCurrentDriftPercent: number;
  /** What the drift is measured against: '' (the current itself), or the PTAT law's words for a PTAT tail. */
  tailCurrentDriftBasis: string;
  tailCurrentDriftLimitPercent: number;
  tailCurrentDriftMarginPercent: number;
  temperatureMinC: number;
  temperatureMaxC: number;
  /** Gain change between the input common-mode extremes, per cent of nominal. */
  gainVsCommonModePercent: number;
  gainVsCommonModeLimitPercent: number;
  gainVsCommonModeMarginPercent: number;
  /** Rail span |V+ − V−| and the usual safe-to-touch limit [IEC62368]. */
  railSpanV: number;
  hazardousVoltageLimitV: number;
  /** hazardousVoltageLimitV − railSpanV. */
  hazardousVoltageMarginV: number;
  patientConnected: boolean;
  mainsReferenced: boolean;
  /** Transistors saturated or cut off at any corner (names with corner), empty when none. */
  operatingPointProblems: string[];
  operatingPointProblemCount: number;
  /** Tail output resistance at the spec frequency |Rout ∥ 1/(jωCt)|, ohms, and its textbook limit. */
  tailImpedanceAtFrequencyOhm: number;
  tailOutputResistanceOhm: number;
  tailOutputResistanceClosedFormOhm: number | null;
  tailOutputResistanceFormula: string;
  /** One sentence: the solved Rout beside its textbook limit, e.g. "5.48 MΩ by node analysis (textbook β·ro/2 ≈ 5.29 MΩ)". */
  tailOutputResistanceNote: string;
  /**
   * The trade-off targets (shared/engine/tradeoff-figures.ts): for each, whether the spec sets it,
   * the figure at the condition where it is worst, the target, the margin (positive: met) and
   * that condition's label; null and '' where the target is left out.
   */
  noiseTargetSet: boolean;
  /** Input-referred noise density at the spec's frequency, V/√Hz. */
  noiseVPerRtHz: number | null;
  noiseMaxVPerRtHz: number | null;
  noiseFrequencyHz: number | null;
  noiseMarginVPerRtHz: number | null;
  noiseCorner: string;
  inputBiasTargetSet: boolean;
  /** Mean DC current into the inputs, A. */
  inputBiasCurrentWorstA: number | null;
  inputBiasCurrentMaxA: number | null;
  inputBiasCurrentMarginA: number | null;
  inputBiasCorner: string;
  offsetTargetSet: boolean;
  /** The statistical input offset: `offsetSigmas` × its standard deviation over the Monte Carlo draws, V. */
  offsetAtSigmasV: number | null;
  /** Every mismatch at `offsetSigmas` standard deviations, adding in magnitude, V. */
  offsetWorstCaseV: number | null;
  offsetMaxV: number | null;
  offsetMarginV: number | null;
  offsetSigmas: number | null;
  offsetCorner: string;
  driftTargetSet: boolean;
  /** The offset's drift at `offsetSigmas` standard deviations, and its worst case, V/°C (at the offset's corner). */
  offsetDriftAtSigmasVPerC: number | null;
  offsetDriftWorstCaseVPerC: number | null;
  offsetDriftMaxVPerC: number | null;
  offsetDriftMarginVPerC: number | null;
  bandwidthTargetSet: boolean;
  /** Differential bandwidth into the spec's load capacitance, Hz (10 GHz when above it). */
  bandwidthWorstHz: number | null;
  bandwidthMinHz: number | null;
  bandwidthMarginHz: number | null;
  bandwidthCorner: string;
  psrrPositiveTargetSet: boolean;
  /** Supply rejection of the positive rail for the spec's output (a differential output: its mismatch worst case), dB. */
  psrrPositiveDb: number | null;
  psrrPositiveMinDb: number | null;
  psrrPositiveMarginDb: number | null;
  psrrPositiveCorner: string;
  psrrNegativeTargetSet: boolean;
  psrrNegativeDb: number | null;
  psrrNegativeMinDb: number | null;
  psrrNegativeMarginDb: number | null;
  psrrNegativeCorner: string;
  linearRangeTargetSet: boolean;
  /** Linear input range (1 % from the gain line), V (twice the rails' span when beyond it). */
  linearInputRangeWorstV: number | null;
  linearInputRangeMinV: number | null;
  linearInputRangeMarginV: number | null;
  linearRangeCorner: string;
  slewRateTargetSet: boolean;
  /** The largest rate of change of v(c1,c2) after the contract's −1 V → +1 V input step, V/s. */
  slewRateWorstVPerS: number | null;
  slewRateMinVPerS: number | null;
  slewRateMarginVPerS: number | null;
  slewRateCorner: string;
  /** Whether the spec sets a target that bounds the tail current (sizing picked it inside a window: current-window.ts). */
  tailCurrentWindowSet: boolean;
  /** Whether the window is empty: a floor above a ceiling. */
  tailCurrentWindowEmpty: boolean;
  /** The current the option was sized at, and the window around it, in words (the bounds and the requirement behind each). */
  tailCurrentWindowNote: string;
}

/** A rule set as the engine sees it: a version, its rules, and an evaluator (rules/ provides it). */
export interface RuleSet {
  version: string;
  /** Every rule's id, severity and metadata, sorted by id (what an unsolvable option reports as not evaluated). */
  rules: (RuleMeta & { severity: Severity })[];
  evaluate(facts: OptionFacts): Promise<Check[]>;
}
