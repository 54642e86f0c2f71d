/**
 * Proposals and their workflow: rank a spec version with the engine, let a designer decide
 * (accept, choose another option, or override with an own design, analysed as thoroughly),
 * let a reviewer approve or return. Every step checks the transition in shared/workflow, and
 * writes the record and its audit event in one transaction.
 */
import { In, type DataSource, type EntityManager } from 'typeorm';
import { ENGINE_VERSION, type RecommendResult } from '#shared/engine/index';
import type { RecommendOption } from '#shared/engine/recommend';
import type { Design, RuleSet } from '#shared/engine/types';
import { allowedEvents, nextState, type ProposalEvent, type ProposalState } from '#shared/workflow/proposal-states';
import { mayIn, type Action } from '#shared/workflow/roles';
import { AuditEventEntity } from '../entities/audit-event.entity';
import { DecisionEntity, type Decision } from '../entities/decision.entity';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { ProposalEntity, type Proposal } from '../entities/proposal.entity';
import { ReviewEntity, type Review } from '../entities/review.entity';
import { SpecVersionEntity, type SpecVersion } from '../entities/spec-version.entity';
import { validateDesign } from '#shared/validate';
import { lockRowForUpdate } from '../data-source';
import { evaluateSpecDesign, rankSpec } from '../engine/engine-pool';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { boundCurrentDesign } from '../verification/design-binding';
import { designVerificationState } from './design-verification';
import { currentDesignName, currentDesignSummary } from '#shared/workflow/current-design';
import { topologyName } from '#shared/engine/topologies';
import { queueNotification } from './notifications.service';
import { openThreadSummaries } from './comments.service';
import { projectFor } from './projects.service';
import { indexRecords } from './search-index.service';
import { specMovedOn, supersedeOlderRankings } from './spec-lifecycle.service';
import { latestVersion, specFor, specVersionDocument, storedSpecDocument } from './specs.service';
import { rankingOf, rankingText, storeRanking } from './rankings.service';
import type { PublicUser } from './users.service';
import type { AuditEvent } from '#shared/api/admin';
import type * as Wire from '#shared/api/proposals';
import type { DecisionInput, ReviewInput, WithdrawalInput } from '#shared/api/proposals';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/** Every proposal column but the engine output. */
const SUMMARY_COLUMNS = {
  id: true,
  projectId: true,
  specId: true,
  specVersionId: true,
  engineVersion: true,
  rulesetVersion: true,
  recommendedTopology: true,
  status: true,
  supersededById: true,
  closedReason: true,
  closedById: true,
  closedAt: true,
  createdById: true,
  createdAt: true,
  updatedAt: true,
} as const;

/** A proposal as the API shows it: every column but the reference to its stored ranking (answered whole as `result`). */
export function proposalRecord(proposal: Proposal): Omit<Proposal, 'rankingId'> {
  const { rankingId: _ranking, ...record } = proposal;
  return record;
}

/** Largest page of the proposal list. */
export const MAX_PAGE_SIZE = 100;

export type { DecisionInput, ReviewInput };

/**
 * The proposal if its project is visible to the viewer, else 404; with an action, also a 403
 * unless the role the viewer holds in the proposal's project may take it.
 */
export async function proposalFor(manager: EntityManager | DataSource, viewer: Viewer, proposalId: number, action?: Action): Promise<Proposal> {
  const proposal = await manager.getRepository(ProposalEntity).findOneBy({ id: proposalId });
  if (!proposal) throw notFound('proposal');
  try {
    await projectFor(manager, viewer, proposal.projectId, action);
  } catch (error) {
    if (error instanceof AppError && error.status === 403) throw error;
    throw notFound('proposal');
  }
  return proposal;
}

/** The state after `event`, or a 409 saying what is allowed now. */
function transition(proposal: Proposal, event: ProposalEvent): ProposalState {
  const next = nextState(proposal.status, event);
  if (next) return next;
  const allowed = allowedEvents(proposal.status);
  throw new AppError(
    'invalid-transition',
    409,
    `Proposal ${proposal.id} is ${proposal.status}: it cannot ${event} now. ${allowed.length ? `Allowed now: ${allowed.join(', ')}.` : 'Nothing can change it now.'}`,
  );
}

