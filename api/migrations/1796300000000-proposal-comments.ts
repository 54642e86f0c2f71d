/**
 * Comments on proposals (`proposal_comment`): threads anchored on one check, figure or SPICE
 * result of an option, their replies, who resolved them and when, and the spec version, engine
 * and rule set of the proposal each belongs to. A new table, TypeORM's portable Table API.
 */
import { Table, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const stamp = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: '32', isNullable });
const reference = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'integer', isNullable });
const short = (name: string, length: number, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: String(length), isNullable });

const PROPOSAL_COMMENT = new Table({
  name: 'proposal_comment',
  columns: [
    { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
    reference('proposal_id'),
    reference('project_id'),
    reference('parent_id', true),
    short('anchor_kind', 20),
    short('topology', 40),
    short('check_id', 80, true),
    short('figure_key', 40, true),
    reference('verification_job_id', true),
    reference('spec_version_id'),
    short('engine_version', 40),
    short('ruleset_version', 80),
    { name: 'body', type: 'text', isNullable: false },
    reference('author_id'),
    stamp('created_at'),
    stamp('resolved_at', true),
    reference('resolved_by_id', true),
  ],
  indices: [
    new TableIndex({ name: 'ix_proposal_comment_proposal', columnNames: ['proposal_id', 'id'] }),
    new TableIndex({ name: 'ix_proposal_comment_parent', columnNames: ['parent_id'] }),
  ],
  foreignKeys: [
    new TableForeignKey({ columnNames: ['proposal_id'], referencedTableName: 'proposal', referencedColumnNames: ['id'], onDelete: 'CASCADE' }),
    new TableForeignKey({ columnNames: ['project_id'], referencedTableName: 'project', referencedColumnNames: ['id'], onDelete: 'CASCADE' }),
    new TableForeignKey({ columnNames: ['parent_id'], referencedTableName: 'proposal_comment', referencedColumnNames: ['id'], onDelete: 'CASCADE' }),
    new TableForeignKey({ columnNames: ['verification_job_id'], referencedTableName: 'verification_job', referencedColumnNames: ['id'], onDelete: 'SET NULL' }),
    new TableForeignKey({ columnNames: ['spec_version_id'], referencedTableName: 'spec_version', referencedColumnNames: ['id'] }),
    new TableForeignKey({ columnNames: ['author_id'], referencedTableName: 'user_account', referencedColumnNames: ['id'] }),
    new TableForeignKey({ columnNames: ['resolved_by_id'], referencedTableName: 'user_account', referencedColumnNames: ['id'] }),
  ],
});

export class ProposalComments1796300000000 implements MigrationInterface {
  name = 'ProposalComments1796300000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(PROPOSAL_COMMENT, false, true, true);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('proposal_comment', false, true, true);
  }
}
