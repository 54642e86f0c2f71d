/**
 * Verification jobs: asked for through the API, run in the background one at a time on the one
 * long-lived SPICE engine, progress written to the job row as it goes.
 *
 * - Fair order: the next job claimed is the waiting job of the person served least recently (the
 *   latest `started_at` among their jobs; someone never served goes first), a whole-proposal
 *   verification before that person's Monte Carlo, then the oldest. So one person's queue of
 *   Monte Carlo jobs takes turns with everyone else's instead of going first because it was
 *   asked first.
 * - Monte Carlo runs in slices of `MONTE_CARLO_SLICE_RUNS`; after each slice the instance runs
 *   the whole-proposal verifications waiting (in the same fair order, at most
 *   `INTERLEAVED_JOBS_PER_SLICE`), and when none is left a waiting Monte Carlo of someone with
 *   nothing simulating, keeping the paused job's heartbeat fresh, then goes on. A verification of
 *   one proposal therefore waits for one slice (well under a second on an idle machine), not for
 *   another person's 2,000 runs, and a second person's Monte Carlo does not wait for the first
 *   person's to end. The paused job stays claimed by this instance, so the claim-token rules below
 *   hold unchanged.
 * - A job is claimed by setting `waiting` → `simulating` with this instance's claim token: on
 *   SQLite (one server) by a conditional update; on PostgreSQL (several app instances) the first
 *   waiting job in the fair order is selected `FOR UPDATE SKIP LOCKED` and updated in the same
 *   transaction, so two instances never claim the same job and neither waits for the other's row.
 *   Every later write checks the token and the state, so a job taken over, marked stopped or
 *   withdrawn is never overwritten by an instance that lost it; a refused write ends the job's run
 *   at once (between two analyses).
 * - Withdrawing (`verification.service.ts`) writes `withdrawn` to the row from any instance; the
 *   claimant notices at its next progress write (at most `PROGRESS_WRITE_INTERVAL_MS` later), or
 *   before its next analysis when the withdrawal came through this instance (`withdrawn(jobId)`).
 * - While simulating, the claimant refreshes `heartbeat_at`. On start, jobs left `simulating` by a
 *   stopped server are marked `stopped` (SQLite: there is only one server, so every one of them;
 *   otherwise those whose heartbeat is older than `staleAfterMs`), and the same sweep runs before
 *   each claim. They can be asked for again; none stays "simulating" forever.
 * - A failing or non-converging simulation becomes that option's error; the job still finishes.
 * - A job's last state (finished, failed) is written in one transaction with the e-mail notice to
 *   whoever asked for it (`verification.ended`). Stopped and withdrawn jobs are not mailed: a
 *   person withdrew it, or the server stopped (the job page says so; it can be asked for again).
 */
import { randomUUID } from 'node:crypto';
import type { DataSource, EntityManager, Repository, SelectQueryBuilder } from 'typeorm';
import { isPostgres } from '../data-source';
import { specVersionDocument } from '../services/specs.service';
import { designCard } from '../services/devices.service';
import { rankingOf } from '../services/rankings.service';
import { queueNotification } from '../services/notifications.service';
import { DecisionEntity } from '../entities/decision.entity';
import { ProposalEntity, type Proposal } from '../entities/proposal.entity';
import { VerificationJobEntity, type VerificationJob } from '../entities/verification-job.entity';
import type { RecommendOption, RecommendResult } from '#shared/engine/recommend';
import type { Spec } from '#shared/engine/types';
import type { DesignBinding } from '#shared/verification/binding';
import { designBinding } from './design-binding';
import { topologyName } from '#shared/engine/topologies';
import {
  VERIFICATION_TOLERANCES,
  type MonteCarloVerificationResult,
  type OptionVerification,
  type ProposalVerificationResult,
} from '#shared/verification/types';
import { SpiceEngine } from './spice-engine';
import { analysesPerOption, verifyOption, type OptionToVerify } from './verify-option';
import { runMonteCarlo } from './monte-carlo';

