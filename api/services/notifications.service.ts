/**
 * E-mail notifications about the workflow. `queueNotification` is called inside the workflow
 * change's own transaction (beside `recordEvent`): it works out who is told, writes each
 * message into the outbox, and is committed or rolled back with the change. Nothing is sent
 * here; the outbox worker (api/mail/outbox-worker.ts) sends later, with retries, so a slow or
 * failing mail server never holds up or undoes a decision.
 *
 * Who is told (current project members only, never the person who acted, never anyone who
 * turned e-mail off or turned that kind of notice off (shared/workflow/notices.ts, the kinds and
 * their descriptions), never a disabled account):
 * - a proposal ranked: the project's designers ("ready for decision");
 * - a decision recorded: the project's reviewers ("decided");
 * - a review: the spec's author (and the author of the ranked version, when another person)
 *   and the designer whose decision was reviewed ("approved" / "returned");
 * - older rankings closed as superseded by a newer one: the project's designers, whoever asked
 *   for a closed ranking and the designer of a closed one's last decision, in one digest each;
 * - a comment or reply: the designer of the proposal's latest decision (none before a decision);
 * - a spec's new version (saved or imported): everyone who asked for a ranking of one of its
 *   earlier versions ("spec.new-version");
 * - a SPICE check or Monte Carlo finished or failed: whoever asked for it, with the outcome
 *   ("verification.ended"; written by the verification queue with the job's last state).
 */
import { In, MoreThan, type DataSource, type EntityManager } from 'typeorm';
import { DecisionEntity, type Decision } from '../entities/decision.entity';
import { MailMessageEntity } from '../entities/mail-message.entity';
import { MailOutboxEntity, type MailOutbox, type OutboxStatus } from '../entities/mail-outbox.entity';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { ProjectEntity } from '../entities/project.entity';
import { ProposalEntity } from '../entities/proposal.entity';
import { ReviewEntity } from '../entities/review.entity';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { SpecEntity } from '../entities/spec.entity';
import { UserEntity, type User } from '../entities/user.entity';
import { VerificationJobEntity } from '../entities/verification-job.entity';
import { wantsNotice } from '#shared/workflow/notices';
import type { Mailbox } from '#shared/mail/types';
import { ProposalCommentEntity } from '../entities/proposal-comment.entity';
import { anchorWords } from '#shared/workflow/comments';
import { anchorOf, openThreadSummaries } from './comments.service';
import { composeMessage, DIGEST_AFTER, DIGEST_WINDOW_MS, type DecisionFacts, type MessageFacts, type NotificationKind, type ProposalFacts } from '../mail/compose';

export type NotificationEvent =
  | { kind: 'proposal.ready'; proposalId: number; actorId: number }
  | { kind: 'proposal.decided'; proposalId: number; decisionId: number; actorId: number }
  | { kind: 'proposal.approved' | 'proposal.returned'; proposalId: number; reviewId: number; actorId: number }
  /** `proposalId` is the newer proposal; `closedIds` the older ones it superseded. */
  | { kind: 'proposal.superseded'; proposalId: number; closedIds: number[]; actorId: number }
  /** A comment or reply: the latest decision's designer is told. */
  | { kind: 'proposal.commented'; proposalId: number; commentId: number; actorId: number }
  /** A spec's new version was saved (edited or imported); `changes`: fields that differ from the version before. */
  | { kind: 'spec.new-version'; specVersionId: number; changes: number; actorId: number }
  /** A SPICE job finished or failed (written by the verification queue: nobody acted). */
  | { kind: 'verification.ended'; jobId: number };

export interface NotificationSettings {
  /** Where links in messages point (the app's public address, no trailing slash). */
  baseUrl: string;
  /** Messages to one person within the digest window sent one by one before the rest wait for a digest (default DIGEST_AFTER). */
  digestAfter?: number;
  /** The digest window, ms (default DIGEST_WINDOW_MS). */
  digestWindowMs?: number;
}

let settings: Required<NotificationSettings> = { baseUrl: 'http://localhost:3000', digestAfter: DIGEST_AFTER, digestWindowMs: DIGEST_WINDOW_MS };

