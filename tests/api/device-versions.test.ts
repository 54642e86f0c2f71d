/**
 * Device cards can be removed or replaced while specs keep what they recorded: a spec's
 * `deviceModel { name, checksum }` still resolves to the exact card text it was filled from
 * (marked replaced or removed), the exported netlist still carries that text as comments, and
 * the library (paged like the proposal list, `q` to find a name) shows the current cards only.
 * Who may do it (`devices:write`), the audit events, the refusals (another name, several cards,
 * the same text, a card already retired), and the library's quota of 500 cards.
 *
 * The cards are invented (Fernhollow Instruments' parts bin); checksums are the files' sha256.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { DeviceModelEntity } from '../../api/entities/device-model.entity';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';
import { countRows } from '../helpers/api-validation-helpers';

const FIRST_FILE = '* Fernhollow parts bin, first issue\n.model FH-K200 NPN (IS=4f BF=200 VAF=90)\n.model FH-K90 NPN (IS=7f BF=90 VAF=40)\n';
const REPLACEMENT_FILE = '* Fernhollow parts bin, FH-K200 re-measured\n.model FH-K200 NPN (IS=4.4f BF=185 VAF=95 BR=2)\n';

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');
const url = (projectId: number, rest = '') => `/api/projects/${projectId}/devices${rest}`;
const send = (request: ReturnType<ApiClient['post']>, content: string, name: string) => request.attach('file', Buffer.from(content, 'utf8'), name);

let api: TestApi;
let projectId: number;
let designer: ApiClient;
let requirements: ApiClient;
let reviewer: ApiClient;
let outsider: ApiClient;
let k200: { id: number };
let k90: { id: number };

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer', 'designer2'] });
  projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Quillon sensor head')).id;
  await api.createProject(['designer2'], 'Sallow tide gauge');
  [designer, requirements, reviewer, outsider] = await Promise.all([api.agentFor('designer'), api.agentFor('requirements'), api.agentFor('reviewer'), api.agentFor('designer2')]);
  const uploaded = await send(requirements.post(url(projectId)), FIRST_FILE, 'parts-bin.lib').expect(201);
  [k200, k90] = uploaded.body.items;
});

afterAll(() => api?.close());

describe('PUT /api/projects/:id/devices/:deviceId replaces a card', () => {
  test('when a designer replaces FH-K200 with a re-measured card, then the library holds the new text, the old one stays readable as replaced, and one audit event names both', async () => {
    // Arrange
    const before = await countRows(api.dataSource);

    // Act
    const response = await send(designer.put(url(projectId, `/${k200.id}`)), REPLACEMENT_FILE, 'k200-remeasured.lib');

    // Assert
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const { item, replaced } = response.body;
    expect(item.name).toBe('FH-K200');
    expect(item.state).toBe('library');
    expect(item.device).toEqual({ family: 'npn', saturationCurrentA: 4.4e-15, beta: 185, earlyVoltageV: 95, model: { IS: 4.4e-15, BF: 185, VAF: 95, BR: 2 } });
    expect(item.checksum).toBe(sha256(REPLACEMENT_FILE));
    expect(replaced.id).toBe(k200.id);
    expect(replaced.state).toBe('replaced');
    expect(replaced.replacedById).toBe(item.id);
    expect(replaced.retiredBy).toEqual({ id: api.users.designer.id, displayName: 'Test designer' });
    expect(replaced.card).toBe('.model FH-K200 NPN (IS=4f BF=200 VAF=90)');
    const after = await countRows(api.dataSource);
    expect(after.device_model - before.device_model).toBe(1);
    expect(after.audit_event - before.audit_event).toBe(1);
    const event = await api.dataSource.getRepository(AuditEventEntity).findOneByOrFail({ action: 'device-model.replaced' });
    expect(event).toMatchObject({ actorId: api.users.designer.id, projectId, beforeId: k200.id, afterId: item.id });
    expect(event.details).toMatchObject({ name: 'FH-K200', previousChecksum: sha256(FIRST_FILE), checksum: sha256(REPLACEMENT_FILE) });

    const listed = await reviewer.get(url(projectId)).expect(200);
    expect(listed.body.items.map((d: { name: string; id: number }) => [d.name, d.id])).toEqual([
      ['FH-K200', item.id],
      ['FH-K90', k90.id],
    ]);
  });

  test('when a spec recorded the first FH-K200, then its record resolves to that exact text, marked replaced, beside the library’s current card', async () => {
    const response = await reviewer.get(url(projectId, `/recorded?name=fh-k200&checksum=${sha256(FIRST_FILE)}`));
    expect(response.status).toBe(200);
    expect(response.body.recorded).toMatchObject({ id: k200.id, state: 'replaced', card: '.model FH-K200 NPN (IS=4f BF=200 VAF=90)', checksum: sha256(FIRST_FILE) });
    expect(response.body.current).toMatchObject({ name: 'FH-K200', state: 'library', checksum: sha256(REPLACEMENT_FILE) });
  });

  test('when that spec’s netlist is exported, then it still carries the card the spec was filled from, saying it has been replaced', async () => {
    // Arrange: a spec filled from the first FH-K200 (IS 4 fA, BF 200, VAF 90)
    const payload = { ...specPayload(), device: { beta: 200, earlyVoltageV: 90, saturationCurrentA: 4e-15 }, deviceModel: { name: 'FH-K200', checksum: sha256(FIRST_FILE) } };
    const spec = await api.createSpec(projectId, { payload });
    const proposal = await api.createProposal(spec.id);

    // Act
    const response = await designer.get(`/api/proposals/${proposal.id}/netlist.cir`).expect(200);

    // Assert
    const lines = response.text.split('\n');
    expect(lines).toContain('*   .model FH-K200 NPN (IS=4f BF=200 VAF=90)');
    expect(lines.some((line) => /^\* .*since been replaced/.test(line))).toBe(true);
    expect(lines.join('\n')).not.toContain('BF=185');
  });

  test.each([
    ['a card of another name', 400, '.model FH-K210 NPN (IS=4f BF=210 VAF=90)\n', /keeps the name FH-K200/],
    ['two cards', 400, '.model FH-K200 NPN (IS=4f BF=210 VAF=90)\n.model FH-K201 NPN (IS=4f BF=201 VAF=90)\n', /holds 2 cards; a replacement file holds one card/],
    ['the stored text again', 409, REPLACEMENT_FILE, /the same card as the library's FH-K200/],
  ] as const)('when the replacement file holds %s, then %i and nothing changes', async (_what, status, content, message) => {
    const current = (await designer.get(url(projectId, '?q=k200')).expect(200)).body.items[0];
    const before = await countRows(api.dataSource);
    const response = await send(designer.put(url(projectId, `/${current.id}`)), content, 'k200.lib');
    expect(response.status, JSON.stringify(response.body)).toBe(status);
    expect(response.body.details[0].message).toMatch(message);
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when the replaced card is replaced again (an old id), then 409 naming its replacement', async () => {
    const response = await send(designer.put(url(projectId, `/${k200.id}`)), '.model FH-K200 NPN (IS=4f BF=190 VAF=90)\n', 'k200.lib');
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('device-model-retired');
    expect(response.body.error).toMatch(/FH-K200 was replaced on .* \(its replacement is card #\d+\)/);
  });
});

describe('DELETE /api/projects/:id/devices/:deviceId removes a card', () => {
  test('when the systems engineer removes FH-K90, then 204, it leaves the library, is listed among the former cards, still resolves for specs, and its name is free again', async () => {
    // Act
    const response = await requirements.delete(url(projectId, `/${k90.id}`));

    // Assert
    expect(response.status).toBe(204);
    const library = (await designer.get(url(projectId)).expect(200)).body;
    expect(library.items.map((d: { name: string }) => d.name)).toEqual(['FH-K200']);
    expect(library.total).toBe(1);
    const former = (await designer.get(url(projectId, '?state=former')).expect(200)).body;
    expect(former.items.map((d: { name: string; state: string }) => [d.name, d.state])).toEqual([
      ['FH-K90', 'removed'],
      ['FH-K200', 'replaced'],
    ]);
    const recorded = (await designer.get(url(projectId, `/recorded?name=FH-K90&checksum=${sha256(FIRST_FILE)}`)).expect(200)).body;
    expect(recorded.recorded).toMatchObject({ id: k90.id, state: 'removed', card: '.model FH-K90 NPN (IS=7f BF=90 VAF=40)', retiredBy: { id: api.users.requirements.id } });
    expect(recorded.current).toBeNull();
    const event = await api.dataSource.getRepository(AuditEventEntity).findOneByOrFail({ action: 'device-model.removed' });
    expect(event).toMatchObject({ actorId: api.users.requirements.id, entityId: k90.id, projectId });
    expect((await designer.get(url(projectId, `/${k90.id}`)).expect(200)).body.state).toBe('removed');

    // The name can be taken again, by a new card
    const again = await send(designer.post(url(projectId)), '.model FH-K90 NPN (IS=7f BF=95 VAF=42)\n', 'k90-again.lib');
    expect(again.status, JSON.stringify(again.body)).toBe(201);
  });

  test('when a removed card is removed again, then 409 and nothing changes', async () => {
    const before = await countRows(api.dataSource);
    const response = await requirements.delete(url(projectId, `/${k90.id}`));
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('device-model-retired');
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when a spec names a card this project never held (a checksum of digits only), then the record resolves to nothing', async () => {
    const response = await designer.get(url(projectId, `/recorded?name=FH-K200&checksum=${'0'.repeat(64)}`)).expect(200);
    expect(response.body).toEqual({ recorded: null, current: expect.objectContaining({ name: 'FH-K200' }) });
  });
});

describe('who may remove or replace', () => {
  test.each([
    ['a reviewer', 403, () => reviewer],
    ['a designer of another project', 404, () => outsider],
  ] as const)('when %s removes or replaces a card, then %i and nothing changes', async (_who, status, client) => {
    const current = (await designer.get(url(projectId, '?q=K200')).expect(200)).body.items[0];
    const before = await countRows(api.dataSource);
    expect((await client().delete(url(projectId, `/${current.id}`))).status).toBe(status);
    expect((await send(client().put(url(projectId, `/${current.id}`)), '.model FH-K200 NPN (IS=4f BF=150 VAF=90)\n', 'k200.lib')).status).toBe(status);
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when a card id of another project is used through this project, then 404', async () => {
    const sallow = (await outsider.get('/api/projects').expect(200)).body.items[0].id;
    const card = await send(outsider.post(url(sallow)), '.model FH-S1 NPN (IS=5f BF=120 VAF=60)\n', 's1.lib').expect(201);
    expect((await designer.delete(url(projectId, `/${card.body.items[0].id}`))).status).toBe(404);
    expect((await designer.get(url(projectId, `/${card.body.items[0].id}`))).status).toBe(404);
  });

  test('when a removal comes without the CSRF header, then 403 and nothing changes', async () => {
    const current = (await designer.get(url(projectId, '?q=K200')).expect(200)).body.items[0];
    const response = await designer.agent.delete(url(projectId, `/${current.id}`));
    expect(response.status).toBe(403);
    expect(response.body.code).toBe('csrf-failed');
  });
});

describe('the library paged, and its quota of 500 cards', () => {
  test('when 497 more cards are stored, then the list pages them by name, q finds a name, and a file of 3 cards is refused with 413 naming the room for 1', async () => {
    // Arrange: the library holds FH-K200 and FH-K90; add FH-Q001 … FH-Q497 directly
    const template = await api.dataSource.getRepository(DeviceModelEntity).findOneByOrFail({ projectId, nameKey: 'fh-k200' });
    const { id: _id, ...fields } = template;
    const rows = Array.from({ length: 497 }, (_, i) => {
      const name = `FH-Q${String(i + 1).padStart(3, '0')}`;
      return { ...fields, name, nameKey: name.toLowerCase(), cardText: `.model ${name} NPN (IS=4f BF=200 VAF=90)` };
    });
    for (let i = 0; i < rows.length; i += 100) await api.dataSource.getRepository(DeviceModelEntity).insert(rows.slice(i, i + 100));

    // Paged like the proposal list: FH-K200, FH-K90, FH-Q001, … by name
    const page = (await designer.get(url(projectId, '?page=2&pageSize=100')).expect(200)).body;
    expect(page).toMatchObject({ total: 499, page: 2, pageSize: 100 });
    expect(page.items[0].name).toBe('FH-Q099');
    expect((await designer.get(url(projectId, '?pageSize=101'))).status).toBe(400);
    const found = (await designer.get(url(projectId, '?q=q12')).expect(200)).body;
    expect(found.items.map((d: { name: string }) => d.name)).toEqual(['FH-Q120', 'FH-Q121', 'FH-Q122', 'FH-Q123', 'FH-Q124', 'FH-Q125', 'FH-Q126', 'FH-Q127', 'FH-Q128', 'FH-Q129']);
    // `_` and `%` are matched as written, not as patterns
    expect((await designer.get(url(projectId, '?q=FH_Q')).expect(200)).body.total).toBe(0);
    expect((await designer.get(url(projectId, '?q=%25')).expect(200)).body.total).toBe(0);

    // Act: three new cards where there is room for one
    const before = await countRows(api.dataSource);
    const response = await send(designer.post(url(projectId)), '.model FH-R1 NPN (IS=4f BF=200 VAF=90)\n.model FH-R2 NPN (IS=4f BF=200 VAF=90)\n.model FH-R3 NPN (IS=4f BF=200 VAF=90)\n', 'three.lib');

    // Assert
    expect(response.status).toBe(413);
    expect(response.body.code).toBe('device-library-quota-exceeded');
    expect(response.body.error).toMatch(/its 3 cards would take this project's device library past 500 cards \(499 in it\); there is room for 1/);
    expect(response.body.error).toMatch(/remove the cards no spec needs any more/);
    expect(await countRows(api.dataSource)).toEqual(before);

    // One fits; then the library is full (409), and a removal makes room again
    await send(designer.post(url(projectId)), '.model FH-R1 NPN (IS=4f BF=200 VAF=90)\n', 'one.lib').expect(201);
    const full = await send(designer.post(url(projectId)), '.model FH-R2 NPN (IS=4f BF=200 VAF=90)\n', 'one-more.lib');
    expect(full.status).toBe(409);
    expect(full.body.code).toBe('device-library-full');
    expect(full.body.error).toMatch(/holds 500 cards, the most it holds \(500\)/);
    const q001 = (await designer.get(url(projectId, '?q=FH-Q001')).expect(200)).body.items[0];
    await designer.delete(url(projectId, `/${q001.id}`)).expect(204);
    await send(designer.post(url(projectId)), '.model FH-R2 NPN (IS=4f BF=200 VAF=90)\n', 'one-more.lib').expect(201);
  });
});
