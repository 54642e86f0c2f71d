/**
 * Comments on a proposal: threads anchored on one check, figure or SPICE result of a ranked
 * option, replies one level deep, resolved and reopened by the project's designers and
 * reviewers. Each write checks the role held in the proposal's project and that the proposal is
 * still open, stores the row with the proposal's spec version, engine and rule-set versions, and
 * writes its audit event (and, for a comment or reply, the e-mail to the deciding designer) in
 * the same transaction.
 */
import { In, IsNull, type DataSource, type EntityManager } from 'typeorm';
import type { RecommendResult } from '#shared/engine/recommend';
import { CLOSED_STATES } from '#shared/workflow/proposal-states';
import { anchorWords, type CommentAnchor, type CommentFigureKey } from '#shared/workflow/comments';
import type { CommentInput, CommentThread, ReplyInput, ThreadStateInput } from '#shared/api/comments';
import type { ProposalVerificationResult } from '#shared/verification/types';
import { ProposalCommentEntity, type ProposalComment } from '../entities/proposal-comment.entity';
import { ProposalEntity, type Proposal } from '../entities/proposal.entity';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { UserEntity } from '../entities/user.entity';
import { VerificationJobEntity } from '../entities/verification-job.entity';
import { lockRowForUpdate } from '../data-source';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { queueNotification } from './notifications.service';
import { proposalFor } from './proposals.service';
import { rankingOf } from './rankings.service';
import type { PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id' | 'role'>;
type Manager = EntityManager | DataSource;

/** The anchor a stored row hangs on. */
export function anchorOf(row: Pick<ProposalComment, 'anchorKind' | 'topology' | 'checkId' | 'figureKey' | 'verificationJobId'>): CommentAnchor {
  if (row.anchorKind === 'check') return { kind: 'check', topology: row.topology, checkId: row.checkId ?? '' };
  if (row.anchorKind === 'figure') return { kind: 'figure', topology: row.topology, figureKey: (row.figureKey ?? 'rejection') as CommentFigureKey };
  return { kind: 'spice', topology: row.topology, jobId: row.verificationJobId ?? 0 };
}

/** An anchor's fields in an audit event's details. */
function anchorDetails(anchor: CommentAnchor): Record<string, unknown> {
  const { kind, ...rest } = anchor;
  return { anchorKind: kind, ...rest };
}

/** The rows as threads, oldest first, each with its replies, names and spec version number. */
async function threadsOf(manager: Manager, rows: ProposalComment[]): Promise<CommentThread[]> {
  if (rows.length === 0) return [];
  const personIds = [...new Set(rows.flatMap((r) => [r.authorId, r.resolvedById]).filter((id): id is number => id !== null))];
  const versionIds = [...new Set(rows.map((r) => r.specVersionId))];
  // One after another: inside a transaction every query shares one connection.
  const people = await manager.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In(personIds) } });
  const versions = await manager.getRepository(SpecVersionEntity).find({ select: { id: true, version: true }, where: { id: In(versionIds) } });
  const person = (id: number) => ({ id, displayName: people.find((p) => p.id === id)?.displayName ?? `account #${id}` });
  const versionOf = new Map(versions.map((v) => [v.id, v.version]));
  return rows
    .filter((r) => r.parentId === null)
    .map((r) => ({
      id: r.id,
      proposalId: r.proposalId,
      anchor: anchorOf(r),
      specVersionId: r.specVersionId,
      specVersion: versionOf.get(r.specVersionId) ?? 0,
      engineVersion: r.engineVersion,
      rulesetVersion: r.rulesetVersion,
      body: r.body,
      author: person(r.authorId),
      createdAt: r.createdAt,
      resolvedAt: r.resolvedAt,
      resolvedBy: r.resolvedById === null ? null : person(r.resolvedById),
      replies: rows.filter((reply) => reply.parentId === r.id).map((reply) => ({ id: reply.id, body: reply.body, author: person(reply.authorId), createdAt: reply.createdAt })),
    }));
}

/** The proposal's comment rows (threads and replies), oldest first. */
const commentRows = (manager: Manager, proposalId: number) => manager.getRepository(ProposalCommentEntity).find({ where: { proposalId }, order: { id: 'ASC' } });

/** One thread with its replies. */
async function threadById(manager: Manager, proposalId: number, threadId: number): Promise<CommentThread> {
  const rows = await manager.getRepository(ProposalCommentEntity).find({ where: [{ id: threadId, proposalId }, { parentId: threadId, proposalId }], order: { id: 'ASC' } });
  const [thread] = await threadsOf(manager, rows);
  if (!thread) throw notFound('comment');
  return thread;
}

