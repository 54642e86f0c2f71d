/**
 * Crash safety: the real server (api/server.ts, a child process) on a fresh SQLite file with the
 * demo organisation; several client loops walk the workflow through HTTP (a spec, a new version
 * of it, a proposal, a decision, a SPICE verification request, a review) and record every write
 * acknowledged with a 2xx and the id it returned; a killer sends SIGKILL after a random
 * 0.2–2 s, restarts the server and waits for GET /api/auth/csrf, at least KILLS times. Then one
 * more restart (its start-up sweep must mark every job left `simulating` by a killed server as
 * `stopped`) and a graceful stop, and the file is opened directly (better-sqlite3):
 * - every acknowledged write is there (the spec and version, proposal, decision, review, job);
 * - `PRAGMA integrity_check` is ok and `PRAGMA foreign_key_check` lists nothing;
 * - every proposal has its `proposal.ranked` event, every spec version, decision, review and
 *   verification job its own event (a write without its event would be half a transaction);
 * - no verification job is left `simulating`.
 */
import Database from 'better-sqlite3';
import { join } from 'node:path';
import { specPayload } from '../helpers/api-app';
import { demoEmail, DEMO_PASSWORD, freePort, HttpClient, row, sleep, spawnServer, stopServer, tempDir, waitHealthy, type PartResult, type RunOptions, type ServerProcess } from './lib';

const PART = 'Crash safety';
const MIN_KILLS = 20;
/** Client loops, each a requirements author, a designer and a reviewer of its own. */
const CLIENT_LOOPS = 3;
const KILL_AFTER_MS = { min: 200, max: 2000 };

type AckKind = 'spec' | 'spec-version' | 'proposal' | 'decision' | 'review' | 'verification';
interface Ack {
  kind: AckKind;
  id: number;
  /** spec versions: the spec id and version number; decisions, reviews and jobs: the proposal. */
  specId?: number;
  version?: number;
  proposalId?: number;
  title?: string;
}

interface Loop {
  requirements: HttpClient;
  designer: HttpClient;
  reviewer: HttpClient;
}

