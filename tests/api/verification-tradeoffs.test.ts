/**
 * The trade-off figures in the SPICE check (ENGINE-CONTRACT.md, version 2 "New outputs"), held to
 * the contract's tolerances, not read from the product's constant: bias and offset currents 3 %,
 * offset voltage 3 % or 20 µV, drift 5 % or 0.1 µV/°C, noise density 5 %, bandwidth 10 %, slew
 * rate 10 %, linear range 5 %, PSRR 1.5 dB, input resistance 5 %. A proposal stored before the
 * engine predicted them lists them as not predicted (ngspice's value alone, never one the engine
 * would give now); a deliberately broken netlist makes a trade-off row disagree. The card and
 * the spec are invented.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { RecommendResult } from '#shared/engine/recommend';
import type { OptionVerification, ProposalVerificationResult, VerifiedFigure } from '#shared/verification/types';
import { ProposalEntity } from '../../api/entities/proposal.entity';
import { RankingEntity } from '../../api/entities/ranking.entity';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';
import { settledJob } from '../helpers/verification-jobs';

/** A small-signal NPN with junction capacitances and transit time (invented, typical of the kind). */
const CARD = { IS: 9e-15, BF: 180, VAF: 72, CJE: 14e-12, CJC: 5e-12, CJS: 2.5e-12, TF: 0.5e-9 };

const CONTRACT_PERCENT: Record<string, number> = {
  inputBiasCurrentA: 3,
  inputOffsetCurrentA: 3,
  inputResistanceOhm: 5,
  linearInputRangeV: 5,
  differentialBandwidthHz: 10,
  slewRateVPerS: 10,
  inputNoiseVPerRtHz: 5,
};
const CONTRACT_PSRR_DB = 1.5;

const TRADEOFF_FIELDS = ['inputBiasCurrentA', 'inputOffsetCurrentA', 'inputOffsetVoltageV', 'offsetDriftVPerC', 'linearInputRangeV', 'psrrDb', 'inputResistanceOhm', 'differentialBandwidthHz', 'slewRateVPerS'] as const;

function figure(option: OptionVerification, key: string): VerifiedFigure {
  const found = option.nominal!.figures.find((f) => f.key === key);
  expect(found, `${option.topology}: ${key} listed`).toBeDefined();
  return found!;
}

/** The difference computed here from the stored values, against the contract's tolerance. */
function expectWithinContract(f: VerifiedFigure): void {
  expect(f.predicted, f.key).not.toBeNull();
  expect(f.simulated, f.key).not.toBeNull();
  if (f.key.startsWith('psrrDb.')) {
    expect(Math.abs(f.predicted! - f.simulated!), f.label).toBeLessThanOrEqual(CONTRACT_PSRR_DB);
  } else {
    const percent = CONTRACT_PERCENT[f.key.replace(/@.*$/, '')];
    expect(Math.abs(f.predicted! / f.simulated! - 1) * 100, `${f.label}: engine ${f.predicted}, ngspice ${f.simulated}`).toBeLessThanOrEqual(percent);
  }
  expect(f.agrees, f.label).toBe(true);
}

/** Rewrites the proposal's stored ranking (as an older engine or a spec with a noise target would have stored it). */
async function rewriteRanking(api: TestApi, proposalId: number, change: (result: RecommendResult) => void): Promise<RecommendResult> {
  const { rankingId } = await api.dataSource.getRepository(ProposalEntity).findOneByOrFail({ id: proposalId });
  const repository = api.dataSource.getRepository(RankingEntity);
  const row = await repository.findOneByOrFail({ id: rankingId });
  const result = JSON.parse(row.result) as RecommendResult;
  change(result);
  await repository.update({ id: rankingId }, { result: JSON.stringify(result) });
  return result;
}

async function verified(reviewer: ApiClient, proposalId: number): Promise<OptionVerification[]> {
  await reviewer.post(`/api/proposals/${proposalId}/verification`).expect(202);
  const { job } = await settledJob(reviewer, proposalId, (s) => s.verification, { timeoutMs: 120_000 });
  expect(job.state).toBe('finished');
  expect(job.done).toBe(job.total);
  const options = (job.result as ProposalVerificationResult).options;
  for (const option of options) expect(option.outcome, `${option.topology}: ${option.error}`).toBe('verified');
  return options;
}

