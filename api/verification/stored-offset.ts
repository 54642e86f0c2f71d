/**
 * The engine's statistical input offset as a ranked option stores it among its facts: the
 * standard deviation of the offset over the spec's mismatch sigmas (`inputOffsetVoltageSigmaV`)
 * and, when stored, its value at the spec's `offset.sigmas` (`inputOffsetVoltageAtSigmasV`).
 * Options stored before the engine computed it carry neither: null, and the SPICE Monte Carlo
 * shows its distribution alone and says the engine figure is absent.
 */
import type { RecommendOption } from '#shared/engine/recommend';

const finite = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);

/** The stored statistical offset, V (the value at `sigmas` taken as sigmas × σ when only σ is stored); null when the option has none. */
export function storedOffsetStatistics(option: Pick<RecommendOption, 'figures'>, sigmas: number): { standardDeviationV: number | null; atSigmasV: number | null } | null {
  const facts = (option.figures ?? {}) as Record<string, unknown>;
  const standardDeviationV = finite(facts.inputOffsetVoltageSigmaV);
  const atSigmasV = finite(facts.inputOffsetVoltageAtSigmasV) ?? (standardDeviationV === null ? null : sigmas * standardDeviationV);
  return standardDeviationV === null && atSigmasV === null ? null : { standardDeviationV, atSigmasV };
}
