/**
 * The resistor tolerance in per cent, like the gain tolerance: `resistors.tolerancePercent`
 * (1 for ±1 %). Older documents (`resistors.tolerance`, a fraction) are still read and converted,
 * by the API and by the migration of stored versions, and rank exactly as before: the tolerance
 * enters the engine as tolerancePercent / 100, the same double as the fraction typed.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { SpecVersionEntity } from '../../api/entities/spec-version.entity';
import { SpecEntity } from '../../api/entities/spec.entity';
import { SpecTextAndTolerance1764800000000 } from '../../api/migrations/1764800000000-spec-text-and-tolerance';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let author: ApiClient;
let projectId: number;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
  projectId = (await api.createProject(['requirements', 'designer'])).id;
  author = await api.agentFor('requirements');
});

afterAll(() => api.close());

const withResistors = (title: string, resistors: Record<string, unknown>) => ({ ...specPayload(), title, resistors: { series: 'E96', ...resistors } });

describe('POST /api/projects/:id/specs with the resistor tolerance', () => {
  test('when given in per cent, then it is stored in per cent', async () => {
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title: 'Tern probe A', payload: withResistors('Tern probe A', { tolerancePercent: 0.5 }) }).expect(201);
    expect(response.body.latest.payload.resistors).toEqual({ series: 'E96', tolerancePercent: 0.5, tempcoPpmPerC: 100 });
  });

  test('when given as the older fraction, then it is stored in per cent (0.07 is 7 %, without binary noise)', async () => {
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title: 'Tern probe B', payload: withResistors('Tern probe B', { tolerance: 0.07 }) }).expect(201);
    expect(response.body.latest.payload.resistors).toEqual({ series: 'E96', tolerancePercent: 7, tempcoPpmPerC: 100 });
  });

  test('when both are given and disagree, then 400 names the older field and says what each says', async () => {
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title: 'Tern probe C', payload: withResistors('Tern probe C', { tolerance: 0.01, tolerancePercent: 5 }) }).expect(400);
    expect(response.body.details).toEqual([{ path: '/payload/resistors/tolerance', message: 'says ±1 % while the resistor tolerance says ±5 %: give it once, in per cent' }]);
  });

  test('when the per-cent value is out of range, then 400 names it with its unit', async () => {
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title: 'Tern probe D', payload: withResistors('Tern probe D', { tolerancePercent: 25 }) }).expect(400);
    expect(response.body.details).toEqual([{ path: '/payload/resistors/tolerancePercent', message: 'must be <= 20 %, got 25 %' }]);
  });

  test('when the same spec is ranked with the fraction and with per cent, then the rankings are identical', async () => {
    const older = await api.createSpec(projectId, { payload: withResistors('Tern probe E', { tolerance: 0.05 }) });
    const newer = await api.createSpec(projectId, { payload: withResistors('Tern probe F', { tolerancePercent: 5 }) });
    const [a, b] = [await api.createProposal(older.id), await api.createProposal(newer.id)];
    expect(b.result).toEqual(a.result);
  });
});

describe('the migration of stored spec versions', () => {
  test('when a stored version has the fraction and a title with line breaks, then up converts both and down restores the fraction', async () => {
    const spec = await api.createSpec(projectId, { payload: withResistors('Tern probe G', { tolerancePercent: 1 }) });
    const versions = api.dataSource.getRepository(SpecVersionEntity);
    const stored = await versions.findOneByOrFail({ specId: spec.id, version: 1 });
    const older = { ...stored.payload, title: 'Tern probe G\n.control', deviceModel: { name: 'QX\r.lib x', checksum: 'ab'.repeat(32) }, resistors: { series: 'E24', tolerance: 0.07 } };
    await versions.update({ id: stored.id }, { title: 'Tern probe G\n.control', payload: older as unknown as typeof stored.payload });
    await api.dataSource.getRepository(SpecEntity).update({ id: spec.id }, { title: 'Tern probe G\n.control' });

    const queryRunner = api.dataSource.createQueryRunner();
    try {
      await new SpecTextAndTolerance1764800000000().up(queryRunner);
      const after = await versions.findOneByOrFail({ id: stored.id });
      const payload = after.payload as unknown as { resistors: unknown; title: string; deviceModel: { name: string } };
      expect(payload.resistors).toEqual({ series: 'E24', tolerancePercent: 7 });
      expect(payload.title).toBe('Tern probe G .control');
      expect(payload.deviceModel.name).toBe('QX .lib x');
      expect(after.title).toBe('Tern probe G .control');
      expect((await api.dataSource.getRepository(SpecEntity).findOneByOrFail({ id: spec.id })).title).toBe('Tern probe G .control');
      // The migrated version validates and ranks again
      await api.createProposal(spec.id);

      await new SpecTextAndTolerance1764800000000().down(queryRunner);
      expect((await versions.findOneByOrFail({ id: stored.id })).payload.resistors).toEqual({ series: 'E24', tolerance: 0.07 });
      await new SpecTextAndTolerance1764800000000().up(queryRunner);
    } finally {
      await queryRunner.release();
    }
  });
});
