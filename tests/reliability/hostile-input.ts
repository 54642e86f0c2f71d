/**
 * Hostile input, first half: property-based requests against the in-process app
 * (tests/helpers/api-app.ts, supertest, a fresh in-memory database arranged as the access
 * matrix arranges it). For every route of the matrix (tests/helpers/access-matrix.ts) and every
 * caller (nobody, admin, requirements author, designer, reviewer), fast-check generates:
 * - bodies from the route's JSON Schema (api/validation/bodies.ts; specs and designs from
 *   shared/schema), mutated ones and arbitrary JSON, sometimes malformed JSON text;
 * - query strings from the route's query schema or arbitrary ones;
 * - sometimes a hostile path id ("-1", "1e3", "..", "%00", a 30-digit number, …);
 * - for uploads, arbitrary file bytes or card-like text under arbitrary file names.
 * Every answer of 500 or more counts (must be 0), and so does every error the app logs.
 * The second half (the injection corpus and the browser check) is injection-corpus.ts.
 */
import fc from 'fast-check';
import type request from 'supertest';
import { DESIGN_SCHEMA, SPEC_SCHEMA } from '#shared/validate';
import {
  ACTIVITY_CSV_QUERY,
  ACTIVITY_QUERY,
  API_TOKEN_BODY,
  DECISION_BODY,
  DIFF_QUERY,
  EVALUATION_BODY,
  IMPORT_QUERY,
  LOGIN_BODY,
  MEMBERSHIP_BODY,
  MONTE_CARLO_BODY,
  TRADEOFF_BODY,
  NETLIST_QUERY,
  NEW_PROJECT_BODY,
  NEW_USER_BODY,
  PASSWORD_CHANGE_BODY,
  PASSWORD_RESET_BODY,
  PREFERENCES_BODY,
  PROPOSAL_LIST_QUERY,
  MEASUREMENT_LIST_QUERY,
  DEVICE_LIST_QUERY,
  DEVICE_RECORDED_QUERY,
  REVIEW_BODY,
  WAITING_QUERY,
  WITHDRAWAL_BODY,
  USER_CHANGES_BODY,
} from '../../api/validation/bodies';
import { arrangeMatrix, CALLERS, fillUrl, MATRIX, registeredRoutes, type Caller, type Ids, type Row } from '../helpers/access-matrix';
import { buildApiApp, type AccountKey, type ApiClient } from '../helpers/api-app';
import { injectionCorpus } from './injection-corpus';
import { row, type PartResult, type RunOptions, type SummaryRow } from './lib';
import { arbitraryFromSchema, hostile } from './schema-arbitrary';

const PART = 'Hostile input';
type Schema = Record<string, unknown>;

const specArb = arbitraryFromSchema(SPEC_SCHEMA as Schema);
const specBody = fc.record({ title: arbitraryFromSchema({ type: 'string', minLength: 1, maxLength: 200, pattern: '\\S' }), payload: specArb });

/** Body arbitraries by route (method and path as app.ts registers it). */
const BODIES: Record<string, fc.Arbitrary<unknown>> = {
  'POST /api/auth/login': arbitraryFromSchema(LOGIN_BODY),
  'PATCH /api/auth/me': arbitraryFromSchema(PREFERENCES_BODY),
  'POST /api/auth/password': arbitraryFromSchema(PASSWORD_CHANGE_BODY),
  'POST /api/auth/password-reset': arbitraryFromSchema(PASSWORD_RESET_BODY),
  'POST /api/auth/tokens': arbitraryFromSchema(API_TOKEN_BODY),
  'POST /api/users': arbitraryFromSchema(NEW_USER_BODY),
  'PATCH /api/users/:id': arbitraryFromSchema(USER_CHANGES_BODY),
  'POST /api/projects': arbitraryFromSchema(NEW_PROJECT_BODY),
  'POST /api/projects/:id/members': arbitraryFromSchema(MEMBERSHIP_BODY),
  'POST /api/projects/:id/specs': specBody,
  'PUT /api/specs/:id': specBody,
  'POST /api/proposals/:id/decision': arbitraryFromSchema(DECISION_BODY as Schema),
  'POST /api/proposals/:id/evaluation': arbitraryFromSchema(EVALUATION_BODY as Schema),
  'POST /api/proposals/:id/review': arbitraryFromSchema(REVIEW_BODY),
  'POST /api/proposals/:id/withdrawal': arbitraryFromSchema(WITHDRAWAL_BODY),
  'POST /api/proposals/:id/verification/monte-carlo': arbitraryFromSchema(MONTE_CARLO_BODY),
  'POST /api/analyze': arbitraryFromSchema(DESIGN_SCHEMA as Schema),
  'POST /api/tradeoff': arbitraryFromSchema(TRADEOFF_BODY as Schema),
};

