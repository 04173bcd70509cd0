import pg from 'pg';
import sqlite3 from 'sqlite3';
import { QueryTypes, type Sequelize } from 'sequelize';
import { canonicalJson } from '../../src/domain/count/chain';
import { ADVISORY_LOCK_CLASS, BUSY_TIMEOUT_MS, pgConnectionConfig } from '../db';

/** The columns of count_events the log writes, in the order of INSERT_SQL's values. */
const INSERT_COLUMNS = 'count_id, seq, type, payload, actor_user_id, actor_name, station, at, command_id, prev_hash, hash';
const ROW_MARKS = `(${INSERT_COLUMNS.split(',').map(() => '?').join(', ')})`;
const INSERT_SQL = `INSERT INTO count_events (${INSERT_COLUMNS}) VALUES ${ROW_MARKS}`;
// One multi-row INSERT per chunk in the fallback keeps a large group within SQLite's limit on bound values.
const FALLBACK_INSERT_CHUNK = 200;
// Rows per multi-row INSERT on the log's own connection (11 values a row, far inside SQLite's limit).
const INSERT_CHUNK = 100;

export interface EventRow {
  countId: number;
  seq: number;
  type: string;
  payload: unknown;
  actor: { userId: number | null; name: string } | null;
  station: string | null;
  at: number;
  commandId: string | null;
  prevHash: string;
  hash: string;
  /** canonicalJson(payload), when the caller has written it already. */
  payloadJson?: string;
}

/** What the event log may do inside its one write transaction. */
export interface LogTransaction {
  /** SQL with `?` placeholders (the PostgreSQL writer numbers them). */
  all<R>(sql: string, params: unknown[]): Promise<R[]>;
  insert(rows: EventRow[]): Promise<void>;
  /**
   * Holds these counts' logs until the transaction ends, against every other writer of the database (other
   * processes included). SQLite's BEGIN IMMEDIATE holds the whole file already; PostgreSQL takes a lock per count.
   */
  lockCounts(countIds: readonly number[]): Promise<void>;
}

/**
 * Runs the event log's write transactions. transaction() resolves only after COMMIT has returned (with
 * synchronous=FULL: after the WAL is synced); if `work` or the COMMIT fails, it rolls back and rejects.
 * Callers run one transaction at a time.
 */
export interface LogWriter {
  transaction(work: (tx: LogTransaction) => Promise<void>): Promise<void>;
  /**
   * Where the database makes a single INSERT statement a transaction of its own (SQLite in autocommit mode):
   * stores `rows` with that one statement, all or nothing, resolving after its commit. `fits` says whether
   * so many rows go in one statement.
   */
  insertAtomic?: { fits(rows: number): boolean; run(rows: EventRow[]): Promise<void> };
  /** The connection's settings, for tests and diagnostics. */
  settings(): Promise<{ journalMode: string; synchronous: number; foreignKeys: number; busyTimeout: number }>;
  close(): Promise<void>;
}

function values(row: EventRow): unknown[] {
  return [
    row.countId,
    row.seq,
    row.type,
    row.payloadJson ?? canonicalJson(row.payload),
    row.actor?.userId ?? null,
    row.actor?.name ?? null,
    row.station,
    row.at,
    row.commandId,
    row.prevHash,
    row.hash,
  ];
}

/** The SQLite file behind a Sequelize instance, or null for an in-memory database (which one connection owns). */
export function sqliteFile(sequelize: Sequelize): string | null {
  if (sequelize.getDialect() !== 'sqlite') throw new Error('The event log needs the sqlite dialect.');
  const storage = (sequelize as unknown as { options: { storage?: string } }).options.storage;
  if (!storage || storage === ':memory:' || storage.startsWith('file::memory:')) return null;
  return storage;
}

/**
 * The log's own long-lived connection to the database file. Sequelize's SQLite dialect opens and closes a new
 * connection for every transaction, so each group commit would also pay for opening the file and configuring
 * the connection; here that happens once, and the INSERT is prepared once.
 *
 * Every step is awaited before the next is sent: node-sqlite3 runs statements on a thread pool, and a BEGIN
 * issued without waiting (or from inside a statement's callback) can run after the inserts, which then commit
 * one by one without any error.
 */
export class SqliteLogWriter implements LogWriter {
  private opened: Promise<{ db: sqlite3.Database; insert: sqlite3.Statement }> | null = null;
  /** Prepared multi-row INSERTs by row count, made as group sizes first occur. */
  private readonly multi = new Map<number, Promise<sqlite3.Statement>>();

  private statementFor(db: sqlite3.Database, rows: number): Promise<sqlite3.Statement> {
    let statement = this.multi.get(rows);
    if (!statement) {
      const sql = `INSERT INTO count_events (${INSERT_COLUMNS}) VALUES ${Array.from({ length: rows }, () => ROW_MARKS).join(', ')}`;
      statement = new Promise<sqlite3.Statement>((resolve, reject) => {
        const s: sqlite3.Statement = db.prepare(sql, (error: Error | null) => (error ? reject(error) : resolve(s)));
      });
      statement.catch(() => this.multi.delete(rows));
      this.multi.set(rows, statement);
    }
    return statement;
  }
  private closed = false;

