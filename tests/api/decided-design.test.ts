/**
 * What is decided is what is shown, verified, exported and signed off. One story over HTTP (the
 * steps build on each other, so they run in order): a proposal ranked, the designer's own values
 * decided and simulated in ngspice, sent back, decided again with other values (RC and the pair's
 * emitter resistors changed); the old result is then stale and says what changed, the sign-off is
 * refused until a fresh run, the fresh run is recorded with the sign-off, and the page, the list,
 * the netlist and the export all name the signed-off design. Then the rules of a sign-off on a
 * design short on a blocking check, and a result stored before fingerprints were recorded.
 *
 * The values are E96 resistors near the engine's sizing for the invented spec (RC 2.26 kΩ, pair
 * RE 82.5 Ω); the stale wording is written here as a designer would read it.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Design } from '#shared/engine/types';
import { VerificationJobEntity } from '../../api/entities/verification-job.entity';
import type { OptionVerification, ProposalVerificationResult, VerificationJobView, VerificationStatus } from '#shared/verification/types';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';
import { settledJob, type JobPick } from '../helpers/verification-jobs';

let api: TestApi;
let designer: ApiClient;
let reviewer: ApiClient;
let projectId: number;
let specId: number;

/** Two tail options keep each SPICE check short. */
const payload = () => ({ ...specPayload(), title: 'Quillon sensor head — decided design', topologies: ['degenerated-mirror', 'cascode'] });

const story = {
  proposalId: 0,
  recommended: '',
  ranked: null as Design | null,
  firstJobId: 0,
  freshJobId: 0,
  firstResult: null as ProposalVerificationResult | null,
};

const url = (suffix = '') => `/api/proposals/${story.proposalId}${suffix}`;
const withValues = (rcOhm: number, pairReOhm: number): Design => ({ ...story.ranked!, collectorResistanceOhm: rcOhm, pairEmitterResistanceOhm: pairReOhm });
const FIRST = { rc: 2210, re: 78.7 };
const SECOND = { rc: 2490, re: 100 };

/** The picked job of the story's proposal (or another), once settled, as the reviewer sees it. */
async function settled(pick: JobPick, proposalId = story.proposalId): Promise<VerificationJobView> {
  return (await settledJob(reviewer, proposalId, pick, { pollMs: 100 })).job;
}

async function status(): Promise<VerificationStatus> {
  return (await reviewer.get(url('/verification')).expect(200)).body as VerificationStatus;
}

/** The RC1 value in an exported netlist, ohms. */
function netlistRc(text: string): number {
  const line = text.split('\n').find((l) => /^RC1\s/i.test(l));
  expect(line, 'the netlist has RC1').toBeDefined();
  return Number(line!.trim().split(/\s+/)[3]);
}

async function listItem(id: number) {
  const list = await designer.get(`/api/projects/${projectId}/proposals`).expect(200);
  return (list.body.items as { id: number; currentDesign: Record<string, unknown> | null }[]).find((p) => p.id === id)!;
}

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
  projectId = (await api.createProject(['requirements', 'designer', 'reviewer'])).id;
  specId = (await api.createSpec(projectId, { payload: payload() })).id;
  [designer, reviewer] = await Promise.all([api.agentFor('designer'), api.agentFor('reviewer')]);
});

afterAll(async () => {
  await api?.close();
});

