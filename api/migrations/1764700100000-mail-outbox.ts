/**
 * E-mail notifications: the outbox (one row per message, written in the workflow change's own
 * transaction and sent later with retries), the demo mailbox of the built-in local mail server,
 * and each person's notification switch. TypeORM's portable Table API only (no SQL dialect), so
 * the same migration builds SQLite and PostgreSQL.
 */
import { Table, TableColumn, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const id: TableColumnOptions = { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' };
const ref = (name: string): TableColumnOptions => ({ name, type: 'integer', isNullable: true });
const stamp = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: '32', isNullable });
const text = (name: string, isNullable = false): TableColumnOptions => ({ name, type: 'text', isNullable });
const short = (name: string, length: number, isNullable = false): TableColumnOptions => ({ name, type: 'varchar', length: String(length), isNullable });
const fk = (column: string, table: string, onDelete: 'SET NULL' | 'RESTRICT') =>
  new TableForeignKey({ columnNames: [column], referencedTableName: table, referencedColumnNames: ['id'], onDelete });

const OUTBOX = new Table({
  name: 'mail_outbox',
  columns: [
    id,
    stamp('created_at'),
    short('kind', 40),
    ref('project_id'),
    ref('proposal_id'),
    ref('user_id'),
    short('to_address', 254),
    short('to_name', 120),
    short('subject', 300),
    short('status', 20),
    { name: 'attempts', type: 'integer', default: 0 },
    stamp('next_attempt_at'),
    stamp('sent_at', true),
    text('last_error', true),
    text('body'),
  ],
  foreignKeys: [fk('project_id', 'project', 'RESTRICT'), fk('proposal_id', 'proposal', 'RESTRICT'), fk('user_id', 'user_account', 'SET NULL')],
  indices: [
    // The worker's question: which pending rows are due, oldest first.
    new TableIndex({ name: 'ix_mail_outbox_due', columnNames: ['status', 'next_attempt_at'] }),
    new TableIndex({ name: 'ix_mail_outbox_proposal', columnNames: ['proposal_id'] }),
  ],
});

const MAILBOX = new Table({
  name: 'mail_message',
  columns: [id, stamp('received_at'), short('mail_from', 254, true), text('recipients'), text('subject'), short('message_id', 300, true), { name: 'outbox_id', type: 'integer', isNullable: true }, text('text_body')],
  indices: [new TableIndex({ name: 'ix_mail_message_outbox', columnNames: ['outbox_id'] })],
});

const NOTIFY = new TableColumn({ name: 'notify', type: 'boolean', isNullable: false, default: true });

export class MailOutbox1764700100000 implements MigrationInterface {
  name = 'MailOutbox1764700100000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumn('user_account', NOTIFY);
    await queryRunner.createTable(OUTBOX, false, true, true);
    await queryRunner.createTable(MAILBOX, false, true, true);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable(MAILBOX.name);
    await queryRunner.dropTable(OUTBOX.name);
    await queryRunner.dropColumn('user_account', NOTIFY.name);
  }
}
