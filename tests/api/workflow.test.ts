/**
 * The whole workflow over HTTP, as one story (each step builds on the one before, so the tests
 * run in order): a spec written and revised, a proposal ranked, accepted, returned, chosen
 * again, returned, overridden with an own design, approved; every illegal step answers 409
 * with what is allowed now; the audit trail tells the story; the list pages and filters.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { ENGINE_VERSION } from '#shared/engine/index';
import type { Design } from '#shared/engine/types';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let requirements: ApiClient;
let designer: ApiClient;
let reviewer: ApiClient;
let reviewer2: ApiClient;
let projectId: number;

const TITLE = 'Quillon sensor head — thermopile input pair';
const REVISED_TITLE = `${TITLE} (rev 2)`;
/** Revision 2: a tighter power budget and a cooler enclosure (invented). */
const revisedPayload = () => ({ ...specPayload(), powerBudgetW: 0.028, temperatureC: { min: 0, max: 60 } });

/** What the story's steps hand on to the next. */
const story = {
  specId: 0,
  proposalId: 0,
  recommended: '',
  decisionIds: [] as number[],
  reviewIds: [] as number[],
  overrideDesign: null as Design | null,
};

beforeAll(async () => {
  api = await buildApiApp();
  projectId = (await api.createProject()).id;
  [requirements, designer, reviewer, reviewer2] = await Promise.all((['requirements', 'designer', 'reviewer', 'reviewer2'] as const).map((key) => api.agentFor(key)));
});

afterAll(async () => {
  await api?.close();
});

const proposalUrl = (suffix = '') => `/api/proposals/${story.proposalId}${suffix}`;

describe('when a requirements author writes and revises a spec', () => {
  test('when the spec is created with some optional fields left out, then 201 with version 1 and the defaults filled in', async () => {
    const response = await requirements.post(`/api/projects/${projectId}/specs`).send({ title: TITLE, payload: specPayload() });

    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({ id: expect.any(Number), projectId, title: TITLE, latestVersion: 1 });
    expect(response.body.latest.version).toBe(1);
    expect(response.body.latest.payload).toMatchObject({
      ...specPayload(),
      device: { ...(specPayload().device as object), family: 'npn', vbeOnV: 0.65, vceSatV: 0.2, vbeMismatchSigmaV: 0.001 },
      temperatureC: { min: 0, max: 70 },
      resistors: { series: 'E96', tolerancePercent: 1 },
      tailCapacitanceF: 0,
      topologies: ['resistor', 'simple-mirror', 'degenerated-mirror', 'widlar', 'wilson', 'cascode'],
      policy: 'simplest-sufficient',
      hazards: { patientConnected: false, mainsReferenced: false },
    });
    story.specId = response.body.id;
  });

  test('when a title has spaces around it, then the spec, its version and its document all keep the same trimmed title', async () => {
    const response = await requirements.post(`/api/projects/${projectId}/specs`).send({ title: '  Quillon spare channel  ', payload: specPayload() });

    expect(response.status).toBe(201);
    expect(response.body.title).toBe('Quillon spare channel');
    expect(response.body.latest.title).toBe('Quillon spare channel');
    expect(response.body.latest.payload.title).toBe('Quillon spare channel');
  });

  test('when the spec is edited, then PUT answers version 2 and the spec shows it as latest', async () => {
    const response = await requirements.put(`/api/specs/${story.specId}`).send({ title: REVISED_TITLE, payload: revisedPayload() });

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ id: story.specId, title: REVISED_TITLE, latestVersion: 2 });
    expect(response.body.latest).toMatchObject({ version: 2, title: REVISED_TITLE });
    const fetched = await designer.get(`/api/specs/${story.specId}`);
    expect(fetched.body.latest.payload.powerBudgetW).toBe(0.028);
  });

  test('when the versions are listed, then both are there in order, the first unchanged', async () => {
    const response = await designer.get(`/api/specs/${story.specId}/versions`);

    expect(response.status).toBe(200);
    expect(response.body.items.map((v: { version: number }) => v.version)).toEqual([1, 2]);
    expect(response.body.items[0].payload.powerBudgetW).toBe(0.03);
    expect(response.body.items[0].title).toBe(TITLE);
  });

  test('when versions 1 and 2 are compared, then the diff lists exactly the changed field paths', async () => {
    const response = await designer.get(`/api/specs/${story.specId}/diff?from=1&to=2`);

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ from: 1, to: 2 });
    expect(response.body.changes).toEqual([
      { path: '/powerBudgetW', kind: 'changed', before: 0.03, after: 0.028 },
      { path: '/temperatureC/max', kind: 'changed', before: 70, after: 60 },
      { path: '/title', kind: 'changed', before: TITLE, after: REVISED_TITLE },
    ]);
  });
});

