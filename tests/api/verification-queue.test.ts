/**
 * Sharing the one SPICE simulator fairly: the order jobs are claimed in (round-robin over the
 * people who asked, a proposal's verification before Monte Carlo), a short verification finishing
 * while another person's long Monte Carlo is still running, the cap on one person's active jobs
 * (429), withdrawing a waiting or running job (who may, what is recorded), and a whole
 * verification across simulator threads replaced after a number of runs.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { VerificationJobEntity, type VerificationJob } from '../../api/entities/verification-job.entity';
import { SpiceEngine } from '../../api/verification/spice-engine';
import type { ProposalVerificationResult, VerificationJobView, VerificationStatus } from '#shared/verification/types';
import { buildApiApp, type AccountKey, type ApiClient, type TestApi } from '../helpers/api-app';

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Polls a job by id through the repository until `done(job)` holds. */
async function until(api: TestApi, jobId: number, done: (job: VerificationJob) => boolean, timeoutMs = 120_000): Promise<VerificationJob> {
  const t0 = Date.now();
  for (;;) {
    const job = await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: jobId });
    if (done(job)) return job;
    if (Date.now() - t0 > timeoutMs) throw new Error(`job ${jobId} never reached the condition: ${job.state} ${job.done}/${job.total}`);
    await sleep(25);
  }
}

const settledStates = ['finished', 'stopped', 'failed', 'withdrawn'];

/** A waiting job written straight to the table, so no request wakes the queue before the test does. */
function waitingJob(api: TestApi, proposalId: number, by: AccountKey, kind: 'proposal' | 'monte-carlo', topology: string | null, runs: number | null) {
  return api.dataSource.getRepository(VerificationJobEntity).save({
    proposalId,
    kind,
    topology,
    runs,
    state: 'waiting' as const,
    done: 0,
    total: runs ?? 0,
    step: null,
    message: null,
    result: null,
    requestedById: api.users[by].id,
    claimToken: null,
    heartbeatAt: null,
    createdAt: new Date().toISOString(),
    startedAt: null,
    finishedAt: null,
  });
}

describe('the order waiting jobs are claimed in', () => {
  let api: TestApi;
  afterAll(() => api?.close());

  it('takes turns between people, and a proposal verification before Monte Carlo, whatever was asked first', async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
    await api.app.verification.ready;
    const project = await api.createProject(['requirements', 'designer', 'reviewer']);
    const spec = await api.createSpec(project.id);
    const proposal = await api.createProposal(spec.id);
    // The designer asked for two Monte Carlo runs first, then the reviewer for one and for a verification.
    const designerFirst = await waitingJob(api, proposal.id, 'designer', 'monte-carlo', 'wilson', 10);
    const designerSecond = await waitingJob(api, proposal.id, 'designer', 'monte-carlo', 'cascode', 10);
    const reviewerMonteCarlo = await waitingJob(api, proposal.id, 'reviewer', 'monte-carlo', 'simple-mirror', 10);
    const reviewerVerification = await waitingJob(api, proposal.id, 'reviewer', 'proposal', null, null);

    api.app.verification.kick();
    await api.app.verification.idle();

    const jobs = await api.dataSource.getRepository(VerificationJobEntity).find({ order: { startedAt: 'ASC' } });
    for (const job of jobs) expect(job.state, `job ${job.id}`).toBe('finished');
    // Nobody served yet: ties go to the verification, then by age. Then whoever was served least recently.
    expect(jobs.map((j) => j.id)).toEqual([reviewerVerification.id, designerFirst.id, reviewerMonteCarlo.id, designerSecond.id]);
  }, 120_000);
});

describe('short work while another person floods the queue with Monte Carlo', () => {
  let api: TestApi;
  afterAll(() => api?.close());

  it('a verification, then a short Monte Carlo of a second person, each finish while the first Monte Carlo is still running and the others still wait', async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
    const project = await api.createProject(['requirements', 'designer', 'reviewer']);
    const spec = await api.createSpec(project.id);
    const flooded = await api.createProposal(spec.id);
    const other = await api.createProposal(spec.id);
    const designer = await api.agentFor('designer');
    const reviewer = await api.agentFor('reviewer');
    const flood: number[] = [];
    for (const topology of ['wilson', 'cascode', 'simple-mirror']) {
      const asked = await designer.post(`/api/proposals/${flooded.id}/verification/monte-carlo`).send({ topology, runs: 2000 }).expect(202);
      flood.push(asked.body.id);
    }
    await until(api, flood[0], (job) => job.state === 'simulating' && job.done > 0);

    const asked = await reviewer.post(`/api/proposals/${other.id}/verification`).expect(202);
    const mine = await until(api, asked.body.id, (job) => settledStates.includes(job.state));

    expect(mine.state).toBe('finished');
    const first = await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: flood[0] });
    expect(first.state, 'the first Monte Carlo is paused, not finished').toBe('simulating');
    expect(first.done).toBeLessThan(2000);
    for (const id of flood.slice(1)) expect((await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id })).state).toBe('waiting');
    const result = mine.result as ProposalVerificationResult;
    expect(result.options.length).toBe(other.result.options.length);
    for (const option of result.options) expect(option.outcome, option.topology).toBe('verified');

    // A second person's (short) Monte Carlo does not wait for the first person's to end either.
    const theirs = await reviewer.post(`/api/proposals/${other.id}/verification/monte-carlo`).send({ topology: 'wilson', runs: 60 }).expect(202);
    const finishedMonteCarlo = await until(api, theirs.body.id, (job) => settledStates.includes(job.state));
    expect(finishedMonteCarlo.state).toBe('finished');
    const firstAgain = await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: flood[0] });
    expect(firstAgain.state, 'the first Monte Carlo is still paused').toBe('simulating');
    expect(firstAgain.done).toBeLessThan(2000);
    for (const id of flood.slice(1)) expect((await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id })).state, 'the flood’s own jobs do not jump in').toBe('waiting');

    // The flood is called off so the file ends quickly (and withdrawing a running job stops it).
    for (const id of flood) await designer.delete(`/api/proposals/${flooded.id}/verification/${id}`).expect(200);
    await api.app.verification.idle();
    for (const id of flood) expect((await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id })).state).toBe('withdrawn');
  }, 300_000);
});

