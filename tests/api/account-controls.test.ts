/**
 * Accounts that can be managed: the password rule (blank, one repeated character, the e-mail
 * address or its name part, a common password) wherever a password is set; a person's own
 * password change (current password required); an administrator's one-time reset link through
 * the mail outbox (only the token's SHA-256 stored, expiry, single use, a newer link replacing
 * an older one); disabling and enabling an account. Changing, resetting and disabling end the
 * person's other sessions; each writes an audit event. The common passwords used here are
 * well-known leaked ones (they head every published list).
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { MailOutboxEntity } from '../../api/entities/mail-outbox.entity';
import { PasswordResetEntity } from '../../api/entities/password-reset.entity';
import { createOutboxWorker } from '../../api/mail/outbox-worker';
import { addMember } from '../../api/services/projects.service';
import { buildApiApp, csrfClient, emailOf, signInAs, TEST_PASSWORD, type AccountKey, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let admin: ApiClient;

beforeAll(async () => {
  api = await buildApiApp();
  admin = await api.agentFor('admin');
});

afterAll(async () => {
  await api?.close();
});

async function signedIn(email: string, password: string): Promise<{ client: ApiClient; status: number; code?: string }> {
  const client = await csrfClient(api.app);
  const response = await signInAs(client, email, password);
  return { client, status: response.status, code: response.body.code };
}

async function auditActions(userId: number): Promise<string[]> {
  const rows = await api.dataSource.getRepository(AuditEventEntity).find({ where: { entityType: 'user', entityId: userId }, order: { id: 'ASC' } });
  return rows.map((r) => r.action);
}

/** A fresh account for one test (its own password history and sessions). */
let serial = 0;
async function freshAccount(password = 'harbour-pilot-7730-ridge'): Promise<{ id: number; email: string; password: string }> {
  serial += 1;
  const email = `person-${serial}@tests.longtail.test`;
  const response = await admin.post('/api/users').send({ email, displayName: `Person ${serial}`, role: 'member', password });
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return { id: response.body.id as number, email, password };
}

describe('when a password is set, then the rule refuses weak ones with a 400 naming the field and the reason', () => {
  const email = 'marlow.quaye@tests.longtail.test';
  const CASES: [string, string, RegExp][] = [
    ['blank after trimming (12 spaces)', ' '.repeat(12), /blank/],
    ['one character repeated', 'kkkkkkkkkkkkkkk', /one character repeated/],
    ['the e-mail address itself', email, /e-mail address/],
    ['the e-mail address inside, in capitals', `X-${email.toUpperCase()}-1`, /e-mail address/],
    ['the name part of the address', 'my-marlow.quaye-2026', /name in your e-mail address/],
    ['a common password', 'qwerty123456', /common passwords/],
    ['a common password in capitals', '1Q2W3E4R5T6Y', /common passwords/],
  ];

  test.each(CASES)('when a new account’s password is %s, then 400 at /password and no account is made', async (_title, password, reason) => {
    const before = (await admin.get('/api/users')).body.items.length;

    const response = await admin.post('/api/users').send({ email, displayName: 'Marlow Quaye', role: 'member', password });

    expect(response.status).toBe(400);
    expect(response.body.details).toEqual([{ path: '/password', message: expect.stringMatching(reason) }]);
    expect((await admin.get('/api/users')).body.items).toHaveLength(before);
  });

  test('when the name part of the address is shorter than four characters, then a password containing it is accepted', async () => {
    const response = await admin.post('/api/users').send({ email: 'al@tests.longtail.test', displayName: 'Al Brandt', role: 'member', password: 'halyard-tally-4471' });

    expect(response.status).toBe(201);
  });

  test('when someone changes their own password to a common one or one repeated character, then 400 at /newPassword and the old password still works', async () => {
    const person = await freshAccount();
    const { client } = await signedIn(person.email, person.password);

    const common = await client.post('/api/auth/password').send({ currentPassword: person.password, newPassword: 'qwerty123456' });
    const repeated = await client.post('/api/auth/password').send({ currentPassword: person.password, newPassword: '000000000000' });

    expect(common.status).toBe(400);
    expect(common.body.details).toEqual([{ path: '/newPassword', message: expect.stringMatching(/common passwords/) }]);
    expect(repeated.status).toBe(400);
    expect(repeated.body.details).toEqual([{ path: '/newPassword', message: expect.stringMatching(/repeated/) }]);
    expect((await signedIn(person.email, person.password)).status).toBe(200);
  });
});

