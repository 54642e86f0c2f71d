/**
 * Distinct rankings stored once: a `ranking` table keyed by the SHA-256 of the engine output's
 * JSON text, and `proposal.ranking_id` referring to it, in place of a copy of the output (tens
 * of kB) in every proposal row. Existing rows are moved in batches: each distinct text becomes
 * one ranking, every proposal that carried it refers to it, then the proposal's copy is dropped.
 * Equal hashes mean equal text (the output names its engine and rule-set versions and holds every
 * figure), so no proposal is ever given another ranking's figures. Also indexes the proposal list's
 * order (newest first by created-at, then id) for keyset paging. Portable Table API and plain SQL
 * every back end reads alike (named parameters, no dialect); the table names are read without the
 * entities, which may change after this migration.
 */
import { createHash } from 'node:crypto';
import { Table, TableColumn, TableForeignKey, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

/** Proposals read per batch while moving their rankings (each row holds tens of kB of JSON). */
const BATCH = 200;

const RANKING = new Table({
  name: 'ranking',
  columns: [
    { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
    { name: 'content_hash', type: 'varchar', length: '64', isUnique: true },
    { name: 'result', type: 'text' },
    { name: 'created_at', type: 'varchar', length: '32' },
  ],
});
const rankingId = (isNullable: boolean) => new TableColumn({ name: 'ranking_id', type: 'integer', isNullable });
const RANKING_FK = new TableForeignKey({ name: 'fk_proposal_ranking', columnNames: ['ranking_id'], referencedTableName: 'ranking', referencedColumnNames: ['id'], onDelete: 'RESTRICT' });
const LIST_INDICES = [
  new TableIndex({ name: 'ix_proposal_project_created', columnNames: ['project_id', 'created_at', 'id'] }),
  new TableIndex({ name: 'ix_proposal_project_status_created', columnNames: ['project_id', 'status', 'created_at', 'id'] }),
  new TableIndex({ name: 'ix_proposal_ranking', columnNames: ['ranking_id'] }),
];

/** Named parameters written in each driver's own placeholders ($1 or ?), so the SQL stays portable. */
async function run<T = unknown>(queryRunner: QueryRunner, sql: string, parameters: Record<string, unknown>): Promise<T> {
  const [text, values] = queryRunner.connection.driver.escapeQueryWithParameters(sql, parameters);
  return queryRunner.query(text, values) as Promise<T>;
}

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

export class DistinctRankings1764900000000 implements MigrationInterface {
  name = 'DistinctRankings1764900000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(RANKING);
    await queryRunner.addColumn('proposal', rankingId(true));
    const known = new Map<string, number>();
    for (let last = 0; ; ) {
      const rows = await run<{ id: number; result: string; created_at: string }[]>(
        queryRunner,
        `SELECT id, result, created_at FROM proposal WHERE id > :last ORDER BY id LIMIT ${BATCH}`,
        { last },
      );
      if (rows.length === 0) break;
      const byRanking = new Map<number, number[]>();
      for (const row of rows) {
        const hash = sha256(row.result);
        let id = known.get(hash);
        if (id === undefined) {
          await run(queryRunner, 'INSERT INTO ranking (content_hash, result, created_at) VALUES (:hash, :result, :at)', { hash, result: row.result, at: row.created_at });
          const [inserted] = await run<{ id: number }[]>(queryRunner, 'SELECT id FROM ranking WHERE content_hash = :hash', { hash });
          id = Number(inserted.id);
          known.set(hash, id);
        }
        byRanking.set(id, [...(byRanking.get(id) ?? []), Number(row.id)]);
      }
      for (const [id, proposalIds] of byRanking) await run(queryRunner, 'UPDATE proposal SET ranking_id = :id WHERE id IN (:...proposalIds)', { id, proposalIds });
      last = Number(rows.at(-1)!.id);
    }
    await queryRunner.dropColumn('proposal', 'result');
    await queryRunner.changeColumn('proposal', 'ranking_id', rankingId(false));
    await queryRunner.createForeignKey('proposal', RANKING_FK);
    await queryRunner.createIndices('proposal', LIST_INDICES);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropIndices('proposal', LIST_INDICES);
    await queryRunner.dropForeignKey('proposal', RANKING_FK);
    await queryRunner.addColumn('proposal', new TableColumn({ name: 'result', type: 'text', isNullable: true }));
    await queryRunner.query('UPDATE proposal SET result = (SELECT r.result FROM ranking r WHERE r.id = proposal.ranking_id)');
    await queryRunner.changeColumn('proposal', 'result', new TableColumn({ name: 'result', type: 'text' }));
    await queryRunner.dropColumn('proposal', 'ranking_id');
    await queryRunner.dropTable('ranking');
  }
}
