/**
 * The device library over HTTP: a text file of NPN .model cards uploaded as multipart/form-data
 * (field `file`) is read, stored with its file name and sha256, and listed; a bad file is refused
 * with each problem's line and nothing stored (every table's row count unchanged); who may
 * upload, project isolation, and the exported netlist carrying the original card as comments.
 *
 * Expected numbers come from the cards as written and ngspice's scale-factor table (ngspice
 * User's Manual, "Some naming conventions", Table 2.2: F = 1e-15, MEG = 1e6, K = 1e3, M = 1e-3).
 * The devices and files are invented (Fernhollow Instruments' parts bin).
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { safeFileName } from '../../api/services/devices.service';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';
import { countRows } from '../helpers/api-validation-helpers';

let api: TestApi;
let projectId: number;
let otherProjectId: number;
let designer: ApiClient;
let requirements: ApiClient;
let reviewer: ApiClient;
let admin: ApiClient;
let outsider: ApiClient;

/** Two cards: one over three lines in parentheses with comments, one on a line with suffixes. */
const GOOD_FILE = [
  '* Fernhollow Instruments parts bin: small-signal NPN',
  '.MODEL FH-N150 NPN (IS=1.2f BF=150 ; forward gain at 1 mA',
  '+ VAF = 86 BR=3.5 NF=1.005',
  '+ CJE=4.5p)',
  '',
  '.model fh-n320 npn is=0.025p bf=320 vaf=0.12k ikf=80m itf=0.4',
].join('\n');

const url = (id: number) => `/api/projects/${id}/devices`;
const sha256 = (text: string | Buffer) => createHash('sha256').update(text).digest('hex');
const upload = (client: ApiClient, id: number, content: string | Buffer, name = 'parts-bin.lib') =>
  client.post(url(id)).attach('file', typeof content === 'string' ? Buffer.from(content, 'utf8') : content, name);

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer', 'designer2'] });
  projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Quillon sensor head')).id;
  otherProjectId = (await api.createProject(['designer2'], 'Sallow tide gauge')).id;
  [designer, requirements, reviewer, admin, outsider] = await Promise.all([
    api.agentFor('designer'),
    api.agentFor('requirements'),
    api.agentFor('reviewer'),
    api.agentFor('admin'),
    api.agentFor('designer2'),
  ]);
});

afterAll(() => api.close());

