/**
 * Bad requests to every write route (and the proposal list's query), each sent by a signed-in
 * user whose role may use the route, so the refusal is about the request itself: 400 (or 413)
 * with the offending JSON path in `details`, no server error, and not one row changed.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Role } from '#shared/workflow/roles';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';
import { countRows } from '../helpers/api-validation-helpers';

type Body = { json: unknown } | { raw: string; type: string } | { multipart: Record<string, string> };
type ProposalKey = 'ranked' | 'spareA' | 'spareB' | 'spareC' | 'spareD';

interface BadRequest {
  /** Method and route pattern; `:id` is filled with the record made in beforeAll. */
  route: string;
  when: string;
  as: Role | 'anonymous';
  body?: Body;
  query?: string;
  /** Which proposal `:id` names: a spare for a case that, wrongly accepted, would decide its proposal. */
  proposal?: ProposalKey;
  status: 400 | 413;
  path: string;
}

/** Over express.json's 256 kB limit once serialised. */
const OVER_LIMIT = 'x'.repeat(300 * 1024);
const deepArrays = (levels: number) => '['.repeat(levels) + ']'.repeat(levels);

/** A valid spec document; cases break one thing in a copy. Three options and 200 draws keep the engine quick. */
const SPEC_PAYLOAD = {
  device: { beta: 240, earlyVoltageV: 95, saturationCurrentA: 1.4e-14 },
  supply: { positiveV: 15, negativeV: -15 },
  gain: { target: 6, output: 'single-ended' },
  cmrr: { minDb: 60, atFrequencyHz: 15000 },
  topologies: ['resistor', 'simple-mirror', 'cascode'],
  monteCarlo: { samples: 200, seed: 11 },
};

/** A valid `analyze` input (the studio receiver's cascode). */
const DESIGN = {
  device: { beta: 240, earlyVoltageV: 95, saturationCurrentA: 1.4e-14 },
  supply: { positiveV: 15, negativeV: -15 },
  collectorResistanceOhm: 15000,
  pairEmitterResistanceOhm: 1100,
  tail: { topology: 'cascode', referenceResistanceOhm: 51000 },
};

type Json = Record<string, any>;
const changed = (value: Json, change: (copy: Json) => void): Json => {
  const copy = structuredClone(value);
  change(copy);
  return copy;
};
const json = (value: unknown): Body => ({ json: value });
const raw = (text: string, type = 'application/json'): Body => ({ raw: text, type });
const spec = (change: (payload: Json) => void, title = 'Line receiver'): Body => json({ title, payload: changed(SPEC_PAYLOAD, change) });
const design = (change: (design: Json) => void): Json => changed(DESIGN, change);
const login = { email: 'someone@validation.test', password: 'long-enough-password' };
const newUser = { email: 'new.person@validation.test', displayName: 'New Person', role: 'member', password: 'long-enough-password' };

