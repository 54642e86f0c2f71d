/**
 * Row counts and full dumps of every table, to prove a refused request changed nothing and
 * that a reopened database file holds what was written. (The app builder, accounts and
 * signed-in clients live in api-app.ts.)
 */
import type { DataSource } from 'typeorm';

const onPostgres = (dataSource: DataSource) => dataSource.options.type === 'postgres';

async function tableNames(dataSource: DataSource): Promise<string[]> {
  const rows: { name: string }[] = onPostgres(dataSource)
    ? await dataSource.query("SELECT table_name AS name FROM information_schema.tables WHERE table_schema = current_schema() AND table_type = 'BASE TABLE' ORDER BY table_name")
    : // Ordinary tables only: the search's FTS5 table and its shadow tables are an index of search_entry, dumped itself.
      await dataSource.query("SELECT name FROM pragma_table_list WHERE schema = 'main' AND type = 'table' AND name <> 'sqlite_schema' ORDER BY name");
  return rows.map((r) => r.name);
}

/** Row count of every table of the database, by table name. */
export async function countRows(dataSource: DataSource): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const name of await tableNames(dataSource)) {
    const [row] = await dataSource.query(`SELECT count(*) AS n FROM "${name}"`);
    counts[name] = Number(row.n);
  }
  return counts;
}

/** Every row of every table, in insertion order (SQLite) or by primary key (PostgreSQL: every table's is `id`), by table name. */
export async function dumpTables(dataSource: DataSource): Promise<Record<string, unknown[]>> {
  const dump: Record<string, unknown[]> = {};
  const order = onPostgres(dataSource) ? 'id' : 'rowid';
  for (const name of await tableNames(dataSource)) dump[name] = await dataSource.query(`SELECT * FROM "${name}" ORDER BY ${order}`);
  return dump;
}