/** Sets the public address for links (server.ts, from LONGTAIL_BASE_URL / PORT), and the digest threshold and window (tests). */
export function configureNotifications(next: NotificationSettings): void {
  settings = { baseUrl: next.baseUrl.replace(/\/+$/, ''), digestAfter: next.digestAfter ?? DIGEST_AFTER, digestWindowMs: next.digestWindowMs ?? DIGEST_WINDOW_MS };
}

export function notificationSettings(): NotificationSettings {
  return settings;
}

type Member = Pick<User, 'id' | 'email' | 'displayName' | 'notify' | 'noticesOff' | 'disabledAt'>;

/** Largest decision or review text quoted in a message (the rest is on the proposal's page). */
const MAX_QUOTE = 2000;
const quote = (text: string | null) => (text && text.length > MAX_QUOTE ? `${text.slice(0, MAX_QUOTE)}…` : text);

function decisionFacts(decision: Decision, recommended: string | null, decidedBy: string): DecisionFacts {
  let passes: boolean | undefined;
  if (decision.kind === 'override' && decision.evaluation) passes = decision.evaluation.passes;
  return { kind: decision.kind, topology: decision.topology, recommended, reason: quote(decision.reason), passes, decidedBy };
}

/**
 * For each recipient who had DIGEST_AFTER or more messages within DIGEST_WINDOW_MS: when the new
 * message goes out with their digest (the time of the digest already waiting, else the end of the
 * window from now). Others are missing from the map and are sent at once.
 */
async function digestTimes(manager: EntityManager, userIds: number[], nowMs: number): Promise<Map<number, string>> {
  if (userIds.length === 0) return new Map();
  const recent = await manager.getRepository(MailOutboxEntity).find({
    select: { id: true, userId: true, digest: true, status: true, nextAttemptAt: true, attempts: true },
    where: { userId: In(userIds), createdAt: MoreThan(new Date(nowMs - settings.digestWindowMs).toISOString()) },
  });
  const times = new Map<number, string>();
  for (const userId of userIds) {
    const mine = recent.filter((row) => row.userId === userId);
    if (mine.length < settings.digestAfter) continue;
    // A digest waiting for the end of its window, not one the worker has leased while it sends
    // (its time is then the lease's end, minutes away): the new row would wait for that lease.
    const windowEnd = new Date(nowMs + settings.digestWindowMs).toISOString();
    const waiting = mine.filter((row) => row.digest && row.status === 'pending' && row.attempts === 0 && row.nextAttemptAt <= windowEnd).map((row) => row.nextAttemptAt).sort()[0];
    times.set(userId, waiting ?? windowEnd);
  }
  return times;
}

/** What an event comes to before anyone is filtered out: the message's facts, where it belongs, and who is told why. */
interface Notice {
  facts: MessageFacts;
  projectId: number;
  proposalId: number | null;
  /** The person who acted (never told about it), or null when nobody did (a SPICE job settling). */
  actorId: number | null;
  /** Recipients with the reason each is told, in order. */
  told: Map<number, string[]>;
}

/** Who is told why, in the order they are added, without repeats. */
function tellingList() {
  const told = new Map<number, string[]>();
  const tell = (userId: number, because: string) => told.set(userId, [...(told.get(userId) ?? []), because]);
  return { told, tell };
}

/** Display names of accounts by id (for "who did what"). */
async function namesOf(manager: EntityManager, ids: number[]): Promise<(id: number) => string> {
  const people = ids.length === 0 ? [] : await manager.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In([...new Set(ids)]) } });
  const byId = new Map(people.map((p) => [p.id, p.displayName]));
  return (id: number) => byId.get(id) ?? `account #${id}`;
}

