/**
 * Sign-in and the protections around it: one answer (and about one duration) for an unknown
 * account and a wrong password, a new session id at sign-in, cookie flags, the CSRF double
 * submit on every state-changing method, the rate limit per address (the per-account delays
 * are in sign-in-delays.test.ts), helmet's
 * headers, sign-out, error bodies without internals (a forced 500 included), the password rule.
 * The rate limits count per app instance (30 sign-ins per address), so the limit tests and the
 * forced 500 get apps of their own.
 */
import { createHmac } from 'node:crypto';
import { readFileSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createApp } from '../../api/app';
import { csrfTokenFor } from '../../api/auth/csrf';
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

const SESSION_COOKIE = 'longtail.sid';
const SECURE_SESSION_COOKIE = '__Host-longtail.sid';
/** The secret buildApiApp gives the app. */
const SESSION_SECRET = 'x'.repeat(40);

/** The Set-Cookie line of one cookie, or undefined. */
function setCookie(response: request.Response, name: string): string | undefined {
  const header = response.headers['set-cookie'] as unknown as string[] | undefined;
  return header?.find((line) => line.startsWith(`${name}=`));
}
const cookieValue = (line: string | undefined) => line?.split(';')[0].split('=').slice(1).join('=');

async function signIn(client: ApiClient, key: AccountKey, password = TEST_PASSWORD) {
  return signInAs(client, emailOf(key), password);
}
/** The session id inside a signed session cookie value ("s:<id>.<signature>", URL-encoded). */
const sessionIdOf = (value: string | undefined) => /^s:([^.]+)\./.exec(decodeURIComponent(value ?? ''))?.[1];

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

describe('when a sign-in fails', () => {
  test('when the account is unknown or the password wrong, then the status and body are the same', async () => {
    const client = await api.anonymous();

    const unknown = await client.post('/api/auth/login').send({ email: `nobody@${'tests.longtail.test'}`, password: TEST_PASSWORD });
    const wrong = await signIn(client, 'reviewer2', `${TEST_PASSWORD}-not`);

    expect(unknown.status).toBe(401);
    expect({ status: wrong.status, body: wrong.body }).toEqual({ status: unknown.status, body: unknown.body });
    expect(unknown.body).toEqual({ error: expect.any(String), code: 'sign-in-failed', details: [] });
    // The visitor's session goes on (its cookie is refreshed) and nobody is signed in by it.
    const visitorSid = sessionIdOf(cookieValue(setCookie(unknown, SESSION_COOKIE)));
    expect(visitorSid).toBeTruthy();
    expect(sessionIdOf(cookieValue(setCookie(wrong, SESSION_COOKIE)))).toBe(visitorSid);
    expect((await client.get('/api/auth/me')).status).toBe(401);
  });

  test('when both kinds are timed a few times, then their medians are within a factor of 3 (scrypt runs for both)', async () => {
    // Arrange
    const client = await api.anonymous();
    const timed = async (send: () => Promise<request.Response>) => {
      const start = performance.now();
      const response = await send();
      expect(response.status).toBe(401);
      return performance.now() - start;
    };
    const unknownMs: number[] = [];
    const wrongMs: number[] = [];
    // An account of its own: five failures start its sign-in delays, which must not reach the
    // accounts the later tests sign in with.
    const timedEmail = 'timing-target@tests.longtail.test';
    await admin.post('/api/users').send({ email: timedEmail, displayName: 'Timing target', role: 'member', password: 'slate-heron-6642-quay' }).expect(201);

    // Act: alternate, so a slow moment of the machine hits both
    for (let i = 0; i < 5; i += 1) {
      unknownMs.push(await timed(() => client.post('/api/auth/login').send({ email: `nobody-${i}@tests.longtail.test`, password: TEST_PASSWORD })));
      wrongMs.push(await timed(() => client.post('/api/auth/login').send({ email: timedEmail, password: `wrong-password-${i}` })));
    }

    // Assert
    const [a, b] = [median(unknownMs), median(wrongMs)];
    expect(Math.max(a, b) / Math.min(a, b), `unknown ${unknownMs.map(Math.round)} ms, wrong ${wrongMs.map(Math.round)} ms`).toBeLessThan(3);
  });
});