/** Every thread of the proposal, oldest first; 404 outside the viewer's projects. */
export async function listComments(dataSource: DataSource, viewer: Viewer, proposalId: number): Promise<CommentThread[]> {
  await proposalFor(dataSource, viewer, proposalId);
  return threadsOf(dataSource, await commentRows(dataSource, proposalId));
}

/** The open threads of a proposal, each with its anchor in words (the send-back's record and e-mail list them). */
export async function openThreadSummaries(manager: Manager, proposalId: number): Promise<{ id: number; anchor: string; author: string; body: string }[]> {
  const rows = await manager.getRepository(ProposalCommentEntity).find({ where: { proposalId, parentId: IsNull(), resolvedAt: IsNull() }, order: { id: 'ASC' } });
  const threads = await threadsOf(manager, rows);
  return threads.map((t) => ({ id: t.id, anchor: anchorWords(t.anchor), author: t.author.displayName, body: t.body }));
}

/** A write needs the proposal open: a closed record (signed off, withdrawn, superseded) is evidence and stays as it was. */
function requireOpen(proposal: Proposal): void {
  if (CLOSED_STATES.includes(proposal.status)) {
    throw new AppError('proposal-closed', 409, `Proposal ${proposal.id} is ${proposal.status}: its record is closed, so its comments can no longer change.`);
  }
}

/** The text, trimmed at the ends; blank is refused. */
function bodyOf(text: string): string {
  const body = text.trim();
  if (!body) throw invalid([{ path: '/body', message: 'is required: write the comment' }]);
  return body;
}

/** The anchor of a new thread, checked against the proposal: a ranked option, one of its checks, a known figure, or a finished SPICE check of this proposal that simulated the option. */
async function checkedAnchor(manager: EntityManager, proposal: Proposal, result: RecommendResult, input: CommentInput): Promise<CommentAnchor> {
  const given = (['checkId', 'figureKey', 'jobId'] as const).filter((field) => input[field] !== undefined);
  const wanted = input.anchorKind === 'check' ? 'checkId' : input.anchorKind === 'figure' ? 'figureKey' : 'jobId';
  const issues = [
    ...(given.includes(wanted) ? [] : [{ path: `/${wanted}`, message: `is required for a comment on a ${input.anchorKind === 'spice' ? 'SPICE result' : input.anchorKind}` }]),
    ...given.filter((field) => field !== wanted).map((field) => ({ path: `/${field}`, message: `belongs to another kind of anchor, not "${input.anchorKind}"` })),
  ];
  if (issues.length > 0) throw invalid(issues);
  const option = result.options.find((o) => o.topology === input.topology);
  if (!option) throw invalid([{ path: '/topology', message: `is not a ranked option of this proposal: ${input.topology}` }]);
  if (input.anchorKind === 'check') {
    if (!option.checks.some((c) => c.rule === input.checkId)) throw invalid([{ path: '/checkId', message: `is not a check of the ${input.topology} option: ${input.checkId}` }]);
    return { kind: 'check', topology: input.topology, checkId: input.checkId! };
  }
  if (input.anchorKind === 'figure') return { kind: 'figure', topology: input.topology, figureKey: input.figureKey! };
  const job = await manager.getRepository(VerificationJobEntity).findOneBy({ id: input.jobId!, proposalId: proposal.id });
  const simulated = job?.kind === 'proposal' && job.state === 'finished' && ((job.result as ProposalVerificationResult | null)?.options ?? []).some((o) => o.source === 'option' && o.topology === input.topology);
  if (!simulated) throw invalid([{ path: '/jobId', message: `is not a finished SPICE check of this proposal that simulated the ${input.topology} option` }]);
  return { kind: 'spice', topology: input.topology, jobId: input.jobId! };
}

/** What every new comment row records: the proposal's spec version, engine and rule versions it was written on, its text, author and time, open. */
function writtenNow(proposal: Pick<Proposal, 'specVersionId' | 'engineVersion' | 'rulesetVersion'>, body: string, actor: Viewer) {
  return {
    specVersionId: proposal.specVersionId,
    engineVersion: proposal.engineVersion,
    rulesetVersion: proposal.rulesetVersion,
    body,
    authorId: actor.id,
    createdAt: new Date().toISOString(),
    resolvedAt: null,
    resolvedById: null,
  };
}

