import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Sequelize } from 'sequelize';
import sqlite3 from 'sqlite3';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { EventLog, EventLogError, sha256Hex, type EventDraft, type EventLogDeps } from '../../server/counts/log';
import { CountEvent, Procedure, Team } from '../../server/models';
import { eventHash, GENESIS_HASH, verifyChain } from '../../src/domain/count/chain';
import { createCount, openCountDatabase, walCommits } from '../helpers/count-log';

let dir: string;
let dbFile: string;
let sequelize: Sequelize;

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'holdfire-count-log-'));
  dbFile = path.join(dir, 'holdfire.sqlite');
  sequelize = await openCountDatabase(dbFile);
});
afterAll(async () => {
  for (const log of logs) await log.close();
  await sequelize.close();
  rmSync(dir, { recursive: true, force: true });
});

// Each EventLog has its own database connection; they are closed before the database.
const logs: EventLog[] = [];
function newLog(deps: Partial<EventLogDeps> = {}): EventLog {
  const log = new EventLog({ sequelize, ...deps });
  logs.push(log);
  return log;
}

const tc = { userId: 1, name: 'Ines Okafor' };
const draft = (type: string, payload: unknown, extra: Partial<EventDraft> = {}): EventDraft => ({ type, payload, actor: tc, station: 'TC', ...extra });
const rows = (countId: number) => CountEvent.count({ where: { countId } });

