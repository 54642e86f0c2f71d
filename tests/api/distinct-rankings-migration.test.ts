/**
 * The move to distinct rankings stored once, on a database written before it (SQLite here,
 * PostgreSQL in the api-postgres project): the schema up to the previous migration, proposals as
 * the old code wrote them (each row holding its own copy of the engine's output, several rows the
 * same output), then the server opened as on an upgrade. Each distinct output must become one
 * ranking row, every proposal must read back exactly the output it held (never another spec
 * version's figures), the list must page newest first by keyset, a new proposal of a ranked
 * version must reuse its row, and the migration must undo to the old rows.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource, openDatabase } from '../../api/data-source';
import { MIGRATIONS } from '../../api/migrations/index';
import { DistinctRankings1764900000000 } from '../../api/migrations/1764900000000-distinct-rankings';
import { createProposal, getProposal, listProposals } from '../../api/services/proposals.service';
import { checkedSpecDocument } from '../../api/services/specs.service';
import { ENGINE_VERSION, recommend } from '#shared/engine/index';
import { loadRuleSet } from '../../rules/index';
import { freshDatabase, type TestDatabase } from '../helpers/test-database';

const AT = '2026-11-02T09:00:00.000Z';
const PAYLOAD = {
  title: 'Kestrel line receiver',
  device: { beta: 240, earlyVoltageV: 95, saturationCurrentA: 1.4e-14 },
  supply: { positiveV: 15, negativeV: -15 },
  gain: { target: 6, output: 'single-ended' },
  cmrr: { minDb: 60, atFrequencyHz: 15000 },
  topologies: ['resistor', 'simple-mirror', 'cascode'],
  monteCarlo: { samples: 200, seed: 11 },
};
/** Version 2 asks for more rejection: its ranking differs from version 1's. */
const PAYLOAD_2 = { ...PAYLOAD, cmrr: { minDb: 80, atFrequencyHz: 15000 } };
/** The old rows: spec version, status and created-at of proposals 1-6 (4 and 5 made in the same millisecond). */
const OLD_PROPOSALS = [
  [1, 'approved', '2026-11-02T09:01:00.000Z'],
  [1, 'superseded', '2026-11-02T09:02:00.000Z'],
  [2, 'decided', '2026-11-02T09:03:00.000Z'],
  [1, 'withdrawn', '2026-11-02T09:04:00.000Z'],
  [2, 'ranked', '2026-11-02T09:04:00.000Z'],
  [2, 'returned', '2026-11-02T09:05:00.000Z'],
] as const;

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

let database: TestDatabase;
let upgraded: DataSource;
let texts: Record<1 | 2, string>;
let before: Record<string, unknown>[];
/** The proposal made after the upgrade (its id is not 7 on PostgreSQL, where a refused insert used a sequence number). */
let createdId: number;
const viewer = { id: 1, role: 'member' as const };

/** Each proposal's ranking text, read by SQL through its reference. */
const storedTexts = async (dataSource: DataSource) =>
  (
    await dataSource
      .createQueryBuilder()
      .select(['p.id AS id', 'r.result AS result'])
      .from('proposal', 'p')
      .innerJoin('ranking', 'r', 'r.id = p.ranking_id')
      .orderBy('p.id')
      .getRawMany<{ id: number; result: string }>()
  ).map((row) => [Number(row.id), row.result]);

const proposalRows = async (dataSource: DataSource) =>
  (await dataSource.query('SELECT * FROM proposal ORDER BY id')).map((row: Record<string, unknown>) => ({ ...row, id: Number(row.id) }));

beforeAll(async () => {
  const ruleSet = await loadRuleSet();
  const documents = { 1: checkedSpecDocument(PAYLOAD), 2: checkedSpecDocument(PAYLOAD_2) } as const;
  texts = { 1: JSON.stringify(await recommend(documents[1], ruleSet)), 2: JSON.stringify(await recommend(documents[2], ruleSet)) };
  expect(texts[1]).not.toBe(texts[2]);

  database = await freshDatabase({ reopenable: true });
  const old = createDataSource(database.location);
  // The schema as it was before: every migration before this one; rows written by column name.
  old.setOptions({ migrations: MIGRATIONS.slice(0, MIGRATIONS.indexOf(DistinctRankings1764900000000)), entities: [] });
  await old.initialize();
  await old.runMigrations();
  const insert = (table: string, values: Record<string, unknown>) => old.createQueryBuilder().insert().into(table).values(values).execute();
  await insert('user_account', { email: 'wren@upgrade.test', display_name: 'Wren Designer', role: 'member', password_hash: 'x', created_at: AT });
  await insert('project', { name: 'Kestrel', description: '', created_by_id: 1, created_at: AT });
  await insert('project_member', { project_id: 1, user_id: 1, role: 'designer', created_at: AT });
  await insert('spec', { project_id: 1, title: PAYLOAD.title, latest_version: 2, created_by_id: 1, created_at: AT, updated_at: AT });
  for (const version of [1, 2] as const) {
    await insert('spec_version', { spec_id: 1, version, title: PAYLOAD.title, payload: JSON.stringify(documents[version]), created_by_id: 1, created_at: AT });
  }
  for (const [version, status, at] of OLD_PROPOSALS) {
    await insert('proposal', {
      project_id: 1,
      spec_id: 1,
      spec_version_id: version,
      engine_version: ENGINE_VERSION,
      ruleset_version: ruleSet.version,
      recommended_topology: (JSON.parse(texts[version]) as { recommended: string | null }).recommended,
      status,
      created_by_id: 1,
      created_at: at,
      updated_at: at,
      result: texts[version],
    });
  }
  before = (await proposalRows(old)).map(({ result: _result, ...row }: Record<string, unknown>) => row);
  await old.destroy();

  // The upgrade: the server opens the database and runs what is pending.
  upgraded = await openDatabase(database.location);
});