describe('when someone signs in', () => {
  test('when the browser already carries another session id, then sign-in issues a new one and the old one no longer signs anybody in', async () => {
    // Arrange: an attacker's own valid session, planted in the victim's browser.
    const attacker = await csrfClient(api.app);
    const attackerSid = cookieValue(setCookie(await signIn(attacker, 'reviewer2'), SESSION_COOKIE));
    expect(attackerSid).toBeTruthy();

    // Act: the victim signs in with the planted cookie (and the token that goes with it, which the attacker knows).
    const response = await request(api.app)
      .post('/api/auth/login')
      .set('Cookie', `${SESSION_COOKIE}=${attackerSid}`)
      .set('X-CSRF-Token', attacker.csrfToken)
      .send({ email: emailOf('admin'), password: TEST_PASSWORD });

    // Assert
    expect(response.status).toBe(200);
    const victimSid = cookieValue(setCookie(response, SESSION_COOKIE));
    expect(victimSid).toBeTruthy();
    expect(victimSid).not.toBe(attackerSid);
    const replay = await request(api.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${attackerSid}`);
    expect(replay.status).toBe(401);
    const victimMe = await request(api.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${victimSid}`);
    expect(victimMe.body.user.email).toBe(emailOf('admin'));
  });

  test('when the same browser signs in twice, then the session id changes', async () => {
    const client = await csrfClient(api.app);

    const first = cookieValue(setCookie(await signIn(client, 'requirements'), SESSION_COOKIE));
    const second = cookieValue(setCookie(await signIn(client, 'requirements'), SESSION_COOKIE));

    expect(first).toBeTruthy();
    expect(second).toBeTruthy();
    expect(second).not.toBe(first);
  });

  test('when the session cookie is set, then it is HttpOnly, SameSite=Lax, Path=/, not readable without the secret, and the only cookie', async () => {
    const visitor = await request(api.app).get('/api/auth/csrf');
    const client = await csrfClient(api.app);

    const login = await signIn(client, 'designer');

    const session = setCookie(login, SESSION_COOKIE) ?? '';
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//);
    expect(session).not.toMatch(/;\s*Domain=/i);
    expect(decodeURIComponent(cookieValue(session) ?? '')).toMatch(/^s:[^.]+\.[^.]+$/); // signed by express-session
    expect(login.body.user).not.toHaveProperty('passwordHash');
    for (const response of [visitor, login]) {
      const names = ((response.headers['set-cookie'] as unknown as string[] | undefined) ?? []).map((line) => line.split('=')[0]);
      expect(names).toEqual([SESSION_COOKIE]);
    }
  });

  test('when the app sits behind an HTTPS proxy, then the session cookie is __Host-longtail.sid: Secure, Path=/, no Domain, and sign-in and writes work with it', async () => {
    // Arrange: a second app on the same database, trusting X-Forwarded-Proto.
    const proxied = createApp({ dataSource: api.dataSource, sessionSecret: SESSION_SECRET, ruleSet: api.ruleSet, trustProxy: true, log: () => {} });
    const agent = request.agent(proxied);
    const visitor = await agent.get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
    const visitorCookie = setCookie(visitor, SECURE_SESSION_COOKIE);

    // Act
    const login = await request(proxied)
      .post('/api/auth/login')
      .set('X-Forwarded-Proto', 'https')
      .set('Cookie', (visitorCookie ?? '').split(';')[0])
      .set('X-CSRF-Token', visitor.body.token as string)
      .send({ email: emailOf('reviewer'), password: TEST_PASSWORD });
    const cookie = setCookie(login, SECURE_SESSION_COOKIE) ?? '';
    const me = await request(proxied).get('/api/auth/me').set('X-Forwarded-Proto', 'https').set('Cookie', cookie.split(';')[0]);
    proxied.closeApp();

    // Assert
    expect(visitorCookie).toBeTruthy();
    expect(setCookie(visitor, SESSION_COOKIE)).toBeUndefined();
    expect(login.status).toBe(200);
    expect(cookie).toMatch(/;\s*Secure/i);
    expect(cookie).toMatch(/;\s*Path=\/(;|$)/);
    expect(cookie).not.toMatch(/;\s*Domain=/i);
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(me.status).toBe(200);
  });

  test('when the app is reached over plain HTTP, then the session cookie has no __Host- prefix (a browser would refuse one without Secure)', async () => {
    const response = await request(api.app).get('/api/auth/csrf');

    expect(setCookie(response, SESSION_COOKIE)).toBeTruthy();
    expect(setCookie(response, SECURE_SESSION_COOKIE)).toBeUndefined();
  });
});