/** Query arbitraries by route; values go out as text, as a browser sends them. */
const QUERIES: Record<string, fc.Arbitrary<unknown>> = {
  'GET /api/projects/:id/proposals': arbitraryFromSchema(PROPOSAL_LIST_QUERY),
  'GET /api/projects/:id/activity': arbitraryFromSchema(ACTIVITY_QUERY),
  'GET /api/projects/:id/activity.csv': arbitraryFromSchema(ACTIVITY_CSV_QUERY),
  'GET /api/waiting': arbitraryFromSchema(WAITING_QUERY),
  'GET /api/proposals/:proposalId/measurements': arbitraryFromSchema(MEASUREMENT_LIST_QUERY),
  'GET /api/projects/:projectId/devices': arbitraryFromSchema(DEVICE_LIST_QUERY),
  'GET /api/projects/:projectId/devices/recorded': arbitraryFromSchema(DEVICE_RECORDED_QUERY),
  'GET /api/specs/:id/diff': arbitraryFromSchema(DIFF_QUERY),
  'GET /api/proposals/:id/netlist.cir': arbitraryFromSchema(NETLIST_QUERY),
  'POST /api/projects/:id/specs/import': arbitraryFromSchema(IMPORT_QUERY),
  'GET /api/projects/:id/proposals.csv': fc.record({ ids: fc.oneof(fc.array(fc.integer({ min: -5, max: 99 }), { maxLength: 5 }).map((a) => a.join(',')), fc.string()) }),
};

const HOSTILE_IDS = ['0', '-1', '1e3', '0x10', '1.5', '999999999999999999999999999999', 'NaN', 'abc', '%00', '..', '%2e%2e%2f', "1'%20OR%201=1", '%F0%9F%98%80', '１２', ' 3'];

const fileNames = fc.oneof(fc.constantFrom('models.lib', '../../etc/passwd', '..\\..\\boot.ini', 'CON', '.lib', 'a\u0000b.lib', '<img src=x>.csv', 'specs.json'), fc.string({ maxLength: 40, unit: 'binary' }));
const fileBytes = fc.oneof(
  fc.uint8Array({ maxLength: 600 }),
  fc.string({ maxLength: 400, unit: 'binary' }).map((s) => Buffer.from(s, 'utf8')),
  // Card-like and CSV-like text, so the readers get past their first checks
  fc
    .array(fc.oneof(fc.constantFrom('.model FHQ NPN (IS=6f BF=140 VAF=70)', '+ BR=2', '* comment', '.end', '.subckt X', 'title,supply.positiveV,supply.negativeV,gain.target,cmrr.minDb', 'Fuzz,9,-9,14,70'), fc.string({ maxLength: 40 })), { maxLength: 8 })
    .map((lines) => Buffer.from(lines.join('\n'), 'utf8')),
);

interface Probe {
  url: string;
  query: unknown;
  body: { kind: 'json'; value: unknown } | { kind: 'raw'; text: string } | { kind: 'none' } | { kind: 'file'; name: string; bytes: Uint8Array };
}