/** The proposal's current design with its binding, from its stored rows (shared/workflow/current-design.ts). */
export function currentDesignOf(proposal: Proposal, specVersion: number, result: RecommendResult, decisions: readonly Decision[]) {
  return boundCurrentDesign(proposal, specVersion, result, decisions);
}

/** How many blocking checks a checked design fails. */
function blockingShortfalls(option: RecommendOption | null): number {
  return option ? option.checks.filter((c) => !c.passed && c.severity === 'blocking').length : 0;
}

/** The whole proposal: its record, the engine's output, the spec snapshot, decisions and reviews. */
export async function getProposal(dataSource: DataSource, viewer: Viewer, proposalId: number): Promise<Wire.Proposal> {
  const proposal = await proposalFor(dataSource, viewer, proposalId);
  const [version, decisions, reviews] = await Promise.all([
    dataSource.getRepository(SpecVersionEntity).findOneByOrFail({ id: proposal.specVersionId }),
    dataSource.getRepository(DecisionEntity).find({ where: { proposalId }, order: { id: 'ASC' } }),
    dataSource.getRepository(ReviewEntity).find({ where: { proposalId }, order: { id: 'ASC' } }),
  ]);
  const result = await rankingOf(dataSource, proposal);
  return {
    ...proposalRecord(proposal),
    result,
    specVersion: { id: version.id, version: version.version, title: version.title, note: version.note, payload: version.payload },
    specMovedOn: await specMovedOn(dataSource, proposal, version),
    decisions,
    reviews,
    allowedEvents: allowedEvents(proposal.status),
    currentDesign: currentDesignOf(proposal, version.version, result, decisions),
  };
}

/** A stored ranking: its row id and its JSON text. */
interface StoredRanking {
  id: number;
  text: string;
}

/** Rankings being computed, by rule set and spec version: concurrent requests share one engine run. */
const rankingsInFlight = new WeakMap<RuleSet, Map<number, Promise<StoredRanking>>>();

/**
 * The engine's output for a spec version, stored once: reused from an earlier proposal of the
 * same version, engine version and rule-set version (the engine is deterministic, so it would be
 * byte for byte the same), else computed now (once, however many ask at the same time) and
 * stored by its content (rankings.service.ts).
 */
async function rankingFor(dataSource: DataSource, version: SpecVersion, ruleSet: RuleSet): Promise<StoredRanking> {
  const earlier = await dataSource.getRepository(ProposalEntity).findOne({
    select: { id: true, rankingId: true },
    where: { specVersionId: version.id, engineVersion: ENGINE_VERSION, rulesetVersion: ruleSet.version },
    order: { id: 'ASC' },
  });
  if (earlier) return { id: earlier.rankingId, text: await rankingText(dataSource, earlier.rankingId) };
  let inFlight = rankingsInFlight.get(ruleSet);
  if (!inFlight) rankingsInFlight.set(ruleSet, (inFlight = new Map()));
  let ranking = inFlight.get(version.id);
  if (!ranking) {
    ranking = rankSpec(storedSpecDocument(version), ruleSet).then(async (text) => ({ id: await storeRanking(dataSource, text), text }));
    inFlight.set(version.id, ranking);
    void ranking.finally(() => inFlight.delete(version.id)).catch(() => undefined);
  }
  return ranking;
}

/** Ranks the spec's latest version (or reuses its ranking) and stores the proposal with its audit event. */
async function storeProposal(dataSource: DataSource, actor: Viewer, specId: number, ruleSet: RuleSet) {
  const spec = await specFor(dataSource, actor, specId, 'proposals:create');
  const version = await latestVersion(dataSource, spec);
  const ranking = await rankingFor(dataSource, version, ruleSet);
  const resultText = ranking.text;
  const parsed = JSON.parse(resultText) as RecommendResult;
  const recommended = parsed.recommended;
  const proposal = await dataSource.transaction(async (manager) => {
    const now = new Date().toISOString();
    const saved = await manager.getRepository(ProposalEntity).save({
      projectId: spec.projectId,
      specId,
      specVersionId: version.id,
      engineVersion: ENGINE_VERSION,
      rulesetVersion: ruleSet.version,
      rankingId: ranking.id,
      recommendedTopology: recommended,
      status: 'ranked' as ProposalState,
      supersededById: null,
      closedReason: null,
      closedById: null,
      closedAt: null,
      createdById: actor.id,
      createdAt: now,
      updatedAt: now,
    });
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'proposal.ranked',
      entityType: 'proposal',
      entityId: saved.id,
      projectId: spec.projectId,
      proposalId: saved.id,
      afterId: saved.id,
      details: { specVersion: version.version, recommended, status: 'ranked' },
    });
    await queueNotification(manager, { kind: 'proposal.ready', proposalId: saved.id, actorId: actor.id });
    await supersedeOlderRankings(manager, actor.id, saved, version);
    await indexRecords(manager, 'proposal', [saved.id]);
    return saved;
  });
  const envelope = {
    ...proposalRecord(proposal),
    specVersion: { id: version.id, version: version.version, title: version.title, note: version.note, payload: version.payload },
    specMovedOn: null,
    decisions: [],
    reviews: [],
    allowedEvents: allowedEvents('ranked'),
    currentDesign: currentDesignOf(proposal, version.version, parsed, []),
  };
  return { envelope, resultText, result: parsed };
}