describe('when the CSRF token is read against the session', () => {
  test('when a visitor fetches a token, then it is the HMAC-SHA256 of the session id with the session secret', async () => {
    const response = await request(api.app).get('/api/auth/csrf');

    const sid = sessionIdOf(cookieValue(setCookie(response, SESSION_COOKIE)));
    expect(sid).toBeTruthy();
    expect(response.body.token).toBe(createHmac('sha256', SESSION_SECRET).update(`longtail-csrf\n${sid}`).digest('base64url'));
    expect(response.headers['cache-control']).toBe('no-store');
  });

  test('when someone signs in, then the token fetched before is refused and the one in the sign-in answer (also from GET /api/auth/csrf) works', async () => {
    // Arrange
    const client = await csrfClient(api.app);
    const before = client.csrfToken;

    // Act
    const login = await signIn(client, 'designer2');
    const stale = await client.agent.patch('/api/auth/me').set('X-CSRF-Token', before).send({ notify: true });
    const fresh = await client.agent.patch('/api/auth/me').set('X-CSRF-Token', login.body.csrfToken).send({ notify: true });
    const refetched = (await client.get('/api/auth/csrf')).body.token;

    // Assert
    expect(login.body.csrfToken).not.toBe(before);
    expect(stale.status).toBe(403);
    expect(stale.body.code).toBe('csrf-failed');
    expect(fresh.status).toBe(200);
    expect(refetched).toBe(login.body.csrfToken);
  });

  test('when the token of one session is sent with another session, or with none, then 403 csrf-failed', async () => {
    const [one, other] = await Promise.all([api.agentFor('designer2'), api.agentFor('reviewer2')]);

    const crossed = await one.agent.patch('/api/auth/me').set('X-CSRF-Token', other.csrfToken).send({ notify: true });
    const sessionless = await request(api.app).patch('/api/auth/me').set('X-CSRF-Token', one.csrfToken).send({ notify: true });
    const forged = await one.agent.patch('/api/auth/me').set('X-CSRF-Token', csrfTokenFor('another-secret-of-forty-characters-00000', 'made-up')).send({ notify: true });

    for (const response of [crossed, sessionless, forged]) {
      expect(response.status).toBe(403);
      expect(response.body.code).toBe('csrf-failed');
    }
  });
});