describe('server SHA-256', () => {
  it('gives the FIPS 180-2 Appendix B.1 digest of "abc"', async () => {
    // Source: FIPS PUB 180-2, Appendix B.1 (SHA-256 example, one-block message "abc").
    expect(await sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});

describe('database settings', () => {
  it('uses WAL and synchronous=FULL on the default connection and inside transactions', async () => {
    const [[mode]] = (await sequelize.query('PRAGMA journal_mode;')) as [{ journal_mode: string }[], unknown];
    expect(mode!.journal_mode).toBe('wal');
    const [[outside]] = (await sequelize.query('PRAGMA synchronous;')) as [{ synchronous: number }[], unknown];
    // 2 = FULL (SQLite documentation, PRAGMA synchronous).
    expect(outside!.synchronous).toBe(2);
    const inside = await sequelize.transaction(async (transaction) => {
      const [[row]] = (await sequelize.query('PRAGMA synchronous;', { transaction })) as [{ synchronous: number }[], unknown];
      return row!.synchronous;
    });
    expect(inside).toBe(2);
  });

  it("uses WAL, synchronous=FULL, foreign keys and a busy timeout on the log's own write connection", async () => {
    const log = newLog();
    // 2 = FULL (SQLite documentation, PRAGMA synchronous); 5000 ms is server/db's BUSY_TIMEOUT_MS.
    expect(await log.settings()).toEqual({ journalMode: 'wal', synchronous: 2, foreignKeys: 1, busyTimeout: 5000 });
  });
});

describe('EventLog.append', () => {
  it('numbers events from 1 and chains their hashes, with the server time unless one is given', async () => {
    let clock = 1767225600000;
    const log = newLog({ now: () => clock });
    const count = await createCount();
    const first = await log.append(count.id, [draft('count:created', { revision: 1 }), draft('poll:opened', { step: 'go-for-loading' }, { at: 42 })]);
    clock += 1500;
    const second = await log.append(count.id, [draft('hold:called', { reason: 'GN2 bottle low' }, { actor: null, station: 'PAD' })]);

    expect(first.map((e) => e.seq)).toEqual([1, 2]);
    expect(first[0]!.prevHash).toBe(GENESIS_HASH);
    expect(first[1]!.prevHash).toBe(first[0]!.hash);
    expect(second[0]!).toMatchObject({ seq: 3, prevHash: first[1]!.hash, at: clock, actor: null, station: 'PAD', type: 'hold:called' });
    expect(first.map((e) => e.at)).toEqual([1767225600000, 42]);

    const stored = await log.read(count.id);
    expect(stored).toEqual([...first, ...second]);
    expect(await log.read(count.id, { sinceSeq: 2 })).toEqual(second);
    expect(await verifyChain(stored, sha256Hex)).toEqual({ ok: true, count: 3 });
    expect(await log.verify(count.id)).toEqual({ ok: true, count: 3 });
    // A new log (a restarted server) continues the chain from the database.
    const [next] = await newLog().append(count.id, [draft('hold:released', {})]);
    expect(next).toMatchObject({ seq: 4, prevHash: second[0]!.hash });
    expect(await log.verify(count.id)).toEqual({ ok: true, count: 4 });
  });

  it('stores the payload as canonical JSON text and the caller changing its object afterwards changes nothing', async () => {
    const log = newLog();
    const count = await createCount();
    const payload = { z: 1, a: { y: [1, 'two'], b: null } };
    const pending = log.append(count.id, [draft('reading:recorded', payload)]);
    payload.z = 999;
    const [event] = await pending;
    expect(event!.payload).toEqual({ z: 1, a: { y: [1, 'two'], b: null } });
    const [[row]] = (await sequelize.query('SELECT payload FROM count_events WHERE count_id = ?', { replacements: [count.id] })) as [{ payload: string }[], unknown];
    expect(row!.payload).toBe('{"a":{"b":null,"y":[1,"two"]},"z":1}');
  });

  it('refuses bad drafts and unknown counts without writing, and without failing the others in the group', async () => {
    const log = newLog();
    const count = await createCount();
    const results = await Promise.allSettled([
      log.append(count.id, [draft('a', { n: 1 })]),
      log.append(count.id, [draft('', {})]),
      log.append(count.id, [draft('b', { n: Number.NaN })]),
      log.append(count.id, [draft('c', {}, { commandId: 'x' }), draft('d', {}, { commandId: 'y' })]),
      log.append(999_999, [draft('e', {})]),
      log.append(count.id, [draft('f', { n: 2 })]),
    ]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'rejected', 'rejected', 'rejected', 'fulfilled']);
    for (const r of results) if (r.status === 'rejected') expect(r.reason).toBeInstanceOf(EventLogError);
    expect((results[4] as PromiseRejectedResult).reason.code).toBe('count_not_found');
    expect((await log.read(count.id)).map((e) => [e.seq, e.type])).toEqual([[1, 'a'], [2, 'f']]);
    expect(await log.verify(count.id)).toEqual({ ok: true, count: 2 });
  });

  it('refuses updates and deletes of events at the database', async () => {
    const log = newLog();
    const count = await createCount();
    await log.append(count.id, [draft('count:created', {})]);
    // Sequelize reports SQLite's constraint error as a ValidationError; SQLite's own message is in `parent`.
    const refusal = { parent: { message: expect.stringMatching(/append-only/) } };
    await expect(sequelize.query('UPDATE count_events SET type = ? WHERE count_id = ?', { replacements: ['x', count.id] })).rejects.toMatchObject(refusal);
    await expect(sequelize.query('DELETE FROM count_events WHERE count_id = ?', { replacements: [count.id] })).rejects.toMatchObject(refusal);
    expect(await rows(count.id)).toBe(1);
  });
});

describe('group commit', () => {
  it('the WAL commit counter sees one commit per autocommit insert (so it would see a BEGIN that came too late)', async () => {
    await sequelize.query('PRAGMA wal_checkpoint(TRUNCATE);');
    const team = await Team.findOne();
    for (let k = 0; k < 3; k += 1) await Procedure.create({ teamId: team!.id, name: `Autocommit ${k}`, stations: [] });
    expect(walCommits(dbFile)).toBe(3);
    await sequelize.transaction(async (transaction) => {
      for (let k = 0; k < 3; k += 1) await Procedure.create({ teamId: team!.id, name: `Grouped ${k}`, stations: [] }, { transaction });
    });
    expect(walCommits(dbFile)).toBe(4);
  });

  it('many callers appending at once get one gapless, ordered chain in fewer durable commits than appends', async () => {
    const log = newLog();
    const count = await createCount();
    await log.append(count.id, [draft('count:created', {})]);
    // Start the write-ahead log afresh so its commit frames are this test's commits only.
    await sequelize.query('PRAGMA wal_checkpoint(TRUNCATE);');
    expect(walCommits(dbFile)).toBe(0);
    const transactions = vi.spyOn(sequelize, 'transaction');
    // The log writes on its own sqlite3 connection: count the transactions it begins there.
    const run = vi.spyOn(sqlite3.Database.prototype, 'run');
    const statementRun = vi.spyOn(sqlite3.Statement.prototype, 'run');
    const commitsBefore = log.commits;

    const CALLERS = 20;
    const EACH = 10;
    const acked: { caller: number; i: number; seq: number }[] = [];
    await Promise.all(
      Array.from({ length: CALLERS }, async (_, caller) => {
        for (let i = 0; i < EACH; i += 1) {
          const [event] = await log.append(count.id, [draft('station:answered', { caller, i }, { station: `S${caller}` })]);
          acked.push({ caller, i, seq: event!.seq });
        }
      }),
    );
    const sequelizeTransactions = transactions.mock.calls.length;
    const started = run.mock.calls.filter(([sql]) => sql === 'BEGIN IMMEDIATE').length;
    const statements = statementRun.mock.calls.length;
    transactions.mockRestore();
    run.mockRestore();
    statementRun.mockRestore();

    const appends = CALLERS * EACH;
    const events = await log.read(count.id);
    expect(events.map((e) => e.seq)).toEqual(Array.from({ length: appends + 1 }, (_, k) => k + 1));
    expect(await log.verify(count.id)).toEqual({ ok: true, count: appends + 1 });
    // Each caller's events are stored in the order it appended them, at the seq it was told.
    for (let caller = 0; caller < CALLERS; caller += 1) {
      const mine = acked.filter((a) => a.caller === caller);
      expect(mine.map((a) => a.i)).toEqual([...Array(EACH).keys()]);
      const seqs = mine.map((a) => a.seq);
      expect(seqs).toEqual([...seqs].sort((a, b) => a - b));
      for (const a of mine) expect(events[a.seq - 1]!.payload).toEqual({ caller, i: a.i });
    }

    const walCommitted = walCommits(dbFile);
    const logCommits = log.commits - commitsBefore;
    // The commits counted three ways agree: INSERT statements run on the log's connection, the log's own counter,
    // and the commit frames SQLite wrote to disk. The count's tail was cached after its first event, so every
    // group was one multi-row INSERT in autocommit mode (a transaction of its own) and none began a transaction;
    // a statement that committed row by row would show as more commit frames than statements. None went
    // through Sequelize (which would open a connection per transaction).
    expect(sequelizeTransactions).toBe(0);
    expect(started).toBe(0);
    expect(statements).toBe(logCommits);
    expect(walCommitted).toBe(logCommits);
    expect(logCommits).toBeLessThan(appends / 2);
    expect(logCommits).toBeGreaterThanOrEqual(EACH);
  });

  it('keeps appends to several counts in one group apart, each chain gapless', async () => {
    const log = newLog();
    const [a, b] = [await createCount('A'), await createCount('B')];
    await Promise.all(Array.from({ length: 30 }, (_, k) => log.append(k % 2 === 0 ? a.id : b.id, [draft('x', { k })])));
    for (const c of [a, b]) {
      const events = await log.read(c.id);
      expect(events.map((e) => e.seq)).toEqual([...Array(15).keys()].map((k) => k + 1));
      expect(events.every((e) => e.countId === c.id)).toBe(true);
      expect(await log.verify(c.id)).toEqual({ ok: true, count: 15 });
    }
  });
});

describe('a failed group', () => {
  it('is rejected whole, stores nothing, and the tails are read again (another writer cannot fork the chain)', async () => {
    const log = newLog();
    const count = await createCount();
    await log.append(count.id, [draft('count:created', {})]);
    // A second log (its own connection) appends behind the first one's cached tail.
    const [intruder] = await newLog().append(count.id, [draft('x', { by: 'other' })]);
    expect(intruder!.seq).toBe(2);

    const commitsBefore = log.commits;
    const results = await Promise.allSettled([log.append(count.id, [draft('a', {})]), log.append(count.id, [draft('b', {})])]);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected']);
    expect((results[0] as PromiseRejectedResult).reason.message).toMatch(/append-only/);
    expect(log.commits).toBe(commitsBefore);
    expect((await log.read(count.id)).map((e) => e.type)).toEqual(['count:created', 'x']);

    // The next append reads the tail from the database and continues the chain after the other writer's event.
    const [next] = await log.append(count.id, [draft('c', {})]);
    expect(next).toMatchObject({ seq: 3, prevHash: intruder!.hash });
    expect(await log.verify(count.id)).toEqual({ ok: true, count: 3 });
  });

  it('also refuses the appends to that count queued while it ran: they were decided on events that were not stored', async () => {
    const count = await createCount();
    const other = await createCount('Other');
    let armed = false;
    let queuedMeanwhile: Promise<unknown>[] = [];
    // now() is read inside the write transaction: appends made there are queued while the group runs.
    const log = newLog({
      now: () => {
        if (armed) {
          armed = false;
          queuedMeanwhile = [log.append(count.id, [draft('decided-on-failed', {})]), log.append(other.id, [draft('unrelated', {})])];
        }
        return 1_000;
      },
    });
    await log.append(count.id, [draft('count:created', {})]);
    // A second log (its own connection) appends behind the first one's cached tail, so its next group fails.
    await newLog().append(count.id, [draft('x', { by: 'other' })]);
    armed = true;
    await expect(log.append(count.id, [draft('a', {})])).rejects.toThrow(/append-only/);
    const [stale, unrelated] = await Promise.allSettled(queuedMeanwhile);
    expect(stale!.status).toBe('rejected');
    expect(unrelated!.status).toBe('fulfilled');
    expect((await log.read(count.id)).map((e) => e.type)).toEqual(['count:created', 'x']);
    expect((await log.append(count.id, [draft('after', {})]))[0]!.seq).toBe(3);
  });

  it('after close, refuses appends; appends queued before close are committed', async () => {
    const log = new EventLog({ sequelize });
    const count = await createCount();
    const queued = log.append(count.id, [draft('count:created', {})]);
    await log.close();
    expect((await queued).map((e) => e.seq)).toEqual([1]);
    await expect(log.append(count.id, [draft('x', {})])).rejects.toThrow(/closed/);
    expect(await rows(count.id)).toBe(1);
  });
});

describe('a database locked by another writer', () => {
  it('is waited for: a group that meets SQLITE_BUSY is tried again and stored once the lock is free', async () => {
    const count = await createCount();
    const log = newLog({ busyTimeoutMs: 20, busyRetryDelaysMs: [50, 100, 200, 400] });
    await log.append(count.id, [draft('count:created', {})]);
    const other = await openRaw(dbFile);
    await run(other, 'BEGIN IMMEDIATE');
    const commitsBefore = log.commits;
    const pending = log.append(count.id, [draft('while-locked', {})]);
    await new Promise((resolve) => setTimeout(resolve, 250));
    await run(other, 'COMMIT');
    await new Promise<void>((resolve) => other.close(() => resolve()));
    const [stored] = await pending;
    expect(stored).toMatchObject({ seq: 2, type: 'while-locked' });
    expect(log.commits).toBe(commitsBefore + 1);
    expect(await log.verify(count.id)).toEqual({ ok: true, count: 2 });
  });

  it('fails the group once the retries are used up, storing nothing', async () => {
    const count = await createCount();
    const log = newLog({ busyTimeoutMs: 10, busyRetryDelaysMs: [10] });
    await log.append(count.id, [draft('count:created', {})]);
    const other = await openRaw(dbFile);
    await run(other, 'BEGIN IMMEDIATE');
    try {
      await expect(log.append(count.id, [draft('never', {})])).rejects.toMatchObject({ code: 'SQLITE_BUSY' });
    } finally {
      await run(other, 'ROLLBACK');
      await new Promise<void>((resolve) => other.close(() => resolve()));
    }
    expect((await log.read(count.id)).map((e) => e.type)).toEqual(['count:created']);
  });
});

function openRaw(file: string): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db: sqlite3.Database = new sqlite3.Database(file, (error) => (error ? reject(error) : resolve(db)));
  });
}

