/**
 * A team's worth of records for the list and search benchmarks, on a migrated data source: three
 * people (a systems engineer, a designer, a reviewer, each in their role in every project) and an
 * administrator, made through the services; then by plain SQL (recursive CTEs in one transaction,
 * no engine: the lists never read a ranking, so every proposal refers to one small stand-in row)
 * the specs, the proposals in the states a team leaves them (most approved, some waiting for a
 * decision, a review or a new decision, some closed), their decisions, reviews and audit events,
 * and a share of the specs revised since their last ranking. A second or two for 10,000
 * proposals. SQLite only (the SQL uses its date functions).
 */
import type { DataSource } from 'typeorm';
import { addMember, createProject } from '../../../api/services/projects.service';
import { createUser, type PublicUser } from '../../../api/services/users.service';
import type { ProjectRole } from '#shared/workflow/roles';

export interface TeamRecordsOptions {
  proposals: number;
  projects: number;
  specs: number;
  /** One spec in this many has a version 2 written after its rankings (its latest version waits to be ranked). */
  revisedEvery: number;
  /** Every account's password. */
  password: string;
}

export interface TeamRecords {
  admin: PublicUser;
  people: Record<ProjectRole, PublicUser>;
  projectIds: number[];
  /** Seconds the SQL part took. */
  seedSeconds: number;
}

const COPIES = 'WITH RECURSIVE copy(n) AS (SELECT 1 UNION ALL SELECT n + 1 FROM copy WHERE n < ?)';
/** An ISO timestamp n seconds into the year, as the server writes them (they sort as text). */
const STAMP = (n: string) => `strftime('%Y-%m-%dT%H:%M:%fZ', '2026-01-01', '+' || (${n}) || ' seconds')`;
/**
 * Proposal n's state, by n mod 20: 2 waiting for a decision, 1 for a review, 1 sent back, 2
 * closed as superseded, 1 withdrawn, 13 approved.
 */
const STATUS = `CASE WHEN copy.n % 20 < 2 THEN 'ranked' WHEN copy.n % 20 = 2 THEN 'decided' WHEN copy.n % 20 = 3 THEN 'returned' WHEN copy.n % 20 < 6 THEN 'superseded' WHEN copy.n % 20 = 6 THEN 'withdrawn' ELSE 'approved' END`;