/** Ranks the spec's latest version with the engine and stores the proposal; returns it whole. */
export async function createProposal(dataSource: DataSource, actor: Viewer, specId: number, ruleSet: RuleSet): Promise<Wire.Proposal> {
  const { envelope, result } = await storeProposal(dataSource, actor, specId, ruleSet);
  return { ...envelope, result };
}

/**
 * As createProposal, answered as JSON text: the stored engine output (tens of kB) is spliced in
 * as it is instead of being parsed and written again, on the route's hot path.
 */
export async function createProposalJson(dataSource: DataSource, actor: Viewer, specId: number, ruleSet: RuleSet): Promise<string> {
  const { envelope, resultText } = await storeProposal(dataSource, actor, specId, ruleSet);
  return `${JSON.stringify(envelope).slice(0, -1)},"result":${resultText}}`;
}

/** The cursor after a listed row: its created-at and id, the list's order. */
const cursorAfter = (row: Pick<Proposal, 'createdAt' | 'id'>) => `${row.createdAt}~${row.id}`;

/**
 * One page of a project's proposals, newest first (created-at, then id), without the engine
 * output, with each one's spec title and version number, the total and the cursor of the next
 * page (null when the page is not full). The page's ids are read from the list's index alone
 * (keyset after a cursor; by number, the skipped entries are index entries, never rows), then
 * its rows.
 */
export async function listProposals(dataSource: DataSource, viewer: Viewer, projectId: number, query: Wire.ProposalListQuery): Promise<Wire.ProposalPage> {
  await projectFor(dataSource, viewer, projectId);
  const where = { projectId, ...(query.status ? { status: query.status } : {}) };
  const repository = dataSource.getRepository(ProposalEntity);
  const page = repository
    .createQueryBuilder('p')
    .select('p.id', 'id')
    .where('p.projectId = :projectId', { projectId })
    .orderBy('p.createdAt', 'DESC')
    .addOrderBy('p.id', 'DESC')
    .limit(query.pageSize);
  if (query.status) page.andWhere('p.status = :status', { status: query.status });
  if (query.cursor) {
    const [at, id] = query.cursor.split('~');
    // A row-value comparison (SQLite and PostgreSQL alike): a range of the list's index, where the
    // equivalent OR of two comparisons walks every entry after the first.
    page.andWhere('(p.createdAt, p.id) < (:at, :id)', { at, id: Number(id) });
  } else page.offset((query.page - 1) * query.pageSize);
  // A plain count: findAndCount with a column selection counts DISTINCT over the selected columns.
  const [total, ids] = await Promise.all([repository.countBy(where), page.getRawMany<{ id: number }>().then((r) => r.map((row) => Number(row.id)))]);
  const found = ids.length ? await repository.find({ select: SUMMARY_COLUMNS, where: { id: In(ids) } }) : [];
  const byRowId = new Map(found.map((r) => [r.id, r]));
  const rows = ids.map((id) => byRowId.get(id)!);
  const versionIds = [...new Set(rows.map((r) => r.specVersionId))];
  const versions = versionIds.length
    ? await dataSource.getRepository(SpecVersionEntity).find({ select: { id: true, version: true, title: true }, where: { id: In(versionIds) } })
    : [];
  const byId = new Map(versions.map((v) => [v.id, v]));
  const decisions = rows.length
    ? await dataSource.getRepository(DecisionEntity).find({
        select: { id: true, proposalId: true, kind: true, topology: true, reason: true },
        where: { proposalId: In(rows.map((r) => r.id)) },
        order: { id: 'ASC' },
      })
    : [];
  const latestDecision = new Map(decisions.map((d) => [d.proposalId, d]));
  const items = rows.map((r) => ({
    ...r,
    specVersionNumber: byId.get(r.specVersionId)?.version ?? null,
    specTitle: byId.get(r.specVersionId)?.title ?? null,
    currentDesign: currentDesignSummary(r.recommendedTopology, latestDecision.get(r.id)),
  }));
  const last = rows.at(-1);
  return { items, total, page: query.cursor ? null : query.page, pageSize: query.pageSize, nextCursor: last && rows.length === query.pageSize ? cursorAfter(last) : null };
}

