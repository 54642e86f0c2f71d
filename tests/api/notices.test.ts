/**
 * Notices per kind: a spec's new version told to whoever ranked one of its versions, a settled
 * SPICE check or Monte Carlo told to whoever asked for it (with its outcome and a link), each kind
 * turned off on its own through PATCH /api/auth/me (unknown kinds refused), the master switch
 * still above them, and the new kinds held for a digest like the others. Who gets what comes from
 * the feature's brief: never the person who acted, never someone who turned the kind (or e-mail)
 * off, never someone outside the project. Read from the outbox rows the change writes.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { MailOutboxEntity, type MailOutbox } from '../../api/entities/mail-outbox.entity';
import { VerificationJobEntity, type VerificationJob } from '../../api/entities/verification-job.entity';
import { createOutboxWorker, type MailSender } from '../../api/mail/outbox-worker';
import { configureNotifications } from '../../api/services/notifications.service';
import { addMember, removeMember } from '../../api/services/projects.service';
import { createUser } from '../../api/services/users.service';
import { buildApiApp, emailOf, specPayload, TEST_PASSWORD, type AccountKey, type ApiClient, type TestApi } from '../helpers/api-app';
import { signInAs, csrfClient } from '../helpers/api-app';

const BASE_URL = 'https://longtail.ashgrove.test';
/** A designer who ranks the spec and then leaves the project (invented). */
const LEAVER = 'leaver@tests.longtail.test';
/** The closing line every message carries: figures are estimates to confirm by simulation and bench measurement. */
const ESTIMATES_LINE = /Figures are .*estimates.*confirm .*simulation and bench measurement/;
/** The kinds as the brief names them (not read from the product's list). */
const KINDS = ['proposal.ready', 'proposal.decided', 'proposal.approved', 'proposal.returned', 'proposal.superseded', 'proposal.commented', 'spec.new-version', 'verification.ended'];

let api: TestApi;
let projectId: number;
let specId: number;
let leaverId: number;
const clients = {} as Record<AccountKey, ApiClient>;
let leaver: ApiClient;

const outbox = () => api.dataSource.getRepository(MailOutboxEntity);
const lastRowId = async () => (await outbox().find({ order: { id: 'DESC' }, take: 1 }))[0]?.id ?? 0;
const rowsSince = async (markId: number, kind?: string): Promise<MailOutbox[]> =>
  (await outbox().find({ order: { id: 'ASC' } })).filter((row) => row.id > markId && (kind === undefined || row.kind === kind));
const addresses = (rows: MailOutbox[]) => rows.map((row) => row.toAddress).sort();

/** A waiting job written straight to the table (the queue takes it once kicked). */
function waitingJob(proposalId: number, requestedById: number, kind: 'proposal' | 'monte-carlo', topology: string | null, runs: number | null): Promise<VerificationJob> {
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
    requestedById,
    claimToken: null,
    heartbeatAt: null,
    createdAt: new Date().toISOString(),
    startedAt: null,
    finishedAt: null,
  });
}

async function runQueue(): Promise<void> {
  api.app.verification.kick();
  await api.app.verification.idle();
}

async function rank(by: AccountKey | ApiClient): Promise<number> {
  const client = typeof by === 'string' ? clients[by] : by;
  const response = await client.post(`/api/specs/${specId}/proposals`).send({});
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body.id as number;
}

beforeAll(async () => {
  configureNotifications({ baseUrl: BASE_URL, digestAfter: 1000 });
  api = await buildApiApp();
  await api.app.verification.ready;
  const project = await api.createProject(['requirements', 'designer', 'designer2', 'reviewer', 'reviewer2'], 'Ashgrove strain bridge');
  projectId = project.id;
  specId = (await api.createSpec(projectId, { title: 'Ashgrove strain bridge — input pair' })).id;
  leaverId = (await createUser(api.dataSource, null, { email: LEAVER, displayName: 'Test leaver', role: 'member', password: TEST_PASSWORD })).id;
  await addMember(api.dataSource, api.users.admin, projectId, leaverId, 'designer');
  for (const key of ['admin', 'requirements', 'designer', 'designer2', 'reviewer', 'reviewer2'] as const) clients[key] = await api.agentFor(key);
  leaver = await csrfClient(api.app);
  expect((await signInAs(leaver, LEAVER, TEST_PASSWORD)).status).toBe(200);
}, 60_000);

afterAll(async () => {
  await api?.close();
});

