/**
 * Comments on a proposal over HTTP, as one story (each step builds on the one before): a reviewer
 * comments on a check of the decided option, the designer replies, a figure and a SPICE result get
 * threads of their own, threads are resolved and reopened with who and when, every step is an audit
 * event in the proposal's record and the project's activity, the deciding designer is told by
 * e-mail, a send-back lists the threads still open, and a closed record takes no more comments.
 * Anchors that do not belong to the proposal, blank or over-long or control-character text and the
 * wrong roles are refused.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { CommentThread } from '#shared/api/comments';
import type { Proposal } from '#shared/api/proposals';
import { MailOutboxEntity } from '../../api/entities/mail-outbox.entity';
import { VerificationJobEntity } from '../../api/entities/verification-job.entity';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let requirements: ApiClient;
let designer: ApiClient;
let reviewer: ApiClient;
let outsider: ApiClient;
let proposal: Proposal;
let topology: string;
let checkId: string;

const story = { checkThread: 0, figureThread: 0, spiceThread: 0, jobId: 0 };
const url = (suffix = '') => `/api/proposals/${proposal.id}/comments${suffix}`;

beforeAll(async () => {
  api = await buildApiApp();
  const project = await api.createProject(['requirements', 'designer', 'reviewer']);
  await api.createProject(['designer2']);
  const spec = await api.createSpec(project.id);
  [requirements, designer, reviewer, outsider] = await Promise.all((['requirements', 'designer', 'reviewer', 'designer2'] as const).map((key) => api.agentFor(key)));
  const ranked = await designer.post(`/api/specs/${spec.id}/proposals`).send();
  expect(ranked.status).toBe(201);
  const decided = await designer.post(`/api/proposals/${ranked.body.id}/decision`).send({ kind: 'choose', topology: ranked.body.result.options[0].topology, reason: 'The simplest one that fits the board.' });
  expect(decided.status).toBe(201);
  proposal = decided.body;
  topology = proposal.result.options[0]!.topology;
  checkId = proposal.result.options[0]!.checks[0]!.rule;
});

afterAll(async () => {
  await api?.close();
});

const outboxFor = async (userId: number) => api.dataSource.getRepository(MailOutboxEntity).find({ where: { userId, proposalId: proposal.id, kind: 'proposal.commented' }, order: { id: 'ASC' } });

describe('when a reviewer comments on a check of an option', () => {
  test('then 201 with the thread: its anchor, the proposal’s spec version, engine and rule set, the author, open, no replies', async () => {
    const response = await reviewer.post(url()).send({ anchorKind: 'check', topology, checkId, body: 'Which corner sets this margin?\nThe cold one, I think.' });

    expect(response.status).toBe(201);
    const thread = response.body as CommentThread;
    expect(thread).toMatchObject({
      proposalId: proposal.id,
      anchor: { kind: 'check', topology, checkId },
      specVersionId: proposal.specVersionId,
      specVersion: proposal.specVersion.version,
      engineVersion: proposal.engineVersion,
      rulesetVersion: proposal.rulesetVersion,
      body: 'Which corner sets this margin?\nThe cold one, I think.',
      author: { id: api.users.reviewer.id, displayName: api.users.reviewer.displayName },
      resolvedAt: null,
      resolvedBy: null,
      replies: [],
    });
    story.checkThread = thread.id;
  });

  test('then the designer of the decision is told by e-mail, with the anchor and the text in the body and no text in the subject', async () => {
    const rows = await outboxFor(api.users.designer.id);

    expect(rows).toHaveLength(1);
    expect(rows[0]!.subject).toBe(`Proposal #${proposal.id}: a new comment (spec version ${proposal.specVersion.version})`);
    expect(rows[0]!.body).toContain(`${api.users.reviewer.displayName} commented on the check “${checkId}” of the`);
    expect(rows[0]!.body).toContain('  Which corner sets this margin?\n  The cold one, I think.');
    expect(await outboxFor(api.users.reviewer.id)).toHaveLength(0);
  });

  test('then the designer’s reply joins the thread, and the designer, who wrote it, gets no e-mail about it', async () => {
    const response = await designer.post(url(`/${story.checkThread}/replies`)).send({ body: 'The cold corner, yes: 0 °C with the supply low.' });

    expect(response.status).toBe(201);
    expect(response.body.id).toBe(story.checkThread);
    expect(response.body.replies).toEqual([
      { id: expect.any(Number), body: 'The cold corner, yes: 0 °C with the supply low.', author: { id: api.users.designer.id, displayName: api.users.designer.displayName }, createdAt: expect.any(String) },
    ]);
    expect(await outboxFor(api.users.designer.id)).toHaveLength(1);
  });

  test('then a reply to a reply is refused (404: replies go to the thread)', async () => {
    const thread = (await reviewer.get(url())).body.items.find((t: CommentThread) => t.id === story.checkThread) as CommentThread;
    const response = await reviewer.post(url(`/${thread.replies[0]!.id}/replies`)).send({ body: 'Nested?' });

    expect(response.status).toBe(404);
  });
});

describe('when threads hang on a figure and on a SPICE result', () => {
  test('then a figure of the option takes a thread', async () => {
    const response = await designer.post(url()).send({ anchorKind: 'figure', topology, figureKey: 'temperature', body: 'The gain drift here is the spec’s limit.' });

    expect(response.status).toBe(201);
    expect(response.body.anchor).toEqual({ kind: 'figure', topology, figureKey: 'temperature' });
    story.figureThread = response.body.id;
  });

  test('then a SPICE result needs a finished SPICE check of this proposal that simulated the option', async () => {
    const jobs = api.dataSource.getRepository(VerificationJobEntity);
    const base = { proposalId: proposal.id, topology: null, runs: null, source: 'option' as const, done: 1, total: 1, step: null, message: null, requestedById: api.users.reviewer.id, claimToken: null, heartbeatAt: null, createdAt: new Date().toISOString(), startedAt: null, finishedAt: null };
    const waiting = await jobs.save({ ...base, kind: 'proposal' as const, state: 'waiting' as const, result: null });
    const finished = await jobs.save({ ...base, kind: 'proposal' as const, state: 'finished' as const, result: { simulator: 'ngspice', elapsedMs: 1, options: [{ topology, source: 'option', outcome: 'verified', error: null, nominal: null, corners: [], rejectionCurve: [], agrees: true, disagreements: 0, elapsedMs: 1 }] } as never });
    story.jobId = finished.id;

    const early = await reviewer.post(url()).send({ anchorKind: 'spice', topology, jobId: waiting.id, body: 'Too early.' });
    const response = await reviewer.post(url()).send({ anchorKind: 'spice', topology, jobId: finished.id, body: 'The simulated rejection sits 1 dB under the engine’s.' });

    expect(early.status).toBe(400);
    expect(early.body.details).toEqual([expect.objectContaining({ path: '/jobId' })]);
    expect(response.status).toBe(201);
    expect(response.body.anchor).toEqual({ kind: 'spice', topology, jobId: finished.id });
    story.spiceThread = response.body.id;
  });
});

describe('when an anchor or a text is not acceptable', () => {
  test.each([
    ['a check the option does not have', () => ({ anchorKind: 'check', topology, checkId: 'no-such-check', body: 'x' }), '/checkId'],
    ['a check anchor without its check', () => ({ anchorKind: 'check', topology, body: 'x' }), '/checkId'],
    ['a figure anchor carrying a check too', () => ({ anchorKind: 'figure', topology, figureKey: 'rejection', checkId, body: 'x' }), '/checkId'],
    ['an unknown figure', () => ({ anchorKind: 'figure', topology, figureKey: 'noise', body: 'x' }), '/figureKey'],
    ['a blank text', () => ({ anchorKind: 'figure', topology, figureKey: 'rejection', body: '   \n ' }), '/body'],
    ['a text over 4000 characters', () => ({ anchorKind: 'figure', topology, figureKey: 'rejection', body: 'x'.repeat(4001) }), '/body'],
    ['a text with a carriage return', () => ({ anchorKind: 'figure', topology, figureKey: 'rejection', body: 'one\r\ntwo' }), '/body'],
    ['a text with a bidi override', () => ({ anchorKind: 'figure', topology, figureKey: 'rejection', body: 'abc\u202edef' }), '/body'],
  ])('then %s is a 400 naming the field', async (_what, body, path) => {
    const response = await reviewer.post(url()).send(body());

    expect(response.status).toBe(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain(path);
  });

  test('then an option this proposal did not rank (the PTAT tail, which the spec leaves out) is a 400 on /topology', async () => {
    expect(proposal.result.options.map((o) => o.topology)).not.toContain('ptat');

    const response = await reviewer.post(url()).send({ anchorKind: 'figure', topology: 'ptat', figureKey: 'rejection', body: 'x' });

    expect(response.status).toBe(400);
    expect(response.body.details[0].path).toBe('/topology');
  });

  test('then a systems engineer may read the threads but not write (403), and someone outside the project gets 404', async () => {
    const read = await requirements.get(url());
    const write = await requirements.post(url()).send({ anchorKind: 'figure', topology, figureKey: 'rejection', body: 'May I?' });
    const outside = await outsider.get(url());

    expect(read.status).toBe(200);
    expect(read.body.items).toHaveLength(3);
    expect(write.status).toBe(403);
    expect(outside.status).toBe(404);
  });
});

describe('when a thread is resolved and reopened', () => {
  test('then resolving records who and when, and resolving again is a 409', async () => {
    const response = await designer.patch(url(`/${story.figureThread}`)).send({ resolved: true });
    const again = await reviewer.patch(url(`/${story.figureThread}`)).send({ resolved: true });

    expect(response.status).toBe(200);
    expect(response.body.resolvedBy).toEqual({ id: api.users.designer.id, displayName: api.users.designer.displayName });
    expect(Date.parse(response.body.resolvedAt)).toBeGreaterThan(Date.now() - 60_000);
    expect(again.status).toBe(409);
    expect(again.body.code).toBe('thread-unchanged');
  });

  test('then reopening clears the resolver, and resolving it again by the reviewer records the reviewer', async () => {
    const reopened = await reviewer.patch(url(`/${story.figureThread}`)).send({ resolved: false });
    const resolved = await reviewer.patch(url(`/${story.figureThread}`)).send({ resolved: true });

    expect(reopened.status).toBe(200);
    expect(reopened.body).toMatchObject({ resolvedAt: null, resolvedBy: null });
    expect(resolved.body.resolvedBy.id).toBe(api.users.reviewer.id);
  });

  test('then the proposal’s record holds every step as an audit event with its anchor', async () => {
    const audit = (await reviewer.get(`/api/proposals/${proposal.id}/audit`)).body.items as { action: string; actorId: number; details: Record<string, unknown> }[];
    const steps = audit.filter((e) => e.action.startsWith('proposal.comment'));

    expect(steps.map((e) => [e.action, e.actorId, e.details.threadId])).toEqual([
      ['proposal.commented', api.users.reviewer.id, story.checkThread],
      ['proposal.comment-replied', api.users.designer.id, story.checkThread],
      ['proposal.commented', api.users.designer.id, story.figureThread],
      ['proposal.commented', api.users.reviewer.id, story.spiceThread],
      ['proposal.comment-resolved', api.users.designer.id, story.figureThread],
      ['proposal.comment-reopened', api.users.reviewer.id, story.figureThread],
      ['proposal.comment-resolved', api.users.reviewer.id, story.figureThread],
    ]);
    expect(steps[0]!.details).toMatchObject({ anchorKind: 'check', topology, checkId, body: 'Which corner sets this margin?\nThe cold one, I think.' });
    expect(steps[3]!.details).toMatchObject({ anchorKind: 'spice', topology, jobId: story.jobId });
  });

  test('then the project’s activity lists them under the kind "comments", and its CSV has them in words', async () => {
    const page = await reviewer.get(`/api/projects/${proposal.projectId}/activity?kind=comments`);
    const csv = await reviewer.get(`/api/projects/${proposal.projectId}/activity.csv?kind=comments`);

    expect(page.status).toBe(200);
    expect(page.body.total).toBe(7);
    expect(csv.text).toContain('resolved comment #');
    expect(csv.text).toContain(`the figure “Tail current and gain over temperature” of the`);
  });
});

describe('when the reviewer sends the decision back with threads still open', () => {
  test('then the send-back’s audit event lists the open threads, and the designer’s e-mail lists each with its anchor and text', async () => {
    const response = await reviewer.post(`/api/proposals/${proposal.id}/review`).send({ verdict: 'return', comment: 'See the open comments.' });
    expect(response.status).toBe(201);

    const audit = (await reviewer.get(`/api/proposals/${proposal.id}/audit`)).body.items as { action: string; details: Record<string, unknown> }[];
    expect(audit.find((e) => e.action === 'proposal.returned')!.details.openComments).toEqual([story.checkThread, story.spiceThread]);
    const mail = await api.dataSource.getRepository(MailOutboxEntity).findOneByOrFail({ userId: api.users.designer.id, proposalId: proposal.id, kind: 'proposal.returned' });
    expect(mail.body).toContain('Open comments (2):');
    expect(mail.body).toContain(`  #${story.checkThread} on the check “${checkId}” of the`);
    expect(mail.body).toContain(`  #${story.spiceThread} on the SPICE result of the`);
    expect(mail.body).toContain('    The simulated rejection sits 1 dB under the engine’s.');
  });
});

describe('when the proposal is closed', () => {
  test('then comments, replies and resolving are refused with 409 and nothing is written', async () => {
    const withdrawn = await designer.post(`/api/proposals/${proposal.id}/withdrawal`).send({ reason: 'Replaced by a new board.' });
    expect(withdrawn.status).toBe(201);
    const before = (await reviewer.get(url())).body;

    const post = await reviewer.post(url()).send({ anchorKind: 'figure', topology, figureKey: 'rejection', body: 'Late.' });
    const reply = await reviewer.post(url(`/${story.checkThread}/replies`)).send({ body: 'Late.' });
    const resolve = await reviewer.patch(url(`/${story.checkThread}`)).send({ resolved: true });

    expect([post.status, reply.status, resolve.status]).toEqual([409, 409, 409]);
    expect(post.body.code).toBe('proposal-closed');
    expect((await reviewer.get(url())).body).toEqual(before);
  });
});