describe('when a designer asks for a proposal on the spec', () => {
  test('when it is created, then 201 ranked with the engine and rule-set versions, every option checked, on the latest spec version', async () => {
    const response = await designer.post(`/api/specs/${story.specId}/proposals`);

    expect(response.status).toBe(201);
    const proposal = response.body;
    expect(proposal).toMatchObject({ status: 'ranked', specId: story.specId, projectId, engineVersion: ENGINE_VERSION, rulesetVersion: api.ruleSet.version, allowedEvents: ['decide', 'withdraw'] });
    expect(proposal.specVersion).toMatchObject({ version: 2, title: REVISED_TITLE });
    expect(proposal.specVersion.payload.powerBudgetW).toBe(0.028);
    expect(proposal.result.recommended).toEqual(expect.any(String));
    expect(proposal.recommendedTopology).toBe(proposal.result.recommended);
    const ruleNames = api.ruleSet.rules.map((r) => r.rule).sort();
    expect(proposal.result.options).toHaveLength(6);
    for (const option of proposal.result.options) {
      expect(option.checks.map((c: { rule: string }) => c.rule).sort(), option.topology).toEqual(ruleNames);
    }
    expect(proposal.decisions).toEqual([]);
    story.proposalId = proposal.id;
    story.recommended = proposal.result.recommended;
  });
});

