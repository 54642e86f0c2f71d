/**
 * Ranks a batch one spec after another (each ranking is a few hundred milliseconds of engine
 * work on the server; one at a time keeps the server free for everyone else), reporting progress
 * before each spec, going on past a failure, and stopping between specs when asked. Pure.
 */

export interface RankItem {
  specId: number;
  title: string;
}

export interface RankOutcome<P> {
  item: RankItem;
  proposal?: P;
  error?: string;
}

export interface RankProgress {
  done: number;
  total: number;
  /** The spec being ranked now (null once finished or stopped). */
  current: RankItem | null;
}

export async function rankInTurn<P>(
  items: readonly RankItem[],
  rankOne: (specId: number) => Promise<P>,
  options: { onProgress?: (progress: RankProgress) => void; shouldStop?: () => boolean } = {},
): Promise<RankOutcome<P>[]> {
  const outcomes: RankOutcome<P>[] = [];
  for (const item of items) {
    if (options.shouldStop?.()) break;
    options.onProgress?.({ done: outcomes.length, total: items.length, current: item });
    try {
      outcomes.push({ item, proposal: await rankOne(item.specId) });
    } catch (error) {
      outcomes.push({ item, error: error instanceof Error ? error.message : 'The ranking could not be made.' });
    }
  }
  options.onProgress?.({ done: outcomes.length, total: items.length, current: null });
  return outcomes;
}