/** A new thread on one anchor of a ranked option. */
export async function postComment(dataSource: DataSource, actor: Viewer, proposalId: number, input: CommentInput): Promise<CommentThread> {
  const body = bodyOf(input.body);
  return dataSource.transaction(async (manager) => {
    await lockRowForUpdate(manager, ProposalEntity, proposalId);
    const proposal = await proposalFor(manager, actor, proposalId, 'proposals:comment');
    requireOpen(proposal);
    const anchor = await checkedAnchor(manager, proposal, await rankingOf(manager, proposal), input);
    const saved = await manager.getRepository(ProposalCommentEntity).save({
      proposalId,
      projectId: proposal.projectId,
      parentId: null,
      anchorKind: anchor.kind,
      topology: anchor.topology,
      checkId: anchor.kind === 'check' ? anchor.checkId : null,
      figureKey: anchor.kind === 'figure' ? anchor.figureKey : null,
      verificationJobId: anchor.kind === 'spice' ? anchor.jobId : null,
      ...writtenNow(proposal, body, actor),
    });
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'proposal.commented',
      entityType: 'comment',
      entityId: saved.id,
      projectId: proposal.projectId,
      proposalId,
      afterId: saved.id,
      details: { threadId: saved.id, ...anchorDetails(anchor), body },
    });
    await queueNotification(manager, { kind: 'proposal.commented', proposalId, commentId: saved.id, actorId: actor.id });
    return threadById(manager, proposalId, saved.id);
  });
}

/** The thread a write names: a first comment of this proposal (a reply takes no replies of its own), else 404. */
async function threadRow(manager: EntityManager, proposalId: number, threadId: number): Promise<ProposalComment> {
  const row = await manager.getRepository(ProposalCommentEntity).findOneBy({ id: threadId, proposalId, parentId: IsNull() });
  if (!row) throw notFound('comment');
  return row;
}

/** A reply to a thread (one level: replies go to the thread). */
export async function replyToComment(dataSource: DataSource, actor: Viewer, proposalId: number, threadId: number, input: ReplyInput): Promise<CommentThread> {
  const body = bodyOf(input.body);
  return dataSource.transaction(async (manager) => {
    await lockRowForUpdate(manager, ProposalEntity, proposalId);
    const proposal = await proposalFor(manager, actor, proposalId, 'proposals:comment');
    const thread = await threadRow(manager, proposalId, threadId);
    requireOpen(proposal);
    const saved = await manager.getRepository(ProposalCommentEntity).save({
      ...thread,
      id: undefined,
      parentId: thread.id,
      ...writtenNow(proposal, body, actor),
    } as Omit<ProposalComment, 'id'>);
    await recordEvent(manager, {
      actorId: actor.id,
      action: 'proposal.comment-replied',
      entityType: 'comment',
      entityId: saved.id,
      projectId: proposal.projectId,
      proposalId,
      beforeId: thread.id,
      afterId: saved.id,
      details: { threadId: thread.id, ...anchorDetails(anchorOf(thread)), body },
    });
    await queueNotification(manager, { kind: 'proposal.commented', proposalId, commentId: saved.id, actorId: actor.id });
    return threadById(manager, proposalId, thread.id);
  });
}

/** Resolves an open thread or reopens a resolved one, recording who and when; 409 when it already is so. */
export async function setThreadState(dataSource: DataSource, actor: Viewer, proposalId: number, threadId: number, input: ThreadStateInput): Promise<CommentThread> {
  return dataSource.transaction(async (manager) => {
    await lockRowForUpdate(manager, ProposalEntity, proposalId);
    const proposal = await proposalFor(manager, actor, proposalId, 'proposals:comment');
    const thread = await threadRow(manager, proposalId, threadId);
    requireOpen(proposal);
    const resolved = thread.resolvedAt !== null;
    if (resolved === input.resolved) throw new AppError('thread-unchanged', 409, `Comment thread #${threadId} is ${resolved ? 'resolved' : 'open'} already.`);
    const now = new Date().toISOString();
    // Reopening keeps no resolver: the audit trail keeps who resolved it and when.
    await manager.getRepository(ProposalCommentEntity).update({ id: threadId }, input.resolved ? { resolvedAt: now, resolvedById: actor.id } : { resolvedAt: null, resolvedById: null });
    await recordEvent(manager, {
      actorId: actor.id,
      action: input.resolved ? 'proposal.comment-resolved' : 'proposal.comment-reopened',
      entityType: 'comment',
      entityId: threadId,
      projectId: proposal.projectId,
      proposalId,
      beforeId: threadId,
      afterId: threadId,
      details: { threadId, ...anchorDetails(anchorOf(thread)) },
    });
    return threadById(manager, proposalId, threadId);
  });
}