/** What a decision settles on: the option's topology and design, and for an override its evaluation. */
async function settledDesign(proposal: Proposal, input: DecisionInput, ruleSet: RuleSet, dataSource: DataSource) {
  if (input.kind === 'override') {
    if (!input.design) throw invalid([{ path: '/design', message: 'is required for an override' }]);
    const { spec } = await specVersionDocument(dataSource, proposal.specVersionId);
    const evaluation = await evaluateSpecDesign(spec, input.design, ruleSet);
    return { topology: input.design.tail.topology, design: input.design, evaluation, engineVersion: ENGINE_VERSION, rulesetVersion: ruleSet.version };
  }
  const result = await rankingOf(dataSource, proposal);
  const topology = input.kind === 'accept' ? result.recommended : input.topology;
  if (input.kind === 'accept' && !topology) throw new AppError('nothing-recommended', 409, 'No option passes, so there is no recommendation to accept: choose an option or override.');
  if (!topology) throw invalid([{ path: '/topology', message: 'is required when choosing an option' }]);
  const option = result.options.find((o) => o.topology === topology);
  if (!option?.design) throw invalid([{ path: '/topology', message: `is not a ranked option of this proposal: ${topology}` }]);
  return { topology, design: option.design, evaluation: null, engineVersion: proposal.engineVersion, rulesetVersion: proposal.rulesetVersion };
}

/** Fields that do not belong to the decision's kind are refused, and an override's design is checked whole. */
function checkDecisionFields(input: DecisionInput): void {
  const issues = [];
  if (input.kind !== 'accept' && !(input.reason ?? '').trim()) issues.push({ path: '/reason', message: 'is required unless you accept the recommendation' });
  if (input.topology !== undefined && input.kind !== 'choose') issues.push({ path: '/topology', message: `belongs to a "choose" decision, not "${input.kind}"` });
  if (input.design !== undefined && input.kind !== 'override') issues.push({ path: '/design', message: `belongs to an "override" decision, not "${input.kind}"` });
  if (input.kind === 'override' && input.design !== undefined) {
    const checked = validateDesign(input.design);
    if (!checked.ok) issues.push(...checked.errors.map((e) => ({ path: `/design${e.path}`, message: e.message })));
  }
  if (issues.length > 0) throw invalid(issues);
}

/**
 * A designer's own values checked as an override would be (every condition and rule, with the
 * spec of the proposal) without recording anything: the full check before deciding.
 */
export async function evaluateOverride(dataSource: DataSource, actor: Viewer, proposalId: number, design: Design, ruleSet: RuleSet): Promise<Wire.OptionEvaluation> {
  const proposal = await proposalFor(dataSource, actor, proposalId, 'proposals:decide');
  const { spec } = await specVersionDocument(dataSource, proposal.specVersionId);
  return evaluateSpecDesign(spec, design, ruleSet);
}