export async function crashSafety(options: RunOptions): Promise<PartResult> {
  const { log } = options;
  const temp = tempDir('longtail-reliability-crash-');
  const databasePath = join(temp.dir, 'longtail.sqlite');
  const port = await freePort();
  const acks: Ack[] = [];
  const failures = { network: 0, other: 0, statuses: new Map<number, number>() };
  let server: ServerProcess = spawnServer({ databasePath, port, seed: true });
  let up = false;
  let kills = 0;
  let stopClients = false;
  const restartMs: number[] = [];

  try {
    const firstStartMs = await waitHealthy(server, 240_000);
    up = true;
    log(`server on 127.0.0.1:${port}, fresh database ${databasePath}, demo seeded and listening after ${(firstStartMs / 1000).toFixed(1)} s`);

    // Sessions live in the database, so they survive the kills: sign in once per client.
    const base = server.baseUrl;
    const signedIn = async (role: 'requirements' | 'designer' | 'reviewer') => {
      const client = new HttpClient(base);
      await client.signIn(demoEmail(role), DEMO_PASSWORD);
      return client;
    };
    const loops: Loop[] = [];
    for (let i = 0; i < CLIENT_LOOPS; i += 1) loops.push({ requirements: await signedIn('requirements'), designer: await signedIn('designer'), reviewer: await signedIn('reviewer') });
    const projects = (await loops[0].requirements.request('GET', '/api/projects')).json as { items: { id: number; name: string }[] };
    const projectId = projects.items[0].id;

    /** One write; the ack is recorded only on a 2xx. Network errors (a kill) and other answers return null. */
    async function write(client: HttpClient, method: string, path: string, body?: unknown): Promise<Record<string, unknown> | null> {
      if (!up) {
        await sleep(50);
        return null;
      }
      try {
        const answer = await client.request(method, path, body, 20_000);
        if (answer.status >= 200 && answer.status < 300) return answer.json as Record<string, unknown>;
        failures.statuses.set(answer.status, (failures.statuses.get(answer.status) ?? 0) + 1);
        if (answer.status >= 500) log(`  ${method} ${path} answered ${answer.status}: ${answer.text.slice(0, 300)}`);
        return null;
      } catch {
        failures.network += 1;
        return null;
      }
    }

    async function clientLoop(loop: Loop, n: number): Promise<void> {
      let round = 0;
      while (!stopClients) {
        round += 1;
        const title = `Crash loop ${n}.${round} — thermopile pair`;
        const spec = await write(loop.requirements, 'POST', `/api/projects/${projectId}/specs`, { title, payload: { ...specPayload(), title } });
        if (!spec) continue;
        const specId = spec.id as number;
        acks.push({ kind: 'spec', id: specId, specId, version: 1, title });
        const revisedTitle = `${title} (rev 2)`;
        const revised = await write(loop.requirements, 'PUT', `/api/specs/${specId}`, { title: revisedTitle, payload: { ...specPayload(), title: revisedTitle, powerBudgetW: 0.028 } });
        if (revised) acks.push({ kind: 'spec-version', id: (revised.latest as { id: number }).id, specId, version: 2, title: revisedTitle });
        const proposal = await write(loop.designer, 'POST', `/api/specs/${specId}/proposals`);
        if (!proposal) continue;
        const proposalId = proposal.id as number;
        acks.push({ kind: 'proposal', id: proposalId, specId });
        const job = await write(loop.designer, 'POST', `/api/proposals/${proposalId}/verification`);
        if (job) acks.push({ kind: 'verification', id: job.id as number, proposalId });
        const decided = await write(loop.designer, 'POST', `/api/proposals/${proposalId}/decision`, { kind: 'choose', topology: 'wilson', reason: `Loop ${n}.${round}: Wilson parts on hand.` });
        if (!decided) continue;
        const decisions = decided.decisions as { id: number }[];
        acks.push({ kind: 'decision', id: decisions[decisions.length - 1].id, proposalId });
        const verdict = round % 2 === 0 ? { verdict: 'approve' } : { verdict: 'return', comment: `Loop ${n}.${round}: take the ranked values.` };
        const reviewed = await write(loop.reviewer, 'POST', `/api/proposals/${proposalId}/review`, verdict);
        if (reviewed) {
          const reviews = reviewed.reviews as { id: number }[];
          acks.push({ kind: 'review', id: reviews[reviews.length - 1].id, proposalId });
        }
      }
    }

    async function killer(): Promise<void> {
      const want = MIN_KILLS;
      while (kills < want && performance.now() < options.deadline - 20_000) {
        await sleep(KILL_AFTER_MS.min + Math.random() * (KILL_AFTER_MS.max - KILL_AFTER_MS.min));
        const exited = new Promise<void>((resolve) => server.child.once('exit', () => resolve()));
        up = false;
        server.child.kill('SIGKILL');
        await exited;
        kills += 1;
        server = spawnServer({ databasePath, port, seed: true });
        restartMs.push(await waitHealthy(server));
        up = true;
        if (kills % 5 === 0) log(`${kills} kills so far; ${acks.length} writes acknowledged`);
      }
    }

    const clientRuns = loops.map((loop, i) => clientLoop(loop, i + 1));
    await killer();
    // A little traffic on the last server, then the clients stop
    await sleep(1000);
    stopClients = true;
    await Promise.all(clientRuns);
    log(`${kills} SIGKILLs, restarts answered after ${restartMs.length ? (restartMs.reduce((a, b) => a + b, 0) / restartMs.length / 1000).toFixed(1) : '-'} s on average (max ${(Math.max(0, ...restartMs) / 1000).toFixed(1)} s)`);

    // One last kill in the middle of work, a restart whose sweep must mark the killed server's jobs stopped, then a graceful stop
    server.child.kill('SIGKILL');
    await new Promise<void>((resolve) => (server.child.exitCode !== null || server.child.signalCode !== null ? resolve() : server.child.once('exit', () => resolve())));
    const simulatingBeforeRestart = countSimulating(databasePath);
    server = spawnServer({ databasePath, port, seed: true });
    await waitHealthy(server);
    await sleep(1500);
    await stopServer(server, 'SIGTERM');
    up = false;
    log(`jobs left simulating by the last kill: ${simulatingBeforeRestart}; after a restart and a graceful stop: checked below`);
  } finally {
    stopClients = true;
    await stopServer(server, 'SIGKILL');
  }

  const checks = checkDatabase(databasePath, acks);
  temp.remove();
  const byKind = (kind: AckKind) => acks.filter((a) => a.kind === kind).length;
  log(`acknowledged writes: ${acks.length} (specs ${byKind('spec')}, versions ${byKind('spec-version')}, proposals ${byKind('proposal')}, decisions ${byKind('decision')}, reviews ${byKind('review')}, verification jobs ${byKind('verification')})`);
  log(`unacknowledged attempts: ${failures.network} cut by a kill; other answers ${JSON.stringify(Object.fromEntries(failures.statuses))}`);
  for (const line of checks.problems.slice(0, 20)) log(`  problem: ${line}`);
  const fivexx = [...failures.statuses].filter(([status]) => status >= 500).reduce((n, [, c]) => n + c, 0);
  return {
    rows: [
      row(PART, 'SIGKILLs (restarted each time)', kills, `≥ ${MIN_KILLS}`, kills >= MIN_KILLS),
      row(PART, 'acknowledged writes', acks.length, '> 0', acks.length > 0),
      row(PART, 'acknowledged writes lost', checks.lost, '0', checks.lost === 0),
      row(PART, '5xx answers during the run', fivexx, '0', fivexx === 0),
      row(PART, 'PRAGMA integrity_check', checks.integrity, 'ok', checks.integrity === 'ok'),
      row(PART, 'PRAGMA foreign_key_check rows', checks.foreignKeyRows, '0', checks.foreignKeyRows === 0),
      row(PART, 'records without their audit event', checks.missingEvents, '0', checks.missingEvents === 0),
      row(PART, 'verification jobs left simulating', checks.simulating, '0', checks.simulating === 0),
    ],
  };
}

