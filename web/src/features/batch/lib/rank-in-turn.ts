/**
 * Ranks a batch one spec after another (each ranking is a few hundred milliseconds of engine
 * work on the server; one at a time keeps the server free for everyone else), reporting progress
 * before each spec, going on past a failure, and stopping between specs when asked. When the
 * server says to wait (its per-person limit on proposals), the same spec is asked for again after
 * the wait, which the progress reports. Pure apart from the timer.
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
  /** Seconds the run waits before asking for the current spec again (the server's limit), when it does. */
  waitingS?: number;
}

/** The default pause: how long to wait before asking again after the server's "too many" (null: a plain failure). */
export type WaitBefore = (error: unknown) => number | null;

const pause = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

export async function rankInTurn<P>(
  items: readonly RankItem[],
  rankOne: (specId: number) => Promise<P>,
  options: { onProgress?: (progress: RankProgress) => void; shouldStop?: () => boolean; waitBefore?: WaitBefore; sleep?: (ms: number) => Promise<void> } = {},
): Promise<RankOutcome<P>[]> {
  const outcomes: RankOutcome<P>[] = [];
  const sleep = options.sleep ?? pause;
  for (const item of items) {
    if (options.shouldStop?.()) break;
    options.onProgress?.({ done: outcomes.length, total: items.length, current: item });
    for (;;) {
      try {
        outcomes.push({ item, proposal: await rankOne(item.specId) });
      } catch (error) {
        const waitMs = options.waitBefore?.(error) ?? null;
        if (waitMs !== null && !options.shouldStop?.()) {
          options.onProgress?.({ done: outcomes.length, total: items.length, current: item, waitingS: Math.ceil(waitMs / 1000) });
          await sleep(waitMs);
          if (!options.shouldStop?.()) continue;
        }
        outcomes.push({ item, error: error instanceof Error ? error.message : 'The ranking could not be made.' });
      }
      break;
    }
  }
  options.onProgress?.({ done: outcomes.length, total: items.length, current: null });
  return outcomes;
}
