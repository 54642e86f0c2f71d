/**
 * Where the engine runs for a request: rankings (proposal creation, and so every ranking of a
 * batch), override evaluations and trade-off sweeps (tens to hundreds of ms each). The engine is CPU work of 10 to 20 ms per ranking; on the
 * request thread it holds every other request behind it, so a server runs it in a pool of worker
 * threads (piscina) sized to the cores, one pool per process shared by every app in it.
 *
 * - `acquireEnginePool(workers)` (createApp, from LONGTAIL_ENGINE_WORKERS) starts the process's
 *   pool or joins it; the lease's `release()` (closeApp) stops the pool with its last user. With
 *   no pool (workers 0, or a caller outside an app such as the CLI or a seed) the engine runs
 *   inline on the calling thread, exactly as in a worker.
 * - The threads load engine-worker.mjs, which loads engine-tasks.ts (the engine calls).
 * - Errors: a thread answers the engine's error as data, thrown here again as the same class
 *   (InputError, ConvergenceError, else Error) with the same message, so routes and the error
 *   handler answer as they would inline. A thread that dies fails its task with piscina's Error
 *   (an internal error answer) and piscina starts another.
 * - A RuleSet not made by createRuleSet (rules/index.ts) cannot be rebuilt in a thread: it runs inline.
 */
import { setImmediate as nextTurn } from 'node:timers/promises';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import { evaluateDesign } from '#shared/engine/index';
import type { RecommendOption } from '#shared/engine/recommend';
import { tradeoffSweep, type TradeoffSweepPoint } from '#shared/engine/tradeoff-sweep';
import type { Design, RuleSet, Spec, TopologyId } from '#shared/engine/types';
import { ruleFilesOf } from '../../rules/index';
import { errorFrom, rankingJson, type EngineAnswer, type EngineTask, type RulesInTask } from './engine-tasks';

/** The worker entry, beside this file (see engine-worker.mjs for how it finds the tasks). */
export const ENGINE_WORKER_FILE = fileURLToPath(new URL('./engine-worker.mjs', import.meta.url));

/** Ms an idle pool keeps its threads before letting them go (they start again on demand). */
const IDLE_TIMEOUT_MS = 60_000;

interface SharedPool {
  pool: Piscina<EngineTask, EngineAnswer>;
  workers: number;
  users: number;
}

let shared: SharedPool | null = null;

export interface EnginePoolLease {
  /** Threads in the process's pool (0: the engine runs inline). */
  readonly workers: number;
  /** Leaves the pool; the last user's release stops its threads. Safe to call twice. */
  release(): Promise<void>;
}

/**
 * Joins the process's engine pool, starting it with `workers` threads when there is none
 * (a pool already running keeps its size). `workers` 0: no pool, the engine runs inline.
 */
export function acquireEnginePool(workers: number): EnginePoolLease {
  if (workers <= 0) return { workers: 0, release: async () => undefined };
  if (!shared) {
    shared = {
      pool: new Piscina<EngineTask, EngineAnswer>({ filename: ENGINE_WORKER_FILE, minThreads: workers, maxThreads: workers, idleTimeout: IDLE_TIMEOUT_MS }),
      workers,
      users: 0,
    };
  }
  const joined = shared;
  joined.users += 1;
  let released = false;
  return {
    workers: joined.workers,
    async release() {
      if (released) return;
      released = true;
      joined.users -= 1;
      if (joined.users > 0) return;
      if (shared === joined) shared = null;
      await joined.pool.destroy();
    },
  };
}

/** The process's engine pool now: its threads and the tasks they finished; null when the engine runs inline. */
export function enginePoolState(): { threads: number; completedTasks: number } | null {
  return shared ? { threads: shared.pool.threads.length, completedTasks: shared.pool.completed } : null;
}

/** The rule list as a task carries it, made once per RuleSet; null when the RuleSet cannot go to a thread. */
const rulesInTasks = new WeakMap<RuleSet, RulesInTask | null>();
function rulesInTask(ruleSet: RuleSet): RulesInTask | null {
  let rules = rulesInTasks.get(ruleSet);
  if (rules === undefined) {
    const files = ruleFilesOf(ruleSet);
    rules = files ? { version: ruleSet.version, json: JSON.stringify(files) } : null;
    rulesInTasks.set(ruleSet, rules);
  }
  return rules;
}

/** The pool a task for this rule set goes to, or null (inline). */
function poolFor(ruleSet: RuleSet): { pool: Piscina<EngineTask, EngineAnswer>; rules: RulesInTask } | null {
  if (!shared) return null;
  const rules = rulesInTask(ruleSet);
  return rules ? { pool: shared.pool, rules } : null;
}

/**
 * A task's answer, taken up in a turn of the event loop of its own. Piscina can settle several
 * tasks in one turn, and their callers would then go on interleaved; on SQLite (one connection)
 * two callers' transactions would overlap ("cannot start a transaction within a transaction").
 * Each caller going on in its own turn finishes its database work before the next starts, as
 * when the engine runs inline.
 */
async function answered<T>(running: Promise<EngineAnswer>, pick: (answer: Exclude<EngineAnswer, { ok: false }>) => T): Promise<T> {
  const answer = await running;
  await nextTurn();
  if (!answer.ok) throw errorFrom(answer.error);
  return pick(answer);
}

/** The engine's ranking of a checked spec, as the JSON text a proposal stores. */
export async function rankSpec(spec: Spec, ruleSet: RuleSet): Promise<string> {
  const target = poolFor(ruleSet);
  if (!target) return rankingJson(spec, ruleSet);
  return answered(target.pool.run({ kind: 'rank', spec, rules: target.rules }), (a) => ('rankingJson' in a ? a.rankingJson : unexpected(a)));
}

/** A designer's own design checked against a checked spec as thoroughly as a ranked option. */
export async function evaluateSpecDesign(spec: Spec, design: Design, ruleSet: RuleSet): Promise<RecommendOption> {
  const target = poolFor(ruleSet);
  if (!target) return evaluateDesign(spec, design, ruleSet);
  return answered(target.pool.run({ kind: 'evaluate', spec, design, rules: target.rules }), (a) => ('option' in a ? a.option : unexpected(a)));
}

/** A topology of a checked spec sized and solved at each tail current (tradeoff-sweep.ts); no rule set, so any pool takes it. */
export async function sweepTradeoff(spec: Spec, topology: TopologyId, tailCurrentsA: number[]): Promise<TradeoffSweepPoint[]> {
  if (!shared) return tradeoffSweep(spec, topology, tailCurrentsA);
  return answered(shared.pool.run({ kind: 'sweep', spec, topology, tailCurrentsA }), (a) => ('points' in a ? a.points : unexpected(a)));
}

function unexpected(answer: unknown): never {
  throw new Error(`The engine thread answered an unexpected shape: ${Object.keys(answer as object).join(', ')}`);
}
