/**
 * Workflow e-mails batched into a digest: when more than DIGEST_AFTER messages for one person
 * arrive within DIGEST_WINDOW_MS, the first DIGEST_AFTER go out one by one and the rest wait for
 * one digest at the end of the window, listing each event with its link. The transport records
 * what it is given, so the headers can be read: only our words, numbers and the bare address,
 * never a spec title or a person's name. Someone who got few messages is not held back.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { SendMailOptions } from 'nodemailer';
import { MailOutboxEntity } from '../../api/entities/mail-outbox.entity';
import { DIGEST_AFTER, DIGEST_WINDOW_MS } from '../../api/mail/compose';
import { createOutboxWorker, type OutboxWorker } from '../../api/mail/outbox-worker';
import { configureNotifications } from '../../api/services/notifications.service';
import { buildApiApp, emailOf, type TestApi } from '../helpers/api-app';

const BASE_URL = 'https://longtail.fernhollow.test';
/** A spec title and display names that must never reach a header (invented). */
const TITLE = 'Quillon sensor head — thermopile input pair';
const EVENTS = DIGEST_AFTER + 3;

let api: TestApi;
let worker: OutboxWorker;
const sent: SendMailOptions[] = [];
const proposalIds: number[] = [];
let specId = 0;

beforeAll(async () => {
  configureNotifications({ baseUrl: BASE_URL });
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
  const project = await api.createProject(['requirements', 'designer', 'reviewer']);
  const spec = await api.createSpec(project.id, { title: TITLE });
  specId = spec.id;
  // Ranked EVENTS times within a few seconds: each tells the designer (and nobody else).
  for (let i = 0; i < EVENTS; i += 1) proposalIds.push((await api.createProposal(spec.id, 'requirements')).id);
  worker = createOutboxWorker({ dataSource: api.dataSource, transport: { sendMail: async (message) => void sent.push(message) }, from: 'Longtail <longtail@fernhollow.test>', retryBaseMs: 10 });
});

afterAll(async () => {
  await worker?.stop();
  await api?.close();
});

const outbox = () => api.dataSource.getRepository(MailOutboxEntity);

describe(`when ${EVENTS} workflow messages for one person arrive within a minute`, () => {
  test(`then the first ${DIGEST_AFTER} go at once and the rest wait about a minute for one digest`, async () => {
    const rows = await outbox().find({ where: { userId: api.users.designer.id }, order: { id: 'ASC' } });

    expect(rows).toHaveLength(EVENTS);
    expect(rows.map((r) => r.digest)).toEqual([...Array(DIGEST_AFTER).fill(false), ...Array(EVENTS - DIGEST_AFTER).fill(true)]);
    const held = rows.filter((r) => r.digest);
    expect(new Set(held.map((r) => r.nextAttemptAt)).size).toBe(1);
    const waitMs = Date.parse(held[0].nextAttemptAt) - Date.parse(held[0].createdAt);
    expect(waitMs).toBeGreaterThan(DIGEST_WINDOW_MS - 5_000);
    expect(waitMs).toBeLessThanOrEqual(DIGEST_WINDOW_MS);

    const run = await worker.runOnce();

    expect(run).toEqual({ sent: DIGEST_AFTER, failed: 0 });
    expect(sent).toHaveLength(DIGEST_AFTER);
  });

  test('when the window is over, then one e-mail lists every held event with its link, and all of them are marked sent', async () => {
    const held = await outbox().findBy({ userId: api.users.designer.id, digest: true });
    await outbox().update({ digest: true }, { nextAttemptAt: new Date(Date.now() - 1).toISOString() });
    const before = sent.length;

    const run = await worker.runOnce();

    expect(run).toEqual({ sent: EVENTS - DIGEST_AFTER, failed: 0 });
    expect(sent.length - before).toBe(1);
    const digest = sent.at(-1)!;
    const text = String(digest.text);
    expect(digest.subject).toBe(`Longtail: ${EVENTS - DIGEST_AFTER} workflow updates`);
    for (const row of held) {
      expect(text).toContain(`Proposal #${row.proposalId} waits for a decision`);
      expect(text).toContain(`${BASE_URL}/proposals/${row.proposalId}`);
    }
    // Subjects carry no titles, so each entry says which project and spec it is about, as the single e-mail would
    const entries = text.split(/^\d+\. /m).slice(1);
    expect(entries).toHaveLength(held.length);
    for (const entry of entries) {
      expect(entry).toContain(`Spec: "${TITLE}", version 1`);
      expect(entry).toContain('Project: Quillon sensor head');
    }
    expect(text).toContain(`${BASE_URL}/profile`);
    expect(text).toMatch(/estimates/);
    const after = await outbox().findBy({ id: held[0].id });
    expect(after[0].status).toBe('sent');
    expect((await outbox().findBy({ digest: true, status: 'pending' })).length).toBe(0);
  });

  test('then no header of any message carries user text: the bare address, and subjects without titles or names', () => {
    for (const message of sent) {
      expect(message.to).toBe(emailOf('designer'));
      const headers = JSON.stringify([message.subject, message.to, message.headers, message.messageId]);
      expect(headers).not.toContain('Quillon');
      expect(headers).not.toContain(api.users.designer.displayName);
      expect(headers).not.toContain(api.users.requirements.displayName);
    }
  });
});

describe('when a single message is held for the end of a window', () => {
  test('then it goes out as itself, with its own subject and text, not as a digest of one', async () => {
    // The designer just had EVENTS messages: the next one is held on its own
    const proposal = await api.createProposal(specId, 'requirements');
    const [row] = await outbox().findBy({ proposalId: proposal.id, userId: api.users.designer.id });
    expect(row.digest).toBe(true);
    await outbox().update({ id: row.id }, { nextAttemptAt: new Date(Date.now() - 1).toISOString() });
    const before = sent.length;

    const run = await worker.runOnce();

    expect(run).toEqual({ sent: 1, failed: 0 });
    expect(sent.length - before).toBe(1);
    const message = sent.at(-1)!;
    expect(message.subject).toBe(`Proposal #${proposal.id} waits for a decision (spec version 1)`);
    expect(String(message.text)).toContain(`Spec: "${TITLE}", version 1`);
    expect(String(message.text)).toContain(`${BASE_URL}/proposals/${proposal.id}`);
    expect(String(message.text)).not.toMatch(/workflow updates/);
  });
});

describe('when a digest is being sent (its rows leased by the worker) and another message comes', () => {
  test('then the new message waits for the end of its own window, not for the end of the lease', async () => {
    // A lease as the worker takes it: the held row stays pending, moved five minutes on while it is sent
    const first = await api.createProposal(specId, 'requirements');
    const [leased] = await outbox().findBy({ proposalId: first.id, userId: api.users.designer.id });
    expect(leased.digest).toBe(true);
    await outbox().update({ id: leased.id }, { nextAttemptAt: new Date(Date.now() + 5 * 60_000).toISOString() });

    const asked = Date.now();
    const next = await api.createProposal(specId, 'requirements');
    const [row] = await outbox().findBy({ proposalId: next.id, userId: api.users.designer.id });

    expect(row.digest).toBe(true);
    expect(Date.parse(row.nextAttemptAt) - asked).toBeLessThanOrEqual(DIGEST_WINDOW_MS + 1_000);
  });
});
