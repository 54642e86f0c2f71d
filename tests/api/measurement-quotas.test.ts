/**
 * Bench measurements are bounded: one proposal keeps at most 20 files, 50,000 points and 2 MB,
 * one project 200 files, 500,000 points and 20 MB (README, DEVELOPERS.md "Bench measurements");
 * past a limit an upload answers 409 (full) or 413 (this file would pass a total) naming the
 * limit, and stores nothing. The list is paged like the proposal list (`page`, `pageSize` ≤ 100,
 * `{ items, total, page, pageSize }`), carries no points, and so stays small however many points
 * are stored; one measurement's points come from `GET …/measurements/:measurementId`.
 *
 * The sweeps are invented (Fernhollow Instruments' bench): flat 80 dB rejection at 1 Hz steps.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { MeasurementEntity } from '../../api/entities/measurement.entity';
import { decide } from '../../api/services/proposals.service';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

const url = (id: number) => `/api/proposals/${id}/measurements`;

/** A rejection sweep of `points` points (1 Hz, 2 Hz, …), padded with comment lines to at least `padToBytes`. */
function sweep(points: number, padToBytes = 0, tag = ''): Buffer {
  const lines = [`# Fernhollow bench sweep ${tag}`, 'frequency_hz,cmrr_db'];
  for (let i = 1; i <= points; i += 1) lines.push(`${i},80`);
  let text = `${lines.join('\n')}\n`;
  const pad = '# padding line of the bench log, kept as the instrument wrote it\n';
  while (text.length < padToBytes) text += pad;
  return Buffer.from(text, 'utf8');
}

let api: TestApi;
let uploadsDir: string;
let designer: ApiClient;
let reviewer: ApiClient;
let projectId: number;
let specId: number;

const upload = (client: ApiClient, id: number, bytes: Buffer, name = 'sweep.csv') => client.post(url(id)).attach('file', bytes, { filename: name, contentType: 'text/csv' });
const storedFiles = () => readdirSync(uploadsDir).filter((name) => !name.startsWith('.')).length;
const rowsOf = (proposalId: number) => api.dataSource.getRepository(MeasurementEntity).countBy({ proposalId });

/** A new proposal of the spec, decided by the designer (the ranking is reused, so this is quick). */
async function decidedProposal(): Promise<number> {
  const proposal = await api.createProposal(specId);
  await decide(api.dataSource, api.users.designer, proposal.id, { kind: 'accept' }, api.ruleSet);
  return proposal.id;
}