function countSimulating(databasePath: string): number {
  const db = new Database(databasePath, { readonly: true });
  try {
    return (db.prepare("SELECT count(*) AS n FROM verification_job WHERE state = 'simulating'").get() as { n: number }).n;
  } finally {
    db.close();
  }
}

function checkDatabase(databasePath: string, acks: Ack[]) {
  const db = new Database(databasePath);
  const problems: string[] = [];
  try {
    const integrity = (db.pragma('integrity_check') as { integrity_check: string }[]).map((r) => r.integrity_check).join('; ');
    const foreignKeyRows = (db.pragma('foreign_key_check') as unknown[]).length;
    const one = (sql: string, ...params: unknown[]) => db.prepare(sql).get(...params) as Record<string, unknown> | undefined;
    let lost = 0;
    for (const ack of acks) {
      let found: Record<string, unknown> | undefined;
      switch (ack.kind) {
        case 'spec':
          found = one('SELECT s.id FROM spec s JOIN spec_version v ON v.spec_id = s.id AND v.version = 1 WHERE s.id = ? AND v.title = ?', ack.id, ack.title);
          break;
        case 'spec-version':
          found = one('SELECT id FROM spec_version WHERE id = ? AND spec_id = ? AND version = ? AND title = ?', ack.id, ack.specId, ack.version, ack.title);
          break;
        case 'proposal':
          found = one('SELECT id FROM proposal WHERE id = ? AND spec_id = ?', ack.id, ack.specId);
          break;
        case 'decision':
          found = one('SELECT id FROM decision WHERE id = ? AND proposal_id = ?', ack.id, ack.proposalId);
          break;
        case 'review':
          found = one('SELECT id FROM review WHERE id = ? AND proposal_id = ?', ack.id, ack.proposalId);
          break;
        case 'verification':
          found = one('SELECT id FROM verification_job WHERE id = ? AND proposal_id = ?', ack.id, ack.proposalId);
          break;
      }
      if (!found) {
        lost += 1;
        problems.push(`acknowledged ${ack.kind} #${ack.id} is missing`);
      }
    }
    // Every record has the event its transaction wrote beside it
    const orphanQueries: [string, string][] = [
      ['proposal without proposal.ranked', "SELECT p.id FROM proposal p WHERE NOT EXISTS (SELECT 1 FROM audit_event e WHERE e.action = 'proposal.ranked' AND e.proposal_id = p.id AND e.entity_id = p.id)"],
      ['decision without proposal.decided', "SELECT d.id FROM decision d WHERE NOT EXISTS (SELECT 1 FROM audit_event e WHERE e.action = 'proposal.decided' AND e.entity_id = d.id AND e.proposal_id = d.proposal_id)"],
      ['review without its verdict event', "SELECT r.id FROM review r WHERE NOT EXISTS (SELECT 1 FROM audit_event e WHERE e.action IN ('proposal.approved', 'proposal.returned') AND e.entity_id = r.id AND e.proposal_id = r.proposal_id)"],
      ['spec version without its spec event', "SELECT v.id FROM spec_version v WHERE NOT EXISTS (SELECT 1 FROM audit_event e WHERE e.action IN ('spec.created', 'spec.version-created') AND e.entity_id = v.spec_id AND e.after_id = v.id)"],
      ['verification job without its request event', "SELECT j.id FROM verification_job j WHERE NOT EXISTS (SELECT 1 FROM audit_event e WHERE e.action IN ('proposal.verification-requested', 'proposal.monte-carlo-requested') AND e.entity_id = j.id)"],
    ];
    let missingEvents = 0;
    for (const [what, sql] of orphanQueries) {
      const ids = (db.prepare(sql).all() as { id: number }[]).map((r) => r.id);
      missingEvents += ids.length;
      if (ids.length) problems.push(`${ids.length} ${what}: #${ids.slice(0, 10).join(', #')}`);
    }
    const simulating = (one("SELECT count(*) AS n FROM verification_job WHERE state = 'simulating'") as { n: number }).n;
    return { lost, integrity, foreignKeyRows, missingEvents, simulating, problems };
  } finally {
    db.close();
  }
}
