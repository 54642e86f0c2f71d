/**
 * A project's activity: the audit events of its specs and proposals (a spec's versions, a
 * file's import, and every event of a proposal: ranking, decisions, reviews, SPICE checks, bench
 * measurements, closing), newest first, optionally one person's or one kind's
 * (shared/workflow/activity.ts); a page for the app, every event for the CSV export. The indexes
 * `ix_audit_project`, `ix_audit_project_actor` and `ix_audit_project_action` carry the order.
 */
import { In, type DataSource, type SelectQueryBuilder } from 'typeorm';
import { ACTIVITY_ACTIONS } from '#shared/workflow/activity';
import { activityCsvHeader, activityCsvRows } from '#shared/export/activity-csv';
import type { ActivityEvent, ActivityFilter, ActivityPage, ActivityQuery } from '#shared/api/activity';
import { AuditEventEntity, type AuditEvent } from '../entities/audit-event.entity';
import { DecisionEntity } from '../entities/decision.entity';
import { ProposalEntity } from '../entities/proposal.entity';
import { ReviewEntity } from '../entities/review.entity';
import { SpecEntity } from '../entities/spec.entity';
import { UserEntity } from '../entities/user.entity';
import { projectFor } from './projects.service';
import type { PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/** Events written per batch of the CSV export. */
const CSV_BATCH = 500;

/** The project's spec and proposal events, filtered, without order or paging. */
function activityEvents(dataSource: DataSource, projectId: number, filter: ActivityFilter): SelectQueryBuilder<AuditEvent> {
  const query = dataSource
    .getRepository(AuditEventEntity)
    .createQueryBuilder('e')
    .where('e.projectId = :projectId', { projectId })
    .andWhere("(e.proposalId IS NOT NULL OR e.entityType = 'spec' OR e.action = 'specs.imported')");
  if (filter.actor !== undefined) query.andWhere('e.actorId = :actor', { actor: filter.actor });
  if (filter.kind) query.andWhere('e.action IN (:...actions)', { actions: [...ACTIVITY_ACTIONS[filter.kind]] });
  return query;
}

/** The events with their actor, their spec and the decision or review they recorded. */
async function withContext(dataSource: DataSource, events: AuditEvent[]): Promise<ActivityEvent[]> {
  if (events.length === 0) return [];
  const ids = (pick: (e: AuditEvent) => number | null | undefined) => [...new Set(events.map(pick).filter((id): id is number => typeof id === 'number'))];
  const actorIds = ids((e) => e.actorId);
  const proposalIds = ids((e) => e.proposalId);
  const decisionIds = ids((e) => (e.entityType === 'decision' ? e.entityId : null));
  const reviewIds = ids((e) => (e.entityType === 'review' ? e.entityId : null));
  const [people, proposals, decisions, reviews] = await Promise.all([
    actorIds.length ? dataSource.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In(actorIds) } }) : [],
    proposalIds.length ? dataSource.getRepository(ProposalEntity).find({ select: { id: true, specId: true, recommendedTopology: true }, where: { id: In(proposalIds) } }) : [],
    decisionIds.length ? dataSource.getRepository(DecisionEntity).find({ select: { id: true, kind: true, topology: true, reason: true }, where: { id: In(decisionIds) } }) : [],
    reviewIds.length ? dataSource.getRepository(ReviewEntity).find({ select: { id: true, comment: true }, where: { id: In(reviewIds) } }) : [],
  ]);
  const specOfProposal = new Map(proposals.map((p) => [p.id, p.specId]));
  const recommendsNothing = new Set(proposals.filter((p) => p.recommendedTopology === null).map((p) => p.id));
  const specOf = (e: AuditEvent) => (e.entityType === 'spec' ? e.entityId : e.proposalId !== null ? (specOfProposal.get(e.proposalId) ?? null) : null);
  const specIds = ids(specOf);
  const specs = specIds.length ? await dataSource.getRepository(SpecEntity).find({ select: { id: true, title: true }, where: { id: In(specIds) } }) : [];
  const personOf = new Map(people.map((p) => [p.id, { id: p.id, displayName: p.displayName }]));
  const titleOf = new Map(specs.map((s) => [s.id, s.title]));
  const decisionOf = new Map(decisions.map((d) => [d.id, { kind: d.kind, topology: d.topology, reason: d.reason }]));
  const reviewOf = new Map(reviews.map((r) => [r.id, { comment: r.comment }]));
  return events.map((event) => {
    const specId = specOf(event);
    return {
      ...event,
      actor: event.actorId === null ? null : (personOf.get(event.actorId) ?? null),
      spec: specId === null ? null : { id: specId, title: titleOf.get(specId) ?? '' },
      records: {
        decision: event.entityType === 'decision' ? (decisionOf.get(event.entityId) ?? null) : undefined,
        review: event.entityType === 'review' ? (reviewOf.get(event.entityId) ?? null) : undefined,
        nothingRecommended: event.proposalId !== null ? recommendsNothing.has(event.proposalId) : undefined,
      },
    };
  });
}

/** One page of the project's activity, newest first; 404 outside the viewer's projects. */
export async function listActivity(dataSource: DataSource, viewer: Viewer, projectId: number, query: ActivityQuery): Promise<ActivityPage> {
  await projectFor(dataSource, viewer, projectId);
  const filter = { actor: query.actor, kind: query.kind };
  const [events, total] = await Promise.all([
    activityEvents(dataSource, projectId, filter)
      .orderBy('e.id', 'DESC')
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize)
      .getMany(),
    activityEvents(dataSource, projectId, filter).getCount(),
  ]);
  return { items: await withContext(dataSource, events), total, page: query.page, pageSize: query.pageSize };
}

/**
 * The project's activity as CSV, oldest first (a record read top to bottom), every event the
 * filter keeps: the visibility is checked first (404 before anything is sent), then the text comes
 * in batches, each read after the one before by id.
 */
export async function activityCsv(dataSource: DataSource, viewer: Viewer, projectId: number, filter: ActivityFilter): Promise<{ fileName: string; chunks: AsyncIterable<string> }> {
  await projectFor(dataSource, viewer, projectId);
  async function* chunks() {
    yield activityCsvHeader();
    let after = 0;
    for (;;) {
      const events = await activityEvents(dataSource, projectId, filter).andWhere('e.id > :after', { after }).orderBy('e.id', 'ASC').limit(CSV_BATCH).getMany();
      if (events.length === 0) return;
      yield activityCsvRows(await withContext(dataSource, events));
      if (events.length < CSV_BATCH) return;
      after = events.at(-1)!.id;
    }
  }
  return { fileName: `longtail-activity-project-${projectId}.csv`, chunks: chunks() };
}
