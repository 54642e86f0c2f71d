/**
 * Notice preferences per kind: `user_account.notices_off`, the JSON list of notice kinds a person
 * turned off (shared/workflow/notices.ts), `[]` for every existing account. `notify` keeps its
 * meaning as the master switch: a person who had e-mail off still gets none, and turning it back
 * on brings every kind, as before. A defaulted text column; the portable Table API builds SQLite
 * and PostgreSQL alike.
 */
import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

export class NoticePreferences1796300000000 implements MigrationInterface {
  name = 'NoticePreferences1796300000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumn('user_account', new TableColumn({ name: 'notices_off', type: 'text', isNullable: false, default: "'[]'" }));
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropColumn('user_account', 'notices_off');
  }
}
