/**
 * Batch specs over HTTP: POST /api/projects/:id/specs/import (multipart, CSV or JSON, dry run
 * or save in one transaction, idempotent re-import) and GET /api/projects/:id/proposals.csv.
 * The expected messages are the spec schema's rules (shared/schema/spec.schema.json: ranges,
 * enumerations, required fields) and the cross-field rail rule, as the import promises to report them.
 */
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { SpecVersionEntity } from '../../api/entities/spec-version.entity';
import { SpecEntity } from '../../api/entities/spec.entity';
import { addMember } from '../../api/services/projects.service';
import type { Proposal } from '#shared/api/proposals';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';
import { TEST_BACKEND } from '../helpers/test-database';

/** A trigger that makes the database refuse one spec title, in each back end's own dialect. */
const FAILING_TITLE = 'Tarn level probe, spare channel';
const FAILURE_TRIGGER = {
  sqlite: {
    create: [`CREATE TRIGGER import_test_failure BEFORE INSERT ON spec WHEN NEW.title = '${FAILING_TITLE}' BEGIN SELECT RAISE(ABORT, 'simulated write failure'); END`],
    drop: ['DROP TRIGGER import_test_failure'],
  },
  postgres: {
    create: [
      `CREATE FUNCTION import_test_failure() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN IF NEW.title = '${FAILING_TITLE}' THEN RAISE EXCEPTION 'simulated write failure'; END IF; RETURN NEW; END $$`,
      'CREATE TRIGGER import_test_failure BEFORE INSERT ON spec FOR EACH ROW EXECUTE FUNCTION import_test_failure()',
    ],
    drop: ['DROP TRIGGER import_test_failure ON spec', 'DROP FUNCTION import_test_failure()'],
  },
}[TEST_BACKEND];

let api: TestApi;
let requirements: ApiClient;
let projectId: number;
let otherProjectId: number;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer', 'designer2'] });
  projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Tarn level probe')).id;
  otherProjectId = (await api.createProject(['designer2'], 'Brindle tide logger')).id;
  requirements = await api.agentFor('requirements');
});

afterAll(() => api.close());

const HEADER =
  'title,supply.positiveV,supply.negativeV,gain.target,gain.output,cmrr.minDb,cmrr.atFrequencyHz,inputCommonMode.minV,inputCommonMode.maxV,outputSwingVpp,powerBudgetW,hazards.patientConnected,monteCarlo.samples,colour';

/** Invented specs of a level probe (no such product); rows 2, 7 and 9 are valid, the others each break a rule. */
const MIXED_ROWS = [
  'Tarn level probe — input pair,9,-9,14,differential,66,400,-2,2,2,30m,no,300,', // 2
  '', // 3: blank, skipped but counted
  'Tarn level probe — rail swap,9,14,14,differential,66,400,-2,2,2,30m,no,300,', // 4
  'Tarn level probe — bad units,12 A,-9,14,diff,-3,400,-2,2,2,30m,no,300,', // 5
  'Tarn level probe — gaps,9,-9,,differential,66,400,-2,2,2,30m,maybe,300,green', // 6
  'Tarn level probe — reference,9,-9,20,single-ended,60,1k,-1.5,1.5,1.8,25m,false,300,', // 7
  'Tarn level probe — input pair,9,-9,16,differential,66,400,-2,2,2,30m,no,300,', // 8
  '"Tarn level probe, spare channel",9 V,-9 V,12,differential,64,0,-2,2,2,0.03,yes,300,', // 9
];
const mixedCsv = (rows = MIXED_ROWS) => `${HEADER}\r\n${rows.join('\r\n')}\r\n`;

const VALID_TITLES = ['Tarn level probe — input pair', 'Tarn level probe — reference', 'Tarn level probe, spare channel'];

const EXPECTED_INVALID = [
  { row: 4, title: 'Tarn level probe — rail swap', ok: false, errors: [{ row: 4, field: 'supply.negativeV', message: 'must be below the positive rail (9 V), got 14 V' }] },
  {
    row: 5,
    title: 'Tarn level probe — bad units',
    ok: false,
    errors: [
      { row: 5, field: 'supply.positiveV', message: '"12 A" has an unexpected unit "A": expected V' },
      { row: 5, field: 'gain.output', message: 'must be one of differential, single-ended, got "diff"' },
      { row: 5, field: 'cmrr.minDb', message: 'must be >= 0 dB, got -3 dB' },
    ],
  },
  {
    row: 6,
    title: 'Tarn level probe — gaps',
    ok: false,
    errors: [
      { row: 6, field: 'gain.target', message: 'is required' },
      { row: 6, field: 'hazards.patientConnected', message: 'must be true or false (also yes/no, 1/0), got "maybe"' },
      { row: 6, field: 'colour', message: 'is not a known column, so "green" would be lost; check its spelling against the template' },
    ],
  },
  { row: 8, title: 'Tarn level probe — input pair', ok: false, errors: [{ row: 8, field: 'title', message: 'repeats the title of row 2: a file holds each spec once' }] },
];

