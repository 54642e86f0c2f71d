/** SPICE verification jobs (portable Table API, as every migration here). */
import { Table, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const short = (name: string, length: number, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: String(length), isNullable });
const stamp = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: '32', isNullable });

export class VerificationJobs1764700000000 implements MigrationInterface {
  name = 'VerificationJobs1764700000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'verification_job',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'proposal_id', type: 'integer' },
          short('kind', 20),
          short('topology', 40, true),
          { name: 'runs', type: 'integer', isNullable: true },
          short('state', 20),
          { name: 'done', type: 'integer' },
          { name: 'total', type: 'integer' },
          short('step', 200, true),
          { name: 'message', type: 'text', isNullable: true },
          { name: 'requested_by_id', type: 'integer' },
          short('claim_token', 40, true),
          stamp('heartbeat_at', true),
          stamp('created_at'),
          stamp('started_at', true),
          stamp('finished_at', true),
          // Last: results are tens of kB, and SQLite reads a row's columns in order.
          { name: 'result', type: 'text', isNullable: true },
        ],
        foreignKeys: [
          new TableForeignKey({ columnNames: ['proposal_id'], referencedTableName: 'proposal', referencedColumnNames: ['id'], onDelete: 'CASCADE' }),
          new TableForeignKey({ columnNames: ['requested_by_id'], referencedTableName: 'user_account', referencedColumnNames: ['id'] }),
        ],
        indices: [
          new TableIndex({ name: 'ix_verification_job_proposal', columnNames: ['proposal_id', 'kind'] }),
          new TableIndex({ name: 'ix_verification_job_state', columnNames: ['state'] }),
        ],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('verification_job');
  }
}