beforeAll(async () => {
  uploadsDir = mkdtempSync(join(tmpdir(), 'longtail-measurement-quotas-'));
  api = await buildApiApp({ uploadsDir, accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
  projectId = (await api.createProject(['requirements', 'designer', 'reviewer'])).id;
  specId = (await api.createSpec(projectId)).id;
  [designer, reviewer] = await Promise.all([api.agentFor('designer'), api.agentFor('reviewer')]);
});

afterAll(async () => {
  await api?.close();
  rmSync(uploadsDir, { recursive: true, force: true });
});

describe('a flooded proposal: 20 measurements of 2,500 points', () => {
  let flooded: number;

  beforeAll(async () => {
    flooded = await decidedProposal();
    for (let i = 0; i < 20; i += 1) {
      const response = await upload(i % 2 === 0 ? designer : reviewer, flooded, sweep(2500, 0, `#${i + 1}`), `sweep-${i + 1}.csv`);
      expect(response.status, JSON.stringify(response.body)).toBe(201);
    }
  });

  test('when a 21st file is uploaded, then 409 naming the limit of 20 and what to do, and nothing is stored', async () => {
    // Arrange
    const [rows, files] = [await rowsOf(flooded), storedFiles()];

    // Act
    const response = await upload(designer, flooded, sweep(3, 0, 'one more'), 'one-more.csv');

    // Assert
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('measurement-quota-full');
    expect(response.body.error).toMatch(/already holds 20 bench measurements, the most it keeps \(20\)/);
    expect(response.body.error).toMatch(/new proposal/);
    expect(response.body.details[0].path).toBe('/file');
    expect(await rowsOf(flooded)).toBe(rows);
    expect(storedFiles()).toBe(files);
  });

  test('when the list is read, then one page of 20 without points, newest first, far smaller than the 50,000 points stored', async () => {
    // Act
    const response = await reviewer.get(url(flooded));

    // Assert
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(20);
    expect(response.body.page).toBe(1);
    expect(response.body.pageSize).toBe(20);
    expect(response.body.items).toHaveLength(20);
    expect(response.body.items.map((m: { fileName: string }) => m.fileName).slice(0, 2)).toEqual(['sweep-20.csv', 'sweep-19.csv']);
    for (const item of response.body.items) {
      expect(item).not.toHaveProperty('points');
      expect(item.pointCount).toBe(2500);
      // Flat 80 dB: the measured value at the spec frequency (400 Hz) is 80 dB
      expect(item.comparison.measuredDb).toBeCloseTo(80, 9);
    }
    // The stored points alone are 20 × 2,500 × ~34 bytes of JSON (about 1.7 MB); a list item is metadata (~1 kB)
    const listBytes = Buffer.byteLength(JSON.stringify(response.body));
    expect(listBytes).toBeLessThan(20 * 1500);
  });

  test('when one measurement is asked for, then its 2,500 points come with it', async () => {
    const first = (await reviewer.get(`${url(flooded)}?pageSize=1`)).body.items[0];
    const response = await reviewer.get(`${url(flooded)}/${first.id}`);
    expect(response.status).toBe(200);
    expect(response.body.points).toHaveLength(2500);
    expect(response.body.points[0]).toEqual({ frequencyHz: 1, value: 80 });
    expect(response.body.points.at(-1)).toEqual({ frequencyHz: 2500, value: 80 });
    expect(response.body.comparison).toEqual(first.comparison);
  });

  test('when the list is paged by 6, then pages 1–4 hold 6, 6, 6 and 2, every measurement once, and page 5 is empty with the total', async () => {
    const pages = await Promise.all([1, 2, 3, 4, 5].map((page) => reviewer.get(`${url(flooded)}?page=${page}&pageSize=6`)));
    expect(pages.map((p) => p.status)).toEqual([200, 200, 200, 200, 200]);
    expect(pages.map((p) => p.body.items.length)).toEqual([6, 6, 6, 2, 0]);
    expect(pages.map((p) => p.body.total)).toEqual([20, 20, 20, 20, 20]);
    const ids = pages.flatMap((p) => p.body.items.map((m: { id: number }) => m.id));
    expect(new Set(ids).size).toBe(20);
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
  });

  test.each([
    ['pageSize=101', '?pageSize'],
    ['page=0', '?page'],
    ['pageSize=abc', '?pageSize'],
    ['points=all', '?'],
  ])('when the list is asked with %s, then 400 on %s, as the proposal list answers', async (query, path) => {
    const response = await reviewer.get(`${url(flooded)}?${query}`);
    expect(response.status).toBe(400);
    expect(response.body.details[0].path.startsWith(path)).toBe(true);
  });
});

describe('the totals of one proposal', () => {
  test('when a file would take the proposal past 50,000 points, then 413 naming the room left, and nothing is stored', async () => {
    // Arrange: five sweeps of 9,990 points (49,950 stored)
    const id = await decidedProposal();
    for (let i = 0; i < 5; i += 1) await upload(designer, id, sweep(9990, 0, `long #${i}`)).expect(201);
    const files = storedFiles();

    // Act
    const response = await upload(designer, id, sweep(60, 0, 'short'), 'short.csv');

    // Assert
    expect(response.status).toBe(413);
    expect(response.body.code).toBe('measurement-quota-exceeded');
    expect(response.body.error).toMatch(/past its 50,000 measured points \(49,950 stored, room for 50\)/);
    expect(response.body.error).toMatch(/at most 50 points/);
    expect(await rowsOf(id)).toBe(5);
    expect(storedFiles()).toBe(files);

    // and a sweep that fits is taken
    expect((await upload(designer, id, sweep(50, 0, 'fits'), 'fits.csv')).status).toBe(201);
  });

  test('when a file would take the proposal past 2 MB of files, then 413 naming the size left', async () => {
    // Arrange: eight files of 250 KB (few points, long comments): 2,000 KB stored of 2,048 KB
    const id = await decidedProposal();
    for (let i = 0; i < 8; i += 1) await upload(designer, id, sweep(10, 250 * 1024, `padded #${i}`).subarray(0, 250 * 1024)).expect(201);

    // Act: 60 KB more
    const response = await upload(designer, id, sweep(10, 60 * 1024, 'over'), 'over.csv');

    // Assert
    expect(response.status).toBe(413);
    expect(response.body.code).toBe('measurement-quota-exceeded');
    expect(response.body.error).toMatch(/past its 2 MB of measurement files \(2,000 KB stored, room for 48 KB\)/);
    expect(await rowsOf(id)).toBe(8);
  });
});

describe('the totals of one project', () => {
  test('when the project already holds 200 measurements, then 409 on any of its proposals, naming the project limit', async () => {
    // Arrange: 200 rows on one proposal of the project, written directly (the service would stop at 20)
    const crowded = await decidedProposal();
    const template = await api.dataSource.getRepository(MeasurementEntity).findOneByOrFail({});
    const repository = api.dataSource.getRepository(MeasurementEntity);
    const existing = await api.dataSource
      .getRepository(MeasurementEntity)
      .createQueryBuilder('m')
      .innerJoin('Proposal', 'p', 'p.id = m.proposalId')
      .where('p.projectId = :projectId', { projectId })
      .getCount();
    const { id: _id, ...fields } = template;
    for (let i = existing; i < 200; i += 1) await repository.insert({ ...fields, proposalId: crowded, pointCount: 2, points: [{ frequencyHz: 1, value: 80 }, { frequencyHz: 2, value: 80 }], sizeBytes: 40 });
    const fresh = await decidedProposal();

    // Act
    const response = await upload(designer, fresh, sweep(3, 0, 'fresh'), 'fresh.csv');

    // Assert
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('measurement-quota-full');
    expect(response.body.error).toMatch(/This proposal's project already holds 200 bench measurements, the most it keeps \(200\)/);
    expect(await rowsOf(fresh)).toBe(0);
  });
});
