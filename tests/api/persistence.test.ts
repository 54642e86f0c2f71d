/**
 * Durability of the database: everything written through one data source (users, a project, a
 * spec, a proposal and its decision, via the services) reads back equal through another data
 * source opened on the same SQLite file or PostgreSQL database (the api-postgres project), which
 * enforces foreign keys, keeps acknowledged writes (SQLite: WAL journal and a busy timeout;
 * PostgreSQL: synchronous commits, fsync on) and does not run the migrations again.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { DataSource } from 'typeorm';
import { loadRuleSet } from '../../rules/index';
import { openDatabase } from '../../api/data-source';
import { addMember, createProject } from '../../api/services/projects.service';
import { createProposal, decide, getProposal } from '../../api/services/proposals.service';
import { createSpec, getSpec } from '../../api/services/specs.service';
import { createUser, listUsers, type PublicUser } from '../../api/services/users.service';
import { TEST_PASSWORD } from '../helpers/api-app';
import { dumpTables } from '../helpers/api-validation-helpers';
import { MIGRATIONS } from '../../api/migrations/index';
import { freshDatabase, TEST_BACKEND, type TestDatabase } from '../helpers/test-database';

const SPEC_PAYLOAD = {
  device: { beta: 240, earlyVoltageV: 95, saturationCurrentA: 1.4e-14 },
  supply: { positiveV: 15, negativeV: -15 },
  gain: { target: 6, output: 'single-ended' },
  cmrr: { minDb: 60, atFrequencyHz: 15000 },
  topologies: ['resistor', 'simple-mirror', 'cascode'],
  // regulated rails and close resistors: a passing option to accept at the sign-off corners
  supplyTolerance: { positivePercent: 0.5, negativePercent: 0.5 },
  resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 25 },
  monteCarlo: { samples: 200, seed: 11 },
};

const rawResult = async (dataSource: DataSource, proposalId: number): Promise<string> =>
  (await dataSource.createQueryBuilder().select('r.result', 'result').from('proposal', 'p').innerJoin('ranking', 'r', 'r.id = p.ranking_id').where('p.id = :id', { id: proposalId }).getRawOne()).result;

describe('a database reopened by another data source', () => {
  let database: TestDatabase;
  let reopened: DataSource;
  let designer: PublicUser;
  let written: {
    tables: Record<string, unknown[]>;
    users: PublicUser[];
    spec: unknown;
    proposal: Awaited<ReturnType<typeof getProposal>>;
    createdResultJson: string;
    storedResultText: string;
  };

  beforeAll(async () => {
    // Arrange: write through a first data source, then close it
    database = await freshDatabase({ reopenable: true });
    const ruleSet = await loadRuleSet();
    const first = await openDatabase(database.location);
    const admin = await createUser(first, null, { email: 'admin@persist.test', displayName: 'Ada Admin', role: 'admin', password: TEST_PASSWORD });
    const author = await createUser(first, admin.id, { email: 'req@persist.test', displayName: 'Rex Requirements', role: 'member', password: TEST_PASSWORD });
    designer = await createUser(first, admin.id, { email: 'design@persist.test', displayName: 'Dee Designer', role: 'member', password: TEST_PASSWORD });
    const project = await createProject(first, admin.id, { name: 'Persistence', description: 'Reopened from disk' });
    await addMember(first, admin, project.id, author.id, 'requirements');
    await addMember(first, admin, project.id, designer.id, 'designer');
    const spec = await createSpec(first, author, project.id, { title: 'Line receiver', payload: SPEC_PAYLOAD });
    const created = await createProposal(first, designer, spec.id, ruleSet);
    await decide(first, designer, created.id, { kind: 'accept' }, ruleSet);
    written = {
      tables: await dumpTables(first),
      users: await listUsers(first),
      spec: await getSpec(first, designer, spec.id),
      proposal: await getProposal(first, designer, created.id),
      createdResultJson: JSON.stringify(created.result),
      storedResultText: await rawResult(first, created.id),
    };
    await first.destroy();

    // Act: open the same database with another data source
    reopened = await openDatabase(database.location);
  });

  afterAll(async () => {
    if (reopened?.isInitialized) await reopened.destroy();
    await database?.drop();
  });

  test('when reopened, then every row of every table reads back equal', async () => {
    expect(written.tables.proposal).toHaveLength(1);
    expect(written.tables.decision).toHaveLength(1);
    expect(await dumpTables(reopened)).toEqual(written.tables);
  });

  test('when reopened, then the services read the same users, spec and proposal', async () => {
    expect(await listUsers(reopened)).toEqual(written.users);
    expect(await getSpec(reopened, designer, (written.spec as { id: number }).id)).toEqual(written.spec);
    expect(await getProposal(reopened, designer, written.proposal.id)).toEqual(written.proposal);
  });

  test('when reopened, then the proposal result JSON is identical byte for byte', async () => {
    expect(written.storedResultText).toBe(written.createdResultJson);
    expect(await rawResult(reopened, written.proposal.id)).toBe(written.storedResultText);
  });

  // Each back end's own durability settings; the test of the other back end is not defined (not skipped).
  if (TEST_BACKEND === 'sqlite') test('when reopened (SQLite), then the journal is WAL, foreign keys are on, with a busy timeout', async () => {
    expect(await reopened.query('PRAGMA journal_mode')).toEqual([{ journal_mode: 'wal' }]);
    expect(await reopened.query('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }]);
    expect(await reopened.query('PRAGMA busy_timeout')).toEqual([{ timeout: 5000 }]);
  });

  if (TEST_BACKEND === 'postgres') test('when reopened (PostgreSQL), then commits wait for the disk and the connections carry the app name', async () => {
    expect(await reopened.query('SHOW synchronous_commit')).toEqual([{ synchronous_commit: 'on' }]);
    expect(await reopened.query('SHOW fsync')).toEqual([{ fsync: 'on' }]);
    expect(await reopened.query('SHOW application_name')).toEqual([{ application_name: 'longtail' }]);
  });

  test('when reopened, then foreign keys are enforced', async () => {
    await expect(reopened.query("INSERT INTO project_member (project_id, user_id, created_at) VALUES (9999, 9999, 'now')")).rejects.toThrow(/FOREIGN KEY|foreign key constraint/i);
  });

  test('when reopened, then the migrations are not run again', async () => {
    expect(await reopened.query('SELECT count(*) AS n FROM migrations')).toEqual([{ n: MIGRATIONS.length }]);
    expect(await reopened.showMigrations()).toBe(false);
  });
});