async function counts() {
  const { dataSource } = api;
  return {
    specs: await dataSource.getRepository(SpecEntity).count(),
    versions: await dataSource.getRepository(SpecVersionEntity).count(),
    events: await dataSource.getRepository(AuditEventEntity).count(),
  };
}

const importUrl = (id: number, dryRun = false) => `/api/projects/${id}/specs/import${dryRun ? '?dryRun=true' : ''}`;
const upload = (client: ApiClient, url: string, text: string | Buffer, name = 'specs.csv') => client.post(url).attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text, 'utf8'), name);

type ReportRow = { row: number; title: string | null; ok: boolean; errors: unknown[]; action: string; specId: number | null; version: number | null };
const withoutLanding = (rows: ReportRow[]) => rows.map(({ row, title, ok, errors }) => ({ row, title, ok, errors }));

describe('POST /api/projects/:id/specs/import with a mixed CSV', () => {
  test('when it is a dry run, then every row is reported with its row number, fields and messages, and nothing is saved', async () => {
    const before = await counts();

    const response = await upload(requirements, importUrl(projectId, true), mixedCsv()).expect(200);

    expect(response.body).toMatchObject({ format: 'csv', dryRun: true, fileName: 'specs.csv', total: 7, valid: 3, counts: { created: 3, 'new-version': 0, unchanged: 0, skipped: 4 } });
    expect(response.body.headerErrors).toEqual([{ row: 1, field: 'colour', message: 'is not a known column (column N); check its spelling against the template' }]);
    const rows = response.body.rows as ReportRow[];
    expect(rows.map((r) => r.row)).toEqual([2, 4, 5, 6, 7, 8, 9]);
    expect(withoutLanding(rows.filter((r) => !r.ok))).toEqual(EXPECTED_INVALID);
    expect(rows.filter((r) => r.ok).map((r) => [r.row, r.title, r.action, r.specId])).toEqual([
      [2, VALID_TITLES[0], 'created', null],
      [7, VALID_TITLES[1], 'created', null],
      [9, VALID_TITLES[2], 'created', null],
    ]);
    expect(rows.filter((r) => !r.ok).every((r) => r.action === 'skipped')).toBe(true);
    expect(await counts()).toEqual(before);
  });

  test('when it is saved, then the valid rows become specs with their audit events in one go, with values in SI units, and the others are skipped', async () => {
    const before = await counts();

    const response = await upload(requirements, importUrl(projectId), mixedCsv()).expect(200);

    expect(response.body).toMatchObject({ dryRun: false, counts: { created: 3, 'new-version': 0, unchanged: 0, skipped: 4 } });
    expect(withoutLanding((response.body.rows as ReportRow[]).filter((r) => !r.ok))).toEqual(EXPECTED_INVALID);
    const created = (response.body.rows as ReportRow[]).filter((r) => r.action === 'created');
    expect(created.every((r) => typeof r.specId === 'number' && r.version === 1)).toBe(true);
    expect(await counts()).toEqual({ specs: before.specs + 3, versions: before.versions + 3, events: before.events + 4 });

    const listed = (await requirements.get(`/api/projects/${projectId}/specs`).expect(200)).body.items as { title: string }[];
    expect(listed.map((s) => s.title).sort()).toEqual([...VALID_TITLES].sort());
    const reference = (await requirements.get(`/api/specs/${created[1].specId}`).expect(200)).body;
    // "25m" W, "1k" Hz: engineering notation read in the column's unit; the empty cells took the schema's defaults.
    expect(reference.latest.payload).toMatchObject({ powerBudgetW: 0.025, cmrr: { atFrequencyHz: 1000, minDb: 60, marginDb: 6 }, gain: { output: 'single-ended', tolerancePercent: 10 }, resistors: { series: 'E96' } });
    const events = await api.dataSource.getRepository(AuditEventEntity).find({ where: { projectId }, order: { id: 'ASC' } });
    const imported = events.filter((e) => e.action === 'spec.created' && e.details.import);
    expect(imported.map((e) => e.details.import)).toEqual([
      { fileName: 'specs.csv', row: 2 },
      { fileName: 'specs.csv', row: 7 },
      { fileName: 'specs.csv', row: 9 },
    ]);
    expect(events.at(-1)!.details).toEqual({ fileName: 'specs.csv', format: 'csv', rows: 7, created: 3, 'new-version': 0, unchanged: 0, skipped: 4 });
    expect(events.at(-1)!.action).toBe('specs.imported');
  });

  test('when the same file is imported again, then its specs are reported unchanged and nothing is duplicated', async () => {
    const before = await counts();

    const response = await upload(requirements, importUrl(projectId), mixedCsv()).expect(200);

    expect(response.body.counts).toEqual({ created: 0, 'new-version': 0, unchanged: 3, skipped: 4 });
    expect((response.body.rows as ReportRow[]).filter((r) => r.ok).map((r) => [r.row, r.action, r.version])).toEqual([
      [2, 'unchanged', 1],
      [7, 'unchanged', 1],
      [9, 'unchanged', 1],
    ]);
    expect(await counts()).toEqual({ ...before, events: before.events + 1 }); // only the import's own event
  });

  test('when a row of a known title has a different figure, then it becomes the next version of that spec', async () => {
    const changed = MIXED_ROWS.map((line, i) => (i === 0 ? line.replace(',14,differential,66,', ',15,differential,66,') : line));
    const before = await counts();

    const response = await upload(requirements, importUrl(projectId), mixedCsv(changed)).expect(200);

    expect(response.body.counts).toEqual({ created: 0, 'new-version': 1, unchanged: 2, skipped: 4 });
    const row2 = (response.body.rows as ReportRow[]).find((r) => r.row === 2)!;
    expect(row2).toMatchObject({ action: 'new-version', version: 2 });
    const diff = (await requirements.get(`/api/specs/${row2.specId}/diff?from=1&to=2`).expect(200)).body;
    expect(diff.changes).toEqual([{ path: '/gain/target', kind: 'changed', before: 14, after: 15 }]);
    expect(await counts()).toEqual({ specs: before.specs, versions: before.versions + 1, events: before.events + 2 });
  });

  test('when the database fails on the third spec, then the whole save is rolled back and nothing partial is left', async () => {
    const fresh = (await api.createProject(['requirements'], 'Tarn level probe — rollback')).id;
    for (const statement of FAILURE_TRIGGER.create) await api.dataSource.query(statement);
    const before = await counts();
    try {
      const response = await upload(requirements, importUrl(fresh), mixedCsv());

      expect(response.status).toBe(500);
      expect(response.body.code).toBe('internal-error');
      expect(await counts()).toEqual(before);
      expect((await requirements.get(`/api/projects/${fresh}/specs`).expect(200)).body.items).toEqual([]);
    } finally {
      for (const statement of FAILURE_TRIGGER.drop) await api.dataSource.query(statement);
    }
  });

  test('when two specs of the project already share a title, then a row of that title is refused on its row', async () => {
    const fresh = (await api.createProject(['requirements'], 'Tarn level probe — twins')).id;
    const a = await api.createSpec(fresh, { title: 'Tarn twin channel' });
    const b = await api.createSpec(fresh, { title: 'Tarn twin channel' });
    const csv = `title,supply.positiveV,supply.negativeV,gain.target,cmrr.minDb\r\nTarn twin channel,9,-9,10,60\r\n`;

    const response = await upload(requirements, importUrl(fresh, true), csv).expect(200);

    expect(response.body.rows).toEqual([
      { row: 2, title: 'Tarn twin channel', ok: false, action: 'skipped', specId: null, version: null, errors: [{ row: 2, field: 'title', message: `matches 2 specs of this project (ids ${a.id}, ${b.id}); rename one of them to import this row` }] },
    ]);
  });
});

