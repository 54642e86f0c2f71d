/**
 * `npm run reliability`: Longtail's promises measured and printed as one summary table (not a
 * unit test; see DEVELOPERS.md, "Reliability run"). Four parts, in order, each with its own time
 * budget, everything on 127.0.0.1 and every server on a fresh temp database and a free port:
 *
 * 1. Crash safety (crash-safety.ts): SIGKILL the real server ≥ 20 times under workflow writes.
 * 2. Load (load.ts): autocannon, 64 connections, on the main read and write routes; a soak.
 * 3. Hostile input (hostile-input.ts, injection-corpus.ts): fast-check bodies from the route
 *    schemas and arbitrary JSON on every route as every role; an injection corpus stored, read
 *    back and rendered in headless Chromium.
 * 4. Access control (access-control.ts): the role × route matrix and cross-project probes.
 * 5. Quotas (quotas.ts): bench-measurement and device-library floods; what is stored, and the
 *    size of the paged lists afterwards.
 * 6. Accounts (accounts.ts): the owner signs in from another address during a wrong-password flood.
 * 7. Fairness (fairness.ts): one person's verification while another floods the SPICE queue with
 *    Monte Carlo jobs (≤ 3× its idle time), the per-person cap, memory, withdrawing the flood.
 *
 * Options: --quick (shorter load, soak and fuzzing: about 4 minutes), --only=crash,load,hostile,access,quotas,accounts,fairness
 * (a subset), --no-browser (skip the Chromium check), --seed=N (fast-check seed).
 * Exit code 1 when any requirement of the table fails (or a part could not run).
 */
import { availableParallelism, loadavg } from 'node:os';
import { accessControl } from './access-control';
import { accountsPart } from './accounts';
import { crashSafety } from './crash-safety';
import { fairnessPart } from './fairness';
import { hostileInput } from './hostile-input';
import { loadPart } from './load';
import { quotasPart } from './quotas';
import { row, type PartResult, type RunOptions, type SummaryRow } from './lib';

interface Part {
  key: 'crash' | 'load' | 'hostile' | 'access' | 'quotas' | 'accounts' | 'fairness';
  title: string;
  /** Time budget, s (full run, quick run). */
  budgetS: [number, number];
  run: (options: RunOptions & { seed: number; browser: boolean }) => Promise<PartResult>;
}

const PARTS: Part[] = [
  { key: 'crash', title: 'Crash safety', budgetS: [270, 270], run: crashSafety },
  { key: 'load', title: 'Load', budgetS: [180, 75], run: loadPart },
  { key: 'hostile', title: 'Hostile input', budgetS: [240, 150], run: hostileInput },
  { key: 'access', title: 'Access control', budgetS: [75, 75], run: accessControl },
  { key: 'quotas', title: 'Quotas', budgetS: [60, 60], run: quotasPart },
  { key: 'accounts', title: 'Accounts', budgetS: [45, 30], run: accountsPart },
  { key: 'fairness', title: 'Fairness', budgetS: [150, 90], run: fairnessPart },
];

const args = process.argv.slice(2);
const quick = args.includes('--quick');
const browser = !args.includes('--no-browser');
const only = args.find((a) => a.startsWith('--only='))?.slice('--only='.length).split(',');
const seed = Number(args.find((a) => a.startsWith('--seed='))?.slice('--seed='.length) ?? 20260611);
const unknown = args.filter((a) => !/^--(quick|no-browser|only=.*|seed=\d+)$/.test(a));
if (unknown.length > 0) {
  console.error(`Unknown option(s): ${unknown.join(' ')}\nUsage: npm run reliability [-- --quick] [--only=crash,load,hostile,access,quotas,accounts,fairness] [--no-browser] [--seed=N]`);
  process.exit(2);
}

const selected = PARTS.filter((part) => !only || only.includes(part.key));
const totalBudgetS = selected.reduce((s, part) => s + part.budgetS[quick ? 1 : 0], 0);
const started = performance.now();
const rows: SummaryRow[] = [];
console.log(`Longtail reliability run${quick ? ' (--quick)' : ''}: ${selected.map((p) => p.title).join(', ')}; budget ${Math.round(totalBudgetS / 60)} min on 127.0.0.1`);
console.log(`Node ${process.version}, ${availableParallelism()} CPUs, 1-minute load average ${loadavg()[0].toFixed(1)} at the start (other work on the machine slows every figure)\n`);

for (const part of selected) {
  const budgetS = part.budgetS[quick ? 1 : 0];
  const partStart = performance.now();
  console.log(`== ${part.title} (budget ${budgetS} s) ==`);
  const log = (line: string) => console.log(`  ${line}`);
  let timer: NodeJS.Timeout | undefined;
  try {
    // The part stops its own loops near the deadline; past budget + 60 s it is counted as failed
    const overrun = new Promise<never>((_resolve, reject) => {
      timer = setTimeout(() => reject(new Error(`did not finish within its budget of ${budgetS} s (+60 s grace)`)), (budgetS + 60) * 1000);
    });
    const result = await Promise.race([part.run({ quick, deadline: partStart + budgetS * 1000, log, seed, browser }), overrun]);
    rows.push(...result.rows);
  } catch (error) {
    const message = error instanceof Error ? (error.stack ?? error.message) : String(error);
    log(`FAILED: ${message}`);
    rows.push(row(part.title, 'part completed', 'no', 'yes', false));
  } finally {
    clearTimeout(timer);
  }
  console.log(`  (${((performance.now() - partStart) / 1000).toFixed(0)} s)\n`);
}

const elapsedS = (performance.now() - started) / 1000;
rows.push(row('Run', 'total time', `${(elapsedS / 60).toFixed(1)} min`, `≤ ${Math.ceil(totalBudgetS / 60)} min budget`, elapsedS <= totalBudgetS + 60));

const headers = ['part', 'measure', 'value', 'requirement', 'verdict'] as const;
const widths = headers.map((h) => Math.max(h.length, ...rows.map((r) => [...r[h]].length)));
const line = (cells: string[]) => cells.map((c, i) => c + ' '.repeat(Math.max(0, widths[i] - [...c].length))).join('  ');
console.log('Summary');
console.log(line([...headers]));
console.log(line(widths.map((w) => '-'.repeat(w))));
for (const r of rows) console.log(line(headers.map((h) => r[h])));
const failed = rows.filter((r) => r.verdict === 'FAIL');
console.log(`\n${failed.length === 0 ? 'Every requirement holds.' : `${failed.length} requirement(s) failed: ${failed.map((r) => `${r.part} / ${r.measure}`).join('; ')}`}`);
console.log(`1-minute load average at the end: ${loadavg()[0].toFixed(1)}. Latencies and throughput are estimates for this machine under its load at the time, not product figures.`);
process.exit(failed.length === 0 ? 0 : 1);