function run(db: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((resolve, reject) => db.run(sql, (error: Error | null) => (error ? reject(error) : resolve())));
}

describe('idempotency by commandId', () => {
  it('a retry returns the stored events of the command and stores nothing twice', async () => {
    const log = newLog();
    const count = await createCount();
    const cmd = [draft('hold:called', { reason: 'wind' }, { commandId: 'cmd-1' }), draft('clock:stopped', {}, { commandId: 'cmd-1' })];
    const first = await log.append(count.id, cmd);
    const retry = await log.append(count.id, [draft('hold:called', { reason: 'different text' }, { commandId: 'cmd-1' })]);
    expect(retry).toEqual(first);
    expect(await rows(count.id)).toBe(2);

    // The same command twice in one group, and a retry after a restart (no cached state).
    const [x, y] = await Promise.all([
      log.append(count.id, [draft('hold:released', {}, { commandId: 'cmd-2' })]),
      log.append(count.id, [draft('hold:released', {}, { commandId: 'cmd-2' })]),
    ]);
    expect(y).toEqual(x);
    expect(x!.map((e) => e.seq)).toEqual([3]);
    expect(await newLog().append(count.id, [draft('hold:released', {}, { commandId: 'cmd-2' })])).toEqual(x);
    expect(await rows(count.id)).toBe(3);

    // The same commandId on another count is another command.
    const other = await createCount();
    expect((await log.append(other.id, [draft('hold:called', {}, { commandId: 'cmd-1' })]))[0]!.seq).toBe(1);
    expect(await log.verify(count.id)).toEqual({ ok: true, count: 3 });
  });
});