describe('POST /api/projects/:id/specs/import with JSON', () => {
  const document = (title: string, changes: Record<string, unknown> = {}) => ({ ...specPayload(), title, ...changes });

  test('when { specs: [...] } holds documents, { title, payload } items and a stray value, then rows are numbered from 1 and the good ones saved', async () => {
    const fresh = (await api.createProject(['requirements'], 'Brindle JSON batch')).id;
    const body = {
      specs: [
        document('Brindle gauge — channel A'),
        { title: 'Brindle gauge — channel B', payload: document('ignored title', { gain: { target: 22 } }) },
        'oops',
        document('Brindle gauge — channel D', { cmrr: { minDb: 250 } }),
      ],
    };

    const response = await upload(requirements, importUrl(fresh), JSON.stringify(body), 'batch.json').expect(200);

    expect(response.body).toMatchObject({ format: 'json', total: 4, valid: 2, counts: { created: 2, skipped: 2 } });
    expect(withoutLanding(response.body.rows)).toEqual([
      { row: 1, title: 'Brindle gauge — channel A', ok: true, errors: [] },
      { row: 2, title: 'Brindle gauge — channel B', ok: true, errors: [] },
      { row: 3, title: null, ok: false, errors: [{ row: 3, field: '', message: 'must be an object (a spec), got "oops"' }] },
      { row: 4, title: 'Brindle gauge — channel D', ok: false, errors: [{ row: 4, field: 'cmrr.minDb', message: 'must be <= 200 dB, got 250 dB' }] },
    ]);
    const specs = (await requirements.get(`/api/projects/${fresh}/specs`).expect(200)).body.items as { title: string }[];
    expect(specs.map((s) => s.title)).toEqual(['Brindle gauge — channel A', 'Brindle gauge — channel B']);
  });

  test('when a bare array is sent without an extension, then its content says JSON', async () => {
    const fresh = (await api.createProject(['requirements'], 'Brindle JSON array')).id;

    const response = await upload(requirements, importUrl(fresh, true), JSON.stringify([document('Brindle gauge — spare')]), 'specs').expect(200);

    expect(response.body).toMatchObject({ format: 'json', total: 1, valid: 1 });
  });
});

