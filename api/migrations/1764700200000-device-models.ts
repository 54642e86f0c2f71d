/**
 * The device library: NPN `.model` cards uploaded per project, each with its source file's name
 * and sha256, one name per project (case-insensitive, through `name_key`). TypeORM's portable
 * Table API only (no SQL dialect), so the same migration builds SQLite and PostgreSQL.
 */
import { Table, TableForeignKey, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const id: TableColumnOptions = { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' };
const ref = (name: string): TableColumnOptions => ({ name, type: 'integer', isNullable: false });
const short = (name: string, length: number): TableColumnOptions => ({ name, type: 'varchar', length: String(length), isNullable: false });
const text = (name: string): TableColumnOptions => ({ name, type: 'text', isNullable: false });
const fk = (column: string, table: string) => new TableForeignKey({ columnNames: [column], referencedTableName: table, referencedColumnNames: ['id'], onDelete: 'RESTRICT' });

const DEVICE_MODEL = new Table({
  name: 'device_model',
  columns: [
    id,
    ref('project_id'),
    short('name', 64),
    short('name_key', 64),
    text('parameters'),
    text('card_text'),
    { name: 'source_line', type: 'integer', isNullable: false },
    short('file_name', 255),
    short('checksum', 64),
    ref('uploaded_by_id'),
    short('uploaded_at', 32),
  ],
  uniques: [{ name: 'uq_device_model_project_name', columnNames: ['project_id', 'name_key'] }],
  foreignKeys: [fk('project_id', 'project'), fk('uploaded_by_id', 'user_account')],
});

export class DeviceModels1764700200000 implements MigrationInterface {
  name = 'DeviceModels1764700200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(DEVICE_MODEL, false, true, true);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable(DEVICE_MODEL.name);
  }
}
