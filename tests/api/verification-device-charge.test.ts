/**
 * The SPICE check of a design whose only stored charge is the transistors' own (a card with
 * CJE, CJC, CJS and TF, no wiring or load capacitance): the rejection corner is read from the
 * simulated sweep and held to the engine's within the engine issue's 20 % (not left without a
 * simulated value, as if nothing in the circuit moved with frequency). The card is invented.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ProposalVerificationResult } from '#shared/verification/types';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';
import { settledJob } from '../helpers/verification-jobs';

const CARD = { IS: 9e-15, BF: 180, VAF: 72, CJE: 14e-12, CJC: 5e-12, CJS: 2.5e-12, TF: 0.5e-9 };


describe('the SPICE check of a design whose transistors store charge', () => {
  let api: TestApi;
  let reviewer: ApiClient;
  let projectId: number;

  beforeAll(async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
    projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Harlowmere drift probe')).id;
    reviewer = await api.agentFor('reviewer');
  }, 60_000);
  afterAll(() => api.close());

  it('sweeps for the rejection corner with no wiring or load capacitance, and the corner agrees within 20 %', async () => {
    // Arrange: a simple mirror, whose output transistor's CJC and CJS set a corner in the megahertz
    const payload = { ...specPayload(), device: { model: CARD }, topologies: ['simple-mirror'], tailCapacitanceF: 0, loadCapacitanceF: 0 };
    const spec = await api.createSpec(projectId, { payload });
    const proposal = await api.createProposal(spec.id);

    // Act
    await reviewer.post(`/api/proposals/${proposal.id}/verification`).expect(202);
    const { job } = await settledJob(reviewer, proposal.id);

    // Assert
    expect(job.state).toBe('finished');
    const option = (job.result as ProposalVerificationResult).options[0];
    expect(option.outcome, option.error ?? '').toBe('verified');
    const corner = option.nominal!.figures.find((f) => f.key === 'cmrrCornerHz')!;
    expect(corner.predicted).not.toBeNull();
    expect(corner.simulated).not.toBeNull();
    expect(Math.abs(corner.predicted! / corner.simulated! - 1)).toBeLessThanOrEqual(0.2);
    expect(corner.agrees).toBe(true);
  }, 180_000);
});
