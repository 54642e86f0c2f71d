/**
 * The spec lifecycle over HTTP: ranking a newer spec version closes the older rankings that
 * still wait for a designer (superseded, with audit events and one e-mail digest per person);
 * a proposal can be withdrawn with a reason by its author or a designer; a proposal of an older
 * version says the spec has moved on, with the differences; saving an unchanged spec writes no
 * version; each version keeps its change note.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DataSource, type DataSourceOptions } from 'typeorm';
import { createDataSource, openDatabase } from '../../api/data-source';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { MailOutboxEntity } from '../../api/entities/mail-outbox.entity';
import { ProposalEntity } from '../../api/entities/proposal.entity';
import { SpecVersionEntity } from '../../api/entities/spec-version.entity';
import { SpecLifecycle1764800600000 } from '../../api/migrations/1764800600000-spec-lifecycle';
import { MIGRATIONS } from '../../api/migrations/index';
import { freshDatabase } from '../helpers/test-database';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let requirements: ApiClient;
let designer: ApiClient;
let designer2: ApiClient;
let reviewer: ApiClient;
let projectId: number;

const TITLE = 'Wrenmoor flow meter — bridge input pair';
/** Version 2 (invented): a cooler enclosure, with the author's note. */
const revised = () => ({ ...specPayload(), title: TITLE, temperatureC: { min: 0, max: 55 } });

beforeAll(async () => {
  api = await buildApiApp();
  projectId = (await api.createProject()).id;
  [requirements, designer, designer2, reviewer] = await Promise.all((['requirements', 'designer', 'designer2', 'reviewer'] as const).map((key) => api.agentFor(key)));
});

afterAll(async () => {
  await api?.close();
});

const newSpec = async () => (await requirements.post(`/api/projects/${projectId}/specs`).send({ title: TITLE, payload: { ...specPayload(), title: TITLE } }).expect(201)).body.id as number;
const rank = async (specId: number, client = designer) => (await client.post(`/api/specs/${specId}/proposals`).expect(201)).body.id as number;
const read = async (id: number) => (await designer.get(`/api/proposals/${id}`)).body;
const actions = async (id: number) => (await designer.get(`/api/proposals/${id}/audit`)).body.items.map((e: { action: string }) => e.action);

describe('when a newer version of a spec is ranked', () => {
  const ids = { ranked: 0, returned: 0, decided: 0, approved: 0, newer: 0, specId: 0 };

  beforeAll(async () => {
    ids.specId = await newSpec();
    ids.ranked = await rank(ids.specId, requirements);
    ids.returned = await rank(ids.specId);
    await designer.post(`/api/proposals/${ids.returned}/decision`).send({ kind: 'accept' }).expect(201);
    await reviewer.post(`/api/proposals/${ids.returned}/review`).send({ verdict: 'return', comment: 'Show the hot corner.' }).expect(201);
    ids.decided = await rank(ids.specId);
    await designer.post(`/api/proposals/${ids.decided}/decision`).send({ kind: 'accept' }).expect(201);
    ids.approved = await rank(ids.specId);
    await designer.post(`/api/proposals/${ids.approved}/decision`).send({ kind: 'accept' }).expect(201);
    await reviewer.post(`/api/proposals/${ids.approved}/review`).send({ verdict: 'approve' }).expect(201);
    await requirements.put(`/api/specs/${ids.specId}`).send({ title: TITLE, payload: revised(), note: 'Enclosure now rated to 55 °C.' }).expect(200);
    ids.newer = await rank(ids.specId);
  });

  test('then the rankings waiting for a designer (ranked, returned) are closed as superseded by the newer one', async () => {
    for (const id of [ids.ranked, ids.returned]) {
      const proposal = await read(id);
      expect(proposal).toMatchObject({ status: 'superseded', supersededById: ids.newer, allowedEvents: [] });
      expect(await actions(id)).toContain('proposal.superseded');
    }
  });

  test('then a decision waiting for review and an approved one stay as they were, and say the spec moved on to version 2', async () => {
    expect((await read(ids.decided)).status).toBe('decided');
    const approved = await read(ids.approved);
    expect(approved.status).toBe('approved');
    expect(approved.specMovedOn).toMatchObject({ latestVersion: 2, latestNote: 'Enclosure now rated to 55 °C.' });
    expect(approved.specMovedOn.changes).toEqual([{ path: '/temperatureC/max', kind: 'changed', before: 70, after: 55 }]);
    expect((await read(ids.newer)).specMovedOn).toBeNull();
  });

  test('then the superseding event names both proposals and spec versions', async () => {
    const events = (await designer.get(`/api/proposals/${ids.returned}/audit`)).body.items;
    const superseded = events.find((e: { action: string }) => e.action === 'proposal.superseded');
    expect(superseded).toMatchObject({ beforeId: ids.returned, afterId: ids.newer, details: { from: 'returned', to: 'superseded', byProposal: ids.newer, specVersion: 1, newerSpecVersion: 2 } });
  });

  test('then the count of rankings waiting for a decision no longer counts them', async () => {
    const waiting = (await designer.get(`/api/projects/${projectId}/proposals?status=ranked`)).body;
    expect(waiting.items.map((p: { id: number }) => p.id)).toEqual([ids.newer]);
  });

  test('then each person concerned gets one digest listing the closed proposals, and the one who ranked gets none', async () => {
    const rows = await api.dataSource.getRepository(MailOutboxEntity).findBy({ kind: 'proposal.superseded', proposalId: ids.newer });
    const to = rows.map((r) => r.toAddress).sort();
    // designer2 designs in the project; requirements asked for one of them; the designer ranked the newer one.
    expect(to).toEqual([`designer2@tests.longtail.test`, `requirements@tests.longtail.test`]);
    for (const row of rows) {
      expect(row.subject).toBe('2 proposals closed: the spec moved on to version 2');
      expect(row.body).toContain(`#${ids.ranked} (spec version 1)`);
      expect(row.body).toContain(`#${ids.returned} (spec version 1)`);
    }
  });

  test('then a superseded proposal can no longer be decided (409 saying nothing can change it)', async () => {
    const response = await designer.post(`/api/proposals/${ids.ranked}/decision`).send({ kind: 'accept' });
    expect(response.status).toBe(409);
    expect(response.body.error).toMatch(/is superseded.*Nothing can change it now\./);
  });

  test('when the same version is ranked again, then the ranking of that version stays open', async () => {
    const again = await rank(ids.specId);
    expect((await read(ids.newer)).status).toBe('ranked');
    expect((await read(again)).status).toBe('ranked');
  });
});

