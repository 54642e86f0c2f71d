/**
 * What the engine's worker threads run (loaded through engine-worker.mjs): a ranking, a design
 * evaluation or a trade-off sweep, by calling the pure engine in shared/engine exactly as the request thread would.
 * Each task carries the rule list as JSON text with its version; a thread builds that RuleSet
 * once and keeps it. An error the engine throws comes back as a description (never thrown
 * across the thread boundary, where its class would be lost): engine-pool.ts throws it again as
 * the same class with the same message.
 */
import { recommend, evaluateDesign } from '#shared/engine/index';
import { ConvergenceError } from '#shared/engine/operating-point';
import { InputError } from '#shared/engine/errors';
import type { RecommendOption } from '#shared/engine/recommend';
import { tradeoffSweep, type TradeoffSweepPoint } from '#shared/engine/tradeoff-sweep';
import type { Design, RuleSet, Spec, TopologyId } from '#shared/engine/types';
import { createRuleSet } from '../../rules/index';
import type { RuleFile } from '../../rules/run-rules';

/** A rule list as sent to a thread: its version (the cache key) and its files as JSON text. */
export interface RulesInTask {
  version: string;
  json: string;
}

export type EngineTask =
  | { kind: 'rank'; spec: Spec; rules: RulesInTask }
  | { kind: 'evaluate'; spec: Spec; design: Design; rules: RulesInTask }
  | { kind: 'sweep'; spec: Spec; topology: TopologyId; tailCurrentsA: number[] };

/** An error thrown by the engine, as plain data. */
export interface EngineErrorDescription {
  name: string;
  message: string;
  /** InputError's JSON path. */
  path?: string;
  /** ConvergenceError's hard fields (JSON paths). */
  fields?: string[];
  stack?: string;
}

export type EngineAnswer =
  | { ok: true; rankingJson: string }
  | { ok: true; option: RecommendOption }
  | { ok: true; points: TradeoffSweepPoint[] }
  | { ok: false; error: EngineErrorDescription };

/** The engine's ranking of a spec as the JSON text proposals store (the same text on any thread). */
export async function rankingJson(spec: Spec, ruleSet: RuleSet): Promise<string> {
  return JSON.stringify(await recommend(spec, ruleSet));
}

export function describeError(error: unknown): EngineErrorDescription {
  if (!(error instanceof Error)) return { name: 'Error', message: String(error) };
  return { name: error.name, message: error.message, stack: error.stack, ...(error instanceof InputError ? { path: error.path } : {}), ...(error instanceof ConvergenceError ? { fields: error.fields } : {}) };
}

/** The error a description stands for: InputError and ConvergenceError keep their class, anything else is an Error with the same name. */
export function errorFrom(description: EngineErrorDescription): Error {
  let error: Error;
  if (description.name === 'InputError' && description.path !== undefined) {
    error = new InputError(description.path, '');
    error.message = description.message;
  } else if (description.name === 'ConvergenceError') {
    error = new ConvergenceError(description.message, description.fields);
  } else {
    error = new Error(description.message);
    error.name = description.name;
  }
  if (description.stack) error.stack = description.stack;
  return error;
}

/** Rule sets this thread has built, by version. */
const ruleSets = new Map<string, RuleSet>();

function ruleSetFor(rules: RulesInTask): RuleSet {
  let ruleSet = ruleSets.get(rules.version);
  if (!ruleSet) {
    ruleSet = createRuleSet(JSON.parse(rules.json) as RuleFile[]);
    ruleSets.set(rules.version, ruleSet);
  }
  return ruleSet;
}

/** One task, on a worker thread. */
export async function runEngineTask(task: EngineTask): Promise<EngineAnswer> {
  try {
    // a sweep checks no rule: it needs no rule set
    if (task.kind === 'sweep') return { ok: true, points: tradeoffSweep(task.spec, task.topology, task.tailCurrentsA) };
    const ruleSet = ruleSetFor(task.rules);
    if (task.kind === 'rank') return { ok: true, rankingJson: await rankingJson(task.spec, ruleSet) };
    return { ok: true, option: await evaluateDesign(task.spec, task.design, ruleSet) };
  } catch (error) {
    return { ok: false, error: describeError(error) };
  }
}