/** Monte Carlo runs between two looks for waiting verifications (100 analyses; ≈ 0.3 s idle). */
export const MONTE_CARLO_SLICE_RUNS = 50;
/** Whole-proposal verifications run between two Monte Carlo slices at most (so a stream of them cannot starve a Monte Carlo). */
export const INTERLEAVED_JOBS_PER_SLICE = 4;

export interface VerificationQueueOptions {
  /** The engine to run on (default: a new one, started on the first job). */
  engine?: SpiceEngine;
  /** A `simulating` job whose heartbeat is older than this was left by a stopped server, ms. */
  staleAfterMs?: number;
  /** Mark every `simulating` job stopped on start (true for SQLite: one server per database). */
  singleInstance?: boolean;
  /** Changes a netlist before it runs, by topology (tests break one on purpose). */
  netlistHook?: (topology: string, netlist: string) => string;
  log?: (message: string) => void;
}

/** Heartbeat and progress writes at most this often, ms (the last step always gets written). */
const PROGRESS_WRITE_INTERVAL_MS = 200;
const DEFAULT_STALE_AFTER_MS = 60_000;
/** How often a Monte Carlo paused for another job gets its heartbeat refreshed, ms (well inside the stale limit). */
const PAUSED_HEARTBEAT_MS = 10_000;
const SWEEP_INTERVAL_MS = 30_000;
export const STOPPED_MESSAGE = 'The server stopped while this job was simulating; ask for it again to re-run it.';

const now = () => new Date().toISOString();

/** Thrown inside a job when the queue is closing. */
class ServerStopping extends Error {}

/** Thrown inside a job whose row this instance may no longer write: withdrawn, or marked stopped by another instance. */
class JobEnded extends Error {}

/**
 * Which waiting jobs a claim may take: of one kind; and, with `requesterIdle`, only those of people
 * who have no job simulating now (so a paused Monte Carlo's owner does not jump in with another).
 */
type ClaimFilter = { kind?: VerificationJob['kind']; requesterIdle?: boolean };

/**
 * The fair order of waiting jobs: the requester served least recently first (their latest start;
 * '' when never), whole-proposal verifications before Monte Carlo, then the oldest.
 */
function fairOrder(query: SelectQueryBuilder<VerificationJob>): SelectQueryBuilder<VerificationJob> {
  return query
    .addSelect('COALESCE((SELECT MAX(served.started_at) FROM verification_job served WHERE served.requested_by_id = job.requested_by_id), \'\')', 'last_served')
    .addSelect("CASE WHEN job.kind = 'proposal' THEN 0 ELSE 1 END", 'kind_rank')
    .orderBy('last_served', 'ASC')
    .addOrderBy('kind_rank', 'ASC')
    .addOrderBy('job.id', 'ASC');
}

export class VerificationQueue {
  readonly engine: SpiceEngine;
  readonly claimToken = randomUUID();
  private readonly staleAfterMs: number;
  private draining: Promise<void> | null = null;
  private kickedWhileDraining = false;
  private readonly sweeper: NodeJS.Timeout;
  private closed = false;
  /** Jobs this instance is running now (a Monte Carlo and a verification between its slices). */
  private readonly runningHere = new Set<number>();
  /** Of those, the ones withdrawn through this instance: their run stops before its next analysis. */
  private readonly withdrawnHere = new Set<number>();
  /** Resolves once the start-up sweep has marked jobs left by a stopped server. */
  readonly ready: Promise<void>;

  constructor(
    private readonly dataSource: DataSource,
    private readonly options: VerificationQueueOptions = {},
  ) {
    this.engine = options.engine ?? new SpiceEngine();
    this.staleAfterMs = options.staleAfterMs ?? DEFAULT_STALE_AFTER_MS;
    this.ready = this.markStopped(options.singleInstance ?? true).then(() => this.kick());
    // Now and then, look again: jobs left by an instance that died, jobs asked for on another instance.
    this.sweeper = setInterval(() => this.kick(), SWEEP_INTERVAL_MS);
    this.sweeper.unref();
  }

  private log(message: string): void {
    (this.options.log ?? console.error)(message);
  }

