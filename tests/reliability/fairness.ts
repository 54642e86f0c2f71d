/**
 * Fair use of the SPICE simulator: the real server (a child process) on a fresh database with the
 * demo organisation. The reviewer's verification of one six-option proposal is timed on the idle
 * server (warm engine, median of two); then the designer floods the queue with Monte Carlo jobs
 * of 2,000 runs on every option of another proposal (more than the per-person cap: the extra
 * requests must answer 429), and the reviewer's verification is timed again while the flood runs
 * (median of three). Requirement: ≤ 3× the idle time. The flood then runs on for a while with
 * the server's resident memory sampled (the simulator thread is recycled, so memory must stay
 * bounded), and is withdrawn: a verification asked for then must be done within 3× its idle time
 * plus one cold start (the withdrawal may land while the simulator thread is being replaced).
 */
import { join } from 'node:path';
import { specPayload } from '../helpers/api-app';
import { demoEmail, DEMO_PASSWORD, freePort, HttpClient, mb, residentBytes, row, sleep, spawnServer, stopServer, tempDir, waitHealthy, type PartResult, type RunOptions } from './lib';

const PART = 'Fairness';
/** Requests the flood sends at once: more than the per-person cap (six), so some must be refused. */
const FLOOD_REQUESTS = 8;
const FLOOD_RUNS = 2000;
/** The ratio of flooded to idle verification time allowed (the issue's requirement). */
const MAX_RATIO = 3;
/** Peak growth of the server's resident memory while the flood runs (no recycling: ≈ +270 MB per 2,000-run job, measured). */
const MAX_GROWTH_BYTES = 400 * 2 ** 20;

interface Job {
  id: number;
  state: string;
  done: number;
  total: number;
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
};