describe('when the proposal goes through decisions and reviews', () => {
  test('when the designer accepts the recommendation, then 201 decided with an accept decision on the recommended option', async () => {
    const response = await designer.post(proposalUrl('/decision')).send({ kind: 'accept' });

    expect(response.status).toBe(201);
    expect(response.body.status).toBe('decided');
    expect(response.body.allowedEvents).toEqual(['approve', 'return', 'withdraw']);
    expect(response.body.decisions).toHaveLength(1);
    const [decision] = response.body.decisions;
    const option = response.body.result.options.find((o: { topology: string }) => o.topology === story.recommended);
    expect(decision).toMatchObject({ kind: 'accept', topology: story.recommended, reason: null, evaluation: null, decidedById: api.users.designer.id });
    expect(decision.design).toEqual(option.design);
    story.decisionIds.push(decision.id);
  });

  test('when the reviewer returns it without a comment, then 400 at /comment and it stays decided', async () => {
    const response = await reviewer.post(proposalUrl('/review')).send({ verdict: 'return' });

    expect(response.status).toBe(400);
    expect(response.body.details).toContainEqual(expect.objectContaining({ path: '/comment' }));
    expect((await reviewer.get(proposalUrl())).body.status).toBe('decided');
  });

  test('when the reviewer returns it with a comment, then 201 returned with the review', async () => {
    const comment = 'The hot corner margin on rejection is thin; show me an option with more headroom.';

    const response = await reviewer.post(proposalUrl('/review')).send({ verdict: 'return', comment });

    expect(response.status).toBe(201);
    expect(response.body.status).toBe('returned');
    expect(response.body.allowedEvents).toEqual(['decide', 'withdraw']);
    expect(response.body.reviews).toHaveLength(1);
    expect(response.body.reviews[0]).toMatchObject({ verdict: 'return', comment, reviewerId: api.users.reviewer.id, decisionId: story.decisionIds[0] });
    story.reviewIds.push(response.body.reviews[0].id);
  });

  test('when the designer chooses another option without a reason, then 400 at /reason and it stays returned', async () => {
    const response = await designer.post(proposalUrl('/decision')).send({ kind: 'choose', topology: 'wilson' });

    expect(response.status).toBe(400);
    expect(response.body.details).toContainEqual(expect.objectContaining({ path: '/reason' }));
    expect((await designer.get(proposalUrl())).body.status).toBe('returned');
  });

  test('when the designer chooses another ranked option with a reason, then 201 decided with that option’s design', async () => {
    // Arrange: a ranked option other than the recommendation.
    const before = (await designer.get(proposalUrl())).body;
    const other = before.result.options.find((o: { topology: string; design: Design | null }) => o.topology !== story.recommended && o.design);
    const reason = `The ${other.topology} gives more rejection headroom at the hot corner, as the reviewer asked.`;

    // Act
    const response = await designer.post(proposalUrl('/decision')).send({ kind: 'choose', topology: other.topology, reason });

    // Assert
    expect(response.status).toBe(201);
    expect(response.body.status).toBe('decided');
    expect(response.body.decisions).toHaveLength(2);
    const decision = response.body.decisions[1];
    expect(decision).toMatchObject({ kind: 'choose', topology: other.topology, reason, evaluation: null });
    expect(decision.design).toEqual(other.design);
    story.decisionIds.push(decision.id);
  });

  test('when a second reviewer returns the choice with a comment, then 201 returned', async () => {
    const response = await reviewer2.post(proposalUrl('/review')).send({ verdict: 'return', comment: 'Try the stock resistors from the last build before committing.' });

    expect(response.status).toBe(201);
    expect(response.body.status).toBe('returned');
    story.reviewIds.push(response.body.reviews[1].id);
  });

  test('when the designer overrides with an option’s design with one resistor changed, then 201 decided with the override’s own evaluation', async () => {
    // Arrange: the recommended option's design, its tail reference resistor one E96 step lower.
    const before = (await designer.get(proposalUrl())).body;
    const option = before.result.options.find((o: { topology: string }) => o.topology === story.recommended);
    const design: Design = { ...option.design, tail: { ...option.design.tail, referenceResistanceOhm: 25500 } };
    expect(option.design.tail.referenceResistanceOhm).not.toBe(25500);
    const reason = 'Reels of 25.5 kΩ on hand; the tail current rises a few per cent and stays inside the budget.';

    // Act
    const response = await designer.post(proposalUrl('/decision')).send({ kind: 'override', design, reason });

    // Assert
    expect(response.status).toBe(201);
    expect(response.body.status).toBe('decided');
    expect(response.body.decisions).toHaveLength(3);
    const decision = response.body.decisions[2];
    expect(decision).toMatchObject({ kind: 'override', topology: design.tail.topology, reason });
    expect(decision.design).toMatchObject(design);
    const evaluation = decision.evaluation;
    expect(evaluation.checks.map((c: { rule: string }) => c.rule).sort()).toEqual(api.ruleSet.rules.map((r) => r.rule).sort());
    expect(evaluation.passes).toEqual(expect.any(Boolean));
    expect(evaluation.predicted.tailCurrentA).toBeGreaterThan(option.predicted.tailCurrentA);
    expect(evaluation.figures).toMatchObject({ topology: story.recommended, cmrrAtFrequencyDb: expect.any(Number), powerWorstW: expect.any(Number), gainPredicted: expect.any(Number) });
    story.decisionIds.push(decision.id);
    story.overrideDesign = design;
  });

  test('when the reviewer approves, then 201 approved and nothing is allowed any more', async () => {
    const response = await reviewer.post(proposalUrl('/review')).send({ verdict: 'approve', comment: 'The override holds every blocking check.' });

    expect(response.status).toBe(201);
    expect(response.body.status).toBe('approved');
    expect(response.body.allowedEvents).toEqual([]);
    expect(response.body.reviews[2]).toMatchObject({ verdict: 'approve', decisionId: story.decisionIds[2], reviewerId: api.users.reviewer.id });
    story.reviewIds.push(response.body.reviews[2].id);
  });

  test('when the audit trail is read, then every step is there in order with its actor and before/after ids', async () => {
    const response = await requirements.get(proposalUrl('/audit'));

    expect(response.status).toBe(200);
    const steps = response.body.items.map((e: { action: string; actorId: number; beforeId: number | null; afterId: number | null; proposalId: number }) => ({
      action: e.action,
      actorId: e.actorId,
      beforeId: e.beforeId,
      afterId: e.afterId,
      proposalId: e.proposalId,
    }));
    const { designer: d, reviewer: r, reviewer2: r2 } = api.users;
    const [d1, d2, d3] = story.decisionIds;
    const [v1, v2, v3] = story.reviewIds;
    const proposalId = story.proposalId;
    expect(steps).toEqual([
      { action: 'proposal.ranked', actorId: d.id, beforeId: null, afterId: proposalId, proposalId },
      { action: 'proposal.decided', actorId: d.id, beforeId: null, afterId: d1, proposalId },
      { action: 'proposal.returned', actorId: r.id, beforeId: d1, afterId: v1, proposalId },
      { action: 'proposal.decided', actorId: d.id, beforeId: d1, afterId: d2, proposalId },
      { action: 'proposal.returned', actorId: r2.id, beforeId: d2, afterId: v2, proposalId },
      { action: 'proposal.decided', actorId: d.id, beforeId: d2, afterId: d3, proposalId },
      { action: 'proposal.approved', actorId: r.id, beforeId: d3, afterId: v3, proposalId },
    ]);
    const times = response.body.items.map((e: { at: string }) => e.at);
    expect([...times].sort()).toEqual(times);
    expect(response.body.items.map((e: { details: { kind?: string } }) => e.details.kind).filter(Boolean)).toEqual(['accept', 'choose', 'override']);
  });
});