describe('POST /api/proposals/:id/withdrawal', () => {
  let specId: number;
  beforeAll(async () => {
    specId = await newSpec();
  });

  test('when a designer withdraws a ranked proposal with a reason, then 201 withdrawn with the reason, who and when, and an audit event', async () => {
    const id = await rank(specId);

    const response = await designer2.post(`/api/proposals/${id}/withdrawal`).send({ reason: '  Ranked on the wrong spec.  ' });

    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({ status: 'withdrawn', closedReason: 'Ranked on the wrong spec.', closedById: api.users.designer2.id, allowedEvents: [] });
    expect(response.body.closedAt).toEqual(expect.any(String));
    const events = (await designer.get(`/api/proposals/${id}/audit`)).body.items;
    expect(events.at(-1)).toMatchObject({ action: 'proposal.withdrawn', actorId: api.users.designer2.id, details: { from: 'ranked', to: 'withdrawn', reason: 'Ranked on the wrong spec.' } });
  });

  test('when the requirements author withdraws the proposal they asked for, then 201', async () => {
    const id = await rank(specId, requirements);
    const response = await requirements.post(`/api/proposals/${id}/withdrawal`).send({ reason: 'Asked for by mistake.' });
    expect(response.status).toBe(201);
  });

  test('when a requirements author withdraws a proposal someone else asked for, then 403 and it stays ranked', async () => {
    const id = await rank(specId);
    const response = await requirements.post(`/api/proposals/${id}/withdrawal`).send({ reason: 'Not needed.' });
    expect(response.status).toBe(403);
    expect(response.body.code).toBe('not-yours');
    expect((await read(id)).status).toBe('ranked');
  });

  test('when the reason is missing or blank, then 400 at /reason and nothing changes', async () => {
    const id = await rank(specId);
    for (const body of [{}, { reason: '   ' }]) {
      const response = await designer.post(`/api/proposals/${id}/withdrawal`).send(body);
      expect(response.status).toBe(400);
      expect(response.body.details).toContainEqual(expect.objectContaining({ path: '/reason' }));
    }
    expect((await read(id)).status).toBe('ranked');
  });

  test('when an approved proposal is to be withdrawn, then 409 and it stays approved', async () => {
    const id = await rank(specId);
    await designer.post(`/api/proposals/${id}/decision`).send({ kind: 'accept' }).expect(201);
    await reviewer.post(`/api/proposals/${id}/review`).send({ verdict: 'approve' }).expect(201);
    const response = await designer.post(`/api/proposals/${id}/withdrawal`).send({ reason: 'Too late.' });
    expect(response.status).toBe(409);
    expect((await read(id)).status).toBe('approved');
  });

  test('when a ranked proposal is read, then withdrawing is offered beside deciding', async () => {
    expect((await read(await rank(specId))).allowedEvents).toEqual(['decide', 'withdraw']);
  });
});