describe('POST /api/projects/:id/devices with a good file', () => {
  test('when a designer uploads two cards, then 201 with both read as written, stored with the file name and its sha256, and listed', async () => {
    // Arrange
    const before = await countRows(api.dataSource);

    // Act
    const response = await upload(designer, projectId, GOOD_FILE);

    // Assert
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    const [first, second] = response.body.items;
    expect(first.name).toBe('FH-N150');
    expect(first.device).toEqual({ family: 'npn', saturationCurrentA: 1.2e-15, beta: 150, earlyVoltageV: 86, model: { IS: 1.2e-15, BF: 150, VAF: 86, BR: 3.5, NF: 1.005, CJE: 4.5e-12 } });
    expect(first.parameters).toEqual({ IS: 1.2e-15, BF: 150, VAF: 86, BR: 3.5, NF: 1.005, CJE: 4.5e-12 });
    expect(first.line).toBe(2);
    expect(first.card).toBe(GOOD_FILE.split('\n').slice(1, 4).join('\n'));
    expect(second.name).toBe('fh-n320');
    expect(second.device.saturationCurrentA).toBeCloseTo(2.5e-14, 28);
    expect(second.device.earlyVoltageV).toBeCloseTo(120, 10);
    expect(second.device.beta).toBe(320);
    expect(second.parameters.IKF).toBeCloseTo(0.08, 14);
    for (const item of [first, second]) {
      expect(item.fileName).toBe('parts-bin.lib');
      expect(item.checksum).toBe(sha256(GOOD_FILE));
      expect(item.uploadedBy).toEqual({ id: api.users.designer.id, displayName: 'Test designer' });
    }
    // Every parameter of FH-N150 is the engine's; fh-n320's ITF (transit-time current corner) is SPICE's alone
    expect(first.notes).toEqual([]);
    expect(second.device.model).not.toHaveProperty('ITF');
    expect(second.notes.join(' ')).toMatch(/does not model the card's ITF/);
    const after = await countRows(api.dataSource);
    expect(after.device_model - before.device_model).toBe(2);
    expect(after.audit_event - before.audit_event).toBe(2);

    const listed = await reviewer.get(url(projectId)).expect(200);
    expect(listed.body.items.map((d: { name: string }) => d.name)).toEqual(['FH-N150', 'fh-n320']);
  });

  test('when the file name is not ASCII, then it is stored as the browser sent it (UTF-8)', async () => {
    const response = await upload(requirements, projectId, '.model FH-N90 NPN IS=8f BF=90 VAF=45\n', 'Bauteile-µA.lib');
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    expect(response.body.items[0].fileName).toBe('Bauteile-µA.lib');
  });
});

describe('safeFileName', () => {
  test.each([
    ['C:\\parts\\bin/fh n90.cir', 'fh n90.cir'],
    ['../../etc/parts.lib', 'parts.lib'],
    ['bell\u0007 and del\u007f.lib', 'bell and del.lib'],
    ['   ', 'unnamed file'],
    ['x'.repeat(300), 'x'.repeat(255)],
  ])('when the client names the file %j, then %j is stored', (original, stored) => {
    expect(safeFileName(original)).toBe(stored);
  });
});

const GOOD_CARD = '.model FH-OK NPN (IS=5f BF=200 VAF=70)';
const KIB = 1024;

interface BadFile {
  when: string;
  content: string | Buffer;
  status: 400 | 413;
  /** The line the refusal names (absent: the whole file). */
  line?: number;
  message: RegExp;
}

const BAD_FILES: BadFile[] = [
  {
    when: 'the file is a binary image',
    content: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d, 0x49, 0x48, 0x44, 0x52]),
    status: 400,
    line: 3, // the NUL follows the signature's two line feeds
    message: /NUL bytes/,
  },
  {
    when: 'the file is UTF-16 text',
    content: Buffer.from(`${GOOD_CARD}\n`, 'utf16le'),
    status: 400,
    line: 1,
    message: /NUL bytes.*UTF-16/,
  },
  {
    when: 'a line is Latin-1, not UTF-8',
    content: Buffer.concat([Buffer.from(`${GOOD_CARD}\n* bench notes\n* \u00b5A range: `, 'utf8').subarray(0, -1), Buffer.from([0xb5, 0x0a])]),
    status: 400,
    line: 3,
    message: /not valid UTF-8/,
  },
  {
    when: 'one character in ten is a control character',
    content: `${GOOD_CARD}\n${'*\u0001abcdefgh\n'.repeat(20)}`,
    status: 400,
    line: 2,
    message: /control characters.*binary/,
  },
  {
    when: 'the file is over 256 KB',
    content: `${GOOD_CARD}\n${'* padding to make the file too large for the library\n'.repeat(Math.ceil((260 * KIB) / 52))}`,
    status: 413,
    message: /over 256 KB/,
  },
  {
    when: 'a card gives no VAF',
    content: `${GOOD_CARD}\n* second part\n.model FH-NOVAF NPN (IS=3f BF=120)\n`,
    status: 400,
    line: 3,
    message: /FH-NOVAF: VAF is missing/,
  },
  {
    when: 'a card gives neither IS nor BF',
    content: `.model FH-BARE NPN VAF=50\n${GOOD_CARD}\n`,
    status: 400,
    line: 1,
    message: /FH-BARE: (IS|BF) is missing/,
  },
  {
    when: 'an opening parenthesis is never closed',
    content: `${GOOD_CARD}\n.model FH-OPEN NPN (IS=3f BF=120\n+ VAF=40\n`,
    status: 400,
    line: 2,
    message: /unbalanced parentheses.*never closed/,
  },
  {
    when: 'a closing parenthesis has no opening one',
    content: `${GOOD_CARD}\n.model FH-SHUT NPN IS=3f BF=120 VAF=40)\n`,
    status: 400,
    line: 2,
    message: /unbalanced parentheses/,
  },
  {
    when: 'the file holds a PNP card',
    content: `${GOOD_CARD}\n\n.model FH-P150 PNP (IS=2f BF=150 VAF=60)\n`,
    status: 400,
    line: 3,
    message: /PNP models are not supported/,
  },
  {
    when: 'the file holds a subcircuit',
    content: `${GOOD_CARD}\n.subckt FHPAIR c1 c2 b1 b2 e\nQ1 c1 b1 e FH-OK\nQ2 c2 b2 e FH-OK\n.ends\n`,
    status: 400,
    line: 2,
    message: /Subcircuits/,
  },
  {
    when: 'a value is an expression in braces',
    content: `.param bf_typ=180\n${GOOD_CARD}\n.model FH-EXPR NPN (IS=3f BF={bf_typ} VAF=50)\n`,
    status: 400,
    line: 3,
    message: /braces/,
  },
  {
    when: 'BF is beyond what a spec accepts',
    content: `${GOOD_CARD}\n.model FH-HIGH NPN (IS=3f BF=5k VAF=50)\n`,
    status: 400,
    line: 2,
    message: /BF=5000 is outside/,
  },
  {
    when: 'the file holds only comments',
    content: '* nothing here yet\n',
    status: 400,
    message: /no \.model card/,
  },
];