export async function fairnessPart(runOptions: RunOptions): Promise<PartResult> {
  const { log, quick, deadline } = runOptions;
  const soakS = quick ? 20 : 60;
  const temp = tempDir('longtail-reliability-fairness-');
  const port = await freePort();
  const server = spawnServer({ databasePath: join(temp.dir, 'longtail.sqlite'), port, seed: true });
  try {
    await waitHealthy(server, 240_000);
    const base = server.baseUrl;
    const [author, designer, reviewer] = [new HttpClient(base), new HttpClient(base), new HttpClient(base)];
    await author.signIn(demoEmail('requirements'), DEMO_PASSWORD);
    await designer.signIn(demoEmail('designer'), DEMO_PASSWORD);
    await reviewer.signIn(demoEmail('reviewer'), DEMO_PASSWORD);

    const projectId = ((await designer.request('GET', '/api/projects')).json as { items: { id: number }[] }).items[0].id;
    const spec = (await author.request('POST', `/api/projects/${projectId}/specs`, { title: 'Fairness run — thermopile pair', payload: specPayload() })).json as { id: number };
    const newProposal = async () => {
      const answer = await designer.request('POST', `/api/specs/${spec.id}/proposals`);
      if (answer.status !== 201) throw new Error(`a proposal answered ${answer.status}: ${answer.text.slice(0, 200)}`);
      return answer.json as { id: number; result: { options: { topology: string; design: unknown }[] } };
    };
    const target = await newProposal();
    const flooded = await newProposal();
    const options = target.result.options.filter((o) => o.design);
    log(`reviewer's proposal ${target.id}: ${options.length} options; designer's proposal ${flooded.id} gets the flood`);

    /** The reviewer's verification of the target, from the request to `finished`, ms. */
    const verifyOnce = async (): Promise<number> => {
      const t0 = performance.now();
      const asked = await reviewer.request('POST', `/api/proposals/${target.id}/verification`);
      if (asked.status !== 202) throw new Error(`the verification answered ${asked.status}: ${asked.text.slice(0, 200)}`);
      const id = (asked.json as Job).id;
      for (;;) {
        const status = (await reviewer.request('GET', `/api/proposals/${target.id}/verification`)).json as { verification: Job };
        if (status.verification.id === id && !['waiting', 'simulating'].includes(status.verification.state)) {
          if (status.verification.state !== 'finished') throw new Error(`the verification ended ${status.verification.state}`);
          return performance.now() - t0;
        }
        await sleep(50);
      }
    };

    const cold = await verifyOnce();
    const idle = [await verifyOnce(), await verifyOnce()];
    const idleMs = median(idle);
    log(`idle: first (engine start) ${(cold / 1000).toFixed(2)} s; warm ${idle.map((ms) => (ms / 1000).toFixed(2)).join(', ')} s`);

    // The flood: every option, at once, and more requests than the cap allows
    const rssBefore = await residentBytes(server.child.pid!);
    // Every option of the designer's proposal; past the six options, the first ones again on the other proposal (new work, so the cap decides)
    const requests = Array.from({ length: FLOOD_REQUESTS }, (_, i) => ({ topology: options[i % options.length].topology, proposalId: i < options.length ? flooded.id : target.id }));
    const asked = await Promise.all(
      requests.map(({ topology, proposalId }) => designer.request('POST', `/api/proposals/${proposalId}/verification/monte-carlo`, { topology, runs: FLOOD_RUNS })),
    );
    const proposalOf = new Map(asked.flatMap((a, i) => (a.status === 202 ? [[(a.json as Job).id, requests[i].proposalId] as const] : [])));
    const accepted = asked.filter((a) => a.status === 202).map((a) => a.json as Job);
    const refused = asked.filter((a) => a.status === 429).length;
    const other = asked.filter((a) => a.status !== 202 && a.status !== 429).map((a) => a.status);
    log(`flood: ${accepted.length} Monte Carlo jobs of ${FLOOD_RUNS} runs accepted, ${refused} refused with 429${other.length ? `, other answers ${other.join(', ')}` : ''}`);
    const floodIds = new Set(accepted.map((j) => j.id));
    const floodProgress = async () => {
      const jobs = await Promise.all(
        [flooded.id, target.id].map(async (id) => ((await designer.request('GET', `/api/proposals/${id}/verification`)).json as { monteCarlo: Job[] }).monteCarlo),
      );
      return jobs.flat().filter((j) => floodIds.has(j.id));
    };
    for (let i = 0; i < 600; i += 1) {
      if ((await floodProgress()).some((j) => j.state === 'simulating' && j.done > 0)) break;
      await sleep(50);
    }

    const flooded3 = [await verifyOnce(), await verifyOnce(), await verifyOnce()];
    const floodedMs = median(flooded3);
    const ratio = floodedMs / idleMs;
    log(`during the flood: ${flooded3.map((ms) => (ms / 1000).toFixed(2)).join(', ')} s; median ${(floodedMs / 1000).toFixed(2)} s = ${ratio.toFixed(2)}× idle`);

    // Let the flood run on, sampling the server's memory
    let peak = await residentBytes(server.child.pid!);
    const soakEnd = Math.min(performance.now() + soakS * 1000, deadline - 30_000);
    while (performance.now() < soakEnd) {
      await sleep(1000);
      peak = Math.max(peak, await residentBytes(server.child.pid!));
    }
    const progress = await floodProgress();
    const runsDone = progress.reduce((s, j) => s + (j.state === 'finished' ? j.total : j.done), 0);
    log(`after ${soakS} s more: ${runsDone} Monte Carlo runs done (${progress.filter((j) => j.state === 'finished').length} jobs finished); resident memory ${mb(rssBefore)} before the flood, peak ${mb(peak)}`);

    // Withdraw the flood; the simulator must be free again promptly
    const t0 = performance.now();
    // The waiting ones first: withdrawing the running one first would let the queue start the next of the flood meanwhile
    const active = [...progress.filter((j) => j.state === 'waiting'), ...progress.filter((j) => j.state === 'simulating')];
    for (const job of active) {
      const answer = await designer.request('DELETE', `/api/proposals/${proposalOf.get(job.id)}/verification/${job.id}`);
      if (answer.status !== 200) log(`withdrawing job ${job.id} answered ${answer.status}: ${answer.text.slice(0, 200)}`);
    }
    const freed = await verifyOnce();
    const freedMs = performance.now() - t0;
    log(`flood withdrawn and a verification run after it in ${(freedMs / 1000).toFixed(2)} s (the verification alone ${(freed / 1000).toFixed(2)} s)`);

    return {
      rows: [
        row(PART, 'six-option verification, idle (warm)', `${(idleMs / 1000).toFixed(2)} s`, 'reported', null),
        row(PART, 'same, while another user floods Monte Carlo', `${(floodedMs / 1000).toFixed(2)} s (${ratio.toFixed(2)}×)`, `≤ ${MAX_RATIO}× idle`, ratio <= MAX_RATIO),
        row(PART, 'flood requests past the per-person cap refused', `${refused} of ${FLOOD_REQUESTS - 6}`, '429 each', refused === FLOOD_REQUESTS - 6 && other.length === 0),
        row(PART, 'server memory growth during the flood (peak)', mb(peak - rssBefore), `≤ ${mb(MAX_GROWTH_BYTES)}`, peak - rssBefore <= MAX_GROWTH_BYTES),
        // The withdrawal may land just as the simulator thread is being replaced: allow one start (the cold run's time).
        row(PART, 'flood withdrawn, then a verification done', `${(freedMs / 1000).toFixed(2)} s`, `≤ ${MAX_RATIO}× idle + a cold start (${((MAX_RATIO * idleMs + cold) / 1000).toFixed(1)} s)`, freedMs <= MAX_RATIO * idleMs + cold),
      ],
    };
  } finally {
    await stopServer(server);
    temp.remove();
  }
}