  constructor(
    private readonly file: string,
    private readonly busyTimeoutMs = BUSY_TIMEOUT_MS,
  ) {}

  private connection() {
    if (this.closed) return Promise.reject(new Error('The event log is closed.'));
    this.opened ??= this.open();
    return this.opened;
  }

  private async open() {
    const db = await new Promise<sqlite3.Database>((resolve, reject) => {
      const d: sqlite3.Database = new sqlite3.Database(this.file, sqlite3.OPEN_READWRITE, (error) => (error ? reject(error) : resolve(d)));
    });
    try {
      db.configure('busyTimeout', this.busyTimeoutMs);
      // WAL is the file's mode already (server/db/index.ts); FULL syncs the WAL at every commit, so an
      // acknowledged event survives a power cut; foreign keys as on Sequelize's connections.
      await run(db, 'PRAGMA journal_mode = WAL');
      await run(db, 'PRAGMA synchronous = FULL');
      await run(db, 'PRAGMA foreign_keys = ON');
      const insert = await new Promise<sqlite3.Statement>((resolve, reject) => {
        const s: sqlite3.Statement = db.prepare(INSERT_SQL, (error: Error | null) => (error ? reject(error) : resolve(s)));
      });
      return { db, insert };
    } catch (error) {
      await new Promise<void>((resolve) => db.close(() => resolve()));
      this.opened = null;
      throw error;
    }
  }

  readonly insertAtomic = {
    fits: (rows: number) => rows >= 1 && rows <= INSERT_CHUNK,
    run: async (rows: EventRow[]) => {
      if (!this.insertAtomic.fits(rows.length)) throw new Error(`One statement takes 1 to ${INSERT_CHUNK} rows.`);
      const { db, insert } = await this.connection();
      const statement = rows.length === 1 ? insert : await this.statementFor(db, rows.length);
      // In autocommit mode the statement is its own transaction: with synchronous=FULL it resolves after the WAL
      // is synced, and a failed statement (a UNIQUE seq taken by another writer) stores none of its rows.
      await new Promise<void>((resolve, reject) => statement.run(rows.flatMap(values), (error: Error | null) => (error ? reject(error) : resolve())));
    },
  };

  async transaction(work: (tx: LogTransaction) => Promise<void>): Promise<void> {
    const { db, insert } = await this.connection();
    await run(db, 'BEGIN IMMEDIATE');
    try {
      await work({
        lockCounts: async () => {},
        all: <R>(sql: string, params: unknown[]) =>
          new Promise<R[]>((resolve, reject) => db.all(sql, params, (error: Error | null, rows: R[]) => (error ? reject(error) : resolve(rows)))),
        insert: async (rows) => {
          // One multi-row INSERT per chunk: one trip to the thread pool and back for a whole group instead of
          // one per event. Each chunk is awaited before the next (and COMMIT after the last).
          for (let i = 0; i < rows.length; i += INSERT_CHUNK) {
            const chunk = rows.slice(i, i + INSERT_CHUNK);
            const statement = chunk.length === 1 ? insert : await this.statementFor(db, chunk.length);
            await new Promise<void>((resolve, reject) =>
              statement.run(chunk.flatMap(values), (error: Error | null) => (error ? reject(error) : resolve())),
            );
          }
        },
      });
      await run(db, 'COMMIT');
    } catch (error) {
      // After a failed COMMIT the transaction may still be open; after some errors SQLite has already rolled
      // back, and this ROLLBACK's own "no transaction is active" is of no interest.
      await run(db, 'ROLLBACK').catch(() => {});
      throw error;
    }
  }

  async settings() {
    const { db } = await this.connection();
    const get = <R>(sql: string) => new Promise<R>((resolve, reject) => db.get(sql, (error: Error | null, row: R) => (error ? reject(error) : resolve(row))));
    return {
      journalMode: (await get<{ journal_mode: string }>('PRAGMA journal_mode')).journal_mode,
      synchronous: (await get<{ synchronous: number }>('PRAGMA synchronous')).synchronous,
      foreignKeys: (await get<{ foreign_keys: number }>('PRAGMA foreign_keys')).foreign_keys,
      busyTimeout: (await get<{ timeout: number }>('PRAGMA busy_timeout')).timeout,
    };
  }

  async close(): Promise<void> {
    this.closed = true;
    const opened = this.opened;
    this.opened = null;
    if (!opened) return;
    const { db, insert } = await opened.catch(() => ({ db: null, insert: null }));
    if (!db || !insert) return;
    await new Promise<void>((resolve) => insert.finalize(() => resolve()));
    for (const pending of this.multi.values()) {
      const statement = await pending.catch(() => null);
      if (statement) await new Promise<void>((resolve) => statement.finalize(() => resolve()));
    }
    this.multi.clear();
    await new Promise<void>((resolve, reject) => db.close((error) => (error ? reject(error) : resolve())));
  }
}

function run(db: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((resolve, reject) => db.run(sql, (error: Error | null) => (error ? reject(error) : resolve())));
}

