/**
 * The one search (GET /api/search): projects, specs, proposals and people in the index
 * (search-index.service.ts), only what the person may see, as everywhere else: projects they
 * belong to (an administrator: all) with their specs and proposals, and people who share a
 * project with them, themselves included (an administrator: everyone, as on the people page).
 *
 * The query is cut into words (api/search/search-words.ts) and handed to the back end's full-text
 * index as a parameter: FTS5 `MATCH` ranked by bm25 with the title ten times the rest (SQLite), or
 * `@@` a tsquery ranked by ts_rank with the title weighted A (PostgreSQL). Best match first, then
 * the newest record. Every kind's count in one statement, then each page asked for (without a
 * kind, the first page of every kind that has hits).
 */
import { In, type DataSource } from 'typeorm';
import { SEARCH_KINDS, type SearchAnswer, type SearchGroup, type SearchHit, type SearchKind, type SearchQuery } from '#shared/api/search';
import type { ProposalState } from '#shared/workflow/proposal-states';
import { mayIn, type ProjectRoleOf } from '#shared/workflow/roles';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { ProjectEntity } from '../entities/project.entity';
import { ProposalEntity } from '../entities/proposal.entity';
import { isPostgres } from '../data-source';
import { excerptOf, markedTitle } from '../search/search-excerpt';
import { fts5Expression, queryParts, tsqueryText, type QueryPart } from '../search/search-words';
import { SqlParameters } from '../search/sql-parameters';
import type { PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id' | 'role'> & { projectRoles?: readonly ProjectRoleOf[] };

/** Title words weigh this many times a line's in SQLite's bm25 (PostgreSQL: weights A and B). */
const TITLE_WEIGHT = 10;

/** A matched entry before it is named. */
interface EntryRow {
  id: number;
  kind: SearchKind;
  ref_id: number;
  project_id: number | null;
  title: string;
  body: string;
}

/** The projects whose records the viewer sees (null: all of them). */
async function visibleProjects(dataSource: DataSource, viewer: Viewer): Promise<number[] | null> {
  if (mayIn(viewer.role, null, 'projects:read-all')) return null;
  if (viewer.projectRoles) return viewer.projectRoles.map((m) => m.projectId);
  return (await dataSource.getRepository(ProjectMemberEntity).find({ select: { projectId: true }, where: { userId: viewer.id } })).map((m) => m.projectId);
}

/** `FROM … WHERE` the entries the query matches, and the score (lower is better) of each. */
function matching(dataSource: DataSource, p: SqlParameters, parts: readonly QueryPart[]): { from: string; score: string } {
  if (isPostgres(dataSource)) {
    const query = `CAST(${p.add(tsqueryText(parts))} AS tsquery)`;
    return { from: `FROM search_entry e WHERE e.document @@ ${query}`, score: `-ts_rank(e.document, ${query})` };
  }
  return { from: `FROM search_fts JOIN search_entry e ON e.id = search_fts.rowid WHERE search_fts MATCH ${p.add(fts5Expression(parts))}`, score: `bm25(search_fts, ${TITLE_WEIGHT}, 1)` };
}

/** The condition keeping what the viewer may see (each placeholder used once: SQLite's are positional). */
function visibility(p: SqlParameters, viewer: Viewer, projects: number[] | null): string {
  const records = projects === null ? `e.kind <> ${p.add('person')}` : projects.length > 0 ? `(e.kind <> ${p.add('person')} AND e.project_id IN (${p.list(projects)}))` : null;
  const people = mayIn(viewer.role, null, 'users:manage')
    ? `e.kind = ${p.add('person')}`
    : `(e.kind = ${p.add('person')} AND (e.ref_id = ${p.add(viewer.id)}${projects?.length ? ` OR e.ref_id IN (SELECT pm.user_id FROM project_member pm WHERE pm.project_id IN (${p.list(projects)}))` : ''}))`;
  return records ? `(${records} OR ${people})` : people;
}

/** Every kind's count. */
async function kindCounts(dataSource: DataSource, viewer: Viewer, projects: number[] | null, parts: readonly QueryPart[]): Promise<{ kind: SearchKind; total: number }[]> {
  const p = new SqlParameters(dataSource);
  const { from } = matching(dataSource, p, parts);
  return dataSource.query(`SELECT e.kind, count(*) AS total ${from} AND ${visibility(p, viewer, projects)} GROUP BY e.kind`, p.values);
}

/** One kind's page. */
async function kindPage(dataSource: DataSource, viewer: Viewer, projects: number[] | null, parts: readonly QueryPart[], query: SearchQuery & { kind: SearchKind }): Promise<EntryRow[]> {
  const p = new SqlParameters(dataSource);
  const { from, score } = matching(dataSource, p, parts);
  const sql = `SELECT e.id, e.kind, e.ref_id, e.project_id, e.title, e.body, ${score} AS score ${from} AND e.kind = ${p.add(query.kind)} AND ${visibility(p, viewer, projects)}
    ORDER BY score, e.ref_id DESC LIMIT ${p.add(query.pageSize)} OFFSET ${p.add((query.page - 1) * query.pageSize)}`;
  return dataSource.query(sql, p.values);
}

/** For each person found, one project the viewer shares with them (the lowest id; any of theirs for an administrator). */
async function sharedProjects(dataSource: DataSource, personIds: number[], projects: number[] | null): Promise<Map<number, number>> {
  if (personIds.length === 0 || projects?.length === 0) return new Map();
  const memberships = await dataSource.getRepository(ProjectMemberEntity).find({
    select: { userId: true, projectId: true },
    where: { userId: In(personIds), ...(projects ? { projectId: In(projects) } : {}) },
    order: { projectId: 'ASC' },
  });
  const shared = new Map<number, number>();
  for (const m of memberships) if (!shared.has(m.userId)) shared.set(m.userId, m.projectId);
  return shared;
}

/** The hits of the rows: named (projects, states read now), marked, with their excerpts. */
async function hitsOf(dataSource: DataSource, rows: EntryRow[], projects: number[] | null, parts: readonly QueryPart[]): Promise<SearchHit[]> {
  const refs = (kind: SearchKind) => rows.filter((r) => r.kind === kind).map((r) => Number(r.ref_id));
  const shared = await sharedProjects(dataSource, refs('person'), projects);
  const projectIds = [...new Set([...rows.flatMap((r) => (r.kind === 'spec' || r.kind === 'proposal' ? [Number(r.project_id)] : [])), ...shared.values()])];
  const proposalIds = refs('proposal');
  const [named, states] = await Promise.all([
    projectIds.length ? dataSource.getRepository(ProjectEntity).find({ select: { id: true, name: true }, where: { id: In(projectIds) } }) : [],
    proposalIds.length ? dataSource.getRepository(ProposalEntity).find({ select: { id: true, status: true }, where: { id: In(proposalIds) } }) : [],
  ]);
  const nameOf = new Map(named.map((project) => [project.id, project.name]));
  const stateOf = new Map<number, ProposalState>(states.map((proposal) => [proposal.id, proposal.status]));
  const projectOf = (id: number | undefined) => (id === undefined || !nameOf.has(id) ? null : { id, name: nameOf.get(id)! });
  return rows.map((row) => {
    const id = Number(row.ref_id);
    return {
      kind: row.kind,
      id,
      title: markedTitle(row.title, parts),
      excerpt: excerptOf(row.title, row.body === '' ? [] : row.body.split('\n'), parts),
      project: row.kind === 'project' ? null : projectOf(row.kind === 'person' ? shared.get(id) : Number(row.project_id)),
      state: row.kind === 'proposal' ? (stateOf.get(id) ?? null) : null,
    };
  });
}

const noCounts = (): Record<SearchKind, number> => Object.fromEntries(SEARCH_KINDS.map((kind) => [kind, 0])) as Record<SearchKind, number>;

/** What the viewer may see that matches the query: every kind's count, and the first page of each kind (or the page of one). */
export async function search(dataSource: DataSource, viewer: Viewer, query: SearchQuery): Promise<SearchAnswer> {
  const parts = queryParts(query.q);
  const words = parts.flatMap((part) => part.words);
  const counts = noCounts();
  const group = (kind: SearchKind, items: SearchHit[], page = 1): SearchGroup => ({ kind, items, total: counts[kind], page, pageSize: query.pageSize });
  if (parts.length === 0) return { words, counts, groups: query.kind ? [group(query.kind, [], query.page)] : [] };
  const projects = await visibleProjects(dataSource, viewer);
  if (query.kind) {
    const kind = query.kind;
    const [totals, rows] = await Promise.all([kindCounts(dataSource, viewer, projects, parts), kindPage(dataSource, viewer, projects, parts, { ...query, kind })]);
    for (const row of totals) counts[row.kind] = Number(row.total);
    return { words, counts, groups: [group(kind, await hitsOf(dataSource, rows, projects, parts), query.page)] };
  }
  // Every kind's count, then the first page of each kind that has hits (a sort with a limit each:
  // cheaper than numbering every match of every kind when a word is in thousands of records).
  for (const row of await kindCounts(dataSource, viewer, projects, parts)) counts[row.kind] = Number(row.total);
  const found = SEARCH_KINDS.filter((kind) => counts[kind] > 0);
  const rows: EntryRow[] = [];
  for (const kind of found) rows.push(...(await kindPage(dataSource, viewer, projects, parts, { ...query, kind, page: 1 })));
  const hits = await hitsOf(dataSource, rows, projects, parts);
  return { words, counts, groups: found.map((kind) => group(kind, hits.filter((hit) => hit.kind === kind))) };
}