describe('when a state-changing request lacks the CSRF token or carries a wrong one, then 403 csrf-failed and nothing changes', () => {
  let spec: { id: number };
  let project: { id: number; name: string };
  let requirements: ApiClient;
  let designer: ApiClient;
  let anonymous: ApiClient;

  beforeAll(async () => {
    project = await api.createProject();
    spec = await api.createSpec(project.id);
    [requirements, designer, anonymous] = await Promise.all([api.agentFor('requirements'), api.agentFor('designer'), api.anonymous()]);
  });

  const WRONG_TOKEN = 'f'.repeat(64);
  type Send = (client: ApiClient, header: (t: request.Test) => request.Test) => request.Test;
  const REQUESTS: [string, () => ApiClient, Send][] = [
    ['POST /api/projects', () => admin, (c, h) => h(c.agent.post('/api/projects')).send({ name: 'Forged project' })],
    ['PUT /api/specs/:id', () => requirements, (c, h) => h(c.agent.put(`/api/specs/${spec.id}`)).send({ title: 'Forged edit', payload: { title: 'Forged edit', supply: { positiveV: 5, negativeV: -5 }, gain: { target: 3 }, cmrr: { minDb: 40 } } })],
    ['PATCH /api/users/:id', () => admin, (c, h) => h(c.agent.patch(`/api/users/${api.users.designer2.id}`)).send({ role: 'admin' })],
    ['DELETE /api/projects/:id/members/:userId', () => admin, (c, h) => h(c.agent.delete(`/api/projects/${project.id}/members/${api.users.reviewer.id}`))],
    ['POST /api/auth/logout', () => designer, (c, h) => h(c.agent.post('/api/auth/logout'))],
    ['POST /api/auth/login', () => anonymous, (c, h) => h(c.agent.post('/api/auth/login')).send({ email: emailOf('reviewer'), password: TEST_PASSWORD })],
  ];
  const HEADERS: [string, (t: request.Test) => request.Test][] = [
    ['no X-CSRF-Token header', (t) => t],
    ['a wrong X-CSRF-Token header', (t) => t.set('X-CSRF-Token', WRONG_TOKEN)],
    ['an empty X-CSRF-Token header', (t) => t.set('X-CSRF-Token', '')],
  ];
  const CASES = REQUESTS.flatMap(([route, client, send]) => HEADERS.map(([how, header]) => [`${route} with ${how}`, client, send, header] as const));

  test.each(CASES)('when %s, then 403 csrf-failed', async (_title, client, send, header) => {
    const response = await send(client(), header);

    expect(response.status).toBe(403);
    expect(response.body.code).toBe('csrf-failed');
  });

  test('when every refused request has been sent, then the data and sessions are as before', async () => {
    expect((await admin.get('/api/projects')).body.items.map((p: { name: string }) => p.name)).not.toContain('Forged project');
    expect((await requirements.get(`/api/specs/${spec.id}`)).body.latestVersion).toBe(1);
    expect((await admin.get('/api/users')).body.items.find((u: { id: number }) => u.id === api.users.designer2.id).role).toBe('member');
    expect((await admin.get(`/api/projects/${project.id}/members`)).body.items.map((u: { id: number }) => u.id)).toContain(api.users.reviewer.id);
    expect((await designer.get('/api/auth/me')).status).toBe(200);
    expect((await anonymous.get('/api/auth/me')).status).toBe(401);
  });

  test('when the header is sent without the session it belongs to (a cross-site form), then 403 csrf-failed', async () => {
    const response = await request(api.app).post('/api/auth/login').set('X-CSRF-Token', admin.csrfToken).send({ email: emailOf('reviewer'), password: TEST_PASSWORD });

    expect(response.status).toBe(403);
    expect(response.body.code).toBe('csrf-failed');
  });

  test('when a token from one browser is sent with another browser’s cookie, then 403 csrf-failed', async () => {
    const response = await admin.agent.post('/api/projects').set('X-CSRF-Token', requirements.csrfToken).send({ name: 'Crossed' });

    expect(response.status).toBe(403);
    expect(response.body.code).toBe('csrf-failed');
  });
});

describe('when one address tries many accounts, then 429 after 30 attempts', () => {
  let limited: TestApi;

  beforeAll(async () => {
    limited = await buildApiApp({ accounts: ['admin'] });
  });

  afterAll(async () => {
    await limited?.close();
  });

  test('when 30 attempts on 30 accounts have been made, then the 31st is refused even for a right password', async () => {
    // Arrange: each account once, so the per-account limit never applies.
    const client = await csrfClient(limited.app);
    const statuses: number[] = [];
    for (let batch = 0; batch < 5; batch += 1) {
      const responses = await Promise.all(
        Array.from({ length: 6 }, (_, i) => client.post('/api/auth/login').send({ email: `sprayed-${batch * 6 + i}@tests.longtail.test`, password: TEST_PASSWORD })),
      );
      statuses.push(...responses.map((r) => r.status));
    }
    expect(statuses).toEqual(Array(30).fill(401));

    // Act
    const thirtyFirst = await signIn(client, 'admin');

    // Assert
    expect(thirtyFirst.status).toBe(429);
    expect(thirtyFirst.body.code).toBe('too-many-attempts');
  });
});

