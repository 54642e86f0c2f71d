/**
 * Bench measurements over HTTP: a CSV of rejection against frequency uploaded to a decided
 * proposal is stored (bytes under their sha256 in the uploads folder, points and metadata in
 * the database, an audit event) and compared with the prediction at the spec frequency; refused
 * on a proposal with nothing decided (409), for the requirements role (403), outside the project
 * (404), and for every bad file (400 with the line, nothing stored: rows and files counted); the
 * download is always a text/csv attachment, never HTML; the same content is stored once.
 *
 * Measured values are hand-interpolated in log-frequency: between (100 Hz, 80 dB) and
 * (1 kHz, 70 dB), 400 Hz lies log10 4 = 0.60206 of the way, so 80 − 10·0.60206 = 73.979 dB.
 * The files are invented (Fernhollow Instruments' bench).
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { MeasurementEntity } from '../../api/entities/measurement.entity';
import { addMember } from '../../api/services/projects.service';
import { decide } from '../../api/services/proposals.service';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

/** Spec frequency of specPayload(): 400 Hz. */
const GOOD_FILE = ['# Fernhollow bench, board Q-1', 'frequency_hz,cmrr_db', '10,80.5', '100,80', '1k,70', '10 kHz,55'].join('\n');
const url = (id: number) => `/api/proposals/${id}/measurements`;
const sha256 = (content: string | Buffer) => createHash('sha256').update(content).digest('hex');

let api: TestApi;
let uploadsDir: string;
let decidedId: number;
let rankedId: number;
let otherId: number;
let designer: ApiClient;
let reviewer: ApiClient;
let requirements: ApiClient;
let outsider: ApiClient;

const upload = (client: ApiClient, id: number, content: string | Buffer, name = 'bench.csv', contentType = 'text/csv') =>
  client.post(url(id)).attach('file', typeof content === 'string' ? Buffer.from(content, 'utf8') : content, { filename: name, contentType });
const storedFiles = () => readdirSync(uploadsDir).filter((name) => !name.startsWith('.'));
const counts = async () => ({
  measurements: await api.dataSource.getRepository(MeasurementEntity).count(),
  events: await api.dataSource.getRepository(AuditEventEntity).countBy({ action: 'measurement.uploaded' }),
  files: storedFiles().length,
});

beforeAll(async () => {
  uploadsDir = mkdtempSync(join(tmpdir(), 'longtail-measurements-test-'));
  api = await buildApiApp({ uploadsDir, accounts: ['admin', 'requirements', 'designer', 'reviewer', 'designer2'] });
  const project = await api.createProject(['requirements', 'designer', 'reviewer']);
  // The second designer writes the other project's spec as its systems engineer, then designs in it.
  const other = await api.createProject(['designer2'], 'Sallow tide gauge', { designer2: 'requirements' });
  const spec = await api.createSpec(project.id);
  const otherSpec = await api.createSpec(other.id, { by: 'designer2' });
  await addMember(api.dataSource, api.users.admin, other.id, api.users.designer2.id, 'designer');
  const decided = await api.createProposal(spec.id);
  await decide(api.dataSource, api.users.designer, decided.id, { kind: 'accept' }, api.ruleSet);
  decidedId = decided.id;
  rankedId = (await api.createProposal(spec.id)).id;
  const otherProposal = await api.createProposal(otherSpec.id, 'designer2');
  await decide(api.dataSource, api.users.designer2, otherProposal.id, { kind: 'accept' }, api.ruleSet);
  otherId = otherProposal.id;
  [designer, reviewer, requirements, outsider] = await Promise.all([api.agentFor('designer'), api.agentFor('reviewer'), api.agentFor('requirements'), api.agentFor('designer2')]);
});

afterAll(async () => {
  await api?.close();
  rmSync(uploadsDir, { recursive: true, force: true });
});