describe('when a person turns kinds of notice off on their own', () => {
  test('when the second designer turns "new version" off, then 200, /me lists it, and e-mail stays on', async () => {
    const response = await clients.designer2.patch('/api/auth/me').send({ noticesOff: ['spec.new-version'] });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({ email: emailOf('designer2'), notify: true, noticesOff: ['spec.new-version'] });
    expect((await clients.designer2.get('/api/auth/me')).body.user).toMatchObject({ notify: true, noticesOff: ['spec.new-version'] });
    // Somebody else's list is theirs alone
    expect((await clients.designer.get('/api/auth/me')).body.user.noticesOff).toEqual([]);
  });

  test('when the list names a kind the server does not know, then 400 naming the field and the known kinds, and nothing changes', async () => {
    const response = await clients.designer2.patch('/api/auth/me').send({ noticesOff: ['spec.new-version', 'proposal.rumoured'] });
    expect(response.status).toBe(400);
    expect(response.body.code).toBe('invalid-request');
    const detail = response.body.details.find((d: { path: string }) => d.path === '/noticesOff/1');
    expect(detail?.message).toContain('proposal.rumoured');
    for (const kind of KINDS) expect(detail?.message).toContain(kind);
    expect((await clients.designer2.get('/api/auth/me')).body.user.noticesOff).toEqual(['spec.new-version']);
  });

  test.each([
    ['an empty change', {}],
    ['a kind twice', { noticesOff: ['proposal.ready', 'proposal.ready'] }],
    ['a list that is not a list', { noticesOff: 'proposal.ready' }],
    ['another field', { noticesOff: [], role: 'admin' }],
  ])('when the change is %s, then 400', async (_what, body) => {
    expect((await clients.designer2.patch('/api/auth/me').send(body)).status).toBe(400);
  });

  test('when every kind the brief names is turned off and on again, then each is accepted', async () => {
    const off = await clients.reviewer2.patch('/api/auth/me').send({ noticesOff: KINDS });
    expect(off.status).toBe(200);
    expect([...off.body.user.noticesOff].sort()).toEqual([...KINDS].sort());
    const on = await clients.reviewer2.patch('/api/auth/me').send({ noticesOff: [] });
    expect(on.body.user.noticesOff).toEqual([]);
  });
});

describe('when a spec that people ranked gets a new version', () => {
  let markId: number;
  let designerRanking: number;

  beforeAll(async () => {
    designerRanking = await rank('designer');
    await rank('designer2');
    await rank('requirements');
    await rank(leaver);
    // The leaver ranked, then left the project
    await removeMember(api.dataSource, api.users.admin, projectId, leaverId);
    markId = await lastRowId();
    const payload = { ...specPayload(), title: 'Ashgrove strain bridge — input pair', powerBudgetW: 0.025, outputSwingVpp: 2.6 };
    const response = await clients.requirements.put(`/api/specs/${specId}`).send({ title: payload.title, payload, note: 'Tighter power budget after the board review' });
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    expect(response.body.latest.version).toBe(2);
  }, 60_000);

  test('then only the designer who ranked it is told: not the author who saved it, not the designer who turned the kind off, not the one who left, not the reviewers', async () => {
    const rows = await rowsSince(markId);
    expect(rows.map((row) => row.kind)).toEqual(['spec.new-version']);
    expect(addresses(rows)).toEqual([emailOf('designer')]);
  });

  test('then the message names the new version, who saved it, the note, what it is about and the history page, and says why it came', async () => {
    const [row] = await rowsSince(markId, 'spec.new-version');
    expect(row.subject).toBe('New version 2 of a spec you ranked');
    expect(row.subject).not.toContain('Ashgrove');
    expect(row.projectId).toBe(projectId);
    expect(row.link).toBe(`${BASE_URL}/specs/${specId}/history`);
    expect(row.body).toContain('Test requirements saved version 2 of a spec you had ranked; 2 fields differ from version 1.');
    expect(row.body).toContain('Project: Ashgrove strain bridge');
    expect(row.body).toContain('Spec: "Ashgrove strain bridge — input pair", version 2');
    expect(row.body).toContain('Change note:\n  Tighter power budget after the board review');
    expect(row.body).toContain(`you asked for a ranking of version 1 of this spec (proposal #${designerRanking})`);
    expect(row.body).toContain(`${BASE_URL}/profile`);
    expect(row.body).toMatch(ESTIMATES_LINE);
  });

  test('when the same figures are saved again, then no version and no notice', async () => {
    const mark = await lastRowId();
    const spec = (await clients.requirements.get(`/api/specs/${specId}`)).body;
    const response = await clients.requirements.put(`/api/specs/${specId}`).send({ title: spec.title, payload: spec.latest.payload });
    expect(response.status).toBe(200);
    expect(response.body.unchanged).toBe(true);
    expect(await rowsSince(mark)).toEqual([]);
  });
});

