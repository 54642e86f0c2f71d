/**
 * `npm run bench`, part: SPICE verification speed (not a test: nothing here passes or fails).
 * Target (the verification issue): a six-option verification — every analysis at nominal and at
 * the four corners — in ≤ 2 s after the engine has started. Prints the engine's start time and its
 * share of a first (cold) verification, the median warm verification of each demo proposal, and
 * SPICE Monte Carlo runs per second.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { recommend, type RecommendResult } from '#shared/engine/index';
import type { Spec } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../rules/index';
import { SpiceEngine } from '../../api/verification/spice-engine';
import { verifyOption } from '../../api/verification/verify-option';
import { runMonteCarlo } from '../../api/verification/monte-carlo';
import { topologyName } from '#shared/engine/topologies';

const WARM_RUNS = 5;
const MONTE_CARLO_RUNS = 200;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

const specsDir = join(fileURLToPath(new URL('.', import.meta.url)), '..', '..', 'api', 'demo', 'specs');
const ruleSet = await loadRuleSet();
const cases: { name: string; spec: Spec; result: RecommendResult }[] = [];
for (const file of readdirSync(specsDir).filter((f) => f.endsWith('.json')).sort()) {
  const checked = validateSpec(JSON.parse(readFileSync(join(specsDir, file), 'utf8')));
  if (!checked.ok) throw new Error(`${file} is not a valid spec`);
  cases.push({ name: file.replace(/\.json$/, ''), spec: checked.value, result: await recommend(checked.value, ruleSet) });
}

/** Verifies every option of a proposal the way a job does; returns wall time and analyses run. */
async function verifyAll(engine: SpiceEngine, spec: Spec, result: RecommendResult): Promise<{ ms: number; analyses: number; disagreements: number }> {
  let analyses = 0;
  let disagreements = 0;
  const run = (netlist: string, plot?: string) => {
    analyses += 1;
    return engine.run(netlist, plot);
  };
  const t0 = performance.now();
  for (const option of result.options) {
    const verified = await verifyOption(
      run,
      { topology: option.topology, source: 'option', name: topologyName(option.topology), option, differentialOutput: spec.gain.output === 'differential', frequencyHz: spec.cmrr.atFrequencyHz },
      () => {},
    );
    disagreements += verified.disagreements + (verified.outcome === 'error' ? 1 : 0);
  }
  return { ms: performance.now() - t0, analyses, disagreements };
}

const engine = new SpiceEngine();
const coldStart = performance.now();
await verifyAll(engine, cases[0].spec, cases[0].result);
const coldMs = performance.now() - coldStart;
console.log('SPICE verification (ngspice in a worker thread)');
console.log(`  engine start                      ${engine.lastStartMs.toFixed(0)} ms`);
console.log(`  first verification incl. start    ${coldMs.toFixed(0)} ms (${cases[0].name}); start = ${((100 * engine.lastStartMs) / coldMs).toFixed(0)} % of it`);
for (const { name, spec, result } of cases) {
  const times: number[] = [];
  let analyses = 0;
  let disagreements = 0;
  for (let i = 0; i < WARM_RUNS; i += 1) {
    const run = await verifyAll(engine, spec, result);
    times.push(run.ms);
    analyses = run.analyses;
    disagreements = run.disagreements;
  }
  const ms = median(times);
  console.log(
    `  ${name.padEnd(32)} ${result.options.length} options, ${analyses} analyses: median ${ms.toFixed(0)} ms of ${WARM_RUNS} (${(ms / analyses).toFixed(1)} ms per analysis; target 2000 ms: ${ms <= 2000 ? 'met' : 'missed'}; ${disagreements} figures outside tolerance)`,
  );
}

const differential = cases.find((c) => c.spec.gain.output === 'differential');
if (differential) {
  const option = differential.result.options[0];
  const mc = await runMonteCarlo(engine.runner, differential.spec, option, MONTE_CARLO_RUNS, 'ngspice', () => {});
  console.log(
    `  SPICE Monte Carlo                 ${MONTE_CARLO_RUNS} runs of ${topologyName(option.topology)} (${differential.name}) in ${mc.elapsedMs.toFixed(0)} ms: ${((MONTE_CARLO_RUNS * 1000) / mc.elapsedMs).toFixed(0)} runs/s; median simulated ${mc.simulated.percentilesDb.p50.toFixed(2)} dB vs closed form ${mc.predicted.percentilesDb.p50.toFixed(2)} dB`,
  );
}
await engine.stop();
