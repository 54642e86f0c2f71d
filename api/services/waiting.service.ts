/**
 * What waits for a person across every project they belong to, by the role they hold in each
 * (shared/workflow/waiting.ts): rankings to decide and decisions sent back (designers), decisions
 * to review that are not their own (reviewers), specs whose latest version has no ranking
 * (systems engineers). Oldest first; a page's rows are read from the indexes
 * `ix_proposal_project_status_updated` (proposals) and `uq_spec_version` with
 * `ix_proposal_spec_version` (specs), then named with one query per kind of name.
 */
import { In, type DataSource, type SelectQueryBuilder } from 'typeorm';
import { WAITING_KINDS, WAITING_RULES, waitingKindsFor, type WaitingKind } from '#shared/workflow/waiting';
import type { ProposalState } from '#shared/workflow/proposal-states';
import type { WaitingCounts, WaitingItem, WaitingPage, WaitingQuery } from '#shared/api/waiting';
import { DecisionEntity } from '../entities/decision.entity';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { ProjectEntity } from '../entities/project.entity';
import { ProposalEntity } from '../entities/proposal.entity';
import { ReviewEntity } from '../entities/review.entity';
import { SpecEntity } from '../entities/spec.entity';
import { SpecVersionEntity } from '../entities/spec-version.entity';
import { UserEntity } from '../entities/user.entity';
import type { PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id'>;

/** The projects where each kind waits for the viewer: their memberships, by the role held in each. */
async function projectsByKind(dataSource: DataSource, viewer: Viewer): Promise<Record<WaitingKind, number[]>> {
  const memberships = await dataSource.getRepository(ProjectMemberEntity).find({ select: { projectId: true, role: true }, where: { userId: viewer.id } });
  const byKind = Object.fromEntries(WAITING_KINDS.map((kind) => [kind, [] as number[]])) as Record<WaitingKind, number[]>;
  for (const m of memberships) for (const kind of waitingKindsFor(m.role)) byKind[kind].push(m.projectId);
  return byKind;
}

/** Proposals of the projects in the state, oldest change first; for reviews, not those whose latest decision is the viewer's own. */
function waitingProposals(dataSource: DataSource, viewer: Viewer, kind: WaitingKind, projectIds: number[], state: ProposalState): SelectQueryBuilder<object> {
  const query = dataSource
    .getRepository(ProposalEntity)
    .createQueryBuilder('p')
    .where('p.projectId IN (:...projectIds)', { projectIds })
    .andWhere('p.status = :state', { state });
  if (kind === 'review') {
    // Nobody reviews their own decision: it waits for the project's other reviewers.
    query.andWhere('NOT EXISTS (SELECT 1 FROM decision d WHERE d.proposal_id = p.id AND d.decided_by_id = :viewerId AND d.id = (SELECT MAX(d2.id) FROM decision d2 WHERE d2.proposal_id = p.id))', {
      viewerId: viewer.id,
    });
  }
  return query;
}

/** Specs of the projects whose latest version no proposal ranks. */
function specsToRank(dataSource: DataSource, projectIds: number[]): SelectQueryBuilder<object> {
  return dataSource
    .getRepository(SpecEntity)
    .createQueryBuilder('s')
    .innerJoin(SpecVersionEntity.options.name, 'v', 'v.specId = s.id AND v.version = s.latestVersion')
    .where('s.projectId IN (:...projectIds)', { projectIds })
    .andWhere('NOT EXISTS (SELECT 1 FROM proposal r WHERE r.spec_version_id = v.id)');
}

/** How many of each kind wait for the viewer, and the kinds their roles can wait on. */
export async function waitingCounts(dataSource: DataSource, viewer: Viewer): Promise<WaitingCounts> {
  const projects = await projectsByKind(dataSource, viewer);
  const kinds = WAITING_KINDS.filter((kind) => projects[kind].length > 0);
  const counts = Object.fromEntries(WAITING_KINDS.map((kind) => [kind, 0])) as Record<WaitingKind, number>;
  for (const kind of kinds) {
    const { state } = WAITING_RULES[kind];
    counts[kind] = await (state ? waitingProposals(dataSource, viewer, kind, projects[kind], state) : specsToRank(dataSource, projects[kind])).getCount();
  }
  return { counts, kinds };
}

/** A row of a page before it is named. */
interface Row {
  proposalId: number | null;
  projectId: number;
  specId: number;
  specVersionId: number;
  since: string;
  askedById: number;
}

async function proposalRows(dataSource: DataSource, viewer: Viewer, query: WaitingQuery, projectIds: number[], state: ProposalState): Promise<[Row[], number]> {
  const base = () => waitingProposals(dataSource, viewer, query.kind, projectIds, state);
  const raw = await base()
    .select('p.id', 'proposalId')
    .addSelect('p.projectId', 'projectId')
    .addSelect('p.specId', 'specId')
    .addSelect('p.specVersionId', 'specVersionId')
    .addSelect('p.updatedAt', 'since')
    .addSelect('p.createdById', 'askedById')
    .orderBy('p.updatedAt', 'ASC')
    .addOrderBy('p.id', 'ASC')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize)
    .getRawMany<Row>();
  return [raw, await base().getCount()];
}

