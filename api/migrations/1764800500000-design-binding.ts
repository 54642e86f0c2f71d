/**
 * Verification bound to a design: a decision records the engine and rule-set versions that
 * checked it, a review records the verification job it relied on (and whether the reviewer
 * accepted one that simulated another design), and a Monte Carlo job records whether it
 * simulates a ranked option or the decided design. Only added columns (nullable or defaulted),
 * with the portable Table API.
 */
import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

const COLUMNS: [string, TableColumn][] = [
  ['decision', new TableColumn({ name: 'engine_version', type: 'varchar', length: '20', isNullable: true })],
  ['decision', new TableColumn({ name: 'ruleset_version', type: 'varchar', length: '64', isNullable: true })],
  ['review', new TableColumn({ name: 'verification_job_id', type: 'integer', isNullable: true })],
  ['review', new TableColumn({ name: 'stale_verification_accepted', type: 'boolean', isNullable: false, default: false })],
  ['verification_job', new TableColumn({ name: 'design_source', type: 'varchar', length: '20', isNullable: false, default: "'option'" })],
];

export class DesignBinding1764800500000 implements MigrationInterface {
  name = 'DesignBinding1764800500000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const [table, column] of COLUMNS) await queryRunner.addColumn(table, column);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [table, column] of [...COLUMNS].reverse()) await queryRunner.dropColumn(table, column.name);
  }
}