describe('the cap on one person’s active jobs', () => {
  let api: TestApi;
  afterAll(() => api?.close());

  it('answers 429 with the reason past six waiting or simulating, and takes the job once one is withdrawn', async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
    const project = await api.createProject(['requirements', 'designer', 'reviewer']);
    const spec = await api.createSpec(project.id);
    const proposal = await api.createProposal(spec.id);
    const second = await api.createProposal(spec.id);
    const designer = await api.agentFor('designer');
    const reviewer = await api.agentFor('reviewer');
    const topologies = proposal.result.options.filter((o) => o.design).map((o) => o.topology);
    expect(topologies.length).toBe(6);
    const mine: number[] = [];
    for (const topology of topologies) mine.push((await designer.post(`/api/proposals/${proposal.id}/verification/monte-carlo`).send({ topology, runs: 2000 }).expect(202)).body.id);

    const refused = await designer.post(`/api/proposals/${second.id}/verification`).expect(429);
    expect(refused.body.code).toBe('too-many-verification-jobs');
    expect(refused.body.error).toMatch(/6 SPICE jobs waiting or simulating/);
    expect(refused.body.error).toMatch(/Withdraw one or wait/);
    // Asking again for a job already waiting is not a new job: it answers that job, not 429.
    const same = await designer.post(`/api/proposals/${proposal.id}/verification/monte-carlo`).send({ topology: topologies[5], runs: 2000 }).expect(202);
    expect(same.body.id).toBe(mine[5]);
    // Someone else is not held back by the designer's jobs.
    await reviewer.post(`/api/proposals/${second.id}/verification`).expect(202);

    await designer.delete(`/api/proposals/${proposal.id}/verification/${mine[5]}`).expect(200);
    await designer.post(`/api/proposals/${second.id}/verification`).expect(202);

    for (const id of mine.slice(0, 5)) await designer.delete(`/api/proposals/${proposal.id}/verification/${id}`).expect(200);
  }, 120_000);
});