describe('when a SPICE check or Monte Carlo someone asked for settles', () => {
  let proposalId: number;

  beforeAll(async () => {
    proposalId = await rank('requirements');
  }, 60_000);

  test('when the designer’s check of every option finishes, then the designer alone is told how each option came out, with a link', async () => {
    const mark = await lastRowId();
    const job = await waitingJob(proposalId, api.users.designer.id, 'proposal', null, null);
    await runQueue();
    const settled = await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: job.id });
    expect(settled.state).toBe('finished');
    const rows = await rowsSince(mark);
    expect(rows.map((row) => [row.kind, row.toAddress])).toEqual([['verification.ended', emailOf('designer')]]);
    const [row] = rows;
    expect(row.proposalId).toBe(proposalId);
    expect(row.subject).toBe(`SPICE check #${job.id} finished (proposal #${proposalId}, spec version 2)`);
    expect(row.link).toBe(`${BASE_URL}/proposals/${proposalId}`);
    expect(row.body).toContain(`The SPICE check #${job.id} you asked for on proposal #${proposalId} finished: `);
    // One line per simulated option, its verdict in words, as many as the stored result holds
    const result = settled.result as { options: { outcome: string; agrees: boolean }[] };
    const verdicts = row.body.split('\n').filter((line) => /^ {2}\S.*: (agrees within the tolerances|\d+ figures? outside the tolerances|could not be simulated)/.test(line));
    expect(verdicts).toHaveLength(result.options.length);
    const agreeing = result.options.filter((o) => o.outcome === 'verified' && o.agrees).length;
    expect(row.body).toContain(`${result.options.length} options simulated; ${agreeing} ${agreeing === 1 ? 'agrees' : 'agree'} with the engine within the tolerances`);
    expect(row.body).toContain('you asked for this SPICE check');
    expect(row.body).toContain(`${BASE_URL}/proposals/${proposalId}`);
    expect(row.body).toMatch(ESTIMATES_LINE);
  }, 180_000);

  test('when a Monte Carlo finishes, then its requester gets the share of runs that meet the rejection', async () => {
    const mark = await lastRowId();
    const job = await waitingJob(proposalId, api.users.reviewer.id, 'monte-carlo', 'simple-mirror', 10);
    await runQueue();
    const settled = await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: job.id });
    expect(settled.state).toBe('finished');
    const rows = await rowsSince(mark);
    expect(addresses(rows)).toEqual([emailOf('reviewer')]);
    const mc = settled.result as { runs: number; requiredDb: number; simulated: { yieldPercent: number } };
    expect(rows[0].subject).toBe(`SPICE Monte Carlo #${job.id} finished (proposal #${proposalId}, spec version 2)`);
    expect(rows[0].body).toContain(`${mc.simulated.yieldPercent.toFixed(1)} % of 10 runs of the Simple mirror meet the required ${mc.requiredDb} dB rejection`);
  }, 180_000);

  test('when a job cannot run, then its requester is told it could not run and why', async () => {
    const mark = await lastRowId();
    const job = await waitingJob(proposalId, api.users.designer.id, 'monte-carlo', 'no-such-tail', 10);
    await runQueue();
    expect((await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: job.id })).state).toBe('failed');
    const rows = await rowsSince(mark);
    expect(addresses(rows)).toEqual([emailOf('designer')]);
    expect(rows[0].subject).toBe(`SPICE Monte Carlo #${job.id} could not run (proposal #${proposalId}, spec version 2)`);
    expect(rows[0].body).toContain(`The SPICE Monte Carlo #${job.id} you asked for on proposal #${proposalId} could not run, so nothing was simulated.`);
    expect(rows[0].body).toContain('Why:\n  The job could not run: The proposal has no such option.');
  }, 60_000);

  test('when the requester turned the kind off, or e-mail off, or left the project, then nobody is told', async () => {
    await clients.designer2.patch('/api/auth/me').send({ noticesOff: ['verification.ended'] }).expect(200);
    await clients.reviewer.patch('/api/auth/me').send({ notify: false }).expect(200);
    const mark = await lastRowId();
    const jobs = [
      await waitingJob(proposalId, api.users.designer2.id, 'monte-carlo', 'simple-mirror', 10),
      await waitingJob(proposalId, api.users.reviewer.id, 'monte-carlo', 'simple-mirror', 10),
      await waitingJob(proposalId, leaverId, 'monte-carlo', 'simple-mirror', 10),
    ];
    await runQueue();
    for (const job of jobs) expect((await api.dataSource.getRepository(VerificationJobEntity).findOneByOrFail({ id: job.id })).state).toBe('finished');
    expect(await rowsSince(mark)).toEqual([]);
    await clients.reviewer.patch('/api/auth/me').send({ notify: true }).expect(200);
    await clients.designer2.patch('/api/auth/me').send({ noticesOff: ['spec.new-version'] }).expect(200);
  }, 180_000);
});