  /** Marks jobs left simulating by a stopped server as `stopped`. */
  private async markStopped(all: boolean): Promise<void> {
    const query = this.dataSource
      .createQueryBuilder()
      .update(VerificationJobEntity)
      .set({ state: 'stopped', message: STOPPED_MESSAGE, finishedAt: now(), claimToken: null, step: null })
      .where('state = :state', { state: 'simulating' });
    if (!all) query.andWhere('(heartbeat_at IS NULL OR heartbeat_at < :limit)', { limit: new Date(Date.now() - this.staleAfterMs).toISOString() });
    await query.execute();
  }

  /** Starts working through waiting jobs unless already doing so. */
  kick(): void {
    if (this.closed) return;
    if (this.draining) {
      // A job asked for while the loop is finishing its last look would otherwise wait for the next kick.
      this.kickedWhileDraining = true;
      return;
    }
    this.kickedWhileDraining = false;
    this.draining = this.drain()
      .catch((error: unknown) => this.log(`verification queue: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`))
      .finally(() => {
        this.draining = null;
        if (this.kickedWhileDraining) this.kick();
      });
  }

  /** A job was withdrawn (through this instance): if it runs here, stop it before its next analysis, then look for more work. */
  withdrawn(jobId: number): void {
    if (this.runningHere.has(jobId)) this.withdrawnHere.add(jobId);
    this.kick();
  }

  /** Resolves when no job is being worked on (tests). */
  async idle(): Promise<void> {
    await this.ready;
    while (this.draining) await this.draining;
  }

  /**
   * Stops taking jobs and ends the simulator at once; a job it was running is marked `stopped`
   * (it can be asked for again). Safe to call more than once.
   */
  async close(): Promise<void> {
    this.closed = true;
    clearInterval(this.sweeper);
    await this.engine.stop();
    await this.draining;
  }

  private async drain(): Promise<void> {
    while (!this.closed) {
      await this.markStopped(false);
      const job = await this.claimNext();
      if (!job) return;
      await this.runJob(job);
    }
  }

  /** The next waiting job in the fair order, claimed by this instance; null when there is none. */
  private async claimNext(filter: ClaimFilter = {}): Promise<VerificationJob | null> {
    if (isPostgres(this.dataSource)) return this.claimNextLocked(filter);
    const repository = this.dataSource.getRepository(VerificationJobEntity);
    for (;;) {
      const next = await this.nextWaiting(repository.createQueryBuilder('job'), filter).getOne();
      if (!next) return null;
      const claimed = await this.claim(repository, next);
      if (claimed) return claimed;
    }
  }

  /** PostgreSQL: the next waiting job no other instance is claiming, row-locked and claimed in one transaction. */
  private claimNextLocked(filter: ClaimFilter): Promise<VerificationJob | null> {
    return this.dataSource.transaction(async (manager) => {
      const repository = manager.getRepository(VerificationJobEntity);
      const next = await this.nextWaiting(repository.createQueryBuilder('job'), filter).setLock('pessimistic_write').setOnLocked('skip_locked').getOne();
      return next ? this.claim(repository, next) : null;
    });
  }

  private nextWaiting(query: SelectQueryBuilder<VerificationJob>, filter: ClaimFilter): SelectQueryBuilder<VerificationJob> {
    query.where('job.state = :state', { state: 'waiting' });
    if (filter.kind) query.andWhere('job.kind = :kind', { kind: filter.kind });
    if (filter.requesterIdle) {
      query.andWhere("NOT EXISTS (SELECT 1 FROM verification_job busy WHERE busy.requested_by_id = job.requested_by_id AND busy.state = 'simulating')");
    }
    return fairOrder(query).limit(1);
  }

  private async claim(repository: Repository<VerificationJob>, next: VerificationJob): Promise<VerificationJob | null> {
    const at = now();
    const claimed = await repository.update(
      { id: next.id, state: 'waiting' },
      { state: 'simulating', claimToken: this.claimToken, startedAt: at, heartbeatAt: at, step: 'Starting the simulator' },
    );
    if (claimed.affected !== 1) return null;
    return { ...next, state: 'simulating' as const, claimToken: this.claimToken, startedAt: at, heartbeatAt: at };
  }

