/**
 * The spec lifecycle: a change note on each spec version; a proposal can be closed as superseded
 * (by a proposal of a newer version of its spec) or withdrawn with a reason. Adds nullable
 * columns only, then closes the rankings that already wait on an older version of a spec whose
 * newer version was ranked, each with its audit event, so the counts of what waits for a decision
 * stop counting them. Portable Table API and plain SQL every back end reads alike (named parameters, no dialect); the
 * table names are read without the entities, which may change after this migration.
 */
import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

const NOTE = new TableColumn({ name: 'note', type: 'text', isNullable: true });
const PROPOSAL_COLUMNS = [
  new TableColumn({ name: 'superseded_by_id', type: 'integer', isNullable: true }),
  new TableColumn({ name: 'closed_reason', type: 'text', isNullable: true }),
  new TableColumn({ name: 'closed_by_id', type: 'integer', isNullable: true }),
  new TableColumn({ name: 'closed_at', type: 'varchar', length: '32', isNullable: true }),
];
/** The open states a newer ranking closes (shared/workflow/proposal-states.ts, SUPERSEDABLE_STATES, as of this migration). */
const OPEN = ['ranked', 'returned'];

interface Row {
  id: number;
  spec_id: number;
  project_id: number;
  status: string;
  version: number;
}

/** Named parameters written in each driver's own placeholders ($1 or ?), so the SQL stays portable. */
async function run(queryRunner: QueryRunner, sql: string, parameters: Record<string, unknown>): Promise<void> {
  const [text, values] = queryRunner.connection.driver.escapeQueryWithParameters(sql, parameters);
  await queryRunner.query(text, values);
}

export class SpecLifecycle1764800600000 implements MigrationInterface {
  name = 'SpecLifecycle1764800600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumn('spec_version', NOTE);
    await queryRunner.addColumns('proposal', PROPOSAL_COLUMNS);
    const rows: Row[] = await queryRunner.query(
      'SELECT p.id AS id, p.spec_id AS spec_id, p.project_id AS project_id, p.status AS status, v.version AS version FROM proposal p INNER JOIN spec_version v ON v.id = p.spec_version_id ORDER BY p.id',
    );
    const now = new Date().toISOString();
    for (const row of rows) {
      if (!OPEN.includes(row.status)) continue;
      // The first proposal of a newer version of the same spec is the one that supersedes it.
      const newer = rows.find((r) => r.spec_id === row.spec_id && Number(r.version) > Number(row.version));
      if (!newer) continue;
      await run(queryRunner, `UPDATE proposal SET status = :status, superseded_by_id = :newer, closed_at = :now, updated_at = :now WHERE id = :id`, { status: 'superseded', newer: newer.id, now, id: row.id });
      const details = JSON.stringify({ from: row.status, to: 'superseded', byProposal: newer.id, specVersion: Number(row.version), newerSpecVersion: Number(newer.version), when: 'on upgrade' });
      await run(
        queryRunner,
        `INSERT INTO audit_event (at, actor_id, action, entity_type, entity_id, project_id, proposal_id, before_id, after_id, details) VALUES (:now, NULL, :action, :entityType, :id, :projectId, :id, :id, :newer, :details)`,
        { now, action: 'proposal.superseded', entityType: 'proposal', id: row.id, projectId: row.project_id, newer: newer.id, details },
      );
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropColumns('proposal', PROPOSAL_COLUMNS);
    await queryRunner.dropColumn('spec_version', NOTE);
  }
}