describe('when a step is not allowed in the proposal’s state, then 409 says what is allowed now and nothing changes', () => {
  /** A second proposal, decided; a third, ranked. */
  const extra = { decided: 0, ranked: 0 };

  beforeAll(async () => {
    const decided = await api.createProposal(story.specId);
    await designer.post(`/api/proposals/${decided.id}/decision`).send({ kind: 'accept' }).expect(201);
    extra.decided = decided.id;
    extra.ranked = (await api.createProposal(story.specId)).id;
  });

  const trailOf = async (id: number) => (await designer.get(`/api/proposals/${id}/audit`)).body.items.length;

  test.each([
    ['a decision on a decided proposal', () => designer.post(`/api/proposals/${extra.decided}/decision`).send({ kind: 'accept' }), () => extra.decided, /is decided.*Allowed now: approve, return, withdraw\./],
    ['an approval of a ranked proposal', () => reviewer.post(`/api/proposals/${extra.ranked}/review`).send({ verdict: 'approve' }), () => extra.ranked, /is ranked.*Allowed now: decide, withdraw\./],
    ['a return of a ranked proposal', () => reviewer.post(`/api/proposals/${extra.ranked}/review`).send({ verdict: 'return', comment: 'Too early.' }), () => extra.ranked, /is ranked.*Allowed now: decide, withdraw\./],
    ['a decision on an approved proposal', () => designer.post(proposalUrl('/decision')).send({ kind: 'accept' }), () => story.proposalId, /is approved.*Nothing can change it now\./],
    ['a choice of another option on an approved proposal', () => designer.post(proposalUrl('/decision')).send({ kind: 'choose', topology: 'cascode', reason: 'Late change.' }), () => story.proposalId, /is approved.*Nothing can change it now\./],
    ['an override on an approved proposal', () => designer.post(proposalUrl('/decision')).send({ kind: 'override', design: story.overrideDesign, reason: 'Late change.' }), () => story.proposalId, /is approved.*Nothing can change it now\./],
    ['an approval of an approved proposal', () => reviewer2.post(proposalUrl('/review')).send({ verdict: 'approve' }), () => story.proposalId, /is approved.*Nothing can change it now\./],
    ['a return of an approved proposal', () => reviewer2.post(proposalUrl('/review')).send({ verdict: 'return', comment: 'Reopen.' }), () => story.proposalId, /is approved.*Nothing can change it now\./],
  ] as const)('when %s is asked for, then 409', async (_title, act, id, message) => {
    // Arrange
    const before = await designer.get(`/api/proposals/${id()}`);
    const trail = await trailOf(id());

    // Act
    const response = await act();

    // Assert
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('invalid-transition');
    expect(response.body.error).toMatch(message);
    const after = await designer.get(`/api/proposals/${id()}`);
    expect(after.body).toEqual(before.body);
    expect(await trailOf(id())).toBe(trail);
  });

  test('when a reviewer reviews the same decision twice, then the second answers 409 saying only a decision is allowed', async () => {
    // Arrange
    const first = await reviewer.post(`/api/proposals/${extra.decided}/review`).send({ verdict: 'return', comment: 'Show the cold corner too.' });
    expect(first.status).toBe(201);

    // Act
    const again = await reviewer2.post(`/api/proposals/${extra.decided}/review`).send({ verdict: 'approve' });
    const repeat = await reviewer.post(`/api/proposals/${extra.decided}/review`).send({ verdict: 'return', comment: 'Show the cold corner too.' });

    // Assert
    for (const response of [again, repeat]) {
      expect(response.status).toBe(409);
      expect(response.body.error).toMatch(/is returned.*Allowed now: decide, withdraw\./);
    }
    expect((await reviewer.get(`/api/proposals/${extra.decided}`)).body.reviews).toHaveLength(1);
  });

  test('when two designers decide the same ranked proposal at once, then one gets 201, the other 409, and one decision is stored', async () => {
    const designer2 = await api.agentFor('designer2');

    const responses = await Promise.all([
      designer.post(`/api/proposals/${extra.ranked}/decision`).send({ kind: 'accept' }),
      designer2.post(`/api/proposals/${extra.ranked}/decision`).send({ kind: 'choose', topology: 'cascode', reason: 'More rejection for the same parts count.' }),
    ]);

    expect(responses.map((r) => r.status).sort()).toEqual([201, 409]);
    const after = (await designer.get(`/api/proposals/${extra.ranked}`)).body;
    expect(after.status).toBe('decided');
    expect(after.decisions).toHaveLength(1);
    expect((await designer.get(`/api/proposals/${extra.ranked}/audit`)).body.items.map((e: { action: string }) => e.action)).toEqual(['proposal.ranked', 'proposal.decided']);
  });

  test('when two reviewers approve the same decision at once, then one gets 201, the other 409, and one review is stored', async () => {
    const responses = await Promise.all([
      reviewer.post(`/api/proposals/${extra.ranked}/review`).send({ verdict: 'approve' }),
      reviewer2.post(`/api/proposals/${extra.ranked}/review`).send({ verdict: 'approve' }),
    ]);

    expect(responses.map((r) => r.status).sort()).toEqual([201, 409]);
    const after = (await reviewer.get(`/api/proposals/${extra.ranked}`)).body;
    expect(after.status).toBe('approved');
    expect(after.reviews).toHaveLength(1);
  });
});