describe('PUT /api/specs/:id with nothing changed, and change notes', () => {
  test('when the same document is saved again (defaults written out or left out), then 200 with unchanged: true and no new version or event', async () => {
    const specId = await newSpec();
    const before = (await designer.get(`/api/specs/${specId}/versions`)).body.items.length;
    const stored = (await designer.get(`/api/specs/${specId}`)).body.latest.payload;

    const same = await requirements.put(`/api/specs/${specId}`).send({ title: TITLE, payload: { ...specPayload(), title: TITLE } });
    const spelled = await requirements.put(`/api/specs/${specId}`).send({ title: ` ${TITLE} `, payload: stored, note: 'Nothing really.' });

    for (const response of [same, spelled]) {
      expect(response.status).toBe(200);
      expect(response.body).toMatchObject({ unchanged: true, latestVersion: 1, latest: { version: 1 } });
    }
    expect((await designer.get(`/api/specs/${specId}/versions`)).body.items).toHaveLength(before);
  });

  test('when a changed document is saved with a note, then 200 with unchanged: false and version 2, and the history shows the note', async () => {
    const specId = await newSpec();
    const response = await requirements.put(`/api/specs/${specId}`).send({ title: TITLE, payload: revised(), note: '  Enclosure now rated to 55 °C.  ' });

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ unchanged: false, latestVersion: 2, latest: { version: 2, note: 'Enclosure now rated to 55 °C.' } });
    const versions = (await designer.get(`/api/specs/${specId}/versions`)).body.items;
    expect(versions.map((v: { note: string | null }) => v.note)).toEqual([null, 'Enclosure now rated to 55 °C.']);
  });

  test.each([
    ['blank', '   '],
    ['over 1000 characters', 'x'.repeat(1001)],
    ['not text', 42],
    ['on two lines (a note is one line, like a title)', 'Enclosure rated to 55 °C.\nSee the thermal report.'],
  ])('when the note is %s, then 400 at /note and no version is written', async (_title, note) => {
    const specId = await newSpec();
    const response = await requirements.put(`/api/specs/${specId}`).send({ title: TITLE, payload: revised(), note });
    expect(response.status).toBe(400);
    expect(response.body.details).toContainEqual(expect.objectContaining({ path: '/note' }));
    expect((await designer.get(`/api/specs/${specId}`)).body.latestVersion).toBe(1);
  });
});

describe('when a database from before the spec lifecycle is migrated', () => {
  test('when older versions have rankings still waiting, then those are closed as superseded by the first newer ranking, with an event each, and the rest is kept', async () => {
    const database = await freshDatabase({ reopenable: true });
    try {
      const old = new DataSource({ ...createDataSource(database.location).options, entities: [], migrations: MIGRATIONS.slice(0, MIGRATIONS.indexOf(SpecLifecycle1764800600000)) } as DataSourceOptions);
      await old.initialize();
      await old.runMigrations();
      const at = "'2026-01-01T00:00:00.000Z'";
      await old.query(`INSERT INTO user_account (email, display_name, role, password_hash, created_at) VALUES ('early@tests.longtail.test', 'Early Person', 'designer', 'x', ${at})`);
      await old.query(`INSERT INTO project (name, description, created_by_id, created_at) VALUES ('Old project', '', 1, ${at})`);
      await old.query(`INSERT INTO spec (project_id, title, latest_version, created_by_id, created_at, updated_at) VALUES (1, 'Old spec', 2, 1, ${at}, ${at})`);
      for (const version of [1, 2]) await old.query(`INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at) VALUES (1, ${version}, 'Old spec', '{}', 1, ${at})`);
      // Proposals 1-3 on version 1 (ranked, returned, approved), 4 and 5 on version 2 (ranked).
      for (const [version, status] of [[1, 'ranked'], [1, 'returned'], [1, 'approved'], [2, 'ranked'], [2, 'ranked']] as const)
        await old.query(`INSERT INTO proposal (project_id, spec_id, spec_version_id, engine_version, ruleset_version, status, created_by_id, created_at, updated_at, result) VALUES (1, 1, ${version}, '1', 'x', '${status}', 1, ${at}, ${at}, '{}')`);
      await old.destroy();

      const migrated = await openDatabase(database.location);
      try {
        const rows = await migrated.getRepository(ProposalEntity).find({ select: { id: true, status: true, supersededById: true }, order: { id: 'ASC' } });
        expect(rows).toEqual([
          { id: 1, status: 'superseded', supersededById: 4 },
          { id: 2, status: 'superseded', supersededById: 4 },
          { id: 3, status: 'approved', supersededById: null },
          { id: 4, status: 'ranked', supersededById: null },
          { id: 5, status: 'ranked', supersededById: null },
        ]);
        const events = await migrated.getRepository(AuditEventEntity).find({ order: { id: 'ASC' } });
        expect(events.map((e) => [e.action, e.proposalId, e.afterId, e.details.from])).toEqual([
          ['proposal.superseded', 1, 4, 'ranked'],
          ['proposal.superseded', 2, 4, 'returned'],
        ]);
        expect((await migrated.getRepository(SpecVersionEntity).findOneByOrFail({ id: 1 })).note).toBeNull();
      } finally {
        await migrated.destroy();
      }
    } finally {
      await database.drop();
    }
  });
});