const BAD_REQUESTS: BadRequest[] = [
  // POST /api/auth/login (no role: a visitor holding a CSRF token)
  { route: 'POST /api/auth/login', when: 'the password is missing', as: 'anonymous', body: json({ email: login.email }), status: 400, path: '/password' },
  { route: 'POST /api/auth/login', when: 'the email is a number', as: 'anonymous', body: json({ ...login, email: 42 }), status: 400, path: '/email' },
  { route: 'POST /api/auth/login', when: 'an unknown field is sent', as: 'anonymous', body: json({ ...login, remember: true }), status: 400, path: '/remember' },
  { route: 'POST /api/auth/login', when: 'the email is 256 characters', as: 'anonymous', body: json({ ...login, email: `${'a'.repeat(245)}@valid.test` }), status: 400, path: '/email' },
  { route: 'POST /api/auth/login', when: 'the password is 1,025 characters', as: 'anonymous', body: json({ ...login, password: 'p'.repeat(1025) }), status: 400, path: '/password' },
  { route: 'POST /api/auth/login', when: 'an unknown field holds 2,000 levels of arrays', as: 'anonymous', body: raw(`{"email":"a@b.c","password":"x","extra":${deepArrays(2000)}}`), status: 400, path: '/extra' },
  { route: 'POST /api/auth/login', when: 'an unknown field holds 10,000 levels of arrays', as: 'anonymous', body: raw(`{"email":"a@b.c","password":"x","extra":${deepArrays(10_000)}}`), status: 400, path: '/extra' },
  { route: 'POST /api/auth/login', when: 'the body is form-urlencoded', as: 'anonymous', body: raw('email=a%40b.c&password=long-enough-password', 'application/x-www-form-urlencoded'), status: 400, path: '' },
  { route: 'POST /api/auth/login', when: 'the JSON is cut short', as: 'anonymous', body: raw('{"email": "a@b.c", "password": '), status: 400, path: '' },
  { route: 'POST /api/auth/login', when: 'the JSON body is empty', as: 'anonymous', body: raw(''), status: 400, path: '/email' },
  { route: 'POST /api/auth/login', when: 'the body is JSON null', as: 'anonymous', body: raw('null'), status: 400, path: '' },
  { route: 'POST /api/auth/login', when: 'the body is a bare JSON string', as: 'anonymous', body: raw('"a@b.c"'), status: 400, path: '' },
  { route: 'POST /api/auth/login', when: 'the body is over 256 kB', as: 'anonymous', body: json({ ...login, password: OVER_LIMIT }), status: 413, path: '' },

  // POST /api/users (admin)
  { route: 'POST /api/users', when: 'the role is not a known role', as: 'admin', body: json({ ...newUser, role: 'superuser' }), status: 400, path: '/role' },
  { route: 'POST /api/users', when: 'the password has 11 characters', as: 'admin', body: json({ ...newUser, password: 'elevenchars' }), status: 400, path: '/password' },
  { route: 'POST /api/users', when: 'the email has no @', as: 'admin', body: json({ ...newUser, email: 'new.person.validation.test' }), status: 400, path: '/email' },
  { route: 'POST /api/users', when: 'the display name is empty', as: 'admin', body: json({ ...newUser, displayName: '' }), status: 400, path: '/displayName' },
  { route: 'POST /api/users', when: 'the role is missing', as: 'admin', body: json({ ...newUser, role: undefined }), status: 400, path: '/role' },
  { route: 'POST /api/users', when: 'an unknown field isAdmin is sent', as: 'admin', body: json({ ...newUser, isAdmin: true }), status: 400, path: '/isAdmin' },
  { route: 'POST /api/users', when: 'a __proto__ field is sent', as: 'admin', body: raw(JSON.stringify(newUser).replace(/}$/, ',"__proto__":{"role":"admin"}}')), status: 400, path: '/__proto__' },
  { route: 'POST /api/users', when: 'the body is multipart form data', as: 'admin', body: { multipart: { email: newUser.email, displayName: newUser.displayName, role: 'member', password: newUser.password } }, status: 400, path: '' },

  // PATCH /api/users/:id (admin)
  { route: 'PATCH /api/users/:id', when: 'the body is an empty object', as: 'admin', body: json({}), status: 400, path: '' },
  { route: 'PATCH /api/users/:id', when: 'the email (not changeable) is sent', as: 'admin', body: json({ email: 'other@validation.test' }), status: 400, path: '/email' },
  { route: 'PATCH /api/users/:id', when: 'the display name is 121 characters', as: 'admin', body: json({ displayName: 'n'.repeat(121) }), status: 400, path: '/displayName' },
  { route: 'PATCH /api/users/:id', when: 'the role is a number', as: 'admin', body: json({ role: 3 }), status: 400, path: '/role' },
  { route: 'PATCH /api/users/:id', when: 'the body is a JSON merge patch', as: 'admin', body: raw('{"displayName":"Renamed"}', 'application/merge-patch+json'), status: 400, path: '' },

  // POST /api/projects (admin)
  { route: 'POST /api/projects', when: 'the name is a number', as: 'admin', body: json({ name: 123 }), status: 400, path: '/name' },
  { route: 'POST /api/projects', when: 'the name is missing', as: 'admin', body: json({ description: 'No name' }), status: 400, path: '/name' },
  { route: 'POST /api/projects', when: 'the name is only spaces', as: 'admin', body: json({ name: '   ' }), status: 400, path: '/name' },
  { route: 'POST /api/projects', when: 'the description is 4,001 characters', as: 'admin', body: json({ name: 'P', description: 'd'.repeat(4001) }), status: 400, path: '/description' },
  { route: 'POST /api/projects', when: 'an unknown field holds a 200 kB string', as: 'admin', body: json({ name: 'P', notes: 'n'.repeat(200 * 1024) }), status: 400, path: '/notes' },
  { route: 'POST /api/projects', when: 'the body is a JSON array', as: 'admin', body: json([{ name: 'P' }]), status: 400, path: '' },
  { route: 'POST /api/projects', when: 'the body is over 256 kB', as: 'admin', body: json({ name: 'P', description: OVER_LIMIT }), status: 413, path: '' },
  { route: 'POST /api/projects', when: 'the body is plain text', as: 'admin', body: raw('{"name":"P"}', 'text/plain'), status: 400, path: '' },

  // POST /api/projects/:id/members (admin)
  { route: 'POST /api/projects/:id/members', when: 'the user id is a string', as: 'admin', body: json({ userId: '2', role: 'designer' }), status: 400, path: '/userId' },
  { route: 'POST /api/projects/:id/members', when: 'the user id is 0', as: 'admin', body: json({ userId: 0, role: 'designer' }), status: 400, path: '/userId' },
  { route: 'POST /api/projects/:id/members', when: 'the user id is 1.5', as: 'admin', body: json({ userId: 1.5, role: 'designer' }), status: 400, path: '/userId' },
  { route: 'POST /api/projects/:id/members', when: 'the user id names no account', as: 'admin', body: json({ userId: 999_999, role: 'designer' }), status: 400, path: '/userId' },
  { route: 'POST /api/projects/:id/members', when: 'the user id is missing and a role is sent', as: 'admin', body: json({ role: 'designer' }), status: 400, path: '/userId' },
  { route: 'POST /api/projects/:id/members', when: 'the role in the project is missing', as: 'admin', body: json({ userId: 2 }), status: 400, path: '/role' },
  { route: 'POST /api/projects/:id/members', when: 'the role in the project is the administrator role', as: 'admin', body: json({ userId: 2, role: 'admin' }), status: 400, path: '/role' },
  { route: 'POST /api/users', when: 'the role is a project role (roles are given per project)', as: 'admin', body: json({ ...newUser, role: 'designer' }), status: 400, path: '/role' },

  // POST /api/projects/:id/specs (requirements)
  { route: 'POST /api/projects/:id/specs', when: 'the negative rail is above the positive one', as: 'requirements', body: spec((p) => (p.supply.negativeV = 20)), status: 400, path: '/payload/supply/negativeV' },
  { route: 'POST /api/projects/:id/specs', when: 'beta is 5', as: 'requirements', body: spec((p) => (p.device.beta = 5)), status: 400, path: '/payload/device/beta' },
  { route: 'POST /api/projects/:id/specs', when: 'topologies lists "mirror"', as: 'requirements', body: spec((p) => (p.topologies = ['mirror'])), status: 400, path: '/payload/topologies/0' },
  { route: 'POST /api/projects/:id/specs', when: 'the supply has an unknown field', as: 'requirements', body: spec((p) => (p.supply.groundV = 0)), status: 400, path: '/payload/supply/groundV' },
  { route: 'POST /api/projects/:id/specs', when: 'the gain is missing', as: 'requirements', body: spec((p) => delete p.gain), status: 400, path: '/payload/gain' },
  { route: 'POST /api/projects/:id/specs', when: 'the title is missing', as: 'requirements', body: json({ payload: SPEC_PAYLOAD }), status: 400, path: '/title' },
  { route: 'POST /api/projects/:id/specs', when: 'the title is 201 characters', as: 'requirements', body: spec(() => {}, 't'.repeat(201)), status: 400, path: '/title' },
  { route: 'POST /api/projects/:id/specs', when: 'the payload is a string', as: 'requirements', body: json({ title: 'T', payload: JSON.stringify(SPEC_PAYLOAD) }), status: 400, path: '/payload' },
  { route: 'POST /api/projects/:id/specs', when: 'an unknown top-level field is sent', as: 'requirements', body: json({ title: 'T', payload: SPEC_PAYLOAD, status: 'approved' }), status: 400, path: '/status' },
  { route: 'POST /api/projects/:id/specs', when: 'the payload is 10,000 levels of arrays', as: 'requirements', body: raw(`{"title":"T","payload":${deepArrays(10_000)}}`), status: 400, path: '/payload' },

  // PUT /api/specs/:id (requirements; a new version)
  { route: 'PUT /api/specs/:id', when: 'the gain target is 0', as: 'requirements', body: spec((p) => (p.gain.target = 0)), status: 400, path: '/payload/gain/target' },
  { route: 'PUT /api/specs/:id', when: 'the Monte Carlo sample count is 150.5', as: 'requirements', body: spec((p) => (p.monteCarlo.samples = 150.5)), status: 400, path: '/payload/monteCarlo/samples' },
  { route: 'PUT /api/specs/:id', when: 'the Early voltage is 0.5 V', as: 'requirements', body: spec((p) => (p.device.earlyVoltageV = 0.5)), status: 400, path: '/payload/device/earlyVoltageV' },
  { route: 'PUT /api/specs/:id', when: 'the common-mode range is upside down', as: 'requirements', body: spec((p) => (p.inputCommonMode = { minV: 2, maxV: -2 })), status: 400, path: '/payload/inputCommonMode/minV' },
  { route: 'PUT /api/specs/:id', when: 'the output swing spans the rails', as: 'requirements', body: spec((p) => (p.outputSwingVpp = 30)), status: 400, path: '/payload/outputSwingVpp' },
  { route: 'PUT /api/specs/:id', when: 'the policy is unknown', as: 'requirements', body: spec((p) => (p.policy = 'cheapest')), status: 400, path: '/payload/policy' },
  { route: 'PUT /api/specs/:id', when: 'the title is only spaces', as: 'requirements', body: spec(() => {}, '   '), status: 400, path: '/title' },
  { route: 'PUT /api/specs/:id', when: 'a positive rail holds 10,000 levels of arrays', as: 'requirements', body: raw(JSON.stringify({ title: 'T', payload: SPEC_PAYLOAD }).replace('"positiveV":15', `"positiveV":${deepArrays(10_000)}`)), status: 400, path: '/payload/supply/positiveV' },
  { route: 'PUT /api/specs/:id', when: 'the body is over 256 kB', as: 'requirements', body: spec((p) => (p.notes = OVER_LIMIT)), status: 413, path: '' },
  { route: 'PUT /api/specs/:id', when: 'the body is plain text', as: 'requirements', body: raw(JSON.stringify({ title: 'T', payload: SPEC_PAYLOAD }), 'text/plain'), status: 400, path: '' },

  // POST /api/proposals/:id/decision (designer)
  { route: 'POST /api/proposals/:id/decision', when: 'the kind is "maybe"', as: 'designer', body: json({ kind: 'maybe' }), status: 400, path: '/kind' },
  { route: 'POST /api/proposals/:id/decision', when: 'the kind is missing', as: 'designer', body: json({ reason: 'No kind' }), status: 400, path: '/kind' },
  { route: 'POST /api/proposals/:id/decision', when: 'choosing without a reason', as: 'designer', body: json({ kind: 'choose', topology: 'resistor' }), status: 400, path: '/reason' },
  { route: 'POST /api/proposals/:id/decision', when: 'choosing without a topology', as: 'designer', body: json({ kind: 'choose', reason: 'Cheaper' }), status: 400, path: '/topology' },
  { route: 'POST /api/proposals/:id/decision', when: 'choosing topology "mirror"', as: 'designer', body: json({ kind: 'choose', topology: 'mirror', reason: 'Cheaper' }), status: 400, path: '/topology' },
  { route: 'POST /api/proposals/:id/decision', when: 'choosing a topology the spec did not rank', as: 'designer', body: json({ kind: 'choose', topology: 'wilson', reason: 'Cheaper' }), status: 400, path: '/topology' },
  { route: 'POST /api/proposals/:id/decision', when: 'overriding without a design', as: 'designer', body: json({ kind: 'override', reason: 'Own values' }), status: 400, path: '/design' },
  { route: 'POST /api/proposals/:id/decision', when: 'overriding with tail topology "mirror"', as: 'designer', body: json({ kind: 'override', reason: 'Own values', design: design((d) => (d.tail.topology = 'mirror')) }), status: 400, path: '/design/tail/topology' },
  { route: 'POST /api/proposals/:id/decision', when: 'the override tail has an unknown field', as: 'designer', body: json({ kind: 'override', reason: 'Own values', design: design((d) => (d.tail.gainDb = 3)) }), status: 400, path: '/design/tail/gainDb' },
  { route: 'POST /api/proposals/:id/decision', when: 'accepting with a topology', as: 'designer', proposal: 'spareC', body: json({ kind: 'accept', topology: 'resistor' }), status: 400, path: '/topology' },
  { route: 'POST /api/proposals/:id/decision', when: 'choosing with a design', as: 'designer', proposal: 'spareD', body: json({ kind: 'choose', topology: 'resistor', reason: 'Cheaper', design: DESIGN }), status: 400, path: '/design' },
  { route: 'POST /api/proposals/:id/decision', when: 'the reason is 4,001 characters', as: 'designer', body: json({ kind: 'choose', topology: 'resistor', reason: 'r'.repeat(4001) }), status: 400, path: '/reason' },
  { route: 'POST /api/proposals/:id/decision', when: 'the override puts the negative rail above the positive one', as: 'designer', proposal: 'spareA', body: json({ kind: 'override', reason: 'Own values', design: design((d) => (d.supply = { positiveV: -5, negativeV: 5 })) }), status: 400, path: '/design/supply/negativeV' },
  { route: 'POST /api/proposals/:id/decision', when: 'the override biases the inputs outside the rails', as: 'designer', proposal: 'spareB', body: json({ kind: 'override', reason: 'Own values', design: design((d) => (d.inputCommonModeV = 50)) }), status: 400, path: '/design/inputCommonModeV' },

  // POST /api/proposals/:id/review (reviewer)
  { route: 'POST /api/proposals/:id/review', when: 'the verdict is "maybe"', as: 'reviewer', body: json({ verdict: 'maybe' }), status: 400, path: '/verdict' },
  { route: 'POST /api/proposals/:id/review', when: 'returning without a comment', as: 'reviewer', body: json({ verdict: 'return' }), status: 400, path: '/comment' },
  { route: 'POST /api/proposals/:id/review', when: 'the comment is a number', as: 'reviewer', body: json({ verdict: 'return', comment: 7 }), status: 400, path: '/comment' },
  { route: 'POST /api/proposals/:id/review', when: 'an unknown field score is sent', as: 'reviewer', body: json({ verdict: 'approve', score: 5 }), status: 400, path: '/score' },
  { route: 'POST /api/proposals/:id/review', when: 'the comment is 4,001 characters', as: 'reviewer', body: json({ verdict: 'return', comment: 'c'.repeat(4001) }), status: 400, path: '/comment' },

  // POST /api/analyze (any signed-in role)
  { route: 'POST /api/analyze', when: 'the tail is missing', as: 'designer', body: json(design((d) => delete d.tail)), status: 400, path: '/tail' },
  { route: 'POST /api/analyze', when: 'beta is 5', as: 'designer', body: json(design((d) => (d.device.beta = 5))), status: 400, path: '/device/beta' },
  { route: 'POST /api/analyze', when: 'the collector resistance is "15k"', as: 'designer', body: json(design((d) => (d.collectorResistanceOhm = '15k'))), status: 400, path: '/collectorResistanceOhm' },
  { route: 'POST /api/analyze', when: 'the negative rail is above the positive one', as: 'designer', body: json(design((d) => (d.supply = { positiveV: -5, negativeV: 5 }))), status: 400, path: '/supply/negativeV' },
  { route: 'POST /api/analyze', when: 'the input common mode is outside the rails', as: 'designer', body: json(design((d) => (d.inputCommonModeV = 50))), status: 400, path: '/inputCommonModeV' },
  { route: 'POST /api/analyze', when: 'the collector resistance is 1e-300 Ω', as: 'designer', body: json(design((d) => (d.collectorResistanceOhm = 1e-300))), status: 400, path: '/collectorResistanceOhm' },
  { route: 'POST /api/analyze', when: 'the body is plain text', as: 'designer', body: raw(JSON.stringify(DESIGN), 'text/plain'), status: 400, path: '' },

  // GET /api/projects/:id/proposals?query (any member)
  { route: 'GET /api/projects/:id/proposals', when: 'page is 0', as: 'designer', query: 'page=0', status: 400, path: '?page' },
  { route: 'GET /api/projects/:id/proposals', when: 'page is "abc"', as: 'designer', query: 'page=abc', status: 400, path: '?page' },
  { route: 'GET /api/projects/:id/proposals', when: 'page is 1.5', as: 'designer', query: 'page=1.5', status: 400, path: '?page' },
  { route: 'GET /api/projects/:id/proposals', when: 'page is given twice', as: 'designer', query: 'page=1&page=2', status: 400, path: '?page' },
  { route: 'GET /api/projects/:id/proposals', when: 'pageSize is 101', as: 'designer', query: 'pageSize=101', status: 400, path: '?pageSize' },
  { route: 'GET /api/projects/:id/proposals', when: 'status is "done"', as: 'designer', query: 'status=done', status: 400, path: '?status' },
  { route: 'GET /api/projects/:id/proposals', when: 'an unknown parameter sort is sent', as: 'designer', query: 'sort=id', status: 400, path: '?sort' },
];