describe('POST /api/proposals/:id/measurements with a good file', () => {
  test('when the designer uploads rejection of a decided proposal, then 201 with the points, the file under its sha256, a row, an audit event and the comparison at 400 Hz', async () => {
    // Arrange
    const before = await counts();

    // Act
    const response = await upload(designer, decidedId, GOOD_FILE, '../bench/run 1.csv').field('note', '  Board Q-1, 25 °C  ');

    // Assert
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    const body = response.body;
    expect(body.kind).toBe('cmrr');
    expect(body.unit).toBe('dB');
    expect(body.points).toEqual([
      { frequencyHz: 10, value: 80.5 },
      { frequencyHz: 100, value: 80 },
      { frequencyHz: 1000, value: 70 },
      { frequencyHz: 10000, value: 55 },
    ]);
    expect(body.pointCount).toBe(4);
    expect(body.fileName).toBe('run 1.csv');
    expect(body.note).toBe('Board Q-1, 25 °C');
    expect(body.sha256).toBe(sha256(GOOD_FILE));
    expect(body.sizeBytes).toBe(Buffer.byteLength(GOOD_FILE));
    expect(body.uploadedBy).toEqual({ id: api.users.designer.id, displayName: 'Test designer' });

    // The decided design: the accepted recommendation
    const proposal = (await designer.get(`/api/proposals/${decidedId}`)).body;
    const decision = proposal.decisions.at(-1);
    expect(body.decisionId).toBe(decision.id);
    expect(body.topology).toBe(decision.topology);
    expect(body.designSource).toBe('option');

    // The comparison at the spec frequency (400 Hz): measured hand-interpolated, predicted between the stored curve's neighbours
    const comparison = body.comparison;
    expect(comparison.atFrequencyHz).toBe(400);
    expect(comparison.basis).toBe('spec');
    expect(comparison.measuredDb).toBeCloseTo(73.979, 3);
    const curve: { frequencyHz: number; singleEndedDb: number }[] = proposal.result.options.find((o: { topology: string }) => o.topology === decision.topology).curves.cmrrVsFrequency;
    const below = curve.filter((p) => p.frequencyHz <= 400).at(-1)!;
    const above = curve.find((p) => p.frequencyHz >= 400)!;
    expect(comparison.predictedDb).toBeGreaterThanOrEqual(Math.min(below.singleEndedDb, above.singleEndedDb) - 1e-9);
    expect(comparison.predictedDb).toBeLessThanOrEqual(Math.max(below.singleEndedDb, above.singleEndedDb) + 1e-9);
    expect(comparison.differenceFromPredictedDb).toBeCloseTo(comparison.measuredDb - comparison.predictedDb, 10);
    expect(comparison.simulatedDb).toBeNull();

    // Stored: the bytes as sent under their sha256, one row, one audit event
    expect(readFileSync(join(uploadsDir, sha256(GOOD_FILE)), 'utf8')).toBe(GOOD_FILE);
    expect(await counts()).toEqual({ measurements: before.measurements + 1, events: before.events + 1, files: before.files + 1 });
    const row = await api.dataSource.getRepository(MeasurementEntity).findOneByOrFail({ id: body.id });
    expect(row.points).toEqual(body.points);
    const event = await api.dataSource.getRepository(AuditEventEntity).findOneByOrFail({ action: 'measurement.uploaded', entityId: body.id });
    expect(event.proposalId).toBe(decidedId);
    expect(event.actorId).toBe(api.users.designer.id);
    expect(event.details).toMatchObject({ kind: 'cmrr', fileName: 'run 1.csv', sha256: sha256(GOOD_FILE), points: 4 });
  });

  test('when the same content is uploaded again (by the reviewer), then a second measurement and still one stored file', async () => {
    const before = await counts();
    const response = await upload(reviewer, decidedId, GOOD_FILE, 'copy.csv');
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    expect(await counts()).toEqual({ measurements: before.measurements + 1, events: before.events + 1, files: before.files });
  });

  test('when a gain file in V/V is uploaded, then it is stored as gain and compared at its lowest frequency', async () => {
    const response = await upload(designer, decidedId, 'Frequency (Hz),Gain (V/V)\n10,14\n100k,9\n');
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    expect(response.body.kind).toBe('gain');
    expect(response.body.unit).toBe('V/V');
    expect(response.body.comparison.atFrequencyHz).toBe(10);
    // 20·log10 14 = 22.923 dB
    expect(response.body.comparison.measuredDb).toBeCloseTo(22.923, 3);
    expect(response.body.comparison.predictedDb).not.toBeNull();
  });

  test('when anyone of the project lists the measurements, then a page of them, newest first, each with its comparison and without its points', async () => {
    const response = await requirements.get(url(decidedId));
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ total: 3, page: 1, pageSize: 20 });
    expect(response.body.items.map((m: { fileName: string }) => m.fileName)).toEqual(['bench.csv', 'copy.csv', 'run 1.csv']);
    expect(response.body.items[2].comparison.measuredDb).toBeCloseTo(73.979, 3);
    expect(response.body.items[2]).not.toHaveProperty('points');
  });

  test('when anyone of the project asks for one measurement, then it comes with its points', async () => {
    const first = (await requirements.get(`${url(decidedId)}?page=3&pageSize=1`)).body.items[0];
    const response = await requirements.get(`${url(decidedId)}/${first.id}`);
    expect(response.status).toBe(200);
    expect(response.body.fileName).toBe('run 1.csv');
    expect(response.body.points).toEqual([
      { frequencyHz: 10, value: 80.5 },
      { frequencyHz: 100, value: 80 },
      { frequencyHz: 1000, value: 70 },
      { frequencyHz: 10000, value: 55 },
    ]);
  });

  test('when the proposal is exported, then export.json carries the measurements', async () => {
    const response = await reviewer.get(`/api/proposals/${decidedId}/export.json`);
    expect(response.status).toBe(200);
    expect(response.body.measurements).toHaveLength(3);
  });
});