/** Seeds the team (see the head of this file); spec s is "Bench spec s", proposal n ranks spec (n mod specs) + 1. */
export async function seedTeamRecords(dataSource: DataSource, options: TeamRecordsOptions): Promise<TeamRecords> {
  const { proposals, projects, specs, revisedEvery, password } = options;
  // --- People and projects, through the services ---------------------------------------------
  const account = (key: string) => createUser(dataSource, null, { email: `${key}@bench.longtail.test`, displayName: `Bench ${key}`, role: key === 'admin' ? 'admin' : 'member', password });
  const admin = await account('admin');
  const people: Record<ProjectRole, PublicUser> = { requirements: await account('requirements'), designer: await account('designer'), reviewer: await account('reviewer') };
  const projectIds: number[] = [];
  for (let i = 1; i <= projects; i += 1) {
    const project = await createProject(dataSource, admin.id, { name: `Bench project ${i}` });
    for (const role of ['requirements', 'designer', 'reviewer'] as const) await addMember(dataSource, admin, project.id, people[role].id, role);
    projectIds.push(project.id);
  }

  // --- The records, by SQL -----------------------------------------------------------------------
  const seeded = performance.now();
  const firstProject = projectIds[0];
  const { requirements: author, designer, reviewer } = people;
  await dataSource.transaction(async (manager) => {
    // Spec s (1-based) in project (s mod projects); version 1 at second s.
    await manager.query(
      `${COPIES} INSERT INTO spec (project_id, title, latest_version, created_by_id, created_at, updated_at)
       SELECT ? + copy.n % ?, 'Bench spec ' || copy.n, 1, ?, ${STAMP('copy.n')}, ${STAMP('copy.n')} FROM copy`,
      [specs, firstProject, projects, author.id],
    );
    await manager.query(
      `INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at) SELECT id, 1, title, '{}', created_by_id, created_at FROM spec`,
    );
    await manager.query(`INSERT INTO ranking (content_hash, result, created_at) VALUES ('bench-waiting-stand-in', '{}', ${STAMP('0')})`);
    // Proposal n ranks version 1 of spec (n mod specs) + 1, asked for by the designer at second specs + n, last changed 30 s later.
    await manager.query(
      `${COPIES} INSERT INTO proposal (project_id, spec_id, spec_version_id, engine_version, ruleset_version, ranking_id, recommended_topology, status, created_by_id, created_at, updated_at)
       SELECT spec.project_id, spec.id, spec_version.id, 'bench', 'bench', (SELECT id FROM ranking), 'wilson', ${STATUS}, ?, ${STAMP(`${specs} + copy.n`)}, ${STAMP(`${specs} + copy.n + CASE WHEN copy.n % 20 < 2 THEN 0 ELSE 30 END`)}
       FROM copy JOIN spec ON spec.id = (SELECT min(id) FROM spec) + copy.n % ? JOIN spec_version ON spec_version.spec_id = spec.id AND spec_version.version = 1`,
      [proposals, designer.id, specs],
    );
    // Every proposal that got past a decision has one, by the designer; those a reviewer saw have one review.
    await manager.query(
      `INSERT INTO decision (proposal_id, kind, topology, design, evaluation, reason, decided_by_id, created_at, engine_version, ruleset_version)
       SELECT id, 'accept', 'wilson', '{}', NULL, NULL, ?, updated_at, 'bench', 'bench' FROM proposal WHERE status IN ('decided', 'returned', 'approved')`,
      [designer.id],
    );
    await manager.query(
      `INSERT INTO review (proposal_id, decision_id, verdict, comment, reviewer_id, created_at, verification_job_id, stale_verification_accepted)
       SELECT p.id, d.id, CASE p.status WHEN 'approved' THEN 'approve' ELSE 'return' END, NULL, ?, p.updated_at, NULL, 0 FROM proposal p JOIN decision d ON d.proposal_id = p.id WHERE p.status IN ('returned', 'approved')`,
      [reviewer.id],
    );
    // One spec in revisedEvery gets a version 2 after its rankings: it waits to be ranked.
    await manager.query(
      `INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at) SELECT id, 2, title, '{}', created_by_id, ${STAMP(`${specs + proposals} + id`)} FROM spec WHERE id % ? = 0`,
      [revisedEvery],
    );
    await manager.query(`UPDATE spec SET latest_version = 2, updated_at = ${STAMP(`${specs + proposals} + id`)} WHERE id % ? = 0`, [revisedEvery]);
    // The audit trail: each spec version, each ranking, each decision and review.
    await manager.query(
      `INSERT INTO audit_event (at, actor_id, action, entity_type, entity_id, project_id, proposal_id, before_id, after_id, details)
       SELECT v.created_at, v.created_by_id, CASE v.version WHEN 1 THEN 'spec.created' ELSE 'spec.version-created' END, 'spec', s.id, s.project_id, NULL, NULL, v.id, '{"version":' || v.version || '}' FROM spec_version v JOIN spec s ON s.id = v.spec_id
       UNION ALL SELECT created_at, created_by_id, 'proposal.ranked', 'proposal', id, project_id, id, NULL, id, '{"status":"ranked"}' FROM proposal
       UNION ALL SELECT d.created_at, d.decided_by_id, 'proposal.decided', 'decision', d.id, p.project_id, p.id, NULL, d.id, '{"kind":"accept","topology":"wilson"}' FROM decision d JOIN proposal p ON p.id = d.proposal_id
       UNION ALL SELECT r.created_at, r.reviewer_id, CASE r.verdict WHEN 'approve' THEN 'proposal.approved' ELSE 'proposal.returned' END, 'review', r.id, p.project_id, p.id, r.decision_id, r.id, '{}' FROM review r JOIN proposal p ON p.id = r.proposal_id
       ORDER BY 1`,
    );
  });
  await dataSource.query('ANALYZE');
  return { admin, people, projectIds, seedSeconds: (performance.now() - seeded) / 1000 };
}