describe('bad requests to the write routes', () => {
  let api: TestApi;
  const serverErrors: string[] = [];
  const clients = {} as Record<Role | 'anonymous', ApiClient>;
  const ids = { userId: 0, projectId: 0, specId: 0, proposals: {} as Record<ProposalKey, number> };

  beforeAll(async () => {
    api = await buildApiApp({ log: (message) => serverErrors.push(message) });
    for (const role of ['admin', 'requirements', 'designer', 'reviewer'] as const) clients[role] = await api.agentFor(role);
    clients.anonymous = await api.anonymous();
    ids.userId = api.users.designer.id;

    // The records the cases aim at, made through the API by the roles that may make them
    const project = await clients.admin.post('/api/projects').send({ name: 'Validation' }).expect(201);
    ids.projectId = project.body.id;
    for (const role of ['requirements', 'designer', 'reviewer'] as const) {
      await clients.admin.post(`/api/projects/${ids.projectId}/members`).send({ userId: api.users[role].id, role }).expect(201);
    }
    const spec = await clients.requirements.post(`/api/projects/${ids.projectId}/specs`).send({ title: 'Line receiver', payload: SPEC_PAYLOAD }).expect(201);
    ids.specId = spec.body.id;
    for (const key of ['ranked', 'spareA', 'spareB', 'spareC', 'spareD'] as const) {
      const proposal = await clients.designer.post(`/api/specs/${ids.specId}/proposals`).expect(201);
      ids.proposals[key] = proposal.body.id;
    }
  });

  afterAll(async () => {
    await api?.close();
  });

  function urlFor(row: BadRequest): string {
    const pattern = row.route.split(' ')[1];
    const id = pattern.startsWith('/api/users/')
      ? ids.userId
      : pattern.startsWith('/api/projects/')
        ? ids.projectId
        : pattern.startsWith('/api/specs/')
          ? ids.specId
          : ids.proposals[row.proposal ?? 'ranked'];
    const path = pattern.replace(':id', String(id));
    return row.query ? `${path}?${row.query}` : path;
  }

  function send(row: BadRequest) {
    const method = row.route.split(' ')[0].toLowerCase() as 'get' | 'post' | 'put' | 'patch';
    const req = clients[row.as][method](urlFor(row));
    const body = row.body;
    if (!body) return req;
    if ('json' in body) return req.send(body.json as object);
    if ('raw' in body) return req.set('Content-Type', body.type).send(body.raw);
    for (const [name, value] of Object.entries(body.multipart)) req.field(name, value);
    return req;
  }

  const titled = BAD_REQUESTS.map((row) => [`${row.route}: when ${row.when}, then ${row.status} at "${row.path}"`, row] as const);

  test.each(titled)('%s', async (_title, row) => {
    // Arrange
    const before = await countRows(api.dataSource);
    const errorsBefore = serverErrors.length;

    // Act
    const response = await send(row);

    // Assert
    const seen = `${response.status} ${response.text.slice(0, 400)}`;
    expect(response.status, seen).toBe(row.status);
    expect(response.type).toBe('application/json');
    expect(response.body.details.map((d: { path: string }) => d.path), seen).toContain(row.path);
    expect(response.text).not.toMatch(/\bat .+\.[jt]s:\d+/);
    expect(serverErrors.slice(errorsBefore)).toEqual([]);
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('the table covers every write route and the list query', () => {
    const routes = new Set(BAD_REQUESTS.map((r) => r.route));
    expect(BAD_REQUESTS.length).toBeGreaterThanOrEqual(40);
    expect([...routes].sort()).toEqual(
      [
        'GET /api/projects/:id/proposals',
        'PATCH /api/users/:id',
        'POST /api/analyze',
        'POST /api/auth/login',
        'POST /api/projects',
        'POST /api/projects/:id/members',
        'POST /api/projects/:id/specs',
        'POST /api/proposals/:id/decision',
        'POST /api/proposals/:id/review',
        'POST /api/users',
        'PUT /api/specs/:id',
      ].sort(),
    );
  });
});