describe('POST /api/projects/:id/specs/import: who may, and files that cannot be read', () => {
  const oneSpec = 'title,supply.positiveV,supply.negativeV,gain.target,cmrr.minDb\r\nTarn access probe,9,-9,10,60\r\n';

  test.each([
    ['admin', 403, 'forbidden'],
    ['designer', 403, 'forbidden'],
    ['reviewer', 403, 'forbidden'],
  ] as const)('when the %s imports, then %i %s', async (key, status, code) => {
    const client = await api.agentFor(key);
    const response = await upload(client, importUrl(projectId, true), oneSpec);
    expect(response.status).toBe(status);
    expect(response.body.code).toBe(code);
  });

  test('when nobody is signed in, then 401', async () => {
    const response = await upload(await api.anonymous(), importUrl(projectId, true), oneSpec);
    expect(response.status).toBe(401);
  });

  test('when the project is not the caller’s, then 404 and nothing is saved', async () => {
    const before = await counts();
    const response = await upload(requirements, importUrl(otherProjectId), oneSpec);
    expect(response.status).toBe(404);
    expect(response.body.code).toBe('project-not-found');
    expect(await counts()).toEqual(before);
  });

  test('when the CSRF header is missing on the multipart POST, then 403 csrf-failed', async () => {
    const response = await requirements.agent.post(importUrl(projectId, true)).attach('file', Buffer.from(oneSpec), 'specs.csv');
    expect(response.status).toBe(403);
    expect(response.body.code).toBe('csrf-failed');
  });

  test('when no file is attached, then 400 names the file field', async () => {
    const response = await requirements.post(importUrl(projectId, true)).field('note', 'no file here');
    expect(response.status).toBe(400);
    expect(response.body.details).toEqual([{ path: '/file', message: 'attach the CSV or JSON file of specs in the form field "file" (multipart/form-data)' }]);
  });

  test('when the file name carries a control character, then the unreadable multipart header answers 400, not 500', async () => {
    // Found by the reliability run's fuzz (npm run reliability): busboy's "Malformed part header" reached the error handler as a 500
    const before = await counts();
    const response = await upload(requirements, importUrl(projectId), 'title,gain.target\r\n', 'specs\u0005.csv');
    expect(response.status).toBe(400);
    expect(response.body.details).toEqual([{ path: '', message: 'is not a readable multipart/form-data upload' }]);
    expect(await counts()).toEqual(before);
  });

  test('when the file is over 1 MB, then 413 and nothing is saved', async () => {
    const before = await counts();
    const response = await upload(requirements, importUrl(projectId), Buffer.alloc(1024 * 1024 + 1, 'a'));
    expect(response.status).toBe(413);
    expect(response.body.code).toBe('file-too-large');
    expect(await counts()).toEqual(before);
  });

  test.each([
    ['broken JSON', '[{"title": ', 'specs.json', /^is not valid JSON/],
    ['a JSON object without specs', '{"title": "x"}', 'specs.json', /^must hold an array of specs/],
    ['a header alone', 'title,gain.target\r\n', 'specs.csv', /^holds no spec rows under the header$/],
    ['Latin-1 bytes', Buffer.from([0x74, 0x69, 0x74, 0x6c, 0x65, 0x0a, 0xe9, 0x0a]), 'specs.csv', /^is not UTF-8 text/],
  ])('when the file is %s, then 400 on the file', async (_what, content, name, message) => {
    const response = await upload(requirements, importUrl(projectId, true), content, name);
    expect(response.status).toBe(400);
    expect(response.body.details[0].path).toBe('/file');
    expect(response.body.details[0].message).toMatch(message);
  });

  test('when the template is downloaded, then it names every required column and its example row imports as valid', async () => {
    const template = await requirements.get('/api/schema/spec.csv').expect(200).expect('content-type', /text\/csv/);
    const header = template.text.split('\r\n')[0].split(',');
    expect(header).toEqual(expect.arrayContaining(['title', 'supply.positiveV', 'supply.negativeV', 'gain.target', 'cmrr.minDb']));

    const response = await upload(requirements, importUrl(projectId, true), template.text, 'longtail-spec-template.csv').expect(200);

    expect(response.body).toMatchObject({ total: 1, valid: 1, headerErrors: [] });
  });
});