async function specRows(dataSource: DataSource, query: WaitingQuery, projectIds: number[]): Promise<[Row[], number]> {
  const raw = await specsToRank(dataSource, projectIds)
    .select('s.id', 'specId')
    .addSelect('s.projectId', 'projectId')
    .addSelect('v.id', 'specVersionId')
    .addSelect('v.createdAt', 'since')
    .addSelect('v.createdById', 'askedById')
    .orderBy('v.createdAt', 'ASC')
    .addOrderBy('s.id', 'ASC')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize)
    .getRawMany<Omit<Row, 'proposalId'>>();
  return [raw.map((r) => ({ ...r, proposalId: null })), await specsToRank(dataSource, projectIds).getCount()];
}

/** The latest decision and review of each proposal of a page (who decided, who sent it back). */
async function latestSteps(dataSource: DataSource, proposalIds: number[]) {
  if (proposalIds.length === 0) return { decisions: new Map<number, number>(), reviews: new Map<number, number>() };
  const [decisions, reviews] = await Promise.all([
    dataSource.getRepository(DecisionEntity).find({ select: { id: true, proposalId: true, decidedById: true }, where: { proposalId: In(proposalIds) }, order: { id: 'ASC' } }),
    dataSource.getRepository(ReviewEntity).find({ select: { id: true, proposalId: true, reviewerId: true }, where: { proposalId: In(proposalIds) }, order: { id: 'ASC' } }),
  ]);
  return { decisions: new Map(decisions.map((d) => [d.proposalId, d.decidedById])), reviews: new Map(reviews.map((r) => [r.proposalId, r.reviewerId])) };
}

/** One page of one kind of what waits for the viewer, oldest first. */
export async function listWaiting(dataSource: DataSource, viewer: Viewer, query: WaitingQuery): Promise<WaitingPage> {
  const projectIds = (await projectsByKind(dataSource, viewer))[query.kind];
  const empty = { items: [], total: 0, page: query.page, pageSize: query.pageSize };
  if (projectIds.length === 0) return empty;
  const { state } = WAITING_RULES[query.kind];
  const [raw, total] = state ? await proposalRows(dataSource, viewer, query, projectIds, state) : await specRows(dataSource, query, projectIds);
  const rows = raw.map((r) => ({ ...r, proposalId: r.proposalId === null ? null : Number(r.proposalId), projectId: Number(r.projectId), specId: Number(r.specId), specVersionId: Number(r.specVersionId), askedById: Number(r.askedById) }));
  if (rows.length === 0) return { ...empty, total };
  const proposalIds = rows.flatMap((r) => (r.proposalId === null ? [] : [r.proposalId]));
  const [steps, projects, versions] = await Promise.all([
    latestSteps(dataSource, proposalIds),
    dataSource.getRepository(ProjectEntity).find({ select: { id: true, name: true }, where: { id: In([...new Set(rows.map((r) => r.projectId))]) } }),
    dataSource.getRepository(SpecVersionEntity).find({ select: { id: true, version: true, title: true }, where: { id: In([...new Set(rows.map((r) => r.specVersionId))]) } }),
  ]);
  const byWhom = (row: (typeof rows)[number]): number | null => {
    if (query.kind === 'review') return steps.decisions.get(row.proposalId!) ?? null;
    if (query.kind === 'rework') return steps.reviews.get(row.proposalId!) ?? null;
    return row.askedById;
  };
  const personIds = [...new Set(rows.map(byWhom).filter((id): id is number => id !== null))];
  const people = personIds.length ? await dataSource.getRepository(UserEntity).find({ select: { id: true, displayName: true }, where: { id: In(personIds) } }) : [];
  const projectOf = new Map(projects.map((p) => [p.id, p]));
  const versionOf = new Map(versions.map((v) => [v.id, v]));
  const personOf = new Map(people.map((p) => [p.id, { id: p.id, displayName: p.displayName }]));
  const items: WaitingItem[] = rows.map((row) => {
    const version = versionOf.get(row.specVersionId);
    const by = byWhom(row);
    return {
      kind: query.kind,
      since: row.since,
      project: { id: row.projectId, name: projectOf.get(row.projectId)?.name ?? '' },
      spec: { id: row.specId, title: version?.title ?? '', version: version?.version ?? 0 },
      proposalId: row.proposalId,
      by: by === null ? null : (personOf.get(by) ?? null),
      yours: query.kind === 'rework' && steps.decisions.get(row.proposalId!) === viewer.id,
    };
  });
  return { items, total, page: query.page, pageSize: query.pageSize };
}