describe('POST /api/projects/:id/devices with a bad file', () => {
  test.each(BAD_FILES.map((bad) => [bad.when, bad] as const))('when %s, then refused with the line and reason, and nothing is saved', async (_when, bad) => {
    // Arrange
    const before = await countRows(api.dataSource);

    // Act
    const response = await upload(designer, projectId, bad.content, 'bad-parts.lib');

    // Assert
    expect(response.status, JSON.stringify(response.body)).toBe(bad.status);
    expect(response.body.error).toEqual(expect.any(String));
    const match = response.body.details.find((d: { message: string }) => bad.message.test(d.message));
    expect(match, JSON.stringify(response.body.details)).toBeDefined();
    if (bad.line !== undefined) expect(match.line).toBe(bad.line);
    expect(match.path).toBe('/file');
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when a card name is already in the library (in another case), then 409 naming the card line, and nothing of the file is saved', async () => {
    // Arrange: FH-N150 was stored by the first test
    const before = await countRows(api.dataSource);
    const file = `.model FH-NEW NPN (IS=7f BF=110 VAF=66)\n.model fh-N150 NPN (IS=1.3f BF=155 VAF=80)\n`;

    // Act
    const response = await upload(designer, projectId, file);

    // Assert
    expect(response.status, JSON.stringify(response.body)).toBe(409);
    expect(response.body.code).toBe('device-model-exists');
    expect(response.body.details).toEqual([{ path: '/file', line: 2, message: expect.stringMatching(/fh-N150 is already in this project's library \(from parts-bin\.lib\)/) }]);
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when no file is attached (a JSON body), then 400 asking for the file field', async () => {
    const response = await designer.post(url(projectId)).send({ card: GOOD_CARD });
    expect(response.status).toBe(400);
    expect(response.body.details[0].path).toBe('/file');
  });

  test('when the file comes in another form field, then 400 naming the field to use', async () => {
    const response = await designer.post(url(projectId)).attach('cards', Buffer.from(GOOD_CARD), 'parts.lib');
    expect(response.status).toBe(400);
    expect(response.body.details[0].message).toMatch(/form field "file"/);
  });

  test('when a text field comes beside the file, then 400 and nothing is saved', async () => {
    const before = await countRows(api.dataSource);
    const response = await designer.post(url(projectId)).field('note', 'extra').attach('file', Buffer.from('.model FH-FIELD NPN IS=1f BF=100 VAF=10'), 'parts.lib');
    expect(response.status).toBe(400);
    expect(await countRows(api.dataSource)).toEqual(before);
  });
});

describe('who may upload and read', () => {
  const card = (name: string) => `.model ${name} NPN (IS=4f BF=130 VAF=55)\n`;

  test.each([
    ['a reviewer', () => reviewer, 403, 'forbidden'],
    ['an admin (who manages, not designs)', () => admin, 403, 'forbidden'],
    ['a designer of another project', () => outsider, 404, 'project-not-found'],
  ] as const)('when %s uploads to the project, then %i and nothing is saved', async (_who, client, status, code) => {
    const before = await countRows(api.dataSource);
    const response = await upload(client(), projectId, card('FH-ROLE'));
    expect(response.status).toBe(status);
    expect(response.body.code).toBe(code);
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when a designer of another project lists this project’s library, then 404', async () => {
    const response = await outsider.get(url(projectId));
    expect(response.status).toBe(404);
    expect(response.body.code).toBe('project-not-found');
  });

  test('when a signed-in designer uploads without the CSRF header, then 403 csrf-failed and nothing is saved', async () => {
    const before = await countRows(api.dataSource);
    const response = await designer.agent.post(url(projectId)).attach('file', Buffer.from(card('FH-CSRF')), 'parts.lib');
    expect(response.status).toBe(403);
    expect(response.body.code).toBe('csrf-failed');
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when the other project’s designer uploads there, then that library holds the card and this one does not', async () => {
    await upload(outsider, otherProjectId, card('FH-SALLOW')).expect(201);
    const own = await designer.get(url(projectId)).expect(200);
    const other = await outsider.get(url(otherProjectId)).expect(200);
    expect(own.body.items.map((d: { name: string }) => d.name)).not.toContain('FH-SALLOW');
    expect(other.body.items.map((d: { name: string }) => d.name)).toEqual(['FH-SALLOW']);
  });
});

describe('the exported netlist of a spec filled from a library card', () => {
  test('when the spec names the card and the design keeps its values, then the netlist simulates the whole card and carries the card as written as comments', async () => {
    // Arrange: a spec whose device is FH-N150 (uploaded above) with the choice recorded
    const payload = { ...specPayload(), device: { beta: 150, earlyVoltageV: 86, saturationCurrentA: 1.2e-15 }, deviceModel: { name: 'FH-N150', checksum: sha256(GOOD_FILE) } };
    const spec = await api.createSpec(projectId, { payload });
    const proposal = await api.createProposal(spec.id);

    // Act
    const response = await designer.get(`/api/proposals/${proposal.id}/netlist.cir`).expect(200);

    // Assert
    const lines = response.text.split('\n');
    expect(lines).toContain('*   .MODEL FH-N150 NPN (IS=1.2f BF=150 ; forward gain at 1 mA');
    expect(lines).toContain('*   + CJE=4.5p)');
    // The spec carries IS, BF and VAF only: the card's NF, BR and CJE follow them on the one live .model card
    const live = lines.filter((line) => /^\s*\.model/i.test(line));
    expect(live).toHaveLength(1);
    expect(live[0]).toMatch(/^\.model QNPN NPN \(IS=1\.2e-15 BF=150 VAF=86 NF=1\.005 BR=3\.5 CJE=4\.5(e-12|p)\)$/);
    // No line of the card as written is live: every one is behind "*"
    expect(lines.filter((line) => /^\s*\+/.test(line))).toEqual([]);
  });
});