function probeArbitrary(row: Row): fc.Arbitrary<Probe> {
  const placeholders = [...row.url.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
  const pathIds = fc.array(fc.option(fc.constantFrom(...HOSTILE_IDS), { freq: 4 }), { minLength: placeholders.length, maxLength: placeholders.length });
  const queryArb = QUERIES[row.route] ? hostile(QUERIES[row.route]) : fc.option(fc.dictionary(fc.string({ maxLength: 8 }), fc.string({ maxLength: 12 }), { maxKeys: 3 }), { freq: 4 });
  const bodyArb: fc.Arbitrary<Probe['body']> = row.file
    ? fc.record({ kind: fc.constant('file' as const), name: fileNames, bytes: fileBytes })
    : fc.oneof(
        { weight: 6, arbitrary: hostile(BODIES[row.route] ?? fc.jsonValue({ maxDepth: 2 })).map((value) => ({ kind: 'json' as const, value })) },
        { weight: 1, arbitrary: fc.string({ maxLength: 60 }).map((text) => ({ kind: 'raw' as const, text: `{${text}` })) },
        { weight: 1, arbitrary: fc.constant({ kind: 'none' as const }) },
      );
  return fc.record({ ids: pathIds, query: queryArb, body: bodyArb }).map(({ ids, query, body }) => {
    let i = 0;
    const url = row.url.replace(/\{(\w+)\}/g, (whole) => {
      const replacement = ids[i++];
      return replacement ?? whole;
    });
    return { url, query, body };
  });
}

function queryString(query: unknown): string {
  if (query === null || query === undefined || typeof query !== 'object' || Array.isArray(query)) return '';
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query as Record<string, unknown>)) params.append(key, typeof value === 'string' ? value : JSON.stringify(value));
  const text = params.toString();
  return text ? `?${text}` : '';
}

