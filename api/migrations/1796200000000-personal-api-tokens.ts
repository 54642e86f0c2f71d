/**
 * Personal API tokens (`api_token`): a person's named tokens for scripts and CI. Only the token's
 * SHA-256 is kept, with a few leading characters to tell tokens apart, when it was made, last
 * used and revoked. A new table, TypeORM's portable Table API.
 */
import { Table, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const stamp = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: '32', isNullable });

const API_TOKEN = new Table({
  name: 'api_token',
  columns: [
    { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
    { name: 'user_id', type: 'integer', isNullable: false },
    { name: 'name', type: 'varchar', length: '120', isNullable: false },
    { name: 'token_hash', type: 'varchar', length: '64', isNullable: false, isUnique: true },
    { name: 'token_start', type: 'varchar', length: '16', isNullable: false },
    stamp('created_at'),
    stamp('last_used_at', true),
    stamp('revoked_at', true),
  ],
  indices: [new TableIndex({ name: 'ix_api_token_user', columnNames: ['user_id', 'id'] })],
  foreignKeys: [new TableForeignKey({ columnNames: ['user_id'], referencedTableName: 'user_account', referencedColumnNames: ['id'], onDelete: 'CASCADE' })],
});

export class PersonalApiTokens1796200000000 implements MigrationInterface {
  name = 'PersonalApiTokens1796200000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(API_TOKEN, false, true, true);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('api_token', false, true, true);
  }
}
