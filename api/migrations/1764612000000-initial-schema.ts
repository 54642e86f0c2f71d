/**
 * The first schema: users, projects and memberships, specs with immutable versions, proposals,
 * decisions, reviews, the audit trail and sessions. Written with TypeORM's portable Table API
 * (no SQL dialect), so the same migration builds SQLite and PostgreSQL.
 */
import { Table, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const id: TableColumnOptions = { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' };
const ref = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'integer', isNullable });
const stamp = (name: string): TableColumnOptions => ({ name, type: 'varchar', length: '32' });
const text = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'text', isNullable });
const short = (name: string, length: number, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: String(length), isNullable });
const fk = (column: string, table: string, onDelete: 'CASCADE' | 'RESTRICT' = 'RESTRICT') =>
  new TableForeignKey({ columnNames: [column], referencedTableName: table, referencedColumnNames: ['id'], onDelete });

const TABLES: Table[] = [
  new Table({
    name: 'user_account',
    columns: [id, { ...short('email', 254), isUnique: true }, short('display_name', 120), short('role', 20), short('password_hash', 200), stamp('created_at')],
  }),
  new Table({
    name: 'project',
    columns: [id, short('name', 160), text('description'), ref('created_by_id'), stamp('created_at')],
    foreignKeys: [fk('created_by_id', 'user_account')],
  }),
  new Table({
    name: 'project_member',
    columns: [id, ref('project_id'), ref('user_id'), stamp('created_at')],
    uniques: [{ name: 'uq_project_member', columnNames: ['project_id', 'user_id'] }],
    foreignKeys: [fk('project_id', 'project', 'CASCADE'), fk('user_id', 'user_account', 'CASCADE')],
    indices: [new TableIndex({ name: 'ix_project_member_user', columnNames: ['user_id'] })],
  }),
  new Table({
    name: 'spec',
    columns: [id, ref('project_id'), short('title', 200), { name: 'latest_version', type: 'integer' }, ref('created_by_id'), stamp('created_at'), stamp('updated_at')],
    foreignKeys: [fk('project_id', 'project'), fk('created_by_id', 'user_account')],
    indices: [new TableIndex({ name: 'ix_spec_project', columnNames: ['project_id'] })],
  }),
  new Table({
    name: 'spec_version',
    columns: [id, ref('spec_id'), { name: 'version', type: 'integer' }, short('title', 200), text('payload'), ref('created_by_id'), stamp('created_at')],
    uniques: [{ name: 'uq_spec_version', columnNames: ['spec_id', 'version'] }],
    foreignKeys: [fk('spec_id', 'spec'), fk('created_by_id', 'user_account')],
  }),
  new Table({
    name: 'proposal',
    columns: [
      id,
      ref('project_id'),
      ref('spec_id'),
      ref('spec_version_id'),
      short('engine_version', 20),
      short('ruleset_version', 64),
      short('recommended_topology', 40, true),
      short('status', 20),
      ref('created_by_id'),
      stamp('created_at'),
      stamp('updated_at'),
      // Last: the engine output is tens of kB, and SQLite reads a row's columns in order.
      text('result'),
    ],
    foreignKeys: [fk('project_id', 'project'), fk('spec_id', 'spec'), fk('spec_version_id', 'spec_version'), fk('created_by_id', 'user_account')],
    indices: [
      new TableIndex({ name: 'ix_proposal_project_status', columnNames: ['project_id', 'status', 'id'] }),
      new TableIndex({ name: 'ix_proposal_project', columnNames: ['project_id', 'id'] }),
      new TableIndex({ name: 'ix_proposal_spec', columnNames: ['spec_id'] }),
      new TableIndex({ name: 'ix_proposal_spec_version', columnNames: ['spec_version_id', 'engine_version', 'ruleset_version'] }),
    ],
  }),
  new Table({
    name: 'decision',
    columns: [id, ref('proposal_id'), short('kind', 20), short('topology', 40), text('design'), text('evaluation', true), text('reason', true), ref('decided_by_id'), stamp('created_at')],
    foreignKeys: [fk('proposal_id', 'proposal'), fk('decided_by_id', 'user_account')],
    indices: [new TableIndex({ name: 'ix_decision_proposal', columnNames: ['proposal_id'] })],
  }),
  new Table({
    name: 'review',
    columns: [id, ref('proposal_id'), ref('decision_id'), short('verdict', 20), text('comment', true), ref('reviewer_id'), stamp('created_at')],
    foreignKeys: [fk('proposal_id', 'proposal'), fk('decision_id', 'decision'), fk('reviewer_id', 'user_account')],
    indices: [new TableIndex({ name: 'ix_review_proposal', columnNames: ['proposal_id'] })],
  }),
  new Table({
    name: 'audit_event',
    columns: [
      id,
      stamp('at'),
      ref('actor_id', true),
      short('action', 60),
      short('entity_type', 40),
      { name: 'entity_id', type: 'integer' },
      ref('project_id', true),
      ref('proposal_id', true),
      { name: 'before_id', type: 'integer', isNullable: true },
      { name: 'after_id', type: 'integer', isNullable: true },
      text('details'),
    ],
    foreignKeys: [fk('actor_id', 'user_account')],
    indices: [
      new TableIndex({ name: 'ix_audit_proposal', columnNames: ['proposal_id', 'id'] }),
      new TableIndex({ name: 'ix_audit_project', columnNames: ['project_id', 'id'] }),
    ],
  }),
  new Table({
    name: 'session',
    columns: [{ ...short('id', 128), isPrimary: true }, { name: 'expires_at_ms', type: 'bigint' }, text('data')],
    indices: [new TableIndex({ name: 'ix_session_expiry', columnNames: ['expires_at_ms'] })],
  }),
];

export class InitialSchema1764612000000 implements MigrationInterface {
  name = 'InitialSchema1764612000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const table of TABLES) await queryRunner.createTable(table, false, true, true);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of [...TABLES].reverse()) await queryRunner.dropTable(table.name);
  }
}