  /** Writes to the job only while this instance still holds it; false when it no longer does. */
  private async write(jobId: number, changes: Partial<VerificationJob>): Promise<boolean> {
    const result = await this.dataSource
      .getRepository(VerificationJobEntity)
      .update({ id: jobId, claimToken: this.claimToken, state: 'simulating' }, { ...changes, heartbeatAt: now() });
    return result.affected === 1;
  }

  /** Throws `JobEnded` when the job was withdrawn through this instance, `ServerStopping` when closing. */
  private checkStillWanted(jobId: number): void {
    if (this.closed) throw new ServerStopping();
    if (this.withdrawnHere.has(jobId)) throw new JobEnded();
  }

  /** Writes progress at most every `PROGRESS_WRITE_INTERVAL_MS` (or when forced); a refused write ends the job's run. */
  private progressWriter(jobId: number) {
    let last = 0;
    return async (done: number, step: string, force = false) => {
      this.checkStillWanted(jobId);
      const t = performance.now();
      if (!force && t - last < PROGRESS_WRITE_INTERVAL_MS) return;
      last = t;
      if (!(await this.write(jobId, { done, step }))) throw new JobEnded();
    };
  }

  /**
   * Between two slices of a Monte Carlo: the waiting whole-proposal verifications, in the fair
   * order, each run to its end; when none is left, one waiting Monte Carlo of a person who has
   * nothing simulating (only between the slices of a Monte Carlo that is not itself running in
   * such a pause, so pauses never nest deeper than one). The paused job's heartbeat is refreshed
   * before, during and after each.
   */
  private async interleave(paused: VerificationJob, nested: boolean): Promise<void> {
    for (let n = 0; n < INTERLEAVED_JOBS_PER_SLICE; n += 1) {
      this.checkStillWanted(paused.id);
      if (!(await this.write(paused.id, {}))) throw new JobEnded();
      await this.markStopped(false);
      const job = (await this.claimNext({ kind: 'proposal' })) ?? (nested ? null : await this.claimNext({ kind: 'monte-carlo', requesterIdle: true }));
      if (!job) break;
      // A job on a loaded machine can take a while: keep the paused job's heartbeat fresh meanwhile.
      const heartbeat = setInterval(() => void this.write(paused.id, {}).catch(() => undefined), PAUSED_HEARTBEAT_MS);
      try {
        await this.runJob(job, true);
      } finally {
        clearInterval(heartbeat);
      }
    }
    this.checkStillWanted(paused.id);
    if (!(await this.write(paused.id, {}))) throw new JobEnded();
  }

  /** Runs a claimed job; `nested` when it runs in another Monte Carlo's pause. */
  private async runJob(job: VerificationJob, nested = false): Promise<void> {
    this.runningHere.add(job.id);
    try {
      await this.runClaimed(job, nested);
    } finally {
      this.runningHere.delete(job.id);
      this.withdrawnHere.delete(job.id);
    }
  }