describe('tampering', () => {
  async function loggedCount(n: number) {
    const log = newLog();
    const count = await createCount();
    for (let k = 1; k <= n; k += 1) await log.append(count.id, [draft('reading:recorded', { bar: 200 + k })]);
    expect(await log.verify(count.id)).toEqual({ ok: true, count: n });
    return { log, count };
  }

  // Someone with the database file can drop the triggers; the chain still shows what they did.
  async function withoutGuards(sql: string, replacements: unknown[]) {
    await sequelize.transaction(async (transaction) => {
      await sequelize.query('DROP TRIGGER count_events_no_update;', { transaction });
      await sequelize.query('DROP TRIGGER count_events_no_delete;', { transaction });
      await sequelize.query(sql, { replacements, transaction });
      // Put them back for the other tests (SQLite DDL is transactional, so this is all or nothing).
      await sequelize.query(`CREATE TRIGGER count_events_no_update BEFORE UPDATE ON count_events BEGIN SELECT RAISE(ABORT, 'count events are append-only'); END;`, { transaction });
      await sequelize.query(`CREATE TRIGGER count_events_no_delete BEFORE DELETE ON count_events BEGIN SELECT RAISE(ABORT, 'count events are append-only'); END;`, { transaction });
    });
  }

  it('an edited payload is named by its seq', async () => {
    const { log, count } = await loggedCount(5);
    await withoutGuards(`UPDATE count_events SET payload = '{"bar":250}' WHERE count_id = ? AND seq = 3`, [count.id]);
    expect(await log.verify(count.id)).toMatchObject({ ok: false, seq: 3, reason: 'hash-mismatch' });
  });

  it('an edit with its hash recomputed is named at the next seq', async () => {
    const { log, count } = await loggedCount(5);
    const [row] = await log.read(count.id, { sinceSeq: 1 });
    const forged = { ...row!, payload: { bar: 250 } };
    const hash = await eventHash(forged.prevHash, forged, sha256Hex);
    await withoutGuards(`UPDATE count_events SET payload = '{"bar":250}', hash = ? WHERE count_id = ? AND seq = 2`, [hash, count.id]);
    expect(await log.verify(count.id)).toMatchObject({ ok: false, seq: 3, reason: 'prev-hash-mismatch' });
  });

  it('a payload that is no longer JSON is named, not thrown', async () => {
    const { log, count } = await loggedCount(3);
    await withoutGuards(`UPDATE count_events SET payload = 'oops' WHERE count_id = ? AND seq = 2`, [count.id]);
    expect(await log.verify(count.id)).toMatchObject({ ok: false, seq: 2, reason: 'hash-mismatch' });
  });

  it('a deleted event shows as a gap in seq', async () => {
    const { log, count } = await loggedCount(5);
    await withoutGuards('DELETE FROM count_events WHERE count_id = ? AND seq = 4', [count.id]);
    expect(await log.verify(count.id)).toMatchObject({ ok: false, seq: 5, reason: 'seq-gap' });
  });
});