/** A designer's decision: moves a ranked or returned proposal to decided. */
export async function decide(dataSource: DataSource, actor: Viewer, proposalId: number, input: DecisionInput, ruleSet: RuleSet): Promise<Wire.Proposal> {
  checkDecisionFields(input);
  // The engine works outside the transaction (it is CPU, not data); the state is checked again inside.
  const before = await proposalFor(dataSource, actor, proposalId, 'proposals:decide');
  transition(before, 'decide');
  const settled = await settledDesign(before, input, ruleSet, dataSource);
  await dataSource.transaction(async (manager) => {
    // PostgreSQL: concurrent steps on one proposal wait here, then see the state the first one left.
    await lockRowForUpdate(manager, ProposalEntity, proposalId);
    const proposal = await proposalFor(manager, actor, proposalId, 'proposals:decide');
    const status = transition(proposal, 'decide');
    const previous = await manager.getRepository(DecisionEntity).findOne({ where: { proposalId }, order: { id: 'DESC' } });
    const decision = await manager.getRepository(DecisionEntity).save({
      proposalId,
      kind: input.kind,
      topology: settled.topology,
      design: settled.design,
      evaluation: settled.evaluation,
      reason: input.reason?.trim() || null,
      decidedById: actor.id,
      createdAt: new Date().toISOString(),
      engineVersion: settled.engineVersion,
      rulesetVersion: settled.rulesetVersion,
    });
    await manager.getRepository(ProposalEntity).update({ id: proposalId }, { status, updatedAt: decision.createdAt });
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'proposal.decided',
      entityType: 'decision',
      entityId: decision.id,
      projectId: proposal.projectId,
      proposalId,
      beforeId: previous?.id ?? null,
      afterId: decision.id,
      details: { kind: input.kind, topology: settled.topology, from: proposal.status, to: status, passes: settled.evaluation?.passes },
    });
    await queueNotification(manager, { kind: 'proposal.decided', proposalId, decisionId: decision.id, actorId: actor.id });
    await indexRecords(manager, 'proposal', [proposalId]);
  });
  return getProposal(dataSource, actor, proposalId);
}

/**
 * A reviewer's verdict on the latest decision: sign off (`approve`), or send back for rework
 * (`return`, with a comment). The rules of a sign-off, held here rather than in the browser:
 * - a decided design short on a blocking check needs a comment (400 on `/comment`);
 * - the review records the finished verification job that simulated exactly the decided design
 *   (by fingerprint), or none when nothing about it was simulated;
 * - when the only verification about it simulated another design (stale) or was stored before
 *   fingerprints were recorded, the sign-off is refused (409 `verification-stale`, saying what
 *   changed) unless `acceptStaleVerification: true` comes with a comment saying why (400 on
 *   `/comment` without one); the review then records that job and the acceptance.
 */