describe('when kinds that existed before are turned off', () => {
  test('when the designer turns "ready for a decision" off, then a ranking tells the second designer only; turned on again, both', async () => {
    await clients.designer.patch('/api/auth/me').send({ noticesOff: ['proposal.ready'] }).expect(200);
    let mark = await lastRowId();
    await rank('requirements');
    expect(addresses(await rowsSince(mark, 'proposal.ready'))).toEqual([emailOf('designer2')]);
    await clients.designer.patch('/api/auth/me').send({ noticesOff: [] }).expect(200);
    mark = await lastRowId();
    await rank('requirements');
    expect(addresses(await rowsSince(mark, 'proposal.ready'))).toEqual([emailOf('designer'), emailOf('designer2')].sort());
  }, 60_000);

  test('when the second reviewer turns "decided" off, then a decision tells the first reviewer only', async () => {
    await clients.reviewer2.patch('/api/auth/me').send({ noticesOff: ['proposal.decided'] }).expect(200);
    const proposalId = await rank('requirements');
    const mark = await lastRowId();
    await clients.designer.post(`/api/proposals/${proposalId}/decision`).send({ kind: 'accept' }).expect(201);
    expect(addresses(await rowsSince(mark, 'proposal.decided'))).toEqual([emailOf('reviewer')]);
    await clients.reviewer2.patch('/api/auth/me').send({ noticesOff: [] }).expect(200);
  }, 60_000);

  test('when e-mail is off but no kind is, then nothing comes; the master switch stays above the kinds', async () => {
    await clients.designer.patch('/api/auth/me').send({ notify: false }).expect(200);
    const mark = await lastRowId();
    await rank('requirements');
    expect(addresses(await rowsSince(mark, 'proposal.ready'))).toEqual([emailOf('designer2')]);
    await clients.designer.patch('/api/auth/me').send({ notify: true }).expect(200);
  }, 60_000);
});

describe('when the new kinds come in a burst', () => {
  test('then beyond the threshold they are held and go out in one digest listing each with its project, spec and link', async () => {
    configureNotifications({ baseUrl: BASE_URL, digestAfter: 1, digestWindowMs: 400 });
    try {
      // Earlier messages out of the window first
      await new Promise((resolve) => setTimeout(resolve, 500));
      const mark = await lastRowId();
      // The designer gets "ready" (sent at once), then a new version and a settled check (held)
      const proposalId = await rank('requirements');
      const payload = { ...specPayload(), title: 'Ashgrove strain bridge — input pair', powerBudgetW: 0.024, outputSwingVpp: 2.6 };
      await clients.requirements.put(`/api/specs/${specId}`).send({ title: payload.title, payload }).expect(200);
      await waitingJob(proposalId, api.users.designer.id, 'monte-carlo', 'no-such-tail', 10);
      await runQueue();
      const mine = (await rowsSince(mark)).filter((row) => row.toAddress === emailOf('designer'));
      expect(mine.map((row) => [row.kind, row.digest])).toEqual([
        ['proposal.ready', false],
        ['spec.new-version', true],
        ['verification.ended', true],
      ]);
      const sent: { to: unknown; subject: unknown; text: unknown }[] = [];
      const transport: MailSender = { sendMail: async (message) => void sent.push({ to: message.to, subject: message.subject, text: message.text }) };
      const worker = createOutboxWorker({ dataSource: api.dataSource, transport, from: 'Longtail <longtail@tests.longtail.test>', batchSize: 500 });
      await new Promise((resolve) => setTimeout(resolve, 500));
      await worker.runOnce();
      await worker.stop();
      const toDesigner = sent.filter((m) => m.to === emailOf('designer'));
      const digest = toDesigner.find((m) => String(m.subject).startsWith('Longtail: 2 workflow updates'));
      expect(digest, JSON.stringify(toDesigner.map((m) => m.subject))).toBeDefined();
      const text = String(digest!.text);
      expect(text).toContain('1. New version 3 of a spec you ranked');
      expect(text).toContain('Test requirements saved version 3 of a spec you had ranked');
      expect(text).toContain(`${BASE_URL}/specs/${specId}/history`);
      expect(text).toMatch(/2\. SPICE Monte Carlo #\d+ could not run/);
      expect(text).toContain(`${BASE_URL}/proposals/${proposalId}`);
      expect(text.match(/Project: Ashgrove strain bridge/g)).toHaveLength(2);
      expect(text).toContain('Spec: "Ashgrove strain bridge — input pair", version 3');
    } finally {
      configureNotifications({ baseUrl: BASE_URL, digestAfter: 1000 });
    }
  }, 120_000);
});
