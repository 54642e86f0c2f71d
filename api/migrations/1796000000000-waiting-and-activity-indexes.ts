/**
 * Indexes for two lists: what waits for a person (proposals of their projects in one state, oldest
 * change first: project, state, updated-at, id) and a project's activity filtered by person or by
 * kind of event (audit events by project and actor, and by project and action, newest first).
 * Only indexes (the portable Table API).
 */
import { TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

const INDEXES: [table: string, index: TableIndex][] = [
  ['proposal', new TableIndex({ name: 'ix_proposal_project_status_updated', columnNames: ['project_id', 'status', 'updated_at', 'id'] })],
  ['audit_event', new TableIndex({ name: 'ix_audit_project_actor', columnNames: ['project_id', 'actor_id', 'id'] })],
  ['audit_event', new TableIndex({ name: 'ix_audit_project_action', columnNames: ['project_id', 'action', 'id'] })],
];

export class WaitingAndActivityIndexes1796000000000 implements MigrationInterface {
  name = 'WaitingAndActivityIndexes1796000000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const [table, index] of INDEXES) await queryRunner.createIndex(table, index);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [table, index] of [...INDEXES].reverse()) await queryRunner.dropIndex(table, index.name as string);
  }
}
