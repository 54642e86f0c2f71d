/**
 * One person cannot flood the engine with proposals: at most PROPOSALS_PER_MINUTE in a minute,
 * then a 429 that says the limit and when to try again (Retry-After), with nothing written;
 * another person is not affected; proposals older than a minute do not count. The earlier
 * proposals are stored rows (copies of one ranked proposal), so the test runs the engine once.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { ProposalEntity } from '../../api/entities/proposal.entity';
import { PROPOSAL_RATE_WINDOW_MS, PROPOSALS_PER_MINUTE } from '../../api/services/proposal-rate';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let specId: number;
let designer: ApiClient;
let requirements: ApiClient;

const proposals = () => api.dataSource.getRepository(ProposalEntity);

/** Stores `count` copies of a ranked proposal as the person's, made `ageMs` ago. */
async function earlierProposals(userId: number, count: number, ageMs: number) {
  const template = await proposals().findOneOrFail({ where: { specId }, order: { id: 'ASC' } });
  const { id: _id, ...row } = template;
  const at = new Date(Date.now() - ageMs).toISOString();
  await proposals().save(Array.from({ length: count }, () => ({ ...row, createdById: userId, createdAt: at, updatedAt: at })));
}

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
  const project = await api.createProject(['requirements', 'designer']);
  specId = (await api.createSpec(project.id)).id;
  await api.createProposal(specId, 'requirements');
  [designer, requirements] = await Promise.all([api.agentFor('designer'), api.agentFor('requirements')]);
});

afterAll(async () => {
  await api?.close();
});

describe(`when one person asks for more than ${PROPOSALS_PER_MINUTE} proposals within a minute`, () => {
  test('when it is the last one the limit allows, then 201', async () => {
    await earlierProposals(api.users.designer.id, PROPOSALS_PER_MINUTE - 1, 5_000);

    const response = await designer.post(`/api/specs/${specId}/proposals`);

    expect(response.status, JSON.stringify(response.body)).toBe(201);
  });

  test('when it is one more, then 429 naming the limit, with Retry-After, and nothing written', async () => {
    const before = await proposals().count();

    const response = await designer.post(`/api/specs/${specId}/proposals`);

    expect(response.status).toBe(429);
    expect(response.body.code).toBe('too-many-proposals');
    expect(response.body.error).toContain(String(PROPOSALS_PER_MINUTE));
    const retryAfter = Number(response.headers['retry-after']);
    expect(Number.isInteger(retryAfter)).toBe(true);
    expect(retryAfter).toBeGreaterThanOrEqual(1);
    expect(retryAfter).toBeLessThanOrEqual(PROPOSAL_RATE_WINDOW_MS / 1000);
    expect(response.body.error).toContain(`${retryAfter} s`);
    expect(await proposals().count()).toBe(before);
  });

  test('when another person of the project asks at the same time, then 201', async () => {
    const response = await requirements.post(`/api/specs/${specId}/proposals`);

    expect(response.status).toBe(201);
  });

  test('when the earlier proposals are more than a minute old, then the person may ask again', async () => {
    const old = new Date(Date.now() - PROPOSAL_RATE_WINDOW_MS - 1_000).toISOString();
    await proposals().update({ createdById: api.users.designer.id }, { createdAt: old });

    const response = await designer.post(`/api/specs/${specId}/proposals`);

    expect(response.status).toBe(201);
  });
});
