/**
 * Workflow e-mail digests: an outbox row may be held for a digest (several messages to one
 * person within a minute go out as one e-mail), and each row keeps the page it points to, which
 * the digest lists. Adds a defaulted and a nullable column; the portable Table API builds both
 * SQLite and PostgreSQL.
 */
import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

export class MailDigest1764800400100 implements MigrationInterface {
  name = 'MailDigest1764800400100';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumns('mail_outbox', [
      new TableColumn({ name: 'digest', type: 'boolean', isNullable: false, default: false }),
      new TableColumn({ name: 'link', type: 'varchar', length: '500', isNullable: true }),
    ]);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropColumn('mail_outbox', 'link');
    await queryRunner.dropColumn('mail_outbox', 'digest');
  }
}
