/**
 * Notice preferences per kind: `user_account.notices_off`, the JSON list of notice kinds a person
 * turned off (shared/workflow/notices.ts), `[]` for every existing account. `notify` keeps its
 * meaning as the master switch: a person who had e-mail off still gets none, and turning it back
 * on brings every kind, as before.
 *
 * Plain ALTER TABLE, the same statements on SQLite and PostgreSQL. TypeORM's Table API rebuilds
 * the table on SQLite (copy, drop, rename), and a revert that drops `user_account` that way while
 * foreign keys are enforced and other rows point at accounts (audit events, memberships) is
 * refused. SQLite adds a column with a constant default in place, and drops one in place since 3.35.
 */
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class NoticePreferences1796400000000 implements MigrationInterface {
  name = 'NoticePreferences1796400000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "user_account" ADD COLUMN "notices_off" text NOT NULL DEFAULT '[]'`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "user_account" DROP COLUMN "notices_off"`);
  }
}