describe('the trade-off figures of a proposal made now', () => {
  let api: TestApi;
  let reviewer: ApiClient;
  let projectId: number;

  beforeAll(async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
    projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Tallowmere preamp')).id;
    reviewer = await api.agentFor('reviewer');
  }, 60_000);
  afterAll(() => api.close());

  it('lists input, supply and speed figures that agree with ngspice within the contract, and noise at the stored ac frequencies', async () => {
    // Arrange: devices and loads that store charge (a bandwidth to read); the stored prediction carries
    // noise at 1 kHz and 100 kHz, as a proposal does when its spec sets a noise target there.
    const payload = { ...specPayload(), device: { model: CARD }, topologies: ['simple-mirror', 'wilson'], tailCapacitanceF: 2e-12, loadCapacitanceF: 10e-12 };
    const spec = await api.createSpec(projectId, { payload });
    const proposal = await api.createProposal(spec.id);
    const stored = await rewriteRanking(api, proposal.id, (result) => {
      for (const option of result.options) {
        if (!option.design) continue;
        option.design = { ...option.design, frequenciesHz: [1e3, 1e5] };
        option.predicted = { ...option.predicted!, ac: analyze(option.design).ac };
      }
    });

    // Act
    const options = await verified(reviewer, proposal.id);

    // Assert
    for (const option of options) {
      for (const key of ['inputBiasCurrentA', 'inputResistanceOhm', 'linearInputRangeV', 'psrrDb.positive.singleEnded', 'psrrDb.negative.singleEnded', 'differentialBandwidthHz', 'inputNoiseVPerRtHz@1000', 'inputNoiseVPerRtHz@100000']) {
        expectWithinContract(figure(option, key));
      }
      // The slew rate is simulated exactly when the stored prediction has one (engines that predict it).
      const predicted = stored.options.find((o) => o.topology === option.topology)!.predicted as unknown as { slewRateVPerS?: number };
      if (typeof predicted.slewRateVPerS === 'number') expectWithinContract(figure(option, 'slewRateVPerS'));
      else expect(option.nominal!.figures.some((f) => f.key === 'slewRateVPerS')).toBe(false);
      // A ranked option's pair is matched: its offset figures are zero by symmetry, not simulated.
      for (const key of ['inputOffsetVoltageV', 'inputOffsetCurrentA', 'offsetDriftVPerC']) {
        const f = figure(option, key);
        expect(f.notCompared).toBe('matched-pair');
        expect(f.predicted).toBe(0);
        expect(f.simulated).toBeNull();
        expect(f.agrees).toBeNull();
      }
      // Groups in the table's order: operating point, gain and rejection, input, supply, speed.
      const groups = option.nominal!.figures.map((f) => f.group);
      expect(groups.every(Boolean)).toBe(true);
      expect([...new Set(groups)]).toEqual(['bias', 'gain', 'input', 'supply', 'speed']);
      expect(option.agrees).toBe(true);
    }
  }, 180_000);
});

describe('a proposal stored before the engine predicted the trade-off figures', () => {
  let api: TestApi;
  afterAll(() => api?.close());

  it('shows ngspice’s values as not predicted, with no engine value and no verdict', async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
    const project = await api.createProject(['requirements', 'designer', 'reviewer'], 'Ashcombe bridge');
    const spec = await api.createSpec(project.id, { payload: { ...specPayload(), topologies: ['simple-mirror', 'resistor'] } });
    const proposal = await api.createProposal(spec.id);
    await rewriteRanking(api, proposal.id, (result) => {
      for (const option of result.options) {
        const stored = option.predicted as unknown as Record<string, unknown>;
        for (const field of TRADEOFF_FIELDS) delete stored[field];
        stored.ac = (stored.ac as Record<string, unknown>[]).map(({ inputNoiseVPerRtHz: _dropped, ...rest }) => rest);
      }
    });
    const reviewer = await api.agentFor('reviewer');

    const options = await verified(reviewer, proposal.id);

    for (const option of options) {
      for (const key of ['inputBiasCurrentA', 'inputResistanceOhm', 'linearInputRangeV', 'psrrDb.positive.singleEnded', 'psrrDb.negative.singleEnded']) {
        const f = figure(option, key);
        expect(f.notCompared, key).toBe('not-predicted');
        expect(f.predicted, key).toBeNull();
        expect(f.simulated, key).not.toBeNull();
        expect(Number.isFinite(f.simulated!), key).toBe(true);
        expect(f.agrees, key).toBeNull();
        expect(f.delta, key).toBeNull();
      }
      // No noise frequency stored, no slew rate predicted: nothing simulated for them.
      expect(option.nominal!.figures.some((f) => f.key.startsWith('inputNoiseVPerRtHz'))).toBe(false);
      expect(option.nominal!.figures.some((f) => f.key === 'slewRateVPerS')).toBe(false);
      // Not predicted is not a disagreement: the established figures still decide.
      expect(option.agrees).toBe(true);
    }
  }, 180_000);
});

describe('a deliberately broken netlist', () => {
  let api: TestApi;
  afterAll(() => api?.close());

  it('makes the positive-rail rejection disagree (the rail’s AC source doubled), and says so with a cause', async () => {
    // Only the positive-rail AC run carries "AC 1" on VP: doubling it doubles the rail's gain to the collectors, 6 dB less rejection.
    api = await buildApiApp({
      accounts: ['admin', 'requirements', 'designer', 'reviewer'],
      verification: { netlistHook: (topology, netlist) => (topology === 'simple-mirror' ? netlist.replace(/^(VP vp 0 DC \S+) AC 1 0$/m, '$1 AC 2 0') : netlist) },
    });
    const project = await api.createProject(['requirements', 'designer', 'reviewer'], 'Ashcombe bridge');
    const spec = await api.createSpec(project.id, { payload: { ...specPayload(), topologies: ['simple-mirror', 'resistor'] } });
    const proposal = await api.createProposal(spec.id);
    const reviewer = await api.agentFor('reviewer');

    const options = await verified(reviewer, proposal.id);

    const mirror = options.find((o) => o.topology === 'simple-mirror')!;
    const positive = figure(mirror, 'psrrDb.positive.singleEnded');
    expect(positive.delta! - 20 * Math.log10(2)).toBeCloseTo(0, 1);
    expect(positive.agrees).toBe(false);
    expect(positive.cause?.kind).toBe('unexplained');
    expect(figure(mirror, 'psrrDb.negative.singleEnded').agrees).toBe(true);
    expect(mirror.agrees).toBe(false);
    expect(mirror.disagreements).toBe(1);
    const resistor = options.find((o) => o.topology === 'resistor')!;
    expect(figure(resistor, 'psrrDb.positive.singleEnded').agrees).toBe(true);
  }, 180_000);
});
