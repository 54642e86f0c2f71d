import type { OptionFacts } from '#shared/engine/types';

/** The value shape of a fact, as far as rule conditions and reason templates care. */
export type FactKind = 'number' | 'number-or-null' | 'boolean' | 'text' | 'text-list';

/** The kind a field's TypeScript type calls for (never for a type no template can print). */
type KindOf<T> = [T] extends [boolean]
  ? 'boolean'
  : [T] extends [number]
    ? 'number'
    : [T] extends [number | null]
      ? 'number-or-null'
      : [T] extends [readonly string[]]
        ? 'text-list'
        : [T] extends [string]
          ? 'text'
          : never;

/**
 * Every OptionFacts field and its kind, checked against its type: adding or retyping a fact in
 * shared/engine/types.ts fails the type check here until this table follows. The loader uses it
 * to reject a rule that names an unknown fact or formats one the wrong way.
 */
export const FACT_KINDS: { readonly [K in keyof OptionFacts]-?: KindOf<OptionFacts[K]> & FactKind } = {
  topology: 'text',
  output: 'text',
  isDifferentialOutput: 'boolean',
  isResistorTail: 'boolean',
  cmrrAtFrequencyDb: 'number',
  cmrrFrequencyHz: 'number',
  cmrrRequiredDb: 'number',
  cmrrMarginRequiredDb: 'number',
  cmrrMarginDb: 'number',
  worstCmrrCorner: 'text',
  outputCmrrDb: 'number',
  outputCmrrMarginDb: 'number',
  outputCmrrBasis: 'text',
  outputCommonModeGain: 'number',
  outputCommonModeRejectionDb: 'number',
  outputCommonModeMarginDb: 'number',
  outputCommonModeCorner: 'text',
  cmrrDifferentialWorstCaseDb: 'number-or-null',
  cmrrDifferentialWorstCaseMarginDb: 'number-or-null',
  cmrrDifferentialLimitNote: 'text',
  monteCarloYieldPercent: 'number-or-null',
  monteCarloSamples: 'number',
  requiredYieldPercent: 'number',
  yieldMarginPercent: 'number-or-null',
  gainPredicted: 'number',
  gainTarget: 'number',
  gainErrorPercent: 'number',
  gainTolerancePercent: 'number',
  gainMarginPercent: 'number',
  gainWorstCornerErrorPercent: 'number',
  gainWorstCorner: 'text',
  gainOverConditionsMarginPercent: 'number',
  gainOverConditionsCause: 'text',
  gainOverConditionsRemedy: 'text',
  icmLowMarginV: 'number',
  icmLowV: 'number',
  icmLowHeadroom: 'text',
  icmLowShortfall: 'text',
  icmHighMarginV: 'number',
  icmHighV: 'number',
  icmHighHeadroom: 'text',
  icmHighShortfall: 'text',
  swingMarginV: 'number',
  swingPeakPerCollectorV: 'number',
  outputSwingVpp: 'number',
  swingCompressionPercent: 'number',
  swingCompressionLimitPercent: 'number',
  swingCompressionMarginPercent: 'number',
  swingPeakInputV: 'number-or-null',
  swingLinearInputV: 'number',
  powerWorstW: 'number',
  powerBudgetW: 'number',
  powerMarginW: 'number',
  tailCurrentDriftBasis: 'text',
  tailCurrentDriftPercent: 'number',
  tailCurrentDriftLimitPercent: 'number',
  tailCurrentDriftMarginPercent: 'number',
  temperatureMinC: 'number',
  temperatureMaxC: 'number',
  gainVsCommonModePercent: 'number',
  gainVsCommonModeLimitPercent: 'number',
  gainVsCommonModeMarginPercent: 'number',
  railSpanV: 'number',
  hazardousVoltageLimitV: 'number',
  hazardousVoltageMarginV: 'number',
  patientConnected: 'boolean',
  mainsReferenced: 'boolean',
  operatingPointProblems: 'text-list',
  operatingPointProblemCount: 'number',
  tailImpedanceAtFrequencyOhm: 'number',
  tailOutputResistanceOhm: 'number',
  tailOutputResistanceClosedFormOhm: 'number-or-null',
  tailOutputResistanceFormula: 'text',
  noiseTargetSet: 'boolean',
  noiseVPerRtHz: 'number-or-null',
  noiseMaxVPerRtHz: 'number-or-null',
  noiseFrequencyHz: 'number-or-null',
  noiseMarginVPerRtHz: 'number-or-null',
  noiseCorner: 'text',
  inputBiasTargetSet: 'boolean',
  inputBiasCurrentWorstA: 'number-or-null',
  inputBiasCurrentMaxA: 'number-or-null',
  inputBiasCurrentMarginA: 'number-or-null',
  inputBiasCorner: 'text',
  offsetTargetSet: 'boolean',
  offsetAtSigmasV: 'number-or-null',
  offsetWorstCaseV: 'number-or-null',
  offsetMaxV: 'number-or-null',
  offsetMarginV: 'number-or-null',
  offsetSigmas: 'number-or-null',
  offsetCorner: 'text',
  driftTargetSet: 'boolean',
  offsetDriftAtSigmasVPerC: 'number-or-null',
  offsetDriftWorstCaseVPerC: 'number-or-null',
  offsetDriftMaxVPerC: 'number-or-null',
  offsetDriftMarginVPerC: 'number-or-null',
  bandwidthTargetSet: 'boolean',
  bandwidthWorstHz: 'number-or-null',
  bandwidthMinHz: 'number-or-null',
  bandwidthMarginHz: 'number-or-null',
  bandwidthCorner: 'text',
  psrrPositiveTargetSet: 'boolean',
  psrrPositiveDb: 'number-or-null',
  psrrPositiveMinDb: 'number-or-null',
  psrrPositiveMarginDb: 'number-or-null',
  psrrPositiveCorner: 'text',
  psrrNegativeTargetSet: 'boolean',
  psrrNegativeDb: 'number-or-null',
  psrrNegativeMinDb: 'number-or-null',
  psrrNegativeMarginDb: 'number-or-null',
  psrrNegativeCorner: 'text',
  linearRangeTargetSet: 'boolean',
  linearInputRangeWorstV: 'number-or-null',
  linearInputRangeMinV: 'number-or-null',
  linearInputRangeMarginV: 'number-or-null',
  linearRangeCorner: 'text',
  slewRateTargetSet: 'boolean',
  slewRateWorstVPerS: 'number-or-null',
  slewRateMinVPerS: 'number-or-null',
  slewRateMarginVPerS: 'number-or-null',
  slewRateCorner: 'text',
  tailCurrentWindowSet: 'boolean',
  tailCurrentWindowEmpty: 'boolean',
  tailCurrentWindowNote: 'text',
  tailOutputResistanceNote: 'text',
};

/** True when `name` is an OptionFacts field. */
export function isFactName(name: string): name is keyof OptionFacts {
  return Object.prototype.hasOwnProperty.call(FACT_KINDS, name);
}

/** True when `value` has the shape `kind` promises; numbers must be finite (no NaN or Infinity). */
export function fitsFactKind(kind: FactKind, value: unknown): boolean {
  switch (kind) {
    case 'number':
      return typeof value === 'number' && Number.isFinite(value);
    case 'number-or-null':
      return value === null || (typeof value === 'number' && Number.isFinite(value));
    case 'boolean':
      return typeof value === 'boolean';
    case 'text':
      return typeof value === 'string';
    case 'text-list':
      return Array.isArray(value) && value.every((item) => typeof item === 'string');
  }
}