describe('GET /api/projects/:id/proposals.csv', () => {
  test('when the imported specs are ranked one after another, then the batch CSV parses back to one row per spec with the proposals’ figures', async () => {
    const fresh = (await api.createProject(['requirements', 'designer'], 'Tarn level probe — batch export')).id;
    const report = (await upload(requirements, importUrl(fresh), mixedCsv()).expect(200)).body;
    const specIds = (report.rows as ReportRow[]).filter((r) => r.ok).map((r) => r.specId!);
    const proposals: Proposal[] = [];
    for (const specId of specIds) proposals.push((await requirements.post(`/api/specs/${specId}/proposals`).expect(201)).body);
    const ids = proposals.map((p) => p.id);

    const response = await requirements.get(`/api/projects/${fresh}/proposals.csv?ids=${ids.join(',')}`).expect(200).expect('content-type', /text\/csv/).expect('content-disposition', /attachment/);

    const parsed = Papa.parse<Record<string, string>>(response.text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(['spec_title', 'spec_version', 'proposal_id', 'state', 'recommended_topology', 'figures_of_topology', 'passes', 'rejection_db', 'rejection_kind', 'tail_current_a', 'gain_v_per_v', 'power_worst_w']);
    expect(parsed.data.map((r) => r.spec_title)).toEqual(VALID_TITLES);
    parsed.data.forEach((row, i) => {
      const proposal = proposals[i];
      const option = proposal.result.options.find((o) => o.topology === (proposal.result.recommended ?? proposal.result.options[0].topology))!;
      expect(row).toEqual({
        spec_title: proposal.specVersion.title,
        spec_version: '1',
        proposal_id: String(proposal.id),
        // The state as the app names it; figures at the page's precision (dB to one decimal, the rest to three significant digits).
        state: 'Awaiting decision',
        recommended_topology: proposal.result.recommended ?? '',
        figures_of_topology: option.topology,
        passes: String(option.passes),
        rejection_db: String(Number(option.rejectionDb!.toFixed(1))),
        rejection_kind: proposal.specVersion.payload.gain.output === 'differential' ? 'differential' : 'single-ended',
        tail_current_a: String(Number(option.predicted!.tailCurrentA.toPrecision(3))),
        gain_v_per_v: String(Number(option.figures!.gainPredicted.toPrecision(3))),
        power_worst_w: String(Number(option.figures!.powerWorstW.toPrecision(3))),
      });
    });
  });

  test('when an id is not a proposal of this project, then 404', async () => {
    // The second designer writes it as the other project's systems engineer, then designs in it again.
    await addMember(api.dataSource, api.users.admin, otherProjectId, api.users.designer2.id, 'requirements');
    const other = await api.createSpec(otherProjectId, { by: 'designer2', title: 'Brindle tide logger — pressure pair' });
    await addMember(api.dataSource, api.users.admin, otherProjectId, api.users.designer2.id, 'designer');
    const foreign = await api.createProposal(other.id, 'designer2');
    const response = await requirements.get(`/api/projects/${projectId}/proposals.csv?ids=${foreign.id}`);
    expect(response.status).toBe(404);
    expect(response.body.code).toBe('proposal-not-found');
  });

  test.each(['', 'a,b', '1,,2', '0'])('when ids is %j, then 400 on ?ids', async (ids) => {
    const response = await requirements.get(`/api/projects/${projectId}/proposals.csv?ids=${ids}`);
    expect(response.status).toBe(400);
    expect(response.body.details[0].path).toBe('?ids');
  });
});