describe('POST /api/proposals/:id/measurements refused', () => {
  test('when the proposal is only ranked, then 409 saying nothing is decided, and nothing stored', async () => {
    const before = await counts();
    const response = await upload(designer, rankedId, GOOD_FILE);
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('not-decided');
    expect(response.body.error).toMatch(/is ranked: nothing is decided yet/);
    expect(await counts()).toEqual(before);
  });

  test('when the requirements role uploads, then 403', async () => {
    const response = await upload(requirements, decidedId, GOOD_FILE);
    expect(response.status).toBe(403);
    expect(response.body.code).toBe('forbidden');
  });

  test('when a designer of another project uploads or reads, then 404', async () => {
    expect((await upload(outsider, decidedId, GOOD_FILE)).status).toBe(404);
    expect((await outsider.get(url(decidedId))).status).toBe(404);
    const first = (await designer.get(url(decidedId))).body.items[0];
    expect((await outsider.get(`${url(decidedId)}/${first.id}/file`)).status).toBe(404);
    expect((await outsider.get(`${url(decidedId)}/${first.id}`)).status).toBe(404);
    expect((await designer.get(`${url(otherId)}/${first.id}`)).status).toBe(404);
    // and a measurement id of another proposal does not open through this one
    expect((await designer.get(`${url(otherId)}/${first.id}/file`)).status).toBe(404);
  });

  const BAD: [string, string, number | undefined, RegExp][] = [
    ['no header', '10,80\n20,79\n', 1, /first column must be the frequency/],
    ['a header without units', 'frequency,cmrr\n10,80\n20,79\n', 1, /name the frequency's unit/],
    ['a word for a number', 'frequency_hz,cmrr_db\n10,80\n20,high\n', 3, /"high" is not a number/],
    ['frequencies out of order', 'frequency_hz,cmrr_db\n# sweep\n100,80\n10,79\n', 4, /must increase/],
    ['a frequency of 0 Hz', 'frequency_hz,cmrr_db\n0,80\n10,79\n', 2, /outside 0.01 Hz to 1 GHz/],
    ['a rejection of 250 dB', 'frequency_hz,cmrr_db\n10,80\n20,250\n', 3, /outside 0 to 200 dB/],
    ['one point', 'frequency_hz,cmrr_db\n10,80\n', undefined, /at least 2/],
    ['an HTML page', '<html><head><title>x</title></head><body onload="alert(1)"></body></html>\n', 1, /header must name two columns/],
  ];

  test.each(BAD)('when the file has %s, then 400 with the line and nothing stored', async (_title, content, line, message) => {
    const before = await counts();
    const response = await upload(designer, decidedId, content, 'bad.html', 'text/html');
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.details[0].path).toBe('/file');
    expect(response.body.details[0].line).toBe(line);
    expect(response.body.details[0].message).toMatch(message);
    expect(response.body.error).toMatch(/bad.html was not saved/);
    expect(await counts()).toEqual(before);
  });

  test('when the file is over 256 KB, then 413 and nothing stored', async () => {
    const before = await counts();
    const response = await upload(designer, decidedId, `frequency_hz,cmrr_db\n${'# padding\n'.repeat(27_000)}10,80\n20,79\n`);
    expect(response.status).toBe(413);
    expect(response.body.code).toBe('file-too-large');
    expect(await counts()).toEqual(before);
  });

  test('when no file is attached, then 400 on the file field', async () => {
    const response = await designer.post(url(decidedId)).field('note', 'forgot the file');
    expect(response.status).toBe(400);
    expect(response.body.details[0].path).toBe('/file');
  });
});

describe('GET /api/proposals/:id/measurements/:measurementId/file', () => {
  test('when a text-valid file was uploaded as HTML, then it downloads as a text/csv attachment the browser may not sniff', async () => {
    // Arrange: valid CSV with markup in a comment, sent with an HTML name and type
    const content = '<!-- <script>alert(1)</script> -->\n# <b>bench</b>\nfrequency_hz,cmrr_db\n10,80\n20,79\n';
    const uploaded = await upload(designer, decidedId, '<html>\n' + content, 'page.html', 'text/html');
    expect(uploaded.status).toBe(400);
    const stored = await upload(designer, decidedId, content.replace('<!-- <script>alert(1)</script> -->', '# <script>alert(1)</script>'), 'page.html', 'text/html');
    expect(stored.status, JSON.stringify(stored.body)).toBe(201);

    // Act
    const response = await reviewer.get(`${url(decidedId)}/${stored.body.id}/file`);

    // Assert
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(response.headers['content-disposition']).toBe(`attachment; filename="longtail-measurement-${stored.body.id}.csv"`);
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['content-security-policy']).toContain('sandbox');
    expect(response.text).toContain('# <script>alert(1)</script>');
    expect(sha256(response.text)).toBe(stored.body.sha256);
  });
});
