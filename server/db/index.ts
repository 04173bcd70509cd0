import { Sequelize, Transaction } from 'sequelize';
import type { Config } from '../config';

const BUSY_TIMEOUT_MS = 5000;

interface SqliteConnection {
  configure(option: 'busyTimeout', value: number): void;
  holdfireConfigured?: boolean;
}

/**
 * One Sequelize instance on SQLite: WAL so readers do not block the writer, foreign keys enforced (Sequelize
 * turns them on per connection), and a busy timeout on every connection, transactions' own included, so a
 * second writer waits instead of failing at once.
 */
export async function openDatabase(config: Pick<Config, 'sqliteStorage'>): Promise<Sequelize> {
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    storage: config.sqliteStorage,
    logging: false,
    define: { underscored: true },
    // IMMEDIATE takes the write lock at BEGIN: two transactions that read then write cannot both pass the read.
    transactionType: Transaction.TYPES.IMMEDIATE,
  });
  // The sqlite dialect has no afterConnect hook: wrap its getConnection to configure each new connection once.
  const manager = sequelize.connectionManager as unknown as { getConnection(options?: unknown): Promise<SqliteConnection> };
  const getConnection = manager.getConnection.bind(manager);
  manager.getConnection = async (options) => {
    const connection = await getConnection(options);
    if (!connection.holdfireConfigured) {
      connection.configure('busyTimeout', BUSY_TIMEOUT_MS);
      connection.holdfireConfigured = true;
    }
    return connection;
  };
  await sequelize.authenticate();
  if (config.sqliteStorage !== ':memory:') await sequelize.query('PRAGMA journal_mode = WAL;');
  await sequelize.query('PRAGMA synchronous = NORMAL;');
  return sequelize;
}