  private async runClaimed(job: VerificationJob, nested: boolean): Promise<void> {
    try {
      const { proposal, spec, result, specVersion } = await loadProposal(this.dataSource, job.proposalId);
      const targets = job.kind === 'proposal' ? await verificationTargets(this.dataSource, proposal, spec, result, specVersion, this.options.netlistHook) : [];
      const sizes = targets.map((t) => analysesPerOption(t.option));
      const offsets = sizes.map((_, i) => sizes.slice(0, i).reduce((a, b) => a + b, 0));
      const total = job.kind === 'proposal' ? sizes.reduce((a, b) => a + b, 0) : (job.runs ?? 0);
      await this.write(job.id, { total, done: 0, step: 'Starting the simulator' });
      const simulatorStartMs = await this.engine.start();
      const simulator = await this.engine.version();
      if (job.kind === 'monte-carlo') {
        const target =
          job.source === 'decision'
            ? await decidedTarget(this.dataSource, proposal, result, specVersion)
            : rankedTarget(proposal, result, specVersion, job.topology ?? '');
        if (!target) throw new Error(job.source === 'decision' ? 'The proposal has no decided design to simulate.' : 'The proposal has no such option.');
        const progress = this.progressWriter(job.id);
        const simulated = await runMonteCarlo(
          this.engine.runner,
          spec,
          target.option,
          job.runs ?? 0,
          simulator,
          (done, step) => progress(done, `${target.name}: ${step}`),
          { sliceRuns: MONTE_CARLO_SLICE_RUNS, betweenSlices: () => this.interleave(job, nested) },
          await cardSettings(this.dataSource, proposal, spec, target.option),
        );
        const outcome: MonteCarloVerificationResult = { ...simulated, source: job.source, binding: target.binding };
        await this.finish(job, outcome, job.runs ?? 0);
        return;
      }
      const progress = this.progressWriter(job.id);
      const t0 = performance.now();
      const options: OptionVerification[] = [];
      for (const [index, target] of targets.entries()) {
        let analyses = 0;
        const counted = (netlist: string, plot?: string) => {
          this.checkStillWanted(job.id);
          analyses += 1;
          return this.engine.run(netlist, plot);
        };
        this.checkStillWanted(job.id);
        options.push(
          await verifyOption(counted, target, (step) => progress(offsets[index] + Math.min(analyses, sizes[index] - 1), step)),
        );
        await progress(offsets[index] + sizes[index], `${target.name}: done`, true);
      }
      const outcome: ProposalVerificationResult = {
        simulator,
        tolerances: VERIFICATION_TOLERANCES,
        options,
        simulatorStartMs,
        elapsedMs: performance.now() - t0,
      };
      await this.finish(job, outcome, total);
    } catch (error) {
      if (error instanceof JobEnded) {
        // Withdrawn, or taken from this instance: the row already says so; nothing more to write.
        this.log(`verification job ${job.id} ended: withdrawn or no longer held by this instance`);
        return;
      }
      if (this.closed) {
        await this.dataSource
          .getRepository(VerificationJobEntity)
          .update({ id: job.id, claimToken: this.claimToken, state: 'simulating' }, { state: 'stopped', message: STOPPED_MESSAGE, finishedAt: now(), step: null, claimToken: null })
          .catch(() => undefined);
        return;
      }
      const message = error instanceof Error ? error.message : String(error);
      this.log(`verification job ${job.id} failed: ${message}`);
      const failed = { state: 'failed' as const, message: `The job could not run: ${message}`, finishedAt: now(), step: null };
      await this.settle(job.id, failed).catch(async (noticeError: unknown) => {
        // The job's state matters more than its e-mail: written alone when the notice cannot be.
        this.log(`verification job ${job.id}: its notice could not be queued: ${noticeError instanceof Error ? noticeError.message : String(noticeError)}`);
        await this.dataSource.getRepository(VerificationJobEntity).update({ id: job.id, claimToken: this.claimToken, state: 'simulating' }, failed);
      });
    }
  }

  private async finish(job: VerificationJob, result: ProposalVerificationResult | MonteCarloVerificationResult, total: number): Promise<void> {
    this.checkStillWanted(job.id);
    await this.settle(job.id, { state: 'finished', done: total, total, step: null, result, finishedAt: now(), heartbeatAt: now() });
  }

  /**
   * Writes a job's last state (finished or failed) while this instance still holds it, and in the
   * same transaction queues the notice to whoever asked for it (api/services/notifications.service.ts):
   * both or neither. A job no longer held (withdrawn, taken over) is left alone and nobody is told.
   */
  private async settle(jobId: number, changes: Partial<VerificationJob> & { state: 'finished' | 'failed' }): Promise<void> {
    await this.dataSource.transaction(async (manager) => {
      const written = await manager.getRepository(VerificationJobEntity).update({ id: jobId, claimToken: this.claimToken, state: 'simulating' }, changes);
      if (written.affected === 1) await queueNotification(manager, { kind: 'verification.ended', jobId });
    });
  }
}

async function loadProposal(manager: DataSource | EntityManager, proposalId: number): Promise<{ proposal: Proposal; spec: Spec; result: RecommendResult; specVersion: number }> {
  const proposal = await manager.getRepository(ProposalEntity).findOneByOrFail({ id: proposalId });
  const { version, spec } = await specVersionDocument(manager, proposal.specVersionId);
  return { proposal, spec, result: await rankingOf(manager, proposal), specVersion: version.version };
}

interface SimulationTarget {
  option: RecommendOption;
  name: string;
  binding: DesignBinding | undefined;
}