describe('when the project’s proposals are listed', () => {
  // By now: the story's proposal approved, the second returned, the third approved after the race (newest first).
  test('when a page size of 2 is asked for, then pages hold 2 and 1 proposals, newest first, with the total', async () => {
    const page1 = await designer.get(`/api/projects/${projectId}/proposals?page=1&pageSize=2`);
    const page2 = await designer.get(`/api/projects/${projectId}/proposals?page=2&pageSize=2`);

    expect(page1.status).toBe(200);
    expect(page1.body).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(page2.body).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    const ids = [...page1.body.items, ...page2.body.items].map((p: { id: number }) => p.id);
    expect(ids).toHaveLength(3);
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
    expect(ids[2]).toBe(story.proposalId);
    expect(page1.body.items[0]).not.toHaveProperty('result');
  });

  test('when no page is named, then the first page of 20 is answered', async () => {
    const response = await designer.get(`/api/projects/${projectId}/proposals`);

    expect(response.body).toMatchObject({ total: 3, page: 1, pageSize: 20 });
    expect(response.body.items).toHaveLength(3);
  });

  test.each([
    ['approved', 2],
    ['returned', 1],
    ['ranked', 0],
    ['decided', 0],
  ] as const)('when filtered by status %s, then %i proposal(s) of that status are listed', async (status, count) => {
    const response = await designer.get(`/api/projects/${projectId}/proposals?status=${status}`);

    expect(response.status).toBe(200);
    expect(response.body.total).toBe(count);
    expect(response.body.items).toHaveLength(count);
    for (const item of response.body.items) expect(item.status).toBe(status);
  });

  test('when a page past the end is asked for, then it is empty and the total still counts all', async () => {
    const response = await designer.get(`/api/projects/${projectId}/proposals?page=3&pageSize=2`);

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ items: [], total: 3, page: 3 });
  });

  test('when the page size is over the limit or the status unknown, then 400 with the query path', async () => {
    const tooBig = await designer.get(`/api/projects/${projectId}/proposals?pageSize=101`);
    const unknown = await designer.get(`/api/projects/${projectId}/proposals?status=shelved`);

    expect(tooBig.status).toBe(400);
    expect(tooBig.body.details).toContainEqual(expect.objectContaining({ path: '?pageSize' }));
    expect(unknown.status).toBe(400);
    expect(unknown.body.details).toContainEqual(expect.objectContaining({ path: '?status' }));
  });
});