describe('when own values are decided, sent back and decided again with other values', () => {
  test('when the proposal is ranked, then its current design is the recommendation, on the page and in the project list', async () => {
    const response = await designer.post(`/api/specs/${specId}/proposals`).send({});
    expect(response.status).toBe(201);
    story.proposalId = response.body.id;
    story.recommended = response.body.result.recommended;
    story.ranked = response.body.result.options.find((o: { topology: string }) => o.topology === story.recommended).design;
    expect(story.recommended).toBe('degenerated-mirror');

    const proposal = (await designer.get(url()).expect(200)).body;
    expect(proposal.currentDesign).toMatchObject({ basis: 'recommendation', topology: 'degenerated-mirror', ownValues: false, decisionId: null, differsFromRecommendation: false });
    expect((await listItem(story.proposalId)).currentDesign).toMatchObject({ basis: 'recommendation', topology: 'degenerated-mirror' });
  });

  test('when the designer decides own values, then they are the current design everywhere, with the recommendation and the reason beside them', async () => {
    const reason = 'Stock values from the bench drawer: RC 2.21 kΩ and 78.7 Ω emitter resistors.';
    const response = await designer.post(url('/decision')).send({ kind: 'override', design: withValues(FIRST.rc, FIRST.re), reason });
    expect(response.status).toBe(201);
    const decisionId = response.body.decisions.at(-1).id;

    expect(response.body.currentDesign).toMatchObject({ basis: 'decision', topology: 'degenerated-mirror', ownValues: true, decisionId, recommended: 'degenerated-mirror', differsFromRecommendation: true, reason });
    expect(response.body.currentDesign.design.collectorResistanceOhm).toBe(FIRST.rc);
    expect(response.body.currentDesign.binding.inputs).toMatchObject({ specVersion: 1, design: { collectorResistanceOhm: FIRST.rc, pairEmitterResistanceOhm: FIRST.re } });
    expect(response.body.currentDesign.binding.fingerprint).toMatch(/^[0-9a-f]{64}$/);
    expect((await listItem(story.proposalId)).currentDesign).toMatchObject({ basis: 'decision', ownValues: true, recommended: 'degenerated-mirror', differsFromRecommendation: true, reason });
  });

  test('when the SPICE check runs, then the own values’ result records exactly what it simulated and is current', async () => {
    const asked = await reviewer.post(url('/verification')).send({});
    expect(asked.status).toBe(202);
    const job = await settled((s) => s.verification);
    expect(job.state).toBe('finished');
    story.firstJobId = job.id;
    story.firstResult = job.result as ProposalVerificationResult;

    const own = story.firstResult.options.find((o) => o.source === 'decision')!;
    const proposal = (await reviewer.get(url()).expect(200)).body;
    expect(own.binding?.inputs.design.collectorResistanceOhm).toBe(FIRST.rc);
    expect(own.binding?.inputs.design.pairEmitterResistanceOhm).toBe(FIRST.re);
    expect(own.binding?.fingerprint).toBe(proposal.currentDesign.binding.fingerprint);
    // Every ranked option is bound too, to the ranking's own values.
    for (const option of story.firstResult.options.filter((o) => o.source === 'option')) expect(option.binding?.inputs.topology).toBe(option.topology);
    expect((await status()).currentDesign).toEqual({ state: 'current', jobId: job.id, changes: [] });
  });

  test('when the reviewer sends it back and the designer decides again with RC and the pair’s RE changed, then the earlier result is stale and says what changed', async () => {
    await reviewer.post(url('/review')).send({ verdict: 'return', comment: 'Use the 2.49 kΩ parts from the new reel, and more degeneration.' }).expect(201);
    const response = await designer.post(url('/decision')).send({ kind: 'override', design: withValues(SECOND.rc, SECOND.re), reason: 'New reel: 2.49 kΩ; 100 Ω emitter resistors.' });
    expect(response.status).toBe(201);

    const state = (await status()).currentDesign!;
    expect(state.state).toBe('stale');
    expect(state.jobId).toBe(story.firstJobId);
    expect(state.changes).toContain('simulated RC 2.21 kΩ, decided 2.49 kΩ');
    expect(state.changes).toContain('simulated pair RE 78.7 Ω, decided 100 Ω');
    expect(state.changes).toHaveLength(2);
  });

  test('when the reviewer signs off on the stale result alone, then 409 says what changed and how to go on, and nothing changes', async () => {
    const response = await reviewer.post(url('/review')).send({ verdict: 'approve', comment: 'Looks fine.' });

    expect(response.status).toBe(409);
    expect(response.body.code).toBe('verification-stale');
    expect(response.body.error).toContain('simulated RC 2.21 kΩ, decided 2.49 kΩ');
    expect(response.body.error).toContain('acceptStaleVerification');
    expect((await reviewer.get(url()).expect(200)).body.status).toBe('decided');
  });

  test('when the reviewer accepts the stale result without a comment, then 400 names the comment field', async () => {
    for (const comment of [undefined, '   ']) {
      const response = await reviewer.post(url('/review')).send({ verdict: 'approve', acceptStaleVerification: true, ...(comment === undefined ? {} : { comment }) });
      expect(response.status).toBe(400);
      expect(response.body.details.map((d: { path: string }) => d.path)).toEqual(['/comment']);
    }
  });

  test('when the flag comes with sending back, then 400 names the flag (it belongs to a sign-off)', async () => {
    const response = await reviewer.post(url('/review')).send({ verdict: 'return', comment: 'Again.', acceptStaleVerification: true });
    expect(response.status).toBe(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toEqual(['/acceptStaleVerification']);
  });

  test('when a SPICE Monte Carlo of the decided design is asked for, then it simulates the own values and is bound to them', async () => {
    const asked = await reviewer.post(url('/verification/monte-carlo')).send({ source: 'decision', runs: 10 });
    expect(asked.status).toBe(202);
    expect(asked.body).toMatchObject({ kind: 'monte-carlo', source: 'decision', topology: 'degenerated-mirror' });
    const job = await settled((s) => s.monteCarlo.find((j) => j.source === 'decision'));
    expect(job.state).toBe('finished');
    const proposal = (await reviewer.get(url()).expect(200)).body;
    const result = job.result as { source: string; binding: { fingerprint: string; inputs: { design: Design } } };
    expect(result.source).toBe('decision');
    expect(result.binding.inputs.design.collectorResistanceOhm).toBe(SECOND.rc);
    expect(result.binding.fingerprint).toBe(proposal.currentDesign.binding.fingerprint);
  });

  test('when a fresh SPICE check runs, then it is current for the decided design', async () => {
    await reviewer.post(url('/verification')).send({}).expect(202);
    const job = await settled((s) => (s.verification && s.verification.id !== story.firstJobId ? s.verification : null));
    expect(job.state).toBe('finished');
    story.freshJobId = job.id;
    const own = (job.result as ProposalVerificationResult).options.find((o) => o.source === 'decision')!;
    expect(own.binding?.inputs.design.collectorResistanceOhm).toBe(SECOND.rc);
    expect((await status()).currentDesign).toEqual({ state: 'current', jobId: job.id, changes: [] });
  });

  test('when the reviewer signs off, then the review records the fresh job it relied on, and the audit trail says so', async () => {
    const response = await reviewer.post(url('/review')).send({ verdict: 'approve' });

    expect(response.status).toBe(201);
    expect(response.body.status).toBe('approved');
    expect(response.body.reviews.at(-1)).toMatchObject({ verdict: 'approve', verificationJobId: story.freshJobId, staleVerificationAccepted: false });
    const audit = (await reviewer.get(url('/audit')).expect(200)).body.items as { action: string; details: Record<string, unknown> }[];
    expect(audit.at(-1)).toMatchObject({ action: 'proposal.approved', details: { verificationJobId: story.freshJobId, staleVerificationAccepted: false, topology: 'degenerated-mirror', ownValues: true } });
  });

  test('when the design is handed on, then the page, the list, the netlist and the export all name the signed-off own values', async () => {
    const proposal = (await designer.get(url()).expect(200)).body;
    expect(proposal.currentDesign).toMatchObject({ basis: 'decision', ownValues: true, topology: 'degenerated-mirror' });
    expect(proposal.currentDesign.design.collectorResistanceOhm).toBe(SECOND.rc);
    expect((await listItem(story.proposalId)).currentDesign).toMatchObject({ basis: 'decision', ownValues: true, topology: 'degenerated-mirror' });

    const netlist = await designer.get(url('/netlist.cir?source=decision')).expect(200);
    expect(netlistRc(netlist.text)).toBeCloseTo(SECOND.rc, 6);
    expect(netlist.text).toMatch(/signed-off design, Degenerated mirror, own values/);

    const exported = (await designer.get(url('/export.json')).expect(200)).body;
    expect(exported.proposal.currentDesign.design.collectorResistanceOhm).toBe(SECOND.rc);
    expect(exported.verification.currentDesign).toEqual({ state: 'current', jobId: story.freshJobId, changes: [] });
    const own = (exported.verification.verification.result as ProposalVerificationResult).options.find((o: OptionVerification) => o.source === 'decision')!;
    expect(own.binding?.fingerprint).toBe(exported.proposal.currentDesign.binding.fingerprint);
  });
});

describe('when a decided design is short on a blocking check', () => {
  test('when the reviewer signs off without a comment, then 400 names the comment; with one, 201 and no verification relied on', async () => {
    const proposalId = (await designer.post(`/api/specs/${specId}/proposals`).send({}).expect(201)).body.id;
    // RC 2 kΩ gives too little gain for the spec's 14 V/V ± 8 %.
    const decided = await designer.post(`/api/proposals/${proposalId}/decision`).send({ kind: 'override', design: withValues(2000, 82.5), reason: 'Trying the lower gain on purpose.' });
    expect(decided.status).toBe(201);
    const shortfalls = decided.body.currentDesign.option.checks.filter((c: { passed: boolean; severity: string }) => !c.passed && c.severity === 'blocking');
    expect(shortfalls.length).toBeGreaterThan(0);

    for (const comment of [undefined, '', '  \n ']) {
      const response = await reviewer.post(`/api/proposals/${proposalId}/review`).send({ verdict: 'approve', ...(comment === undefined ? {} : { comment }) });
      expect(response.status).toBe(400);
      expect(response.body.details).toEqual([expect.objectContaining({ path: '/comment', message: expect.stringMatching(/blocking check/) })]);
    }
    expect((await reviewer.get(`/api/proposals/${proposalId}`).expect(200)).body.status).toBe('decided');

    const response = await reviewer.post(`/api/proposals/${proposalId}/review`).send({ verdict: 'approve', comment: 'Lower gain agreed with the systems engineer for this build.' });
    expect(response.status).toBe(201);
    expect(response.body.reviews.at(-1)).toMatchObject({ verificationJobId: null, staleVerificationAccepted: false });
  });
});

describe('when the only verification was stored before results recorded what they simulated', () => {
  test('when it is read, then it is "unbound"; a sign-off needs the flag and a comment, and records the acceptance', async () => {
    const proposalId = (await designer.post(`/api/specs/${specId}/proposals`).send({}).expect(201)).body.id;
    await designer.post(`/api/proposals/${proposalId}/decision`).send({ kind: 'override', design: withValues(FIRST.rc, FIRST.re), reason: 'Bench drawer values.' }).expect(201);
    // A result as older servers stored it: the same figures, no binding.
    const old = { ...story.firstResult!, options: story.firstResult!.options.map(({ binding: _binding, ...rest }) => rest) };
    const now = new Date().toISOString();
    const saved = await api.dataSource.getRepository(VerificationJobEntity).save({
      proposalId,
      kind: 'proposal',
      topology: null,
      source: 'option',
      runs: null,
      state: 'finished',
      done: 1,
      total: 1,
      step: null,
      message: null,
      result: old as ProposalVerificationResult,
      requestedById: api.users.reviewer.id,
      claimToken: null,
      heartbeatAt: null,
      createdAt: now,
      startedAt: now,
      finishedAt: now,
    });

    const read = (await reviewer.get(`/api/proposals/${proposalId}/verification`).expect(200)).body as VerificationStatus;
    expect(read.currentDesign).toEqual({ state: 'unbound', jobId: saved.id, changes: [] });
    expect((read.verification!.result as ProposalVerificationResult).options.find((o) => o.source === 'decision')!.nominal).not.toBeNull();

    const refused = await reviewer.post(`/api/proposals/${proposalId}/review`).send({ verdict: 'approve', comment: 'Fine.' });
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('verification-stale');

    const comment = 'The old run simulated these very values (see the figures); a fresh run is queued for the record.';
    const response = await reviewer.post(`/api/proposals/${proposalId}/review`).send({ verdict: 'approve', acceptStaleVerification: true, comment });
    expect(response.status).toBe(201);
    expect(response.body.reviews.at(-1)).toMatchObject({ verificationJobId: saved.id, staleVerificationAccepted: true, comment });
  });
});