/** The workflow events on a proposal: ranked, decided, reviewed, older rankings superseded. */
async function proposalNotice(manager: EntityManager, event: Extract<NotificationEvent, { proposalId: number }>): Promise<Notice> {
  const proposal = await manager.getRepository(ProposalEntity).findOneOrFail({
    select: { id: true, projectId: true, specId: true, specVersionId: true, recommendedTopology: true },
    where: { id: event.proposalId },
  });
  // One after another: inside a transaction every query shares one connection (PostgreSQL's
  // client refuses overlapping queries on one connection from pg 9 on).
  const project = await manager.getRepository(ProjectEntity).findOneByOrFail({ id: proposal.projectId });
  const spec = await manager.getRepository(SpecEntity).findOneByOrFail({ id: proposal.specId });
  const version = await manager.getRepository(SpecVersionEntity).findOneOrFail({ select: { id: true, version: true, title: true, createdById: true }, where: { id: proposal.specVersionId } });
  const memberships = await manager.getRepository(ProjectMemberEntity).findBy({ projectId: proposal.projectId });
  /** The members holding a role in this project: designers and reviewers are chosen by it. */
  const holding = (role: string) => memberships.filter((m) => m.role === role).map((m) => m.userId);

  const { baseUrl } = settings;
  const base = proposalFactsOf(proposal, project, version, baseUrl);
  const { told, tell } = tellingList();
  let facts: MessageFacts;
  const inProject = `the project "${project.name}"`;

  if (event.kind === 'proposal.ready') {
    const nameOf = await namesOf(manager, [event.actorId]);
    facts = { ...base, kind: event.kind, rankedBy: nameOf(event.actorId), recommended: proposal.recommendedTopology };
    for (const id of holding('designer')) tell(id, `you design in ${inProject}`);
  } else if (event.kind === 'proposal.decided') {
    const decision = await manager.getRepository(DecisionEntity).findOneByOrFail({ id: event.decisionId });
    const decisionNumber = await manager.getRepository(DecisionEntity).countBy({ proposalId: proposal.id });
    const nameOf = await namesOf(manager, [decision.decidedById]);
    facts = { ...base, kind: event.kind, decision: decisionFacts(decision, proposal.recommendedTopology, nameOf(decision.decidedById)), decisionNumber };
    for (const id of holding('reviewer')) tell(id, `you review in ${inProject}`);
  } else if (event.kind === 'proposal.superseded') {
    const closed = await manager.getRepository(ProposalEntity).find({ select: { id: true, specVersionId: true, createdById: true }, where: { id: In(event.closedIds) }, order: { id: 'ASC' } });
    const versions = await manager.getRepository(SpecVersionEntity).find({ select: { id: true, version: true }, where: { id: In([...new Set(closed.map((c) => c.specVersionId))]) } });
    const numberOf = new Map(versions.map((v) => [v.id, v.version]));
    const nameOf = await namesOf(manager, [event.actorId]);
    facts = { ...base, kind: event.kind, rankedBy: nameOf(event.actorId), closed: closed.map((c) => ({ proposalId: c.id, specVersion: numberOf.get(c.specVersionId) ?? 0, link: `${baseUrl}/proposals/${c.id}` })) };
    for (const id of holding('designer')) tell(id, `you design in ${inProject}`);
    for (const c of closed) tell(c.createdById, `you asked for proposal #${c.id}`);
    const decisions = await manager.getRepository(DecisionEntity).find({ select: { id: true, proposalId: true, decidedById: true }, where: { proposalId: In(event.closedIds) }, order: { id: 'ASC' } });
    for (const d of decisions) tell(d.decidedById, `you decided proposal #${d.proposalId}`);
  } else if (event.kind === 'proposal.commented') {
    const comment = await manager.getRepository(ProposalCommentEntity).findOneByOrFail({ id: event.commentId });
    const decision = await manager.getRepository(DecisionEntity).findOne({ select: { id: true, decidedById: true }, where: { proposalId: proposal.id }, order: { id: 'DESC' } });
    const nameOf = await namesOf(manager, [comment.authorId]);
    facts = { ...base, kind: event.kind, commentedBy: nameOf(comment.authorId), anchor: anchorWords(anchorOf(comment)), reply: comment.parentId !== null, body: quote(comment.body) ?? '' };
    if (decision) tell(decision.decidedById, 'you made the latest decision on this proposal');
  } else {
    const review = await manager.getRepository(ReviewEntity).findOneByOrFail({ id: event.reviewId });
    const decision = await manager.getRepository(DecisionEntity).findOneByOrFail({ id: review.decisionId });
    const nameOf = await namesOf(manager, [review.reviewerId, decision.decidedById]);
    facts = {
      ...base,
      kind: event.kind,
      reviewedBy: nameOf(review.reviewerId),
      comment: quote(review.comment),
      decision: decisionFacts(decision, proposal.recommendedTopology, nameOf(decision.decidedById)),
      ...(review.verdict === 'approve' ? { verification: { jobId: review.verificationJobId ?? null, staleAccepted: Boolean(review.staleVerificationAccepted) } } : {}),
      ...(review.verdict === 'return' ? { openComments: (await openThreadSummaries(manager, proposal.id)).map((c) => ({ ...c, body: quote(c.body) ?? '' })) } : {}),
    };
    tell(spec.createdById, `you wrote the spec "${spec.title}"`);
    if (version.createdById !== spec.createdById) tell(version.createdById, `you wrote version ${version.version} of the spec`);
    tell(decision.decidedById, 'you made the decision under review');
  }
  return { facts, projectId: proposal.projectId, proposalId: proposal.id, actorId: event.actorId, told };
}