describe('when any response is sent, then helmet’s security headers are on it', () => {
  test.each([
    ['GET /api/health', () => request(api.app).get('/api/health')],
    ['a 404', () => request(api.app).get('/api/no-such-route')],
    ['a 401', () => request(api.app).get('/api/auth/me')],
  ])('when %s is answered, then nosniff, frame and CSP headers are set and x-powered-by is not', async (_title, send) => {
    const response = await send();

    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(response.headers['content-security-policy']).toContain("default-src 'self'");
    expect(response.headers['referrer-policy']).toBe('no-referrer');
    expect(response.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(response.headers).not.toHaveProperty('x-powered-by');
  });
});

describe('when the Content-Security-Policy is read, then no inline or evaluated script may run', () => {
  test('when the policy is parsed, then scripts come from the app itself only, with neither unsafe-inline nor unsafe-eval', async () => {
    const header = (await request(api.app).get('/api/health')).headers['content-security-policy'] as string;
    const directives = new Map(header.split(';').map((d) => d.trim().split(/\s+/)).map(([name, ...values]) => [name, values] as const));
    const scripts = directives.get('script-src') ?? directives.get('default-src');
    expect(scripts).toEqual(["'self'"]);
    expect(directives.get('script-src-attr') ?? ["'none'"]).toEqual(["'none'"]);
    expect(directives.get('object-src')).toEqual(["'none'"]);
  });

  test('when the app page is read, then it carries no inline script, only the module loaded from a file', () => {
    const html = readFileSync(new URL('../../web/index.html', import.meta.url), 'utf8');
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attributes, body] of scripts) {
      expect(attributes).toMatch(/\bsrc=/);
      expect(body.trim()).toBe('');
    }
    expect(html).not.toMatch(/\son[a-z]+\s*=/i);
  });
});