describe('when the spec is revised after a proposal was made', () => {
  test('when the proposal is read again, then it still shows the spec version it was ranked on', async () => {
    await requirements.put(`/api/specs/${story.specId}`).send({ title: `${TITLE} (rev 3)`, payload: { ...revisedPayload(), powerBudgetW: 0.026 } }).expect(200);

    const response = await designer.get(proposalUrl());

    expect(response.body.specVersion).toMatchObject({ version: 2, title: REVISED_TITLE });
    expect(response.body.specVersion.payload.powerBudgetW).toBe(0.028);
  });
});

describe('when a design breaks a cross-field rule of the design schema (rails in the wrong order, common mode outside the rails)', () => {
  // shared/validate.ts validateDesign refuses these (the command line answers them with an error);
  // the JSON Schema alone cannot express them.
  const inverted = (design: Design): Design => ({ ...design, supply: { positiveV: design.supply.negativeV, negativeV: design.supply.positiveV } });
  let proposal: { id: number; design: Design };

  beforeAll(async () => {
    const created = await api.createProposal(story.specId);
    proposal = { id: created.id, design: created.result.options.find((o) => o.design)!.design! };
  });

  test('when a designer overrides with the rails swapped, then 400 at /design/supply/negativeV and no decision is stored', async () => {
    const response = await designer.post(`/api/proposals/${proposal.id}/decision`).send({ kind: 'override', design: inverted(proposal.design), reason: 'Rails swapped by mistake.' });

    expect(response.status).toBe(400);
    expect(response.body.details).toContainEqual(expect.objectContaining({ path: '/design/supply/negativeV' }));
    const after = (await designer.get(`/api/proposals/${proposal.id}`)).body;
    expect(after.status).toBe('ranked');
    expect(after.decisions).toEqual([]);
  });

  test.each([
    ['the rails swapped', '/supply/negativeV', (d: Design) => inverted(d)],
    ['the input common mode above the positive rail', '/inputCommonModeV', (d: Design) => ({ ...d, inputCommonModeV: d.supply.positiveV + 11 })],
  ] as const)('when POST /api/analyze gets a design with %s, then 400 at %s', async (_title, path, change) => {
    const response = await designer.post('/api/analyze').send(change(proposal.design));

    expect(response.status).toBe(400);
    expect(response.body.details).toContainEqual(expect.objectContaining({ path }));
  });
});