/** A ranked option, bound to the ranking's engine and rule set. */
function rankedTarget(proposal: Proposal, result: RecommendResult, specVersion: number, topology: string): SimulationTarget | null {
  const option = result.options.find((o) => o.topology === topology);
  if (!option) return null;
  const binding = option.design
    ? designBinding({ topology, design: option.design, specVersionId: proposal.specVersionId, specVersion, engineVersion: proposal.engineVersion, rulesetVersion: proposal.rulesetVersion })
    : undefined;
  return { option, name: topologyName(topology), binding };
}

/**
 * The latest decision's design: the designer's own values as the server checked them (bound to
 * the engine and rule set that checked them), or the ranked option accepted or chosen.
 */
async function decidedTarget(dataSource: DataSource, proposal: Proposal, result: RecommendResult, specVersion: number): Promise<SimulationTarget | null> {
  const decision = await dataSource.getRepository(DecisionEntity).findOne({ where: { proposalId: proposal.id }, order: { id: 'DESC' } });
  if (!decision) return null;
  if (decision.kind !== 'override') return rankedTarget(proposal, result, specVersion, decision.topology);
  if (!decision.evaluation) return null;
  const option = decision.evaluation;
  const design = option.design ?? decision.design;
  const binding = designBinding({
    topology: decision.topology,
    design,
    specVersionId: proposal.specVersionId,
    specVersion,
    engineVersion: decision.engineVersion ?? proposal.engineVersion,
    rulesetVersion: decision.rulesetVersion ?? proposal.rulesetVersion,
  });
  return { option, name: `Own values (${topologyName(decision.topology)})`, binding };
}

/**
 * The library card simulated with an option's design: when the spec was filled from a card and
 * the design is still its device, the card's parameters the design does not carry
 * (services/devices.service.ts `designCard`); undefined otherwise.
 */
async function simulatedCard(manager: DataSource | EntityManager, proposal: Proposal, spec: Spec, option: RecommendOption): Promise<OptionToVerify['card']> {
  if (!option.design) return undefined;
  const card = await designCard(manager, proposal.projectId, spec, option.design.device);
  return card.cardName === null ? undefined : { name: card.cardName, spiceOnlyParameters: card.spiceOnlyParameters };
}

async function cardSettings(manager: DataSource | EntityManager, proposal: Proposal, spec: Spec, option: RecommendOption) {
  const card = await simulatedCard(manager, proposal, spec, option);
  return card ? { spiceOnlyParameters: card.spiceOnlyParameters } : {};
}

/** Every ranked option, then the latest decision's own design when it is an override. */
async function verificationTargets(
  dataSource: DataSource,
  proposal: Proposal,
  spec: Spec,
  result: RecommendResult,
  specVersion: number,
  hook: VerificationQueueOptions['netlistHook'],
): Promise<OptionToVerify[]> {
  const common = { differentialOutput: spec.gain.output === 'differential', frequencyHz: spec.cmrr.atFrequencyHz };
  const targets: OptionToVerify[] = [];
  for (const option of result.options) {
    targets.push({
      ...common,
      topology: option.topology,
      source: 'option',
      name: topologyName(option.topology),
      option,
      binding: rankedTarget(proposal, result, specVersion, option.topology)?.binding,
      netlistHook: hook ? (netlist: string) => hook(option.topology, netlist) : undefined,
      card: await simulatedCard(dataSource, proposal, spec, option),
    });
  }
  const decision = await dataSource.getRepository(DecisionEntity).findOne({ where: { proposalId: proposal.id }, order: { id: 'DESC' } });
  if (decision?.kind === 'override' && decision.evaluation) {
    const decided = await decidedTarget(dataSource, proposal, result, specVersion);
    if (decided) {
      targets.push({
        ...common,
        topology: decision.topology,
        source: 'decision',
        name: `Override (${topologyName(decision.topology)})`,
        option: decided.option,
        binding: decided.binding,
        netlistHook: hook ? (netlist: string) => hook(`override:${decision.topology}`, netlist) : undefined,
        card: await simulatedCard(dataSource, proposal, spec, decided.option),
      });
    }
  }
  return targets;
}
