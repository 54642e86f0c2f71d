/**
 * Asking for SPICE verification and reading its progress and results. The jobs themselves run in
 * `api/verification/verification-queue.ts`; this file only records requests (with their audit
 * event, in one transaction) and shows jobs.
 */
import { In, type DataSource } from 'typeorm';
import { UserEntity } from '../entities/user.entity';
import { VerificationJobEntity, type VerificationJob } from '../entities/verification-job.entity';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { lockRowForUpdate } from '../data-source';
import { ProposalEntity } from '../entities/proposal.entity';
import { conflict, invalid } from '../errors';
import type { RecommendOption, RecommendResult } from '../../shared/engine/recommend';
import { MONTE_CARLO_RUNS, type VerificationJobView, type VerificationKind, type VerificationStatus } from '../../shared/verification/types';
import { checkedSpecDocument } from './specs.service';
import { currentDesignOf, proposalFor } from './proposals.service';
import { designVerificationState } from './design-verification';
import { DecisionEntity } from '../entities/decision.entity';
import { recordEvent } from './audit.service';
import { monteCarloRefusal } from '../verification/monte-carlo';
import type { PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

const ACTIVE_STATES = ['waiting', 'simulating'] as const;

async function jobViews(dataSource: DataSource, jobs: VerificationJob[]): Promise<VerificationJobView[]> {
  const ids = [...new Set(jobs.map((j) => j.requestedById))];
  const people = ids.length ? await dataSource.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In(ids) } }) : [];
  const names = new Map(people.map((p) => [p.id, p.displayName]));
  return jobs.map((job) => ({
    id: job.id,
    proposalId: job.proposalId,
    kind: job.kind,
    topology: job.topology,
    source: job.source ?? 'option',
    runs: job.runs,
    state: job.state,
    done: job.done,
    total: job.total,
    step: job.step,
    message: job.message,
    requestedBy: { id: job.requestedById, displayName: names.get(job.requestedById) ?? 'Unknown' },
    createdAt: job.createdAt,
    startedAt: job.startedAt,
    finishedAt: job.finishedAt,
    result: job.result ? JSON.parse(job.result) : null,
  }));
}

/** Records a job unless an equal one is still waiting or simulating; returns it and whether it is new. */
async function requestJob(
  dataSource: DataSource,
  actor: Viewer,
  proposalId: number,
  kind: VerificationKind,
  topology: string | null,
  runs: number | null,
  source: 'option' | 'decision' = 'option',
): Promise<{ job: VerificationJobView; created: boolean }> {
  const { job, created } = await dataSource.transaction(async (manager) => {
    // PostgreSQL: two requests at once see each other's job (one job, not two).
    await lockRowForUpdate(manager, ProposalEntity, proposalId);
    const proposal = await proposalFor(manager, actor, proposalId, 'proposals:verify');
    const repository = manager.getRepository(VerificationJobEntity);
    const active = await repository.findOne({
      where: { proposalId, kind, source, ...(topology === null ? {} : { topology }), state: In([...ACTIVE_STATES]) },
      order: { id: 'DESC' },
    });
    if (active) return { job: active, created: false };
    const saved = await repository.save({
      proposalId,
      kind,
      topology,
      source,
      runs,
      state: 'waiting',
      done: 0,
      total: kind === 'monte-carlo' ? (runs ?? 0) : 0,
      step: null,
      message: null,
      result: null,
      requestedById: actor.id,
      claimToken: null,
      heartbeatAt: null,
      createdAt: new Date().toISOString(),
      startedAt: null,
      finishedAt: null,
    });
    await recordEvent(manager, {
      actorId: actor.id,
      action: kind === 'proposal' ? 'proposal.verification-requested' : 'proposal.monte-carlo-requested',
      entityType: 'verification-job',
      entityId: saved.id,
      projectId: proposal.projectId,
      proposalId,
      afterId: saved.id,
      details: kind === 'proposal' ? {} : { topology, runs, source },
    });
    return { job: saved, created: true };
  });
  return { job: (await jobViews(dataSource, [job]))[0], created };
}

