/**
 * The SPICE check of a proposal whose spec was filled from a library card: ngspice simulates the
 * whole card (the parameters the engine does not model included), and where a figure then falls
 * outside the tolerance the result names its likely cause.
 *
 * The card is invented. Its TNOM = 0 °C is a parameter of ngspice's bipolar model the engine does
 * not model: SPICE reads the card's IS as its value at 0 °C and scales it to 27 °C with the
 * SPICE3 temperature law (SPICE3 User's Guide, bipolar model; ngspice bjttemp.c):
 *   IS(T) = IS · (T/T0)^XTI · exp(EG/VT(T) · (T/T0 − 1)),  XTI = 3, EG = 1.11 eV,
 * so at 27 °C (T = 300.15 K, T0 = 273.15 K) IS is 92 times the card's, and every VBE at a given
 * current is VT·ln(92) ≈ 117 mV lower than the engine's (which reads IS at 27 °C). The tail node
 * sits one VBE below the input common mode, so SPICE's tail node is ≈ 117 mV higher: outside the
 * 50 mV tolerance on node voltages, with the currents (set by ±12 V over the tail resistor) inside.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ProposalVerificationResult } from '#shared/verification/types';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';
import { settledJob } from '../helpers/verification-jobs';

const K_OVER_Q = 1.380649e-23 / 1.602176634e-19;
const CARD_FILE = '.model FH-TN0 NPN (IS=9f BF=180 VAF=72 TNOM=0)\n';


describe('the SPICE check of a spec filled from a library card', () => {
  let api: TestApi;
  let designer: ApiClient;
  let reviewer: ApiClient;
  let projectId: number;

  beforeAll(async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
    projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Tarnwick level probe')).id;
    [designer, reviewer] = await Promise.all([api.agentFor('designer'), api.agentFor('reviewer')]);
    await designer.post(`/api/projects/${projectId}/devices`).attach('file', Buffer.from(CARD_FILE, 'utf8'), 'tnom.lib').expect(201);
  }, 60_000);
  afterAll(() => api.close());

  it('simulates the card’s TNOM the engine does not model, and names it as the cause of the tail node’s difference', async () => {
    // Arrange: the spec takes the card's IS, BF, VAF and records the card; one resistor tail on ±12 V
    const checksum = createHash('sha256').update(CARD_FILE).digest('hex');
    const payload = {
      ...specPayload(),
      supply: { positiveV: 12, negativeV: -12 },
      inputCommonMode: { minV: -1, maxV: 1 },
      topologies: ['resistor'],
      device: { beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 },
      deviceModel: { name: 'FH-TN0', checksum },
    };
    const spec = await api.createSpec(projectId, { payload });
    const proposal = await api.createProposal(spec.id);

    // Act
    await reviewer.post(`/api/proposals/${proposal.id}/verification`).expect(202);
    const { job } = await settledJob(reviewer, proposal.id);

    // Assert
    expect(job.state).toBe('finished');
    const option = (job.result as ProposalVerificationResult).options[0];
    expect(option.outcome, option.error ?? '').toBe('verified');
    expect(option.card).toEqual({ name: 'FH-TN0', spiceOnlyParameters: ['TNOM'] });
    const tailNode = option.nominal!.figures.find((f) => f.key === 'tailNodeVoltageV')!;
    const t = 300.15;
    const t0 = 273.15;
    const vt = K_OVER_Q * t;
    const isRatio = (t / t0) ** 3 * Math.exp((1.11 / vt) * (t / t0 - 1));
    const expectedShiftV = vt * Math.log(isRatio);
    expect(expectedShiftV).toBeGreaterThan(0.1);
    // Engine minus SPICE: the engine's VBE is the higher one, so its tail node is lower
    expect(tailNode.delta!).toBeLessThan(-0.05);
    expect(Math.abs(tailNode.delta! + expectedShiftV)).toBeLessThan(0.1 * expectedShiftV);
    expect(tailNode.agrees).toBe(false);
    expect(tailNode.cause).toEqual({ kind: 'spice-only-parameters', parameters: ['TNOM'], saturated: [] });
    // The currents stay within tolerance: the difference is where the card's TNOM acts, no wider
    const tailCurrent = option.nominal!.figures.find((f) => f.key === 'tailCurrentA')!;
    expect(tailCurrent.agrees).toBe(true);
    expect(tailCurrent.cause).toBeUndefined();
  }, 150_000);

  it('exports the option’s netlist with the card’s TNOM on the live .model card', async () => {
    const checksum = createHash('sha256').update(CARD_FILE).digest('hex');
    const payload = { ...specPayload(), topologies: ['resistor'], device: { beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 }, deviceModel: { name: 'FH-TN0', checksum } };
    const spec = await api.createSpec(projectId, { payload });
    const proposal = await api.createProposal(spec.id);

    const response = await designer.get(`/api/proposals/${proposal.id}/netlist.cir?topology=resistor`).expect(200);

    const live = response.text.split('\n').filter((line) => /^\.model/i.test(line));
    expect(live).toEqual(['.model QNPN NPN (IS=9e-15 BF=180 VAF=72 TNOM=0)']);
    expect(response.text).toMatch(/^\* The \.model card below carries every parameter of the card; the engine does not model TNOM/m);
  });
});