describe('when a signed-in user signs out', () => {
  test('when logout answers, then the session is over: /api/auth/me is 401 and the old cookie no longer works', async () => {
    // Arrange
    const client = await csrfClient(api.app);
    const sid = cookieValue(setCookie(await signIn(client, 'reviewer2'), SESSION_COOKIE));
    expect((await client.get('/api/auth/me')).status).toBe(200);

    // Act
    const logout = await client.post('/api/auth/logout');

    // Assert
    expect(logout.status).toBe(204);
    expect(setCookie(logout, SESSION_COOKIE)).toMatch(/Expires=Thu, 01 Jan 1970/);
    const me = await client.get('/api/auth/me');
    expect(me.status).toBe(401);
    expect(me.body.code).toBe('not-signed-in');
    const replay = await request(api.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${sid}`);
    expect(replay.status).toBe(401);
  });
});

/** Signs of internals that must never reach a client. */
function expectNoInternals(response: request.Response) {
  const text = JSON.stringify(response.body) + (response.text ?? '');
  expect(text).not.toMatch(/\bat \S+ \(|\bat \S+:\d+:\d+/); // stack frames
  expect(text).not.toMatch(/\b(SELECT|INSERT INTO|UPDATE|DELETE FROM)\b/);
  expect(text).not.toMatch(/sqlite|postgres|relation "/i);
  expect(text).not.toMatch(/node_modules|\/work\/|\.ts:\d+/);
  expect(Object.keys(response.body).sort()).toEqual(['code', 'details', 'error']);
}

describe('when a request fails, then the error body carries no stack trace or SQL', () => {
  const BIG = 'x'.repeat(300 * 1024);
  test.each([
    ['malformed JSON', 400, () => admin.post('/api/projects').set('Content-Type', 'application/json').send('{"name": "Half')],
    ['a body that breaks the schema', 400, () => admin.post('/api/projects').send({ name: 42, colour: 'teal' })],
    ['a body over the limit', 413, () => admin.post('/api/projects').send({ name: 'Big', description: BIG })],
    ['a non-JSON content type', 400, () => admin.post('/api/projects').set('Content-Type', 'text/plain').send('name=Plain')],
    ['an unknown route', 404, () => admin.get('/api/no-such-route')],
    ['a record that does not exist', 404, () => admin.get('/api/specs/424242')],
    ['a malformed id', 404, () => admin.get("/api/specs/1'%20OR%201=1")],
    ['an account e-mail taken', 409, () => admin.post('/api/users').send({ email: emailOf('designer'), displayName: 'Twin', role: 'member', password: 'another-long-passphrase' })],
    ['no sign-in', 401, () => request(api.app).get('/api/projects')],
    ['a wrong CSRF token', 403, () => admin.agent.post('/api/projects').set('X-CSRF-Token', 'nope').send({ name: 'x' })],
  ] as const)('when the request has %s, then %i with a plain error body', async (_title, status, send) => {
    const response = await send();

    expect(response.status).toBe(status);
    expectNoInternals(response);
  });

  describe('when the database fails under the server (a table renamed away)', () => {
    let broken: TestApi;
    const logged: string[] = [];

    beforeAll(async () => {
      broken = await buildApiApp({ accounts: ['admin'], log: (message) => logged.push(message) });
    });

    afterAll(async () => {
      await broken?.close();
    });

    test('when a read and a write hit the missing table, then 500 with the generic body, the stack logged only, nothing written', async () => {
      // Arrange
      const client = await broken.agentFor('admin');
      const eventsBefore = await broken.dataSource.query('SELECT COUNT(*) AS n FROM audit_event');
      await broken.dataSource.query('ALTER TABLE project RENAME TO project_gone');

      // Act
      const read = await client.get('/api/projects');
      const write = await client.post('/api/projects').send({ name: 'Into the void' });

      // Assert
      for (const response of [read, write]) {
        expect(response.status).toBe(500);
        expect(response.body).toEqual({ error: expect.any(String), code: 'internal-error', details: [] });
        expectNoInternals(response);
      }
      // SQLite's words, or PostgreSQL's (the api-postgres project).
    expect(logged.join('\n')).toMatch(/no such table: project|relation "project" does not exist/);
      expect(logged.join('\n')).toMatch(/\bat /);
      expect(await broken.dataSource.query('SELECT COUNT(*) AS n FROM audit_event')).toEqual(eventsBefore);
      await broken.dataSource.query('ALTER TABLE project_gone RENAME TO project');
    });
  });
});

describe('when an admin creates an account', () => {
  test('when the password has 11 characters, then 400 at /password and no account is made', async () => {
    const before = (await admin.get('/api/users')).body.items.length;

    const response = await admin.post('/api/users').send({ email: 'short@tests.longtail.test', displayName: 'Short', role: 'member', password: 'elevenchars' });

    expect('elevenchars').toHaveLength(11);
    expect(response.status).toBe(400);
    expect(response.body.details).toContainEqual(expect.objectContaining({ path: '/password' }));
    expect((await admin.get('/api/users')).body.items).toHaveLength(before);
  });

  test('when the password has 12 characters, then 201 and the account can sign in', async () => {
    const response = await admin.post('/api/users').send({ email: 'dozen@tests.longtail.test', displayName: 'Dozen', role: 'member', password: 'twelve-chars' });

    expect(response.status).toBe(201);
    expect(response.body).not.toHaveProperty('passwordHash');
    const client = await csrfClient(api.app);
    expect((await client.post('/api/auth/login').send({ email: 'dozen@tests.longtail.test', password: 'twelve-chars' })).status).toBe(200);
  });
});
