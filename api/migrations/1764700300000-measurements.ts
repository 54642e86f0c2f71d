/**
 * Bench measurements of decided proposals: one row per uploaded CSV (the bytes are a file named by
 * their sha256 in the uploads directory), with the design it measures and the points read from
 * it. TypeORM's portable Table API only (no SQL dialect), so the same migration builds SQLite and
 * PostgreSQL.
 */
import { Table, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner, type TableColumnOptions } from 'typeorm';

const id: TableColumnOptions = { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' };
const ref = (name: string): TableColumnOptions => ({ name, type: 'integer', isNullable: false });
const short = (name: string, length: number): TableColumnOptions => ({ name, type: 'varchar', length: String(length), isNullable: false });
const fk = (column: string, table: string) => new TableForeignKey({ columnNames: [column], referencedTableName: table, referencedColumnNames: ['id'], onDelete: 'RESTRICT' });

const MEASUREMENT = new Table({
  name: 'measurement',
  columns: [
    id,
    ref('proposal_id'),
    ref('decision_id'),
    short('topology', 40),
    short('design_source', 20),
    short('kind', 20),
    short('unit', 10),
    short('file_name', 255),
    short('sha256', 64),
    { name: 'size_bytes', type: 'integer', isNullable: false },
    { name: 'point_count', type: 'integer', isNullable: false },
    { name: 'points', type: 'text', isNullable: false },
    { name: 'note', type: 'text', isNullable: true },
    ref('uploaded_by_id'),
    short('uploaded_at', 32),
  ],
  indices: [new TableIndex({ name: 'ix_measurement_proposal', columnNames: ['proposal_id'] })],
  foreignKeys: [fk('proposal_id', 'proposal'), fk('decision_id', 'decision'), fk('uploaded_by_id', 'user_account')],
});

export class Measurements1764700300000 implements MigrationInterface {
  name = 'Measurements1764700300000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(MEASUREMENT, false, true, true);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable(MEASUREMENT.name);
  }
}