describe('withdrawing a job', () => {
  let api: TestApi;
  let proposalId: number;
  let elsewhere: number;
  const clients = {} as Record<AccountKey, ApiClient>;

  beforeAll(async () => {
    api = await buildApiApp();
    // The second reviewer is not a member: the project is invisible to them.
    const project = await api.createProject(['requirements', 'designer', 'reviewer', 'designer2']);
    const spec = await api.createSpec(project.id);
    proposalId = (await api.createProposal(spec.id)).id;
    elsewhere = (await api.createProposal(spec.id)).id;
    for (const key of ['admin', 'requirements', 'designer', 'reviewer', 'designer2', 'reviewer2'] as const) clients[key] = await api.agentFor(key);
  }, 60_000);
  afterAll(() => api?.close());

  /** The designer's Monte Carlo of 2,000 runs on one option, new each time (a settled one is not given back). */
  const askMonteCarlo = async (topology = 'wilson') =>
    (await clients.designer.post(`/api/proposals/${proposalId}/verification/monte-carlo`).send({ topology, runs: 2000 }).expect(202)).body as VerificationJobView;

  it('stops a running job promptly, keeps it withdrawn with who did it, and records the event', async () => {
    const job = await askMonteCarlo();
    await until(api, job.id, (j) => j.state === 'simulating' && j.done >= 5);
    const t0 = performance.now();
    const answer = await clients.designer.delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(200);
    expect(answer.body).toMatchObject({ id: job.id, state: 'withdrawn', message: 'Withdrawn by Test designer.' });
    await api.app.verification.idle();
    // Between analyses: the simulator is free again within a couple of seconds, not after 2,000 runs.
    expect(performance.now() - t0).toBeLessThan(5000);
    const stored = await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: job.id });
    expect(stored.state).toBe('withdrawn');
    expect(stored.result).toBeNull();
    expect(stored.done).toBeLessThan(2000);
    const status = (await clients.reviewer.get(`/api/proposals/${proposalId}/verification`).expect(200)).body as VerificationStatus;
    expect(status.monteCarlo.find((j) => j.id === job.id)?.state).toBe('withdrawn');
    const audit = (await clients.reviewer.get(`/api/proposals/${proposalId}/audit`).expect(200)).body.items as { action: string; actorId: number; entityId: number; details: Record<string, unknown> }[];
    const event = audit.find((e) => e.action === 'proposal.verification-withdrawn' && e.entityId === job.id);
    expect(event).toMatchObject({ actorId: api.users.designer.id, details: { kind: 'monte-carlo', topology: 'wilson', was: 'simulating' } });
  }, 120_000);

  it('withdraws a waiting job before it ever runs, and the same work can be asked for again', async () => {
    const running = await askMonteCarlo('wilson');
    const waiting = await askMonteCarlo('cascode');
    await until(api, running.id, (j) => j.state === 'simulating');
    await clients.reviewer.delete(`/api/proposals/${proposalId}/verification/${waiting.id}`).expect(200);
    await clients.designer.delete(`/api/proposals/${proposalId}/verification/${running.id}`).expect(200);
    await api.app.verification.idle();
    const stored = await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: waiting.id });
    expect(stored).toMatchObject({ state: 'withdrawn', startedAt: null, message: 'Withdrawn by Test reviewer.' });
    const again = await askMonteCarlo('cascode');
    expect(again.id).not.toBe(waiting.id);
    await clients.designer.delete(`/api/proposals/${proposalId}/verification/${again.id}`).expect(200);
  }, 120_000);

  it('allows the requester, a reviewer and an administrator; refuses another designer and the requirements author', async () => {
    for (const key of ['designer2', 'requirements'] as const) {
      const job = await askMonteCarlo();
      const refused = await clients[key].delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(403);
      expect(refused.body.code).toBe('forbidden');
      await clients.designer.delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(200);
    }
    for (const key of ['designer', 'reviewer', 'admin'] as const) {
      const job = await askMonteCarlo();
      await clients[key].delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(200);
    }
    await api.app.verification.idle();
  }, 120_000);

  it('goes by the role held in the job’s project: a reviewer elsewhere who designs here is refused, a designer elsewhere who reviews here may', async () => {
    const swapped = await api.createProject(['requirements', 'designer', 'designer2', 'reviewer2'], 'Sallow tide gauge', { designer2: 'reviewer', reviewer2: 'designer' });
    const spec = await api.createSpec(swapped.id);
    const proposal = await api.createProposal(spec.id);
    const job = (await clients.designer.post(`/api/proposals/${proposal.id}/verification/monte-carlo`).send({ topology: 'wilson', runs: 2000 }).expect(202)).body as VerificationJobView;
    const refused = await clients.reviewer2.delete(`/api/proposals/${proposal.id}/verification/${job.id}`).expect(403);
    expect(refused.body.code).toBe('forbidden');
    await clients.designer2.delete(`/api/proposals/${proposal.id}/verification/${job.id}`).expect(200);
    await api.app.verification.idle();
  }, 60_000);

  it('answers 404 outside the project, for another proposal’s job and for no job; 409 once settled', async () => {
    const job = await askMonteCarlo();
    const outsider = await clients.reviewer2.delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(404);
    const missing = await clients.reviewer2.delete(`/api/proposals/987654/verification/${job.id}`).expect(404);
    expect(outsider.body).toEqual(missing.body);
    await clients.designer.delete(`/api/proposals/${elsewhere}/verification/${job.id}`).expect(404);
    await clients.designer.delete(`/api/proposals/${proposalId}/verification/987654`).expect(404);
    await clients.designer.delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(200);
    const again = await clients.designer.delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(409);
    expect(again.body.error).toMatch(/already been withdrawn/);
    // No CSRF token, no withdrawal.
    await clients.designer.agent.delete(`/api/proposals/${proposalId}/verification/${job.id}`).expect(403);
    await api.app.verification.idle();
  }, 60_000);
});

describe('the simulator thread replaced as it ages (the engine alone: tests/unit/verification/spice-engine.test.ts)', () => {
  it('runs a whole verification across recycled threads with every option verified', async () => {
    const engine = new SpiceEngine(undefined, { recycleAfterRuns: 40 });
    const api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'], verification: { engine } });
    try {
      const project = await api.createProject(['requirements', 'designer', 'reviewer']);
      const spec = await api.createSpec(project.id);
      const proposal = await api.createProposal(spec.id);
      const reviewer = await api.agentFor('reviewer');
      const asked = await reviewer.post(`/api/proposals/${proposal.id}/verification`).expect(202);
      const job = await until(api, asked.body.id, (j) => settledStates.includes(j.state));
      expect(job.state).toBe('finished');
      const result = job.result as ProposalVerificationResult;
      for (const option of result.options) expect(option.outcome, option.topology).toBe('verified');
      // Six options of 16 analyses each on threads of 40 runs.
      expect(engine.recycles).toBeGreaterThanOrEqual(2);
    } finally {
      await api.close();
    }
  }, 120_000);
});
