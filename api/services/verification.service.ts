/**
 * Asking for SPICE verification, withdrawing it, and reading its progress and results. The jobs
 * themselves run in `api/verification/verification-queue.ts`; this file only records requests
 * and withdrawals (each with its audit event, in one transaction) and shows jobs.
 */
import { In, type DataSource } from 'typeorm';
import { UserEntity } from '../entities/user.entity';
import { VerificationJobEntity, type VerificationJob } from '../entities/verification-job.entity';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { lockRowForUpdate } from '../data-source';
import { ProposalEntity } from '../entities/proposal.entity';
import { AppError, conflict, forbidden, invalid, notFound } from '../errors';
import type { RecommendOption } from '#shared/engine/recommend';
import {
  ACTIVE_VERIFICATION_STATES,
  MAX_ACTIVE_JOBS_PER_PERSON,
  MONTE_CARLO_RUNS,
  type VerificationJobView,
  type VerificationKind,
  type VerificationStatus,
} from '#shared/verification/types';
import { mayIn, type ProjectRole } from '#shared/workflow/roles';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { specVersionDocument } from './specs.service';
import { rankingOf } from './rankings.service';
import { currentDesignOf, proposalFor } from './proposals.service';
import { designVerificationState } from './design-verification';
import { DecisionEntity } from '../entities/decision.entity';
import { recordEvent } from './audit.service';
import { monteCarloRefusal } from '../verification/monte-carlo';
import type { PublicUser } from './users.service';
import type { MonteCarloInput } from '#shared/api/verification';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

const ACTIVE_STATES = ACTIVE_VERIFICATION_STATES;

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
    result: job.result,
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
    // One person may hold only so much of the shared simulator (every project counts).
    const held = await repository.count({ where: { requestedById: actor.id, state: In([...ACTIVE_STATES]) } });
    if (held >= MAX_ACTIVE_JOBS_PER_PERSON) {
      throw new AppError(
        'too-many-verification-jobs',
        429,
        `You already have ${held} SPICE jobs waiting or simulating, the most one person may have at once (${MAX_ACTIVE_JOBS_PER_PERSON}). Withdraw one or wait until one finishes, then ask again.`,
      );
    }
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
export async function requestMonteCarlo(dataSource: DataSource, actor: Viewer, proposalId: number, input: MonteCarloInput) {
  const proposal = await proposalFor(dataSource, actor, proposalId, 'proposals:verify');
  const { spec } = await specVersionDocument(dataSource, proposal.specVersionId);
  const result = await rankingOf(dataSource, proposal);
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
    option = decision.kind === 'override' ? (decision.evaluation ?? undefined) : result.options.find((o) => o.topology === decision.topology);
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
  // Every Monte Carlo job's key, then only the latest of each option read whole (results hold histograms).
  const keys = await repository.find({ select: { id: true, topology: true, source: true }, where: { proposalId, kind: 'monte-carlo' }, order: { id: 'DESC' } });
  const latestIds = keys.filter((job, i) => keys.findIndex((j) => j.topology === job.topology && j.source === job.source) === i).map((job) => job.id);
  const latestPerOption = latestIds.length ? await repository.find({ where: { id: In(latestIds) }, order: { id: 'DESC' } }) : [];
  const views = await jobViews(dataSource, latest ? [latest, ...latestPerOption] : latestPerOption);
  const [version, decisions] = await Promise.all([
    dataSource.getRepository(SpecVersionEntity).findOneOrFail({ select: { id: true, version: true }, where: { id: proposal.specVersionId } }),
    dataSource.getRepository(DecisionEntity).find({ where: { proposalId }, order: { id: 'ASC' } }),
  ]);
  const current = currentDesignOf(proposal, version.version, await rankingOf(dataSource, proposal), decisions);
  const currentDesign = await designVerificationState(dataSource, proposalId, current);
  return latest ? { verification: views[0], monteCarlo: views.slice(1), currentDesign } : { verification: null, monteCarlo: views, currentDesign };
}

/**
 * Whether a person may withdraw a job: the person who asked for it, whoever reviews in the job's
 * project (by the role held there), or an administrator.
 */
function mayWithdraw(actor: Viewer, projectRole: ProjectRole | null | undefined, job: VerificationJob): boolean {
  return job.requestedById === actor.id || actor.role === 'admin' || mayIn(actor.role, projectRole, 'proposals:review');
}

/**
 * Withdraws a waiting or simulating job (state `withdrawn`, with who did it in the message, and
 * its audit event in the same transaction). 404 when the proposal is not visible or the job is
 * not one of its own; 403 for anyone else than the requester, a reviewer or an administrator; 409
 * once the job has settled. A simulating job's claimant notices at its next write and stops.
 */
export async function withdrawJob(dataSource: DataSource, actor: Viewer, proposalId: number, jobId: number): Promise<VerificationJobView> {
  const job = await dataSource.transaction(async (manager) => {
    const proposal = await proposalFor(manager, actor, proposalId);
    await lockRowForUpdate(manager, VerificationJobEntity, jobId);
    const repository = manager.getRepository(VerificationJobEntity);
    const found = await repository.findOneBy({ id: jobId, proposalId });
    if (!found) throw notFound('verification-job');
    const membership = await manager.getRepository(ProjectMemberEntity).findOneBy({ projectId: proposal.projectId, userId: actor.id });
    if (!mayWithdraw(actor, membership?.role, found)) throw forbidden('Only the person who asked for this SPICE job, a reviewer or an administrator may withdraw it.');
    if (!(ACTIVE_STATES as readonly string[]).includes(found.state)) {
      throw conflict('verification-job-settled', `This SPICE job has already ${found.state === 'withdrawn' ? 'been withdrawn' : `ended (${found.state})`}; there is nothing to withdraw.`);
    }
    const person = await manager.getRepository(UserEntity).findOneByOrFail({ id: actor.id });
    const at = new Date().toISOString();
    const changes = { state: 'withdrawn' as const, message: `Withdrawn by ${person.displayName}.`, finishedAt: at, step: null, claimToken: null };
    const updated = await repository.update({ id: jobId, state: found.state }, changes);
    if (updated.affected !== 1) throw conflict('verification-job-settled', 'This SPICE job ended while it was being withdrawn; there is nothing to withdraw.');
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'proposal.verification-withdrawn',
      entityType: 'verification-job',
      entityId: jobId,
      projectId: proposal.projectId,
      proposalId,
      afterId: jobId,
      details: { kind: found.kind, topology: found.topology, runs: found.runs, was: found.state, requestedById: found.requestedById },
    });
    return { ...found, ...changes };
  });
  return (await jobViews(dataSource, [job]))[0];
}