/** A verification of every option (and of an override). */
export function requestVerification(dataSource: DataSource, actor: Viewer, proposalId: number) {
  return requestJob(dataSource, actor, proposalId, 'proposal', null, null);
}

/**
 * A SPICE Monte Carlo of one ranked option (`source: 'option'`, its topology) or of the latest
 * decision's design (`source: 'decision'`, own values included; the topology, when given, must be
 * the decision's); 409 with the reason when it cannot have one.
 */
export async function requestMonteCarlo(dataSource: DataSource, actor: Viewer, proposalId: number, input: { topology?: string; source?: 'option' | 'decision'; runs?: number }) {
  const proposal = await proposalFor(dataSource, actor, proposalId, 'proposals:verify');
  const version = await dataSource.getRepository(SpecVersionEntity).findOneByOrFail({ id: proposal.specVersionId });
  const spec = checkedSpecDocument(JSON.parse(version.payload));
  const result = JSON.parse(proposal.result) as RecommendResult;
  const source = input.source ?? 'option';
  let option: RecommendOption | undefined;
  let topology: string;
  if (source === 'decision') {
    const decision = await dataSource.getRepository(DecisionEntity).findOne({ where: { proposalId }, order: { id: 'DESC' } });
    if (!decision) throw conflict('not-decided', 'Nothing is decided yet: ask for a Monte Carlo of a ranked option instead.');
    if (input.topology !== undefined && input.topology !== decision.topology) {
      throw invalid([{ path: '/topology', message: `is ${input.topology}, but the decided design is a ${decision.topology}; leave it out for the decided design` }]);
    }
    topology = decision.topology;
    option = decision.kind === 'override' ? (decision.evaluation ? (JSON.parse(decision.evaluation) as RecommendOption) : undefined) : result.options.find((o) => o.topology === decision.topology);
  } else {
    if (input.topology === undefined) throw invalid([{ path: '/topology', message: 'is required for a ranked option' }]);
    topology = input.topology;
    option = result.options.find((o) => o.topology === topology);
  }
  const refusal = monteCarloRefusal(spec, option);
  if (refusal) throw conflict('monte-carlo-not-applicable', refusal);
  return requestJob(dataSource, actor, proposalId, 'monte-carlo', topology, input.runs ?? MONTE_CARLO_RUNS.default, source);
}

/**
 * The latest whole-proposal job, the latest Monte Carlo job of each ranked option and of the
 * decided design, and how the verification stands for the current design.
 */
export async function verificationStatus(dataSource: DataSource, viewer: Viewer, proposalId: number): Promise<VerificationStatus> {
  const proposal = await proposalFor(dataSource, viewer, proposalId);
  const repository = dataSource.getRepository(VerificationJobEntity);
  const latest = await repository.findOne({ where: { proposalId, kind: 'proposal' }, order: { id: 'DESC' } });
  const monteCarlo = await repository.find({ where: { proposalId, kind: 'monte-carlo' }, order: { id: 'DESC' } });
  const latestPerOption = monteCarlo.filter((job, i) => monteCarlo.findIndex((j) => j.topology === job.topology && j.source === job.source) === i);
  const views = await jobViews(dataSource, latest ? [latest, ...latestPerOption] : latestPerOption);
  const [version, decisions] = await Promise.all([
    dataSource.getRepository(SpecVersionEntity).findOneOrFail({ select: { id: true, version: true }, where: { id: proposal.specVersionId } }),
    dataSource.getRepository(DecisionEntity).find({ where: { proposalId }, order: { id: 'ASC' } }),
  ]);
  const current = currentDesignOf(proposal, version.version, JSON.parse(proposal.result) as RecommendResult, decisions);
  const currentDesign = await designVerificationState(dataSource, proposalId, current);
  return latest ? { verification: views[0], monteCarlo: views.slice(1), currentDesign } : { verification: null, monteCarlo: views, currentDesign };
}
