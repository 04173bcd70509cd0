import { createHash } from 'node:crypto';
import { Op, type Sequelize } from 'sequelize';
import {
  canonicalJson,
  GENESIS_HASH,
  hashedText,
  verifyChain,
  type ChainedEvent,
  type ChainVerdict,
  type EventActor,
} from '../../src/domain/count/chain';
import { CountEvent } from '../models/count-event.model';
import { PostgresLogWriter, SequelizeLogWriter, SqliteLogWriter, sqliteFile, type EventRow, type LogTransaction, type LogWriter } from './log-writer';

/** SHA-256 as lowercase hex of the UTF-8 text, for chain.ts. */
export function sha256Hex(text: string): Promise<string> {
  return Promise.resolve(sha256HexNow(text));
}

function sha256HexNow(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

export interface EventDraft {
  type: string;
  payload: unknown;
  actor: EventActor | null;
  station: string | null;
  /** The client's id for the command this event answers; a retry with the same id writes nothing again. */
  commandId?: string | null;
  /** Epoch milliseconds; the server's time when left out. */
  at?: number;
}

export interface StoredEvent extends ChainedEvent {
  commandId: string | null;
}

export class EventLogError extends Error {
  constructor(
    readonly code: 'count_not_found' | 'invalid_draft',
    message: string,
  ) {
    super(message);
  }
}

/** A checked draft: its payload copied, and written once as canonical JSON for the hash and the row. */
type CheckedDraft = EventDraft & { payloadJson: string };

interface Pending {
  countId: number;
  drafts: CheckedDraft[];
  commandId: string | null;
  resolve(events: StoredEvent[]): void;
  reject(error: unknown): void;
}

interface Tail {
  seq: number;
  hash: string;
  /**
   * The command ids stored for the count, so a group can tell a retry without reading the database; null where
   * other processes write too (then the group's ids are looked up under the count's lock).
   */
  commands: Set<string> | null;
}

interface Built {
  rows: EventRow[];
  /** The tails after the group, with the command ids it adds (put into the cached set only once committed). */
  newTails: Map<number, Tail & { added: string[] }>;
  outcomes: Map<Pending, StoredEvent[] | EventLogError>;
}

const LIMITS = { type: 60, actorName: 120, station: 40, commandId: 100 };
// Command ids looked up per query, within SQLite's limit on bound values.
const LOOKUP_CHUNK = 200;

export interface EventLogDeps {
  /** Reads go through it; writes through the log's own connection to the same SQLite file. */
  sequelize: Sequelize;
  /** Server time in epoch milliseconds; tests pass a fixed clock. */
  now?: () => number;
  /** How long the write connection waits for another writer's lock before SQLITE_BUSY (tests shorten it). */
  busyTimeoutMs?: number;
  /** Waits before each retry of a group that met SQLITE_BUSY; its length is the number of retries. */
  busyRetryDelaysMs?: readonly number[];
}

/**
 * A group that still finds the database locked after the busy timeout is tried again after these waits: on a
 * machine whose disk is slow, a stream of other writers (sessions, uploads) can keep the lock for longer than
 * one busy timeout, and losing a count's event to that would stop its clock.
 */
export const BUSY_RETRY_DELAYS_MS = [100, 400, 1000] as const;

function isBusy(error: unknown): boolean {
  const code = (error as { code?: unknown } | null)?.code;
  const parent = (error as { parent?: { code?: unknown } } | null)?.parent?.code;
  return code === 'SQLITE_BUSY' || parent === 'SQLITE_BUSY';
}

/**
 * The durable, hash-chained event log of live counts. append() resolves only after the events' transaction has
 * committed, so a caller acknowledges or broadcasts nothing that could still be lost. Appends that arrive
 * while a commit runs wait and go together into the next transaction (group commit): one durable commit per
 * group instead of one per event. One EventLog per process owns the writes of its counts.
 */
export class EventLog {
  private readonly writer: LogWriter;
  /**
   * PostgreSQL, which other processes may write too: no tail is trusted from memory, every write transaction
   * locks its counts and reads their tails, and the live counts decide inside that lock (exclusive()).
   */
  readonly shared: boolean;
  private readonly now: () => number;
  private queue: Pending[] = [];
  /** The running drain, if any; close() waits for it. */
  private draining: Promise<void> | null = null;
  private closed = false;
  /** Last seq and hash per count, so a commit need not read them back. Only committed values go here. */
  private readonly tails = new Map<number, Tail>();
  private committed = 0;
  private readonly busyRetryDelays: readonly number[];

  constructor(deps: EventLogDeps) {
    this.shared = deps.sequelize.getDialect() === 'postgres';
    if (this.shared) {
      this.writer = PostgresLogWriter.forSequelize(deps.sequelize);
    } else {
      const file = sqliteFile(deps.sequelize);
      // An in-memory database lives on Sequelize's one connection: a second connection would open another, empty one.
      this.writer = file === null ? new SequelizeLogWriter(deps.sequelize) : new SqliteLogWriter(file, deps.busyTimeoutMs);
    }
    this.now = deps.now ?? Date.now;
    this.busyRetryDelays = deps.busyRetryDelaysMs ?? BUSY_RETRY_DELAYS_MS;
  }

  /** Waits for the appends already queued, then closes the log's connection; later appends are refused. */
  async close(): Promise<void> {
    this.closed = true;
    while (this.draining) await this.draining;
    await this.writer.close();
  }

  /** The write connection's settings (journal mode, synchronous, foreign keys, busy timeout), for tests. */
  settings(): ReturnType<LogWriter['settings']> {
    return this.writer.settings();
  }

  /** Transactions this log has committed; read by tests and benchmarks. */
  get commits(): number {
    return this.committed;
  }

  /**
   * Appends the drafts to the count's log, in order, and resolves with them as stored once committed.
   * Appends to one count are stored in the order append() was called.
   *
   * Idempotency: every draft of one call carries the same commandId, or none does. If that commandId is already
   * stored for the count (or an earlier append in the same group carries it), nothing is written and the
   * events stored for that command are returned, whatever the new drafts say.
   */
  append(countId: number, drafts: EventDraft[]): Promise<StoredEvent[]> {
    let checked: ReturnType<typeof checkDrafts>;
    try {
      checked = checkDrafts(countId, drafts);
    } catch (error) {
      return Promise.reject(error);
    }
    if (drafts.length === 0) return Promise.resolve([]);
    if (this.closed) return Promise.reject(new Error('The event log is closed.'));
    return new Promise<StoredEvent[]>((resolve, reject) => {
      this.queue.push({ countId, ...checked, resolve, reject });
      // Start on a later turn so appends made in the same turn share the first transaction too.
      this.draining ??= new Promise<void>((resolve) => setImmediate(resolve)).then(() => this.drain());
    });
  }

  /** The count's events in seq order, after `sinceSeq` when given. */
  async read(countId: number, options: { sinceSeq?: number } = {}): Promise<StoredEvent[]> {
    const rows = await CountEvent.findAll({
      where: { countId, ...(options.sinceSeq !== undefined ? { seq: { [Op.gt]: options.sinceSeq } } : {}) },
      order: [['seq', 'ASC']],
    });
    return rows.map(toStored);
  }

  /**
   * Recomputes the count's whole chain from the database (see verifyChain in chain.ts). A payload that is no
   * longer JSON cannot match its hash and is reported as a hash mismatch at its seq.
   */
  async verify(countId: number): Promise<ChainVerdict> {
    const rows = await CountEvent.findAll({ where: { countId }, order: [['seq', 'ASC']] });
    const events: StoredEvent[] = [];
    for (const row of rows) {
      try {
        events.push(toStored(row));
      } catch {
        const before = await verifyChain(events, sha256Hex);
        if (!before.ok) return before;
        return { ok: false, seq: row.seq, reason: 'hash-mismatch', detail: 'the stored payload is not JSON' };
      }
    }
    return verifyChain(events, sha256Hex);
  }

  /**
   * For a log that other processes write too (shared): one transaction holding the count's lock, in which
   * `decide` is given the events stored after `sinceSeq` (appended by others since this process last looked)
   * and returns what to append, as appends of one commandId (or none) each. Resolves after COMMIT with the
   * events read and the stored events of each append. Nothing is written if `decide` throws; seq and hash
   * follow the tail read under the lock, so no two processes can fork the chain.
   */
  async exclusive(
    countId: number,
    sinceSeq: number,
    decide: (others: StoredEvent[]) => { drafts: EventDraft[]; commandId: string | null }[],
  ): Promise<{ others: StoredEvent[]; stored: StoredEvent[][] }> {
    if (this.closed) throw new Error('The event log is closed.');
    let result: { others: StoredEvent[]; stored: StoredEvent[][] } = { others: [], stored: [] };
    await this.writer.transaction(async (tx) => {
      await tx.lockCounts([countId]);
      const [count] = await tx.all<{ id: number }>('SELECT id FROM counts WHERE id = ?', [countId]);
      if (!count) throw new EventLogError('count_not_found', `There is no count ${countId}.`);
      const others = (
        await tx.all<RawEvent>(`SELECT ${RAW_COLUMNS} FROM count_events WHERE count_id = ? AND seq > ? ORDER BY seq`, [countId, sinceSeq])
      ).map(fromRaw);
      let tail: { seq: number; hash: string };
      const newest = others.at(-1);
      if (newest) tail = { seq: newest.seq, hash: newest.hash };
      else {
        const [last] = await tx.all<{ seq: number; hash: string }>('SELECT seq, hash FROM count_events WHERE count_id = ? ORDER BY seq DESC LIMIT 1', [countId]);
        tail = last ? { seq: last.seq, hash: last.hash } : { seq: 0, hash: GENESIS_HASH };
      }
      const appends = decide(others).map((a) => checkDrafts(countId, a.drafts.map((d) => ({ ...d, commandId: a.commandId }))));
      const stored: StoredEvent[][] = [];
      const rows: EventRow[] = [];
      const at = this.now();
      for (const append of appends) {
        const events: StoredEvent[] = [];
        for (const draft of append.drafts) {
          const content = {
            countId,
            seq: tail.seq + 1,
            type: draft.type,
            at: draft.at ?? at,
            actor: draft.actor,
            station: draft.station,
            payload: draft.payload,
          };
          const event: StoredEvent = {
            ...content,
            commandId: append.commandId,
            prevHash: tail.hash,
            hash: sha256HexNow(hashedText(tail.hash, content, draft.payloadJson)),
          };
          events.push(event);
          rows.push({ ...event, payloadJson: draft.payloadJson });
          tail = { seq: event.seq, hash: event.hash };
        }
        stored.push(events);
      }
      await tx.insert(rows);
      result = { others, stored };
    });
    this.committed += 1;
    return result;
  }

  private async drain(): Promise<void> {
    while (this.queue.length > 0) {
      const group = this.queue;
      this.queue = [];
      await this.commitGroup(group);
    }
    this.draining = null;
  }

  private async commitGroup(group: Pending[]): Promise<void> {
    const countIds = [...new Set(group.map((p) => p.countId))];
    let built: Built | null = null;
    try {
      // The usual group: every tail cached and no command id seen before. Its rows are known before any read, and
      // one INSERT statement on its own is a whole transaction (atomic, and durable at its commit): one trip to
      // the database instead of four (BEGIN, the command-id check, INSERT, COMMIT).
      const cached = this.cachedTails(countIds);
      const repeats = cached !== null && group.some((p) => p.commandId !== null && cached.get(p.countId)!.commands?.has(p.commandId) !== false);
      const rows = cached === null || repeats || !this.writer.insertAtomic ? null : this.build(group, cached, new Map());
      if (rows !== null && this.writer.insertAtomic!.fits(rows.rows.length)) {
        await this.retryingBusy(() => this.writer.insertAtomic!.run(rows.rows));
        built = rows;
      } else {
        await this.retryingBusy(() =>
          this.writer.transaction(async (tx) => {
            // Shared with other processes (PostgreSQL): no tail is cached, and the counts' locks order the writers.
            if (this.shared) await tx.lockCounts(countIds);
            const known = await this.loadTails(countIds, tx);
            const earlier = await storedCommands(group, known, tx);
            built = this.build(group, known, earlier);
            await tx.insert(built.rows);
          }),
        );
      }
    } catch (error) {
      // Nothing of the group is stored; forget the tails so the next commit reads them from the database.
      for (const countId of countIds) this.tails.delete(countId);
      for (const pending of group) pending.reject(error);
      // Appends to the same counts queued while this group ran were decided by callers who took the failed
      // events as done: storing them would put facts in the log that follow from events it does not hold.
      const failed = new Set(countIds);
      const stale = this.queue.filter((p) => failed.has(p.countId));
      this.queue = this.queue.filter((p) => !failed.has(p.countId));
      for (const pending of stale) pending.reject(error);
      return;
    }
    const { newTails, outcomes } = built as unknown as Built;
    this.committed += 1;
    if (!this.shared) {
      for (const [countId, { seq, hash, commands, added }] of newTails) {
        // The cached set grows in place: copying it per group would cost as much as every command the count had.
        if (commands) for (const id of added) commands.add(id);
        this.tails.set(countId, { seq, hash, commands });
      }
    }
    for (const pending of group) {
      const outcome = outcomes.get(pending);
      if (outcome instanceof Error || outcome === undefined) pending.reject(outcome ?? new Error('append lost its outcome'));
      else pending.resolve(outcome);
    }
  }

  /** The cached tails of all these counts, or null when one must be read from the database. */
  private cachedTails(countIds: number[]): Map<number, Tail> | null {
    const tails = new Map<number, Tail>();
    for (const id of countIds) {
      const tail = this.tails.get(id);
      if (!tail) return null;
      tails.set(id, tail);
    }
    return tails;
  }

  /**
   * The group's rows, chained on the given tails; `earlier` holds the events already stored for command ids of
   * the group. The new tails list the command ids the group adds: the cached sets take them only after the commit.
   */
  private build(group: Pending[], known: Map<number, Tail>, earlier: Map<string, StoredEvent[]>): Built {
    const newTails: Built['newTails'] = new Map();
    const outcomes = new Map<Pending, StoredEvent[] | EventLogError>();
    const rows: EventRow[] = [];
    for (const pending of group) {
      const tail = newTails.get(pending.countId) ?? known.get(pending.countId);
      if (!tail) {
        outcomes.set(pending, new EventLogError('count_not_found', `There is no count ${pending.countId}.`));
        continue;
      }
      const key = pending.commandId === null ? null : commandKey(pending.countId, pending.commandId);
      const already = key === null ? undefined : earlier.get(key);
      if (already) {
        outcomes.set(pending, already);
        continue;
      }
      const stored: StoredEvent[] = [];
      let { seq, hash } = tail;
      const at = this.now();
      for (const draft of pending.drafts) {
        const content = {
          countId: pending.countId,
          seq: seq + 1,
          type: draft.type,
          at: draft.at ?? at,
          actor: draft.actor,
          station: draft.station,
          payload: draft.payload,
        };
        const event: StoredEvent = {
          ...content,
          commandId: pending.commandId,
          prevHash: hash,
          hash: sha256HexNow(hashedText(hash, content, draft.payloadJson)),
        };
        stored.push(event);
        rows.push({ ...event, payloadJson: draft.payloadJson });
        seq = event.seq;
        hash = event.hash;
      }
      const added = newTails.get(pending.countId)?.added ?? [];
      if (pending.commandId !== null) added.push(pending.commandId);
      newTails.set(pending.countId, { seq, hash, commands: tail.commands, added });
      if (key !== null) earlier.set(key, stored);
      outcomes.set(pending, stored);
    }
    return { rows, newTails, outcomes };
  }

  /** One write (a transaction or a lone INSERT), tried again after the configured waits while SQLite answers SQLITE_BUSY. */
  private async retryingBusy(write: () => Promise<void>): Promise<void> {
    for (let attempt = 0; ; attempt++) {
      try {
        await write();
        return;
      } catch (error) {
        const delay = this.busyRetryDelays[attempt];
        if (!isBusy(error) || delay === undefined) throw error;
        await new Promise((resolve) => setTimeout(resolve, delay));
      }
    }
  }

  /** Committed tails, read from the database (inside the write transaction) for counts not yet cached. */
  private async loadTails(countIds: number[], tx: LogTransaction): Promise<Map<number, Tail>> {
    const tails = new Map<number, Tail>();
    const missing: number[] = [];
    for (const id of countIds) {
      const cached = this.tails.get(id);
      if (cached) tails.set(id, cached);
      else missing.push(id);
    }
    if (missing.length === 0) return tails;
    const counts = await tx.all<{ id: number }>(`SELECT id FROM counts WHERE id IN (${marks(missing.length)})`, missing);
    for (const { id } of counts) {
      const [last] = await tx.all<{ seq: number; hash: string }>('SELECT seq, hash FROM count_events WHERE count_id = ? ORDER BY seq DESC LIMIT 1', [id]);
      // Read once and then kept with the cached tail; a shared log caches nothing and asks per group instead.
      const commands = this.shared
        ? null
        : new Set((await tx.all<{ command_id: string }>('SELECT DISTINCT command_id FROM count_events WHERE count_id = ? AND command_id IS NOT NULL', [id])).map((r) => r.command_id));
      tails.set(id, last ? { seq: last.seq, hash: last.hash, commands } : { seq: 0, hash: GENESIS_HASH, commands });
    }
    return tails;
  }
}

/** Events already stored for the group's command ids (those the tails list as stored), by count and command. */
async function storedCommands(group: Pending[], tails: Map<number, Tail>, tx: LogTransaction): Promise<Map<string, StoredEvent[]>> {
  const found = new Map<string, StoredEvent[]>();
  const byCount = new Map<number, Set<string>>();
  for (const p of group) {
    if (p.commandId === null || tails.get(p.countId)?.commands?.has(p.commandId) === false) continue;
    const ids = byCount.get(p.countId) ?? new Set<string>();
    ids.add(p.commandId);
    byCount.set(p.countId, ids);
  }
  for (const [countId, set] of byCount) {
    const ids = [...set];
    for (let i = 0; i < ids.length; i += LOOKUP_CHUNK) {
      const chunk = ids.slice(i, i + LOOKUP_CHUNK);
      const rows = await tx.all<RawEvent>(
        `SELECT ${RAW_COLUMNS} FROM count_events WHERE count_id = ? AND command_id IN (${marks(chunk.length)}) ORDER BY seq`,
        [countId, ...chunk],
      );
      for (const row of rows) {
        const key = commandKey(countId, row.command_id!);
        found.set(key, [...(found.get(key) ?? []), fromRaw(row)]);
      }
    }
  }
  return found;
}

function marks(n: number): string {
  return Array.from({ length: n }, () => '?').join(', ');
}

function commandKey(countId: number, commandId: string): string {
  return `${countId}:${commandId}`;
}

/**
 * Refuses malformed drafts before they can fail a whole group's transaction. Returns the call's commandId and
 * a copy of the drafts whose payload is already as it will read back (canonical JSON parsed again), so the
 * caller changing its objects after append() changes nothing.
 */
function checkDrafts(countId: number, drafts: EventDraft[]): { commandId: string | null; drafts: CheckedDraft[] } {
  const bad = (message: string) => new EventLogError('invalid_draft', message);
  if (!Number.isInteger(countId) || countId < 1) throw bad('countId must be a positive integer.');
  if (!Array.isArray(drafts)) throw bad('drafts must be an array.');
  const commandIds = new Set(drafts.map((d) => d.commandId ?? null));
  if (commandIds.size > 1) throw bad('All drafts of one append carry the same commandId, or none does.');
  const commandId = drafts[0]?.commandId ?? null;
  if (commandId !== null && (typeof commandId !== 'string' || commandId.length === 0 || commandId.length > LIMITS.commandId)) {
    throw bad(`commandId must be 1 to ${LIMITS.commandId} characters.`);
  }
  for (const d of drafts) {
    if (typeof d.type !== 'string' || d.type.length === 0 || d.type.length > LIMITS.type) throw bad(`type must be 1 to ${LIMITS.type} characters.`);
    if (d.station !== null && (typeof d.station !== 'string' || d.station.length > LIMITS.station)) throw bad(`station must be null or at most ${LIMITS.station} characters.`);
    if (d.actor !== null) {
      if (typeof d.actor !== 'object' || typeof d.actor.name !== 'string' || d.actor.name.length > LIMITS.actorName) throw bad('actor must be null or { userId, name }.');
      if (d.actor.userId !== null && !Number.isInteger(d.actor.userId)) throw bad('actor.userId must be an integer or null.');
    }
    if (d.at !== undefined && !Number.isSafeInteger(d.at)) throw bad('at must be an integer number of epoch milliseconds.');
    if (d.payload === undefined) throw bad('payload is required (use null or {} for none).');
  }
  const copies = drafts.map((d): CheckedDraft => {
    let payload: unknown;
    let payloadJson: string;
    try {
      payloadJson = canonicalJson(d.payload);
      payload = JSON.parse(payloadJson) as unknown;
    } catch (error) {
      throw bad(`payload: ${(error as Error).message}`);
    }
    const actor = d.actor === null ? null : { userId: d.actor.userId, name: d.actor.name };
    return { type: d.type, payload, payloadJson, actor, station: d.station, commandId, ...(d.at !== undefined ? { at: d.at } : {}) };
  });
  return { commandId, drafts: copies };
}

/** A count_events row as read with RAW_COLUMNS, through the log's own connection. */
interface RawEvent {
  count_id: number;
  seq: number;
  type: string;
  payload: string;
  actor_user_id: number | null;
  actor_name: string | null;
  station: string | null;
  at: number;
  command_id: string | null;
  prev_hash: string;
  hash: string;
}

const RAW_COLUMNS = 'count_id, seq, type, payload, actor_user_id, actor_name, station, at, command_id, prev_hash, hash';

function fromRaw(row: RawEvent): StoredEvent {
  return {
    countId: row.count_id,
    seq: row.seq,
    type: row.type,
    at: row.at,
    actor: row.actor_name === null ? null : { userId: row.actor_user_id, name: row.actor_name },
    station: row.station,
    payload: JSON.parse(row.payload) as unknown,
    commandId: row.command_id,
    prevHash: row.prev_hash,
    hash: row.hash,
  };
}

export function toStored(row: CountEvent): StoredEvent {
  return {
    countId: row.countId,
    seq: row.seq,
    type: row.type,
    at: row.at,
    // The actor is stored in two columns; a name means there was an actor.
    actor: row.actorName === null ? null : { userId: row.actorUserId, name: row.actorName },
    station: row.station,
    payload: row.payload,
    commandId: row.commandId,
    prevHash: row.prevHash,
    hash: row.hash,
  };
}