describe('when a person changes their own password', () => {
  test('when the current password is wrong, then 400 at /currentPassword and nothing changes', async () => {
    const person = await freshAccount();
    const { client } = await signedIn(person.email, person.password);

    const response = await client.post('/api/auth/password').send({ currentPassword: 'not-my-password-at-all', newPassword: 'lantern-skiff-9021-dune' });

    expect(response.status).toBe(400);
    expect(response.body.details).toEqual([{ path: '/currentPassword', message: expect.any(String) }]);
    expect((await signedIn(person.email, person.password)).status).toBe(200);
    expect(await auditActions(person.id)).not.toContain('user.password-changed');
  });

  test('when the change is made, then the new password signs in, the old does not, the other sessions end, this one stays, and an audit event is written', async () => {
    // Arrange: two sessions of the person
    const person = await freshAccount();
    const here = await signedIn(person.email, person.password);
    const elsewhere = await signedIn(person.email, person.password);
    expect((await elsewhere.client.get('/api/auth/me')).status).toBe(200);

    // Act
    const response = await here.client.post('/api/auth/password').send({ currentPassword: person.password, newPassword: 'lantern-skiff-9021-dune' });

    // Assert
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    expect(response.body.endedSessions).toBe(1);
    expect((await here.client.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.client.get('/api/auth/me')).status).toBe(401);
    expect((await signedIn(person.email, person.password)).status).toBe(401);
    expect((await signedIn(person.email, 'lantern-skiff-9021-dune')).status).toBe(200);
    expect(await auditActions(person.id)).toContain('user.password-changed');
  });

  test('when nobody is signed in, then 401', async () => {
    const response = await (await api.anonymous()).post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'lantern-skiff-9021-dune' });

    expect(response.status).toBe(401);
  });
});

