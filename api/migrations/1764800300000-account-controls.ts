/**
 * Account controls: an account can be disabled (`user_account.disabled_at`), each session row
 * names its account (`session.user_id`, filled from the stored session data for sessions already
 * there) so a person's sessions can be ended, and one-time password-reset links
 * (`password_reset`: the token's SHA-256 only, its expiry, when it was used). TypeORM's portable
 * Table API, and for the data step two plain statements with each driver's quoting and
 * placeholders, so the same migration runs on SQLite and PostgreSQL.
 */
import { Table, TableColumn, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const stamp = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: '32', isNullable });

const DISABLED_AT = new TableColumn({ name: 'disabled_at', type: 'varchar', length: '32', isNullable: true });
const SESSION_USER = new TableColumn({ name: 'user_id', type: 'integer', isNullable: true });
const SESSION_USER_INDEX = new TableIndex({ name: 'ix_session_user', columnNames: ['user_id'] });

const PASSWORD_RESET = new Table({
  name: 'password_reset',
  columns: [
    { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
    { name: 'user_id', type: 'integer', isNullable: false },
    { name: 'token_hash', type: 'varchar', length: '64', isNullable: false, isUnique: true },
    stamp('created_at'),
    stamp('expires_at'),
    stamp('used_at', true),
    { name: 'created_by_id', type: 'integer', isNullable: true },
  ],
  indices: [new TableIndex({ name: 'ix_password_reset_user', columnNames: ['user_id'] })],
  foreignKeys: [
    new TableForeignKey({ columnNames: ['user_id'], referencedTableName: 'user_account', referencedColumnNames: ['id'], onDelete: 'CASCADE' }),
    new TableForeignKey({ columnNames: ['created_by_id'], referencedTableName: 'user_account', referencedColumnNames: ['id'], onDelete: 'SET NULL' }),
  ],
});

export class AccountControls1764800300000 implements MigrationInterface {
  name = 'AccountControls1764800300000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumn('user_account', DISABLED_AT);
    await queryRunner.addColumn('session', SESSION_USER);
    await queryRunner.createIndex('session', SESSION_USER_INDEX);
    await queryRunner.createTable(PASSWORD_RESET, false, true, true);
    // Sessions signed in before this migration: their account is in the stored data. Plain SQL
    // (the entity metadata describes today's schema, not this step's), each driver's placeholder.
    const driver = queryRunner.connection.driver;
    const table = driver.escape('session');
    const placeholders = driver.options.type === 'postgres' ? ['$1', '$2'] : ['?', '?'];
    const rows = (await queryRunner.query(`SELECT ${driver.escape('id')} AS id, ${driver.escape('data')} AS data FROM ${table}`)) as { id: string; data: string }[];
    for (const row of rows) {
      let userId: unknown;
      try {
        userId = (JSON.parse(row.data) as { passport?: { user?: unknown } }).passport?.user;
      } catch {
        continue;
      }
      if (typeof userId !== 'number' || !Number.isInteger(userId)) continue;
      await queryRunner.query(`UPDATE ${table} SET ${driver.escape('user_id')} = ${placeholders[0]} WHERE ${driver.escape('id')} = ${placeholders[1]}`, [userId, row.id]);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable(PASSWORD_RESET.name);
    await queryRunner.dropIndex('session', SESSION_USER_INDEX.name!);
    await queryRunner.dropColumn('session', SESSION_USER.name);
    await queryRunner.dropColumn('user_account', DISABLED_AT.name);
  }
}
