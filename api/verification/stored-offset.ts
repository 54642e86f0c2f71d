/**
 * The engine's statistical input offset as a ranked option stores it among its facts (when the
 * spec sets an offset or drift target): its value at the spec's `offset.sigmas`
 * (`offsetAtSigmasV`, shared/engine/tradeoff-figures.ts) and that count (`offsetSigmas`), so the
 * standard deviation is their quotient. Options stored before the engine computed it, or for a
 * spec without an offset target, carry neither: null, and the SPICE Monte Carlo shows its
 * distribution alone and says the engine figure is absent.
 */
import type { RecommendOption } from '#shared/engine/recommend';

const finite = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);

/** The stored statistical offset, V (the value at `sigmas` taken as sigmas × σ when only σ is stored); null when the option has none. */
export function storedOffsetStatistics(option: Pick<RecommendOption, 'figures'>, sigmas: number): { standardDeviationV: number | null; atSigmasV: number | null } | null {
  const facts = (option.figures ?? {}) as Record<string, unknown>;
  const storedAtSigmasV = finite(facts.offsetAtSigmasV);
  const storedSigmas = finite(facts.offsetSigmas);
  if (storedAtSigmasV === null || storedSigmas === null || !(storedSigmas > 0)) return null;
  const standardDeviationV = storedAtSigmasV / storedSigmas;
  return { standardDeviationV, atSigmasV: sigmas * standardDeviationV };
}
