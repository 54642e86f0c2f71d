/**
 * A fresh Longtail app per test file: a new database migrated by openDatabase (SQLite in memory,
 * or a new PostgreSQL database in the api-postgres project: tests/helpers/test-database.ts), the rule
 * set from rules/, six accounts (one per role, plus a second designer and a second reviewer; each
 * holds its role in every project it joins unless a test gives another),
 * signed-in supertest clients that carry the CSRF token, and factories that arrange projects,
 * specs and proposals through the services (so a test's Act is its only HTTP call that matters).
 */
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createApp, type LongtailApp } from '../../api/app';
import { openDatabase } from '../../api/data-source';
import { addMember, createProject } from '../../api/services/projects.service';
import { createProposal } from '../../api/services/proposals.service';
import { createSpec } from '../../api/services/specs.service';
import { createUser, type PublicUser } from '../../api/services/users.service';
import type { RuleSet } from '#shared/engine/types';
import type { AccountRole, ProjectRole } from '#shared/workflow/roles';
import { loadRuleSet } from '../../rules/index';
import { VerificationQueue, type VerificationQueueOptions } from '../../api/verification/verification-queue';
import { freshDatabase, type TestDatabase } from './test-database';

/** The seeded accounts: one per role, and a second designer and reviewer for the four-eyes rules. */
export const ACCOUNT_KEYS = ['admin', 'requirements', 'designer', 'reviewer', 'designer2', 'reviewer2'] as const;
export type AccountKey = (typeof ACCOUNT_KEYS)[number];

/** The role each account holds in a project it joins (the admin: none but the administrator's own). */
export const USUAL_PROJECT_ROLES: Record<Exclude<AccountKey, 'admin'>, ProjectRole> = {
  requirements: 'requirements',
  designer: 'designer',
  reviewer: 'reviewer',
  designer2: 'designer',
  reviewer2: 'reviewer',
};
const accountRoleOf = (key: AccountKey): AccountRole => (key === 'admin' ? 'admin' : 'member');

/** Every seeded account's password (invented; ≥ 12 characters). */
export const TEST_PASSWORD = 'tern-lantern-0417-quay';
export const TEST_DOMAIN = 'tests.longtail.test';
export const emailOf = (key: AccountKey) => `${key}@${TEST_DOMAIN}`;

/**
 * An invented requirement spec (a thermopile sensor head that does not exist). Only some
 * optional fields are given, so the server fills the rest with the schema's defaults. 300 Monte
 * Carlo samples (the schema allows ≥ 100) keep one proposal near 50 ms; four of the six
 * options pass and the recommendation is the degenerated mirror. Its sign-off spreads are
 * stated tight (rails ±0.2 %, 10 ppm/°C resistors, as on a bench supply), so the
 * sign-off corners leave that outcome as the workflow tests expect it.
 */
export function specPayload(): Record<string, unknown> {
  return {
    title: 'Quillon sensor head — thermopile input pair',
    device: { beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 },
    supply: { positiveV: 9, negativeV: -9 },
    gain: { target: 14, tolerancePercent: 8, output: 'differential' },
    cmrr: { minDb: 74, atFrequencyHz: 400, marginDb: 3, minYieldPercent: 95 },
    inputCommonMode: { minV: -2.2, maxV: 2.6 },
    outputSwingVpp: 2.4,
    powerBudgetW: 0.03,
    supplyTolerance: { positivePercent: 0.2, negativePercent: 0.2 },
    resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 10 },
    monteCarlo: { samples: 300, seed: 17 },
  };
}

/** A supertest client whose state-changing requests carry the X-CSRF-Token header. */
export interface ApiClient {
  agent: request.Agent;
  csrfToken: string;
  get(url: string): request.Test;
  post(url: string): request.Test;
  put(url: string): request.Test;
  patch(url: string): request.Test;
  delete(url: string): request.Test;
}

export interface TestApi {
  app: LongtailApp;
  dataSource: DataSource;
  ruleSet: RuleSet;
  /** The seeded accounts (only those asked for, when BuildOptions.accounts is given). */
  users: Record<AccountKey, PublicUser>;
  /** A new session: CSRF token fetched, signed in as the account. Every sign-in counts toward the app's limit of 30 per address per 15 minutes (api/auth/rate-limit.ts). */
  agentFor(key: AccountKey): Promise<ApiClient>;
  /** A new session with a CSRF token and nobody signed in. */
  anonymous(): Promise<ApiClient>;
  /** A project (created by the admin) with the given accounts as members, each in its usual role unless `roles` gives another. */
  createProject(members?: Exclude<AccountKey, 'admin'>[], name?: string, roles?: Partial<Record<AccountKey, ProjectRole>>): Promise<{ id: number; name: string }>;
  /** A spec in a project, written by the requirements account (or `by`, who must see the project). */
  createSpec(projectId: number, options?: { payload?: Record<string, unknown>; title?: string; by?: AccountKey }): Promise<{ id: number; projectId: number; latestVersion: number }>;
  /** A ranked proposal on the spec's latest version (runs the engine). */
  createProposal(specId: number, by?: AccountKey): Promise<Awaited<ReturnType<typeof createProposal>>>;
  close(): Promise<void>;
}