describe('when an administrator has a reset link sent', () => {
  /** The token in the newest outbox message to an address (the link is `…/password-reset#<token>`). */
  async function mailedToken(email: string): Promise<{ token: string; body: string; subject: string }> {
    const rows = await api.dataSource.getRepository(MailOutboxEntity).find({ where: { toAddress: email }, order: { id: 'DESC' } });
    const match = /\/password-reset#([A-Za-z0-9_-]+)/.exec(rows[0]?.body ?? '');
    expect(match, rows[0]?.body).toBeTruthy();
    return { token: match![1], body: rows[0].body, subject: rows[0].subject };
  }

  test('when the link is sent, then 202 with its expiry, one message in the outbox, and only the token’s SHA-256 in the database', async () => {
    const person = await freshAccount();

    const response = await admin.post(`/api/users/${person.id}/password-reset`);

    expect(response.status).toBe(202);
    const hours = (Date.parse(response.body.expiresAt) - Date.now()) / 3_600_000;
    expect(hours).toBeGreaterThan(23.9);
    expect(hours).toBeLessThanOrEqual(24);
    const { token, subject, body } = await mailedToken(person.email);
    expect(subject).toMatch(/new password/i);
    // The expiry in the app's date format, in UTC with the zone named (never an ISO stamp).
    const expiry = new Date(response.body.expiresAt);
    const month = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'][expiry.getUTCMonth()];
    const clock = `${String(expiry.getUTCHours()).padStart(2, '0')}:${String(expiry.getUTCMinutes()).padStart(2, '0')}`;
    expect(body).toContain(`until ${expiry.getUTCDate()} ${month} ${expiry.getUTCFullYear()}, ${clock} UTC.`);
    expect(body).not.toContain(response.body.expiresAt);
    const stored = await api.dataSource.getRepository(PasswordResetEntity).find({ where: { userId: person.id } });
    expect(stored).toEqual([expect.objectContaining({ tokenHash: createHash('sha256').update(token).digest('hex'), usedAt: null, createdById: api.users.admin.id })]);
    expect(JSON.stringify(stored)).not.toContain(token);
    expect(await auditActions(person.id)).toContain('user.password-reset-sent');
  });

  test('when the link is used, then the new password signs in, the old does not, every session of the person ends, and the link does not work twice', async () => {
    // Arrange
    const person = await freshAccount();
    const before = await signedIn(person.email, person.password);
    await admin.post(`/api/users/${person.id}/password-reset`).expect(202);
    const { token } = await mailedToken(person.email);
    const visitor = await api.anonymous();

    // Act
    const used = await visitor.post('/api/auth/password-reset').send({ token, newPassword: 'gannet-rope-3318-shoal' });
    const again = await visitor.post('/api/auth/password-reset').send({ token, newPassword: 'another-gannet-4419-shoal' });

    // Assert
    expect(used.status, JSON.stringify(used.body)).toBe(200);
    expect(used.body).toEqual({ email: person.email });
    expect((await before.client.get('/api/auth/me')).status).toBe(401);
    expect((await signedIn(person.email, person.password)).status).toBe(401);
    expect((await signedIn(person.email, 'gannet-rope-3318-shoal')).status).toBe(200);
    expect(again.status).toBe(400);
    expect(again.body.code).toBe('reset-link-invalid');
    expect(await auditActions(person.id)).toEqual(expect.arrayContaining(['user.password-reset-sent', 'user.password-reset']));
  });

  test('when a newer link was sent, then the older one is refused and the newer one works', async () => {
    const person = await freshAccount();
    await admin.post(`/api/users/${person.id}/password-reset`).expect(202);
    const older = (await mailedToken(person.email)).token;
    await admin.post(`/api/users/${person.id}/password-reset`).expect(202);
    const newer = (await mailedToken(person.email)).token;
    const visitor = await api.anonymous();

    const refused = await visitor.post('/api/auth/password-reset').send({ token: older, newPassword: 'gannet-rope-3318-shoal' });
    const accepted = await visitor.post('/api/auth/password-reset').send({ token: newer, newPassword: 'gannet-rope-3318-shoal' });

    expect(newer).not.toBe(older);
    expect(refused.status).toBe(400);
    expect(refused.body.code).toBe('reset-link-invalid');
    expect(accepted.status).toBe(200);
  });

  test('when the link has expired, then 400 and the password is unchanged', async () => {
    const person = await freshAccount();
    await admin.post(`/api/users/${person.id}/password-reset`).expect(202);
    const { token } = await mailedToken(person.email);
    await api.dataSource.getRepository(PasswordResetEntity).update({ userId: person.id }, { expiresAt: '2020-01-01T00:00:00.000Z' });

    const response = await (await api.anonymous()).post('/api/auth/password-reset').send({ token, newPassword: 'gannet-rope-3318-shoal' });

    expect(response.status).toBe(400);
    expect(response.body.code).toBe('reset-link-invalid');
    expect((await signedIn(person.email, person.password)).status).toBe(200);
  });

  test('when the new password breaks the rule, then 400 at /newPassword and the link stays open', async () => {
    const person = await freshAccount();
    await admin.post(`/api/users/${person.id}/password-reset`).expect(202);
    const { token } = await mailedToken(person.email);
    const visitor = await api.anonymous();

    const weak = await visitor.post('/api/auth/password-reset').send({ token, newPassword: `${person.email}!` });
    const good = await visitor.post('/api/auth/password-reset').send({ token, newPassword: 'gannet-rope-3318-shoal' });

    expect(weak.status).toBe(400);
    expect(weak.body.details).toEqual([{ path: '/newPassword', message: expect.stringMatching(/e-mail address/) }]);
    expect(good.status).toBe(200);
  });

  test('when the outbox worker has sent the message, then its stored body no longer holds the link', async () => {
    const person = await freshAccount();
    await admin.post(`/api/users/${person.id}/password-reset`).expect(202);
    const { token } = await mailedToken(person.email);
    const sent: string[] = [];
    const worker = createOutboxWorker({ dataSource: api.dataSource, from: 'Longtail <longtail@tests.longtail.test>', transport: { sendMail: async (message) => void sent.push(String(message.text)) } });

    await worker.runOnce();

    expect(sent.some((text) => text.includes(token))).toBe(true);
    const rows = await api.dataSource.getRepository(MailOutboxEntity).find({ where: { toAddress: person.email } });
    expect(rows.every((r) => r.status === 'sent' && !r.body.includes(token))).toBe(true);
  });
});

