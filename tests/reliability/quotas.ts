/**
 * Quotas and paged lists (README, DEVELOPERS.md "Bench measurements" and "Device models"): the
 * flood an attack review made is repeated against the in-process app on a fresh database, and
 * what was accepted and what the lists then answer is measured.
 *
 * - 30 bench files of 9,000 points each on one proposal: how many are stored (the proposal keeps
 *   50,000 points), and the refusals' statuses.
 * - 25 files of 2,400 points on another proposal (the proposal keeps 20 files): the list answer's
 *   size with the default page and with a page of 100, against the points stored.
 * - 2,004 .model cards in files of 200 into one library: how many are stored (500 at most) and
 *   the size of the library's first page.
 *
 * The sweeps and cards are invented (Fernhollow Instruments' bench and parts bin).
 */
import { decide } from '../../api/services/proposals.service';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';
import { row, type PartResult, type RunOptions, type SummaryRow } from './lib';

const PART = 'Quotas';

function sweep(points: number, tag: string): Buffer {
  const lines = [`# Fernhollow bench flood ${tag}`, 'frequency_hz,cmrr_db'];
  for (let i = 1; i <= points; i += 1) lines.push(`${i},${(80 - i / 1000).toFixed(3)}`);
  return Buffer.from(`${lines.join('\n')}\n`, 'utf8');
}

function cards(from: number, count: number): Buffer {
  const lines = ['* Fernhollow parts bin, flood'];
  for (let i = from; i < from + count; i += 1) lines.push(`.model FH-F${String(i).padStart(4, '0')} NPN (IS=5f BF=${100 + (i % 200)} VAF=60)`);
  return Buffer.from(`${lines.join('\n')}\n`, 'utf8');
}

const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} kB`;

async function decidedProposal(api: TestApi, specId: number): Promise<number> {
  const proposal = await api.createProposal(specId);
  await decide(api.dataSource, api.users.designer, proposal.id, { kind: 'accept' }, api.ruleSet);
  return proposal.id;
}

async function flood(client: ApiClient, url: string, files: Buffer[], name: string): Promise<{ statuses: Map<number, number>; stored: number }> {
  const statuses = new Map<number, number>();
  let stored = 0;
  for (const [i, bytes] of files.entries()) {
    const response = await client.post(url).attach('file', bytes, { filename: `${name}-${i + 1}`, contentType: 'text/plain' });
    statuses.set(response.status, (statuses.get(response.status) ?? 0) + 1);
    if (response.status === 201) stored += 1;
  }
  return { statuses, stored };
}

const statusText = (statuses: Map<number, number>) => [...statuses.entries()].map(([status, n]) => `${n}×${status}`).join(', ');

export async function quotasPart(options: RunOptions): Promise<PartResult> {
  const { log } = options;
  const serverErrors: string[] = [];
  const api = await buildApiApp({ log: (message) => serverErrors.push(message) });
  const rows: SummaryRow[] = [];
  try {
    const project = await api.createProject(['requirements', 'designer', 'reviewer']);
    const spec = await api.createSpec(project.id);
    const designer = await api.agentFor('designer');
    const reviewer = await api.agentFor('reviewer');

    // 1. Thirty long sweeps on one proposal
    const long = await decidedProposal(api, spec.id);
    const longFlood = await flood(designer, `/api/proposals/${long}/measurements`, Array.from({ length: 30 }, (_, i) => sweep(9000, `long ${i + 1}`)), 'long.csv');
    log(`30 files of 9,000 points on proposal ${long}: ${statusText(longFlood.statuses)}`);
    rows.push(row(PART, 'files of 9,000 points stored on one proposal (30 sent)', longFlood.stored, '≤ 5 (50,000 points a proposal)', longFlood.stored <= 5));

    // 2. Twenty-five shorter sweeps: the list's size with the proposal full
    const many = await decidedProposal(api, spec.id);
    const manyFlood = await flood(designer, `/api/proposals/${many}/measurements`, Array.from({ length: 25 }, (_, i) => sweep(2400, `short ${i + 1}`)), 'short.csv');
    log(`25 files of 2,400 points on proposal ${many}: ${statusText(manyFlood.statuses)}`);
    rows.push(row(PART, 'files of 2,400 points stored on one proposal (25 sent)', manyFlood.stored, '≤ 20 (20 files a proposal)', manyFlood.stored <= 20));
    const exported = await reviewer.get(`/api/proposals/${many}/export.json`);
    const pointsBytes = Buffer.byteLength(JSON.stringify((exported.body.measurements as { points: unknown }[]).map((m) => m.points)));
    const firstPage = await reviewer.get(`/api/proposals/${many}/measurements`);
    const fullPage = await reviewer.get(`/api/proposals/${many}/measurements?pageSize=100`);
    const firstBytes = Buffer.byteLength(firstPage.text);
    const fullBytes = Buffer.byteLength(fullPage.text);
    log(`list of proposal ${many}: ${firstPage.body.items.length} items, ${kb(firstBytes)}; pageSize=100: ${kb(fullBytes)}; the stored points as JSON: ${kb(pointsBytes)}`);
    rows.push(row(PART, `measurement list answer, ${manyFlood.stored} stored × 2,400 points`, `${kb(fullBytes)} (points ${kb(pointsBytes)})`, '≤ 64 kB, no points', fullBytes <= 64 * 1024 && !fullPage.text.includes('"points"')));

    // 3. 2,004 cards into one library
    const files = Array.from({ length: 11 }, (_, i) => cards(i * 200 + 1, i === 10 ? 4 : 200));
    const cardFlood = await flood(designer, `/api/projects/${project.id}/devices`, files, 'flood.lib');
    const library = await reviewer.get(`/api/projects/${project.id}/devices`);
    log(`2,004 cards in 11 files: ${statusText(cardFlood.statuses)}; library total ${library.body.total}, first page ${kb(Buffer.byteLength(library.text))}`);
    rows.push(row(PART, 'device cards stored of 2,004 sent', library.body.total, '≤ 500 cards a library', library.body.total <= 500));
    rows.push(row(PART, 'device library first page', kb(Buffer.byteLength(library.text)), 'info', null));
    rows.push(row(PART, 'server errors (5xx) during the floods', serverErrors.length, '0', serverErrors.length === 0));
  } finally {
    await api.close();
  }
  return { rows };
}