function clientFor(agent: request.Agent, csrfToken: string): ApiClient {
  // The token is read at each call: it changes when the session does (signInAs sets the new one).
  const client: ApiClient = {
    agent,
    csrfToken,
    get: (url) => agent.get(url),
    post: (url) => agent.post(url).set('X-CSRF-Token', client.csrfToken),
    put: (url) => agent.put(url).set('X-CSRF-Token', client.csrfToken),
    patch: (url) => agent.patch(url).set('X-CSRF-Token', client.csrfToken),
    delete: (url) => agent.delete(url).set('X-CSRF-Token', client.csrfToken),
  };
  return client;
}

/**
 * Signs the client in (POST /api/auth/login) and takes the new session's CSRF token from the
 * answer, as the browser app does; the answer is returned whatever its status.
 */
export async function signInAs(client: ApiClient, email: string, password: string): Promise<request.Response> {
  const response = await client.post('/api/auth/login').send({ email, password });
  if (response.status === 200 && typeof response.body.csrfToken === 'string') client.csrfToken = response.body.csrfToken;
  return response;
}

/** A fresh agent with a CSRF token (the cookie is kept by the agent). */
export async function csrfClient(app: LongtailApp): Promise<ApiClient> {
  const agent = request.agent(app);
  const response = await agent.get('/api/auth/csrf').expect(200);
  return clientFor(agent, response.body.token as string);
}

export interface BuildOptions {
  /** Where the app logs server errors (default: nowhere). */
  log?: (message: string) => void;
  /** The accounts to seed (default all six; each costs one scrypt hash). */
  accounts?: readonly AccountKey[];
  /** Options for the app's verification queue (netlist hooks, engine with another time limit). */
  verification?: VerificationQueueOptions;
  /**
   * An existing database to open instead of a fresh one (restart tests open one twice: make it
   * with `freshDatabase({ reopenable: true })`); the caller drops it. Accounts already there are
   * not seeded again: pass `accounts: []` to the second app.
   */
  database?: TestDatabase;
  /** Where uploaded files go (default: the app's own temporary folder, removed on close). */
  uploadsDir?: string;
  /** Trust X-Forwarded-For and -Proto (so a test can speak from several addresses, or as HTTPS). */
  trustProxy?: boolean;
  /** The clock of the sign-in delays (default Date.now). */
  clock?: () => number;
  /** Worker threads for the engine (default 0: the engine runs on the request thread). */
  engineWorkers?: number;
}

/** Builds the app on a new database (or `options.database`) and seeds the accounts. */
export async function buildApiApp(options: BuildOptions = {}): Promise<TestApi> {
  const owned = options.database ? null : await freshDatabase();
  const database = options.database ?? owned!;
  const dataSource = await openDatabase(database.location);
  const ruleSet = await loadRuleSet();
  const log = options.log ?? (() => {});
  const verification = new VerificationQueue(dataSource, { log, ...options.verification });
  const app = createApp({ dataSource, sessionSecret: 'x'.repeat(40), ruleSet, log, verification, uploadsDir: options.uploadsDir, trustProxy: options.trustProxy, clock: options.clock, engineWorkers: options.engineWorkers });
  const entries = await Promise.all(
    (options.accounts ?? ACCOUNT_KEYS).map(async (key) => {
      const user = await createUser(dataSource, null, { email: emailOf(key), displayName: `Test ${key}`, role: accountRoleOf(key), password: TEST_PASSWORD });
      return [key, user] as const;
    }),
  );
  const users = Object.fromEntries(entries) as Record<AccountKey, PublicUser>;

  return {
    app,
    dataSource,
    ruleSet,
    users,
    async agentFor(key) {
      const client = await csrfClient(app);
      const response = await signInAs(client, emailOf(key), TEST_PASSWORD);
      if (response.status !== 200) throw new Error(`sign-in as ${key} answered ${response.status}: ${JSON.stringify(response.body)}`);
      return client;
    },
    anonymous: () => csrfClient(app),
    async createProject(members = ['requirements', 'designer', 'reviewer', 'designer2', 'reviewer2'], name = 'Quillon sensor head', roles = {}) {
      const project = await createProject(dataSource, users.admin.id, { name, description: 'Invented project for the API tests.' });
      for (const key of members) await addMember(dataSource, users.admin, project.id, users[key].id, roles[key] ?? USUAL_PROJECT_ROLES[key]);
      return project;
    },
    async createSpec(projectId, { payload = specPayload(), title = String(payload.title ?? 'Untitled spec'), by = 'requirements' } = {}) {
      return createSpec(dataSource, users[by], projectId, { title, payload });
    },
    async createProposal(specId, by = 'designer') {
      return createProposal(dataSource, users[by], specId, ruleSet);
    },
    async close() {
      app.closeApp();
      await app.verification.close();
      await app.enginePool.release();
      if (dataSource.isInitialized) await dataSource.destroy();
      await owned?.drop();
    },
  };
}