/** A new version of a spec: everyone who asked for a ranking of one of its earlier versions. */
async function specVersionNotice(manager: EntityManager, event: Extract<NotificationEvent, { kind: 'spec.new-version' }>): Promise<Notice> {
  const version = await manager.getRepository(SpecVersionEntity).findOneOrFail({ select: { id: true, specId: true, version: true, title: true, note: true }, where: { id: event.specVersionId } });
  const spec = await manager.getRepository(SpecEntity).findOneByOrFail({ id: version.specId });
  const project = await manager.getRepository(ProjectEntity).findOneByOrFail({ id: spec.projectId });
  const rankings = await manager.getRepository(ProposalEntity).find({ select: { id: true, specVersionId: true, createdById: true }, where: { specId: spec.id }, order: { id: 'ASC' } });
  const versions = await manager.getRepository(SpecVersionEntity).find({ select: { id: true, version: true }, where: { specId: spec.id } });
  const numberOf = new Map(versions.map((v) => [v.id, v.version]));
  const nameOf = await namesOf(manager, [event.actorId]);
  const { baseUrl } = settings;
  const { told, tell } = tellingList();
  // One reason per person: their latest ranking of the spec.
  const latestOf = new Map<number, { id: number; version: number }>();
  for (const r of rankings) latestOf.set(r.createdById, { id: r.id, version: numberOf.get(r.specVersionId) ?? 0 });
  for (const [userId, r] of latestOf) tell(userId, `you asked for a ranking of version ${r.version} of this spec (proposal #${r.id})`);
  return {
    facts: {
      kind: 'spec.new-version',
      projectName: project.name,
      specTitle: version.title,
      specVersion: version.version,
      savedBy: nameOf(event.actorId),
      note: quote(version.note),
      changes: event.changes,
      link: `${baseUrl}/specs/${spec.id}/history`,
      profileLink: `${baseUrl}/profile`,
    },
    projectId: spec.projectId,
    proposalId: null,
    actorId: event.actorId,
    told,
  };
}

/** What every message about one proposal says of it: its number, project, spec version and links. */
function proposalFactsOf(proposal: { id: number }, project: { name: string }, version: { title: string; version: number }, baseUrl: string): ProposalFacts {
  return {
    proposalId: proposal.id,
    projectName: project.name,
    specTitle: version.title,
    specVersion: version.version,
    link: `${baseUrl}/proposals/${proposal.id}`,
    profileLink: `${baseUrl}/profile`,
  };
}

/** A SPICE check or Monte Carlo settled (finished or failed): whoever asked for it. */
async function verificationNotice(manager: EntityManager, event: Extract<NotificationEvent, { kind: 'verification.ended' }>): Promise<Notice | null> {
  const job = await manager.getRepository(VerificationJobEntity).findOneByOrFail({ id: event.jobId });
  if (job.state !== 'finished' && job.state !== 'failed') return null;
  const proposal = await manager.getRepository(ProposalEntity).findOneOrFail({ select: { id: true, projectId: true, specVersionId: true }, where: { id: job.proposalId } });
  const project = await manager.getRepository(ProjectEntity).findOneByOrFail({ id: proposal.projectId });
  const version = await manager.getRepository(SpecVersionEntity).findOneOrFail({ select: { id: true, version: true, title: true }, where: { id: proposal.specVersionId } });
  const { baseUrl } = settings;
  const { told, tell } = tellingList();
  tell(job.requestedById, `you asked for this ${job.kind === 'monte-carlo' ? 'Monte Carlo' : 'SPICE check'}`);
  return {
    facts: {
      kind: 'verification.ended',
      ...proposalFactsOf(proposal, project, version, baseUrl),
      job: { id: job.id, kind: job.kind, state: job.state, message: quote(job.message), result: job.result },
    },
    projectId: proposal.projectId,
    proposalId: proposal.id,
    actorId: null,
    told,
  };
}