describe('when an administrator disables and enables an account', () => {
  test('when the account is disabled, then its sessions end, the right password answers 403 account-disabled, a wrong one the usual 401, and enabling lets it sign in again', async () => {
    // Arrange
    const person = await freshAccount();
    const session = await signedIn(person.email, person.password);

    // Act
    const disabled = await admin.patch(`/api/users/${person.id}`).send({ disabled: true });
    const meAfter = await session.client.get('/api/auth/me');
    const right = await signedIn(person.email, person.password);
    const wrong = await signedIn(person.email, 'not-the-password-1');
    const enabled = await admin.patch(`/api/users/${person.id}`).send({ disabled: false });
    const again = await signedIn(person.email, person.password);

    // Assert
    expect(disabled.status).toBe(200);
    expect(disabled.body.disabledAt).toEqual(expect.any(String));
    expect(meAfter.status).toBe(401);
    expect(right).toMatchObject({ status: 403, code: 'account-disabled' });
    expect(wrong).toMatchObject({ status: 401, code: 'sign-in-failed' });
    expect(enabled.body.disabledAt).toBeNull();
    expect(again.status).toBe(200);
    expect(await auditActions(person.id)).toEqual(expect.arrayContaining(['user.disabled', 'user.enabled']));
    expect((await admin.get('/api/users')).body.items.find((u: { id: number }) => u.id === person.id).disabledAt).toBeNull();
  });

  test('when a disabled designer is a project member, then a new proposal mails the other designers but not them', async () => {
    const person = await freshAccount();
    const project = await api.createProject(['requirements', 'designer']);
    await addMember(api.dataSource, api.users.admin, project.id, person.id, 'designer');
    await admin.patch(`/api/users/${person.id}`).send({ disabled: true }).expect(200);
    const spec = await api.createSpec(project.id);

    const proposal = await api.createProposal(spec.id, 'requirements');

    const recipients = (await api.dataSource.getRepository(MailOutboxEntity).find({ where: { proposalId: proposal.id } })).map((r) => r.toAddress);
    expect(recipients).toContain(emailOf('designer'));
    expect(recipients).not.toContain(person.email);
  });

  test('when an administrator tries to disable their own account, then 409 and nothing changes', async () => {
    const response = await admin.patch(`/api/users/${api.users.admin.id}`).send({ disabled: true, displayName: 'Renamed on the way' });

    expect(response.status).toBe(409);
    expect(response.body.code).toBe('own-account');
    const me = (await admin.get('/api/auth/me')).body.user;
    expect(me).toMatchObject({ disabledAt: null, displayName: api.users.admin.displayName });
  });

  test.each(['requirements', 'designer', 'reviewer'] as AccountKey[])('when the %s role tries to disable someone or send a reset link, then 403', async (key) => {
    const client = await api.agentFor(key);

    const disable = await client.patch(`/api/users/${api.users.reviewer2.id}`).send({ disabled: true });
    const reset = await client.post(`/api/users/${api.users.reviewer2.id}/password-reset`);

    expect(disable.status).toBe(403);
    expect(reset.status).toBe(403);
    expect((await signedIn(emailOf('reviewer2'), TEST_PASSWORD)).status).toBe(200);
  });
});