/**
 * For an in-memory database, which exists only on Sequelize's one connection: the log's transactions go through
 * sequelize.transaction (on ':memory:' Sequelize reuses that connection instead of opening a new one).
 */
export class SequelizeLogWriter implements LogWriter {
  constructor(private readonly sequelize: Sequelize) {}

  async transaction(work: (tx: LogTransaction) => Promise<void>): Promise<void> {
    await this.sequelize.transaction(async (transaction) => {
      await work({
        lockCounts: async () => {},
        all: <R>(sql: string, params: unknown[]) =>
          this.sequelize.query(sql, { replacements: params, type: QueryTypes.SELECT, transaction }) as Promise<R[]>,
        insert: async (rows) => {
          for (let i = 0; i < rows.length; i += FALLBACK_INSERT_CHUNK) {
            const chunk = rows.slice(i, i + FALLBACK_INSERT_CHUNK);
            await this.sequelize.query(`INSERT INTO count_events (${INSERT_COLUMNS}) VALUES ${chunk.map(() => ROW_MARKS).join(', ')}`, {
              replacements: chunk.flatMap(values),
              type: QueryTypes.INSERT,
              transaction,
            });
          }
        },
      });
    });
  }

  async settings() {
    const get = async <R>(sql: string) => ((await this.sequelize.query(sql, { type: QueryTypes.SELECT })) as R[])[0]!;
    return {
      journalMode: (await get<{ journal_mode: string }>('PRAGMA journal_mode')).journal_mode,
      synchronous: (await get<{ synchronous: number }>('PRAGMA synchronous')).synchronous,
      foreignKeys: (await get<{ foreign_keys: number }>('PRAGMA foreign_keys')).foreign_keys,
      busyTimeout: (await get<{ timeout: number }>('PRAGMA busy_timeout')).timeout,
    };
  }

  async close(): Promise<void> {}
}


/** `?` placeholders as PostgreSQL's $1, $2, ... (the log's SQL has no `?` inside literals). */
function numbered(sql: string): string {
  let n = 0;
  return sql.replace(/\?/g, () => `$${++n}`);
}

/**
 * The log on PostgreSQL, which several Holdfire processes may share: a small pool of its own, one client per
 * transaction. lockCounts takes a transaction-scoped advisory lock per count (in id order, so two groups cannot
 * deadlock); whoever holds it reads the count's tail and appends, and the lock goes with COMMIT or ROLLBACK.
 * synchronous_commit is set on for the log's transactions whatever the server's default, so COMMIT returns
 * only once the events are in the flushed WAL.
 */
export class PostgresLogWriter implements LogWriter {
  private readonly pool: pg.Pool;
  private closed = false;

  constructor(connection: pg.PoolConfig) {
    this.pool = new pg.Pool({ ...connection, max: 4, idleTimeoutMillis: 10_000 });
    // An idle client whose server went away: the next transaction gets a new one; nothing to do here.
    this.pool.on('error', () => {});
  }

  /** The connection of a Sequelize instance on PostgreSQL. */
  static forSequelize(sequelize: Sequelize): PostgresLogWriter {
    return new PostgresLogWriter(pgConnectionConfig(sequelize));
  }

  async transaction(work: (tx: LogTransaction) => Promise<void>): Promise<void> {
    if (this.closed) throw new Error('The event log is closed.');
    const client = await this.pool.connect();
    let broken: Error | undefined;
    try {
      await client.query('BEGIN');
      await client.query('SET LOCAL synchronous_commit = on');
      await work({
        all: async <R>(sql: string, params: unknown[]) => (await client.query(numbered(sql), params)).rows as R[],
        insert: async (rows) => {
          for (let i = 0; i < rows.length; i += INSERT_CHUNK) {
            const chunk = rows.slice(i, i + INSERT_CHUNK);
            const sql = `INSERT INTO count_events (${INSERT_COLUMNS}) VALUES ${chunk.map(() => ROW_MARKS).join(', ')}`;
            await client.query(numbered(sql), chunk.flatMap(values));
          }
        },
        lockCounts: async (countIds) => {
          for (const id of [...new Set(countIds)].sort((a, b) => a - b)) {
            await client.query('SELECT pg_advisory_xact_lock($1, $2)', [ADVISORY_LOCK_CLASS, id]);
          }
        },
      });
      await client.query('COMMIT');
    } catch (error) {
      await client.query('ROLLBACK').catch((e: Error) => {
        broken = e;
      });
      throw error;
    } finally {
      client.release(broken);
    }
  }

  /** PostgreSQL's counterparts of the SQLite settings: always WAL; synchronous 2 when commits wait for the flush. */
  async settings() {
    const show = async (name: string) => ((await this.pool.query(`SHOW ${name}`)).rows[0] as Record<string, string>)[name]!;
    const lockTimeout = await show('lock_timeout');
    return {
      journalMode: 'wal',
      synchronous: (await show('synchronous_commit')) === 'off' ? 0 : 2,
      foreignKeys: 1,
      busyTimeout: Number.parseInt(lockTimeout, 10) || 0,
    };
  }

  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    await this.pool.end();
  }
}
