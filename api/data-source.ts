/**
 * The TypeORM data source, on one of two back ends:
 *
 * - SQLite (the embedded default): a file path or ":memory:", through better-sqlite3; WAL journal
 *   (acknowledged writes survive a killed process), foreign keys on, a busy timeout.
 * - PostgreSQL: a `postgres://` (or `postgresql://`) URL, through node-postgres with a small pool;
 *   64-bit integers (count(*), bigint columns) come back as numbers, as the code expects.
 *
 * The same migrations build both (TypeORM's portable Table API); never synchronize.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { DataSource, type EntityManager, type EntityTarget, type ObjectLiteral } from 'typeorm';
import { ENTITIES } from './entities/index';
import { MIGRATIONS } from './migrations/index';

/** How long a writer waits for another connection's lock before failing, ms. */
const BUSY_TIMEOUT_MS = 5000;
/** PostgreSQL connections per app instance (LONGTAIL_DB_POOL_SIZE overrides it through the config). */
export const DEFAULT_POOL_SIZE = 10;
/** Key of the advisory lock that lets one instance at a time run migrations on PostgreSQL. */
const MIGRATION_LOCK_KEY = 0x4c6f6e67; // "Long"

export interface DatabaseOptions {
  /** PostgreSQL only: connections in the pool. */
  poolSize?: number;
}

/** True for a PostgreSQL connection URL, false for a SQLite path. */
export function isPostgresUrl(location: string): boolean {
  return /^postgres(ql)?:\/\//i.test(location);
}

/** The location with any password replaced by "***", for logs. */
export function describeDatabase(location: string): string {
  if (!isPostgresUrl(location)) return location;
  try {
    const url = new URL(location);
    if (url.password) url.password = '***';
    return url.toString();
  } catch {
    return 'postgres://(unreadable URL)';
  }
}

/** True when the data source runs on PostgreSQL (row locks, several instances). */
export function isPostgres(dataSource: DataSource): boolean {
  return dataSource.options.type === 'postgres';
}

/** A data source on a SQLite file, ":memory:", or a PostgreSQL URL. Not yet initialised. */
export function createDataSource(location: string, options: DatabaseOptions = {}): DataSource {
  if (isPostgresUrl(location)) {
    return new DataSource({
      type: 'postgres',
      url: location,
      entities: ENTITIES,
      migrations: MIGRATIONS,
      synchronize: false,
      migrationsRun: false,
      poolSize: options.poolSize ?? DEFAULT_POOL_SIZE,
      // int8 (count(*), bigint columns) as JavaScript numbers: every such value here is a count
      // or milliseconds since the epoch, far below 2^53. int4 (every id) is a number anyway.
      parseInt8: true,
      applicationName: 'longtail',
      connectTimeoutMS: 10_000,
    });
  }
  if (location !== ':memory:') mkdirSync(dirname(location), { recursive: true });
  const dataSource = new DataSource({
    type: 'better-sqlite3',
    database: location,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    migrationsRun: false,
    enableWAL: location !== ':memory:',
    prepareDatabase: (db: { pragma(statement: string): unknown }) => {
      db.pragma('foreign_keys = ON');
      db.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
      // WAL with NORMAL sync is durable against a killed process (not against power loss).
      db.pragma('synchronous = NORMAL');
    },
  });
  transactionsTakeTurns(dataSource);
  return dataSource;
}

/**
 * SQLite: the data source has one connection, and TypeORM runs every transaction on it, so a
 * transaction begun while another is open (two requests writing at once) would run inside the
 * first (BEGIN refused, or a savepoint one commit releases for the other). Transactions begun on
 * the data source take turns instead; one begun inside another's callback (the same async flow)
 * still runs within it.
 */
function transactionsTakeTurns(dataSource: DataSource): void {
  const inside = new AsyncLocalStorage<true>();
  const { manager } = dataSource;
  const transaction = manager.transaction.bind(manager) as (...args: unknown[]) => Promise<unknown>;
  let previous: Promise<unknown> = Promise.resolve();
  manager.transaction = ((...args: unknown[]) => {
    if (inside.getStore()) return transaction(...args);
    const turn = previous.then(() => inside.run(true, () => transaction(...args)));
    previous = turn.catch(() => undefined);
    return turn;
  }) as typeof manager.transaction;
}

/**
 * Runs pending migrations. On PostgreSQL several instances may start at once: a session-level
 * advisory lock (TypeORM takes none) lets one of them migrate while the others wait, then find
 * nothing left to do.
 */
export async function migrate(dataSource: DataSource): Promise<void> {
  if (!isPostgres(dataSource)) {
    await dataSource.runMigrations({ transaction: 'each' });
    return;
  }
  const lock = dataSource.createQueryRunner();
  try {
    await lock.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK_KEY]);
    await dataSource.runMigrations({ transaction: 'each' });
  } finally {
    await lock.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK_KEY]).catch(() => undefined);
    await lock.release();
  }
}

/** Initialises a data source and runs pending migrations. */
export async function openDatabase(location: string, options: DatabaseOptions = {}): Promise<DataSource> {
  const dataSource = createDataSource(location, options);
  await dataSource.initialize();
  try {
    await migrate(dataSource);
  } catch (error) {
    await dataSource.destroy().catch(() => undefined);
    throw error;
  }
  return dataSource;
}

/** The n-th (from 1) parameter of a hand-written statement: `$n` on PostgreSQL, `?` on SQLite. */
export function sqlParameter(dataSource: DataSource, n: number): string {
  return dataSource.options.type === 'postgres' ? `$${n}` : '?';
}

/**
 * Inside a transaction: on PostgreSQL, locks the row (`SELECT ... FOR UPDATE`) so concurrent
 * transactions that check a state and then change it (a proposal's workflow step, a spec's next
 * version number) run one after the other, as they do on SQLite, where one connection
 * serialises every transaction. A no-op on SQLite.
 */
export async function lockRowForUpdate(manager: EntityManager, entity: EntityTarget<ObjectLiteral>, id: number): Promise<void> {
  if (manager.connection.options.type !== 'postgres') return;
  await manager.getRepository(entity).createQueryBuilder('row').select('row.id').where('row.id = :id', { id }).setLock('pessimistic_write').getRawOne();
}
