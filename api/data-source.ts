/**
 * The TypeORM data source: SQLite through better-sqlite3, WAL journal (acknowledged writes
 * survive a killed process), foreign keys on, a busy timeout; migrations, never synchronize.
 */
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { DataSource } from 'typeorm';
import { ENTITIES } from './entities/index';
import { MIGRATIONS } from './migrations/index';

/** How long a writer waits for another connection's lock before failing, ms. */
const BUSY_TIMEOUT_MS = 5000;

/** A data source on a SQLite file, or ":memory:" for tests. Not yet initialised. */
export function createDataSource(databasePath: string): DataSource {
  if (databasePath !== ':memory:') mkdirSync(dirname(databasePath), { recursive: true });
  return new DataSource({
    type: 'better-sqlite3',
    database: databasePath,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    migrationsRun: false,
    enableWAL: databasePath !== ':memory:',
    prepareDatabase: (db: { pragma(statement: string): unknown }) => {
      db.pragma('foreign_keys = ON');
      db.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
      // WAL with NORMAL sync is durable against a killed process (not against power loss).
      db.pragma('synchronous = NORMAL');
    },
  });
}

/** Initialises a data source and runs pending migrations. */
export async function openDatabase(databasePath: string): Promise<DataSource> {
  const dataSource = createDataSource(databasePath);
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  return dataSource;
}
