import pg from 'pg';
import { Sequelize, Transaction } from 'sequelize';
import type { Config } from '../config';

// int8 (BIGINT: epoch milliseconds, COUNT(*)) as a JS number, not a string: every value we keep in one is far
// below 2^53. Set once on the pg module, which Sequelize's postgres dialect and the count log's pool both use.
pg.types.setTypeParser(pg.types.builtins.INT8, (value: string) => Number(value));

export const BUSY_TIMEOUT_MS = 5000;

interface SqliteConnection {
  configure(option: 'busyTimeout', value: number): void;
  run(sql: string, callback: (error: Error | null) => void): void;
  holdfireConfigured?: boolean;
}

/**
 * One Sequelize instance on SQLite: WAL so readers do not block the writer, foreign keys enforced (Sequelize
 * turns them on per connection), and a busy timeout and synchronous=FULL on every connection, transactions' own
 * included (Sequelize opens a new connection per transaction), so a second writer waits instead of failing at once.
 */
export async function openDatabase(
  config: Pick<Config, 'sqliteStorage'> & Partial<Pick<Config, 'dbBusyTimeoutMs' | 'dialect' | 'databaseUrl'>>,
): Promise<Sequelize> {
  if (config.dialect === 'postgres') return openPostgres(config.databaseUrl!);
  const busyTimeoutMs = config.dbBusyTimeoutMs ?? BUSY_TIMEOUT_MS;
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    storage: config.sqliteStorage,
    logging: false,
    define: { underscored: true },
    // IMMEDIATE takes the write lock at BEGIN: two transactions that read then write cannot both pass the read.
    transactionType: Transaction.TYPES.IMMEDIATE,
    // Sequelize tries a query that met SQLITE_BUSY again, each try waiting up to the busy timeout: three tries
    // at most (its default of five kept a request waiting 25 s behind a stuck writer), then the 503 of errors.ts.
    retry: { max: 3, match: [/SQLITE_BUSY/] },
  });
  // The sqlite dialect has no afterConnect hook: wrap its getConnection to configure each new connection once.
  const manager = sequelize.connectionManager as unknown as { getConnection(options?: unknown): Promise<SqliteConnection> };
  const getConnection = manager.getConnection.bind(manager);
  manager.getConnection = async (options) => {
    const connection = await getConnection(options);
    if (!connection.holdfireConfigured) {
      connection.configure('busyTimeout', busyTimeoutMs);
      // FULL syncs the WAL at every commit: with NORMAL a power cut can undo commits made since the last
      // checkpoint, and the count log acknowledges an event only once its commit is on disk. The pragma is
      // per connection, hence here and not once after opening.
      await new Promise<void>((resolve, reject) =>
        connection.run('PRAGMA synchronous = FULL;', (error) => (error ? reject(error) : resolve())),
      );
      connection.holdfireConfigured = true;
    }
    return connection;
  };
  await sequelize.authenticate();
  if (config.sqliteStorage !== ':memory:') await sequelize.query('PRAGMA journal_mode = WAL;');
  return sequelize;
}

/**
 * Sequelize on PostgreSQL (several processes may share it). READ COMMITTED, PostgreSQL's default: the count log
 * serialises its writers per count with a transaction-scoped advisory lock (server/counts/log-writer.ts).
 */
export async function openPostgres(url: string): Promise<Sequelize> {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: false,
    define: { underscored: true },
    pool: { max: 10, min: 0, idle: 10_000 },
  });
  await sequelize.authenticate();
  serialiseTransactions(sequelize);
  return sequelize;
}

/** The first key of Holdfire's advisory locks ('Hold'); the count log's per-count locks use it too. */
export const ADVISORY_LOCK_CLASS = 0x486f6c64;
/** The second key of the lock every Sequelize write transaction takes (count ids start at 1). */
const WRITE_LOCK_KEY = 0;
/** The second key of the start-up lock (migrations and seed); negative, so never a count id. */
const STARTUP_LOCK_KEY = -1;

/** The connection settings of a Sequelize instance on PostgreSQL, for a pg client or pool of our own. */
export function pgConnectionConfig(sequelize: Sequelize): pg.ClientConfig {
  const c = sequelize.config;
  return {
    host: c.host,
    port: c.port === undefined ? undefined : Number(c.port),
    database: c.database,
    user: c.username,
    password: c.password ?? undefined,
    ...(c.ssl ? { ssl: c.ssl as pg.ClientConfig['ssl'] } : {}),
  };
}

/**
 * Runs `work` (migrations, the demo seed) holding a session-level advisory lock on a connection of its own, so
 * several processes started at once on one PostgreSQL do it one after the other: umzug has no lock of its own.
 * On SQLite it just runs `work`.
 */
export async function withStartupLock(sequelize: Sequelize, work: () => Promise<void>): Promise<void> {
  if (sequelize.getDialect() !== 'postgres') return work();
  const client = new pg.Client(pgConnectionConfig(sequelize));
  await client.connect();
  try {
    await client.query('SELECT pg_advisory_lock($1, $2)', [ADVISORY_LOCK_CLASS, STARTUP_LOCK_KEY]);
    await work();
  } finally {
    // Ending the session releases the lock, also when `work` threw.
    await client.end();
  }
}

/**
 * SQLite's BEGIN IMMEDIATE lets one write transaction run at a time, and the routes' read-then-write checks
 * (the first admin, an invitation accepted twice, a reset link used twice) rely on that. Under PostgreSQL's READ
 * COMMITTED two of them would both pass the read: each managed transaction therefore first takes one advisory
 * lock shared by every process, held until COMMIT or ROLLBACK. The count log does not take it (its writer has
 * its own pool and per-count locks), so live counts never wait behind a slow form.
 */
function serialiseTransactions(sequelize: Sequelize): void {
  const transaction = sequelize.transaction.bind(sequelize) as (options: unknown, fn?: unknown) => Promise<unknown>;
  const locked = (fn: (t: Transaction) => Promise<unknown>) => async (t: Transaction) => {
    await sequelize.query('SELECT pg_advisory_xact_lock(?, ?)', { replacements: [ADVISORY_LOCK_CLASS, WRITE_LOCK_KEY], transaction: t });
    return fn(t);
  };
  (sequelize as unknown as { transaction: unknown }).transaction = (options: unknown, fn?: unknown) => {
    if (typeof options === 'function') return transaction(locked(options as (t: Transaction) => Promise<unknown>));
    if (typeof fn === 'function') return transaction(options, locked(fn as (t: Transaction) => Promise<unknown>));
    // An unmanaged transaction (none in Holdfire today): lock right after BEGIN.
    return transaction(options).then(async (t) => {
      await sequelize.query('SELECT pg_advisory_xact_lock(?, ?)', { replacements: [ADVISORY_LOCK_CLASS, WRITE_LOCK_KEY], transaction: t as Transaction });
      return t;
    });
  };
}