/**
 * Writes the messages an event calls for into the outbox, in the caller's transaction.
 * Returns the rows written (none when nobody is to be told).
 */
export async function queueNotification(manager: EntityManager, event: NotificationEvent): Promise<MailOutbox[]> {
  const notice = event.kind === 'spec.new-version' ? await specVersionNotice(manager, event) : event.kind === 'verification.ended' ? await verificationNotice(manager, event) : await proposalNotice(manager, event);
  if (!notice || notice.told.size === 0) return [];
  const { facts, told } = notice;
  const kind: NotificationKind = facts.kind;
  const memberships = await manager.getRepository(ProjectMemberEntity).find({ select: { userId: true }, where: { projectId: notice.projectId } });
  const memberIds = new Set(memberships.map((m) => m.userId));
  const people: Member[] = await manager.getRepository(UserEntity).find({
    select: { id: true, email: true, displayName: true, notify: true, noticesOff: true, disabledAt: true },
    where: { id: In([...told.keys()].filter((id) => memberIds.has(id))) },
  });
  const byId = new Map(people.map((p) => [p.id, p]));

  const nowMs = Date.now();
  const now = new Date(nowMs).toISOString();
  // Current members only, never the person who acted, never a disabled account, and only those
  // who want this kind (the master switch and the kinds turned off: shared/workflow/notices.ts).
  const recipients = [...told.keys()].filter((userId) => {
    const person = byId.get(userId);
    return person && userId !== notice.actorId && !person.disabledAt && wantsNotice(person, kind);
  });
  const held = await digestTimes(manager, recipients, nowMs);
  const rows: Omit<MailOutbox, 'id'>[] = [];
  for (const userId of recipients) {
    const person = byId.get(userId)!;
    const reasons = told.get(userId)!;
    const { subject, text } = composeMessage(facts, person.displayName, [...new Set(reasons)].join(' and '));
    // Beyond DIGEST_AFTER messages within the window, the row waits for the person's digest.
    const digestAt = held.get(userId) ?? null;
    rows.push({
      createdAt: now,
      kind,
      projectId: notice.projectId,
      proposalId: notice.proposalId,
      userId,
      toAddress: person.email,
      toName: person.displayName,
      subject,
      body: text,
      status: 'pending',
      attempts: 0,
      nextAttemptAt: digestAt ?? now,
      lastError: null,
      sentAt: null,
      digest: digestAt !== null,
      link: facts.link,
    });
  }
  if (rows.length === 0) return [];
  return manager.getRepository(MailOutboxEntity).save(rows as MailOutbox[]);
}

/** Largest number of received messages the admin page lists. */
export const MAILBOX_PAGE = 200;

/** The local mail server's messages, newest first, and how the outbox stands. */
export async function listReceivedMail(dataSource: DataSource): Promise<Mailbox> {
  const repository = dataSource.getRepository(MailMessageEntity);
  const outbox = dataSource.getRepository(MailOutboxEntity);
  const statuses: OutboxStatus[] = ['pending', 'sent', 'failed'];
  const [messages, total, ...counts] = await Promise.all([
    repository.find({ order: { id: 'DESC' }, take: MAILBOX_PAGE }),
    repository.count(),
    ...statuses.map((status) => outbox.countBy({ status })),
  ]);
  return {
    items: messages.map((m) => ({
      id: m.id,
      at: m.receivedAt,
      from: m.mailFrom,
      to: m.recipients,
      subject: m.subject,
      text: m.textBody,
      outboxId: m.outboxId,
    })),
    total,
    outbox: Object.fromEntries(statuses.map((status, i) => [status, counts[i]])) as Record<OutboxStatus, number>,
  };
}