export async function review(dataSource: DataSource, actor: Viewer, proposalId: number, input: ReviewInput): Promise<Wire.Proposal> {
  const comment = input.comment?.trim() || null;
  if (input.verdict === 'return' && !comment) throw invalid([{ path: '/comment', message: 'is required when sending a proposal back for rework' }]);
  if (input.verdict === 'return' && input.acceptStaleVerification !== undefined) {
    throw invalid([{ path: '/acceptStaleVerification', message: 'belongs to a sign-off (verdict "approve"), not to sending back' }]);
  }
  await dataSource.transaction(async (manager) => {
    await lockRowForUpdate(manager, ProposalEntity, proposalId);
    const proposal = await proposalFor(manager, actor, proposalId, 'proposals:review');
    const status = transition(proposal, input.verdict);
    const decisions = await manager.getRepository(DecisionEntity).find({ where: { proposalId }, order: { id: 'ASC' } });
    const decision = decisions.at(-1);
    if (!decision) throw new AppError('invalid-transition', 409, `Proposal ${proposalId} has no decision to review.`);
    if (decision.decidedById === actor.id) throw new AppError('own-decision', 403, 'Nobody reviews their own decision.');
    let verificationJobId: number | null = null;
    let staleVerificationAccepted = false;
    if (input.verdict === 'approve') {
      const version = await manager.getRepository(SpecVersionEntity).findOneOrFail({ select: { id: true, version: true }, where: { id: proposal.specVersionId } });
      const current = currentDesignOf(proposal, version.version, await rankingOf(manager, proposal), decisions);
      const shortfalls = blockingShortfalls(current?.option ?? null);
      if (shortfalls > 0 && !comment) {
        throw invalid([{ path: '/comment', message: `is required to sign off a design short on ${shortfalls} blocking check${shortfalls === 1 ? '' : 's'}: say why it is accepted anyway` }]);
      }
      const verification = await designVerificationState(manager, proposalId, current);
      if (verification.state === 'stale' || verification.state === 'unbound') {
        const what =
          verification.state === 'stale'
            ? `simulated another design (${verification.changes.join('; ')})`
            : 'was stored before results recorded which design they simulated';
        if (!input.acceptStaleVerification) {
          throw new AppError(
            'verification-stale',
            409,
            `The only SPICE verification of the decided design (${current ? currentDesignName(current) : topologyName(decision.topology)}), job #${verification.jobId}, ${what}. Run the SPICE check again, or sign off anyway with acceptStaleVerification: true and a comment saying why.`,
          );
        }
        if (!comment) throw invalid([{ path: '/comment', message: 'is required to sign off on a verification that simulated another design: say why it is enough' }]);
        staleVerificationAccepted = true;
      }
      verificationJobId = verification.jobId;
    }
    // A send-back records the comment threads still open, so the record says what was left to answer.
    const openComments = input.verdict === 'return' ? (await openThreadSummaries(manager, proposalId)).map((c) => c.id) : [];
    const saved: Review = await manager.getRepository(ReviewEntity).save({
      proposalId,
      decisionId: decision.id,
      verdict: input.verdict,
      comment,
      reviewerId: actor.id,
      createdAt: new Date().toISOString(),
      verificationJobId,
      staleVerificationAccepted,
    });
    await manager.getRepository(ProposalEntity).update({ id: proposalId }, { status, updatedAt: saved.createdAt });
    await recordEvent(manager, {
      actorId: actor.id,
      action: input.verdict === 'approve' ? 'proposal.approved' : 'proposal.returned',
      entityType: 'review',
      entityId: saved.id,
      projectId: proposal.projectId,
      proposalId,
      beforeId: decision.id,
      afterId: saved.id,
      details: {
        verdict: input.verdict,
        from: proposal.status,
        to: status,
        topology: decision.topology,
        ownValues: decision.kind === 'override',
        ...(input.verdict === 'approve' ? { verificationJobId, staleVerificationAccepted } : { openComments }),
      },
    });
    await queueNotification(manager, { kind: input.verdict === 'approve' ? 'proposal.approved' : 'proposal.returned', proposalId, reviewId: saved.id, actorId: actor.id });
    await indexRecords(manager, 'proposal', [proposalId]);
  });
  return getProposal(dataSource, actor, proposalId);
}

/**
 * Withdraws an open proposal with a reason: its author, or a designer of the project. The
 * record stays (decisions, reviews, audit), closed for good.
 */
export async function withdraw(dataSource: DataSource, actor: Viewer, proposalId: number, input: WithdrawalInput): Promise<Wire.Proposal> {
  const reason = input.reason.trim();
  if (!reason) throw invalid([{ path: '/reason', message: 'is required: say why the proposal is withdrawn' }]);
  await dataSource.transaction(async (manager) => {
    await lockRowForUpdate(manager, ProposalEntity, proposalId);
    const proposal = await proposalFor(manager, actor, proposalId, 'proposals:withdraw');
    // A designer of this project, or whoever asked for the proposal.
    const membership = await manager.getRepository(ProjectMemberEntity).findOneBy({ projectId: proposal.projectId, userId: actor.id });
    if (proposal.createdById !== actor.id && !mayIn(actor.role, membership?.role, 'proposals:decide'))
      throw new AppError('not-yours', 403, 'Only the person who asked for this proposal, or a designer, can withdraw it.');
    const status = transition(proposal, 'withdraw');
    const now = new Date().toISOString();
    await manager.getRepository(ProposalEntity).update({ id: proposalId }, { status, closedReason: reason, closedById: actor.id, closedAt: now, updatedAt: now });
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'proposal.withdrawn',
      entityType: 'proposal',
      entityId: proposalId,
      projectId: proposal.projectId,
      proposalId,
      beforeId: proposalId,
      afterId: proposalId,
      details: { from: proposal.status, to: status, reason },
    });
    await indexRecords(manager, 'proposal', [proposalId]);
  });
  return getProposal(dataSource, actor, proposalId);
}

/** The proposal's audit trail, oldest first. */
export async function proposalAudit(dataSource: DataSource, viewer: Viewer, proposalId: number): Promise<AuditEvent[]> {
  await proposalFor(dataSource, viewer, proposalId);
  return dataSource.getRepository(AuditEventEntity).find({ where: { proposalId }, order: { id: 'ASC' } });
}