afterAll(async () => {
  if (upgraded?.isInitialized) await upgraded.destroy();
  await database?.drop();
});

describe('when a database with proposals from before distinct rankings is opened', () => {
  test('then each distinct output is one ranking row, keyed by the SHA-256 of its text', async () => {
    const rankings = await upgraded.query('SELECT content_hash, result FROM ranking ORDER BY id');
    expect(rankings).toEqual([
      { content_hash: sha256(texts[1]), result: texts[1] },
      { content_hash: sha256(texts[2]), result: texts[2] },
    ]);
  });

  test('then every proposal reads back, byte for byte, the output it held, and its other columns are kept', async () => {
    expect(await storedTexts(upgraded)).toEqual(OLD_PROPOSALS.map(([version], i) => [i + 1, texts[version]]));
    const after = await proposalRows(upgraded);
    expect(after.map(({ ranking_id: _ranking, ...row }: Record<string, unknown>) => row)).toEqual(before);
    expect(Object.keys(after[0])).not.toContain('result');
  });

  test('then the service answers each proposal with its own version’s ranking and no storage reference', async () => {
    const first = await getProposal(upgraded, viewer, 1);
    const third = await getProposal(upgraded, viewer, 3);
    expect(first.result).toEqual(JSON.parse(texts[1]));
    expect(third.result).toEqual(JSON.parse(texts[2]));
    expect(first).toMatchObject({ id: 1, status: 'approved', specVersionId: 1, createdAt: OLD_PROPOSALS[0][2] });
    expect(first).not.toHaveProperty('rankingId');
  });

  test('then a proposal must refer to a stored ranking', async () => {
    await expect(
      upgraded.query(
        `INSERT INTO proposal (project_id, spec_id, spec_version_id, engine_version, ruleset_version, status, created_by_id, created_at, updated_at, ranking_id) VALUES (1, 1, 1, 'e', 'r', 'ranked', 1, '${AT}', '${AT}', 9999)`,
      ),
    ).rejects.toThrow(/FOREIGN KEY|foreign key constraint/i);
  });

  test('then the list pages newest first (created-at, then id), by cursor as by number', async () => {
    const byNumber = await Promise.all([1, 2, 3].map((page) => listProposals(upgraded, viewer, 1, { page, pageSize: 2 })));
    expect(byNumber.map((p) => p.items.map((item) => item.id))).toEqual([[6, 5], [4, 3], [2, 1]]);
    expect(byNumber.map((p) => p.total)).toEqual([6, 6, 6]);
    const pages: number[][] = [];
    let cursor: string | undefined;
    for (;;) {
      const page = await listProposals(upgraded, viewer, 1, { page: 1, pageSize: 2, ...(cursor ? { cursor } : {}) });
      pages.push(page.items.map((item) => item.id));
      if (!page.nextCursor) break;
      cursor = page.nextCursor;
    }
    expect(pages).toEqual([[6, 5], [4, 3], [2, 1], []]);
    const filtered = await listProposals(upgraded, viewer, 1, { page: 1, pageSize: 20, status: 'ranked' });
    expect(filtered.items.map((item) => item.id)).toEqual([5]);
    expect(filtered.items[0]).not.toHaveProperty('result');
    expect(filtered.items[0]).not.toHaveProperty('rankingId');
  });

  test('then a new proposal of an already ranked version refers to that version’s ranking row', async () => {
    const created = await createProposal(upgraded, viewer, 1, await loadRuleSet());
    createdId = created.id;
    expect(created.specVersionId).toBe(2);
    expect(JSON.stringify(created.result)).toBe(texts[2]);
    expect((await upgraded.query('SELECT count(*) AS n FROM ranking'))[0].n).toBe(2);
    expect((await storedTexts(upgraded)).at(-1)).toEqual([created.id, texts[2]]);
  });

  test('when the migration is undone, then every proposal holds its own output again', async () => {
    const queryRunner = upgraded.createQueryRunner();
    try {
      await new DistinctRankings1764900000000().down(queryRunner);
      const rows = await proposalRows(upgraded);
      expect(rows.map((row: { id: number; result: string }) => [row.id, row.result])).toEqual([...OLD_PROPOSALS.map(([version], i) => [i + 1, texts[version]]), [createdId, texts[2]]]);
      await new DistinctRankings1764900000000().up(queryRunner);
      expect(await storedTexts(upgraded)).toEqual([...OLD_PROPOSALS.map(([version], i) => [i + 1, texts[version]]), [createdId, texts[2]]]);
    } finally {
      await queryRunner.release();
    }
  });
});
