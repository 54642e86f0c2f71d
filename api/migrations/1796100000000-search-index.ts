/**
 * The search index: one `search_entry` row per project, spec, proposal and person (its title and
 * lines as a person reads them, and the same cut into the search's words: api/search/), with
 * each back end's own full-text index over the words:
 * - SQLite: an FTS5 table `search_fts` over the entry's word columns (external content, kept
 *   current by triggers on `search_entry`; the words are already cut, so the tokenizer only keeps
 *   a number's decimal point and leaves accents as they are);
 * - PostgreSQL: a generated `tsvector` column `document` (title words weighted A, the rest B,
 *   `simple` configuration: no stemming, as on SQLite) with a GIN index.
 * The table goes through the portable Table API; the two full-text parts are each back end's own
 * SQL. Then every existing record is indexed (api/services/search-index.service.ts, the one
 * writer of the index; it reads only columns that exist at this migration).
 */
import { Table, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';
import { rebuildSearchIndex } from '../services/search-index.service';

const SQLITE_UP = [
  `CREATE VIRTUAL TABLE search_fts USING fts5(title_words, body_words, content='search_entry', content_rowid='id', tokenize="unicode61 remove_diacritics 0 tokenchars '.'", prefix='1 2')`,
  `CREATE TRIGGER search_entry_inserted AFTER INSERT ON search_entry BEGIN
     INSERT INTO search_fts (rowid, title_words, body_words) VALUES (new.id, new.title_words, new.body_words);
   END`,
  `CREATE TRIGGER search_entry_deleted AFTER DELETE ON search_entry BEGIN
     INSERT INTO search_fts (search_fts, rowid, title_words, body_words) VALUES ('delete', old.id, old.title_words, old.body_words);
   END`,
  `CREATE TRIGGER search_entry_updated AFTER UPDATE ON search_entry BEGIN
     INSERT INTO search_fts (search_fts, rowid, title_words, body_words) VALUES ('delete', old.id, old.title_words, old.body_words);
     INSERT INTO search_fts (rowid, title_words, body_words) VALUES (new.id, new.title_words, new.body_words);
   END`,
];
const SQLITE_DOWN = ['DROP TRIGGER search_entry_updated', 'DROP TRIGGER search_entry_deleted', 'DROP TRIGGER search_entry_inserted', 'DROP TABLE search_fts'];

const POSTGRES_UP = [
  `ALTER TABLE search_entry ADD COLUMN document tsvector GENERATED ALWAYS AS (setweight(to_tsvector('simple'::regconfig, title_words), 'A') || setweight(to_tsvector('simple'::regconfig, body_words), 'B')) STORED`,
  'CREATE INDEX ix_search_entry_document ON search_entry USING GIN (document)',
];
const POSTGRES_DOWN = ['DROP INDEX ix_search_entry_document', 'ALTER TABLE search_entry DROP COLUMN document'];

const SEARCH_ENTRY = new Table({
  name: 'search_entry',
  columns: [
    { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
    { name: 'kind', type: 'varchar', length: '20' },
    { name: 'ref_id', type: 'integer' },
    { name: 'project_id', type: 'integer', isNullable: true },
    { name: 'title', type: 'text' },
    { name: 'body', type: 'text' },
    { name: 'title_words', type: 'text' },
    { name: 'body_words', type: 'text' },
  ],
  uniques: [{ name: 'uq_search_entry_record', columnNames: ['kind', 'ref_id'] }],
  indices: [new TableIndex({ name: 'ix_search_entry_project', columnNames: ['project_id', 'kind'] })],
});

export class SearchIndex1796100000000 implements MigrationInterface {
  name = 'SearchIndex1796100000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(SEARCH_ENTRY, false, true, true);
    for (const statement of queryRunner.connection.options.type === 'postgres' ? POSTGRES_UP : SQLITE_UP) await queryRunner.query(statement);
    await rebuildSearchIndex(queryRunner);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const statement of queryRunner.connection.options.type === 'postgres' ? POSTGRES_DOWN : SQLITE_DOWN) await queryRunner.query(statement);
    await queryRunner.dropTable(SEARCH_ENTRY.name);
  }
}
