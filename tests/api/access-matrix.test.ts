/**
 * Role × route matrix: every route of app.ts called by nobody and by each role, the expected
 * status written out per cell. The table is PERMISSIONS (shared/workflow/roles.ts) plus each
 * route's documented rule: public, signed in, or one action; and for records, the project
 * ("own": every non-admin role is a member; "other": none is, so 404 — the admin reads all).
 * Each proposal is put in the state where the allowed role succeeds, so a cell measures the
 * access decision; the two "state" rows show the role check still comes before the 409.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { may, PERMISSIONS, type Action, type Role } from '#shared/workflow/roles';
import { buildApiApp, type AccountKey, type ApiClient, type TestApi } from '../helpers/api-app';
import { arrangeMatrix, CALLERS, fillUrl, MATRIX, registeredRoutes, type Caller, type Ids, type Row } from '../helpers/access-matrix';

interface Cell {
  title: string;
  caller: Caller;
  row: Row;
  status: number;
}

const CELLS: Cell[] = MATRIX.flatMap((row) =>
  CALLERS.map((caller, i) => {
    const status = row.expected[i];
    const suffix = row.note ? ` (${row.note})` : '';
    return { title: `${caller} ${row.route.split(' ')[0]} ${row.url} → ${status}${suffix}`, caller, row, status };
  }),
);

let api: TestApi;
let ids: Ids;
const clients = {} as Record<Caller, ApiClient>;

beforeAll(async () => {
  api = await buildApiApp();
  ids = await arrangeMatrix(api);
  clients.anonymous = await api.anonymous();
  for (const role of ['admin', 'requirements', 'designer', 'reviewer'] as const) clients[role] = await api.agentFor(role);
});

afterAll(async () => {
  await api?.close();
});

const fill = (url: string) => fillUrl(url, ids);

async function clientFor(caller: Caller, fresh: boolean): Promise<ApiClient> {
  if (!fresh) return clients[caller];
  return caller === 'anonymous' ? api.anonymous() : api.agentFor(caller as AccountKey);
}

describe('when each caller calls each route, then the answer is the one the permission table and the route rule give', () => {
  test.each(CELLS.map((cell) => [cell.title, cell] as const))('%s', async (_title, { caller, row, status }) => {
    // Arrange
    const client = await clientFor(caller, row.fresh === true);
    await row.arrange?.(api, ids);
    const method = row.route.split(' ')[0].toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';

    // Act
    const pending = client[method](fill(row.url));
    const response = row.file
      ? await pending.attach('file', Buffer.from(row.file.content, 'utf8'), row.file.name)
      : row.body
        ? await pending.send(row.body(ids, caller))
        : await pending;

    // Assert
    expect(response.status, JSON.stringify(response.body)).toBe(status);
    if (status === 401) expect(response.body.code).toBe('not-signed-in');
    if (status === 403) expect(response.body.code).toBe('forbidden');
    if (status === 404) expect(response.body.code).toMatch(/-not-found$/);
    if (status === 409) expect(response.body.code).toBe('invalid-transition');
  });
});

/** The reading rows for the signed-in callers, each called with a personal API token of the caller's instead of the session. */
const TOKEN_CELLS: Cell[] = CELLS.filter((cell) => cell.caller !== 'anonymous' && cell.row.route.startsWith('GET ') && !cell.row.route.startsWith('GET /api/auth/csrf'));

describe('when a signed-in caller reads each route with a personal API token instead of a session, then the answer is the session’s', () => {
  const tokens = {} as Record<Caller, string>;
  beforeAll(async () => {
    for (const role of ['admin', 'requirements', 'designer', 'reviewer'] as const) {
      const made = await clients[role].post('/api/auth/tokens').send({ name: `matrix reader ${role}` });
      tokens[role] = made.body.token as string;
    }
  });

  test.each(TOKEN_CELLS.map((cell) => [cell.title, cell] as const))('%s', async (_title, { caller, row, status }) => {
    await row.arrange?.(api, ids);
    const response = await request(api.app).get(fill(row.url)).set('Authorization', `Bearer ${tokens[caller]}`);
    // Managing tokens needs the session itself (a token cannot list or make tokens).
    const expected = row.route.startsWith('GET /api/auth/tokens') ? 403 : status;
    expect(response.status, JSON.stringify(response.body)).toBe(expected);
  });
});

describe('when the matrix is read against the app and PERMISSIONS, then it is complete and agrees', () => {
  test('when the app lists its routes, then every one has a row in the matrix', () => {
    const covered = new Set(MATRIX.map((row) => row.route));
    expect(registeredRoutes(api.app).filter((route) => !covered.has(route as Row['route']))).toEqual([]);
    expect([...covered].filter((route) => !registeredRoutes(api.app).includes(route))).toEqual([]);
  });

  const titled = (rows: Row[]) => rows.map((row) => [`${row.route} (${row.url})`, row] as const);

  test.each(titled(MATRIX.filter((row) => row.rule !== 'public' && row.rule !== 'signed-in' && row.rule !== 'per-record')))(
    'when %s needs its permission, then its 403s are exactly the roles PERMISSIONS leaves out',
    (_title, { rule, expected }) => {
      const roles: Role[] = ['admin', 'requirements', 'designer', 'reviewer'];
      const refused = roles.filter((_role, i) => expected[i + 1] === 403);
      expect(refused).toEqual(roles.filter((role) => !may(role, rule as Action)));
      expect(expected[0]).toBe(401);
    },
  );

  test.each(titled(MATRIX.filter((row) => row.rule === 'signed-in')))('when %s needs a sign-in only, then only the anonymous caller is refused', (_title, { expected }) => {
    expect(expected[0]).toBe(401);
    expect(expected.slice(1)).not.toContain(403);
  });

  test.each(titled(MATRIX.filter((row) => row.rule === 'per-record')))('when %s is decided by the record, then it says by whom and refuses the anonymous caller', (_title, { expected, note, url }) => {
    expect(expected[0]).toBe(401);
    if (!url.includes('{other')) expect(note).toBeTruthy();
  });

  test('when PERMISSIONS names an action, then some route of the matrix requires it', () => {
    const used = new Set(MATRIX.map((row) => row.rule));
    const unused = (Object.keys(PERMISSIONS) as Action[]).filter((action) => action !== 'projects:read-all' && !used.has(action));
    expect(unused).toEqual([]);
  });
});