export async function hostileInput(options: RunOptions & { seed: number; browser: boolean }): Promise<PartResult> {
  const { log, quick } = options;
  const runsPerCell = quick ? 5 : 12;
  const serverErrors: string[] = [];
  const api = await buildApiApp({ log: (message) => serverErrors.push(message) });
  const rows: SummaryRow[] = [];
  try {
    const ids: Ids = await arrangeMatrix(api);
    const clients = {} as Record<Caller, ApiClient>;
    clients.anonymous = await api.anonymous();
    for (const role of ['admin', 'requirements', 'designer', 'reviewer'] as const) clients[role] = await api.agentFor(role);

    // Every registered route must be exercised
    const covered = new Set(MATRIX.map((r) => r.route));
    const uncovered = registeredRoutes(api.app).filter((route) => !covered.has(route as Row['route']));
    const cells = MATRIX.flatMap((r) => CALLERS.map((caller) => ({ row: r, caller })));
    // The fuzz gets the part's budget less what the corpus and the browser check need
    const fuzzDeadline = options.deadline - (options.browser ? 90_000 : 30_000);
    let requests = 0;
    let fivexx = 0;
    /** Requests the harness could not send (598), and requests without an answer within 30 s (599). */
    let unsent = 0;
    let hung = 0;
    const statuses = new Map<number, number>();
    const examples: string[] = [];
    let stoppedEarly = 0;
    const slow: string[] = [];
    for (const [index, { row: r, caller }] of cells.entries()) {
      const remaining = fuzzDeadline - performance.now();
      if (remaining <= 0) {
        stoppedEarly = cells.length - index;
        break;
      }
      const cellBudget = remaining / (cells.length - index);
      const cellStart = performance.now();
      // Sign-in and sign-out change the session: those rows get a session of their own (few runs, each sign-in costs a hash)
      const fresh = r.fresh === true;
      const samples = fc.sample(probeArbitrary(r), { numRuns: fresh ? 2 : runsPerCell, seed: options.seed + index });
      for (const probe of samples) {
        if (performance.now() - cellStart > cellBudget * 2) break;
        const client = fresh ? (caller === 'anonymous' || r.route === 'POST /api/auth/login' ? await api.anonymous() : await api.agentFor(caller as AccountKey)) : clients[caller];
        const method = r.route.split(' ')[0].toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
        const url = fillUrl(probe.url, ids) + queryString(probe.query);
        let pending: request.Test = client[method](url).timeout(30_000);
        const body = probe.body;
        // JSON goes out as text, so primitives (true, 3, "x") are sent as they are
        if (body.kind === 'json') pending = pending.set('content-type', 'application/json').send(JSON.stringify(body.value));
        else if (body.kind === 'raw') pending = pending.set('content-type', 'application/json').send(body.text);
        else if (body.kind === 'file') pending = pending.attach('file', Buffer.from(body.bytes), body.name || 'x');
        let status: number;
        const sentAt = performance.now();
        if (process.env.RELIABILITY_TRACE) process.stderr.write(`trace: ${caller} ${r.route.split(' ')[0]} ${url} ${JSON.stringify(body.kind === 'file' ? { name: body.name } : body).slice(0, 300)}\n`);
        try {
          status = (await pending).status;
          const tookMs = performance.now() - sentAt;
          if (tookMs > 5000) slow.push(`${caller} ${r.route.split(' ')[0]} ${url}: ${(tookMs / 1000).toFixed(1)} s, body ${JSON.stringify(body.kind === 'file' ? { name: body.name } : body).slice(0, 300)}`);
        } catch (error) {
          const e = error as { timeout?: number; code?: string; message?: string };
          status = e.timeout ? 599 : 598;
          if (examples.length < 12) examples.push(`${caller} ${r.route.split(' ')[0]} ${url}: no answer: ${e.code ?? ''} ${e.message ?? ''}`.slice(0, 400));
        }
        requests += 1;
        statuses.set(status, (statuses.get(status) ?? 0) + 1);
        if (status === 598) unsent += 1;
        else if (status === 599) hung += 1;
        else if (status >= 500) {
          fivexx += 1;
          if (examples.length < 12) examples.push(`${caller} ${r.route.split(' ')[0]} ${url} → ${status}; body ${JSON.stringify(body.kind === 'file' ? { name: body.name, bytes: body.bytes.length } : body).slice(0, 400)}`);
        }
      }
      // Keep the arranged records usable for the next cells: re-sign in a caller whose session was lost
      if (!fresh && caller !== 'anonymous' && (await clients[caller].get('/api/auth/me')).status !== 200) clients[caller] = await api.agentFor(caller as AccountKey);
    }
    const byStatus = [...statuses].sort((a, b) => a[0] - b[0]).map(([s, n]) => `${s}×${n}`).join(' ');
    log(`fuzz: ${requests} requests over ${MATRIX.length} route rows × ${CALLERS.length} callers${stoppedEarly ? ` (${stoppedEarly} cells skipped: time budget)` : ''}; answers ${byStatus}`);
    for (const example of examples) log(`  ${example}`);
    for (const line of slow.slice(0, 8)) log(`  slow (> 5 s): ${line}`);
    for (const message of serverErrors.slice(0, 5)) log(`  server error logged: ${message.split('\n').slice(0, 4).join(' | ').slice(0, 500)}`);
    rows.push(
      row(PART, 'property-based requests (schemas + JSON)', requests, `all ${cells.length} route×role cells`, stoppedEarly === 0 && uncovered.length === 0),
      row(PART, '5xx answers', fivexx, '0', fivexx === 0),
      row(PART, 'requests unanswered after 30 s', hung, '0', hung === 0),
      row(PART, 'requests the harness could not send', unsent, '0', unsent === 0),
      row(PART, 'server errors logged', serverErrors.length, '0', serverErrors.length === 0),
    );
  } finally {
    await api.close();
  }
  rows.push(...(await injectionCorpus(options)).rows);
  return { rows };
}
