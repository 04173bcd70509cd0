/**
 * The live counts this server is the authority for. Every change goes one way: the clock's due events first,
 * then `decide` turns a person's command into facts, the event log commits them, and only then are they
 * acknowledged, folded into the served state and broadcast to the count's room.
 *
 * Decisions are made in order, one at a time per count, on the *projected* state: the committed state plus what
 * has been decided and handed to the log but not yet committed. A decision therefore never waits for the
 * previous one's disk write, and answers that arrive together are committed together (the log's group commit);
 * nobody hears of an event before it is on disk. If a commit fails, the count is dropped from memory and read
 * back from its log shortly after (or on its next use, if sooner), so its clock goes on without anyone pressing
 * anything; the events the clock made due meanwhile are appended with their own instants.
 */
import type { CountCommand } from '../../src/domain/count/commands';
import { decide } from '../../src/domain/count/commands';
import { dueEvents, nextDueAt, restartHoldDrafts } from '../../src/domain/count/due';
import type { CountEvent, EventDraft } from '../../src/domain/count/events';
import { replay } from '../../src/domain/count/reduce';
import { initialCountState, type CountState } from '../../src/domain/count/state';
import { stampEvents } from '../../src/domain/count/events';
import type { CountEventDto } from '../../src/contract/count';
import type { Role } from '../../src/domain/people/roles';
import { HttpError, notFound } from '../http/errors';
import { Count } from '../models';
import type { EventLog, StoredEvent } from './log';

/** How long a station's last connection may be gone before the count shows it as lost. */
export const STATION_GRACE_MS = 5000;

/** Scrubbed or complete: nothing more is appended to its log, not even who is connected. */
function hasEnded(state: CountState): boolean {
  return state.status === 'scrubbed' || state.status === 'complete';
}
/** How long after a failed commit a count is read back from its log. */
export const REVIVE_AFTER_MS = 1000;

export interface CountActor {
  id: number;
  teamId: number;
  name: string;
  roles: readonly Role[];
}

interface LiveCount {
  id: number;
  teamId: number;
  /** Committed: what has been acknowledged and broadcast. Served to clients. */
  state: CountState;
  /** Committed plus decided-but-not-yet-committed: what the next decision is made on. */
  projected: CountState;
  /** commandId -> its events while the commit is in flight. */
  inflight: Map<string, Promise<CountEventDto[]>>;
  /** The last append handed to the log: settles after everything before it. */
  tail: Promise<unknown>;
  /** Committed events not yet broadcast. */
  outbox: CountEventDto[];
  /** commandId -> the events that command appended, so a retry gets the first answer. */
  commands: Map<string, CountEventDto[]>;
  timer: NodeJS.Timeout | null;
  /** The instant the timer is set for. */
  timerAt?: number | null;
  /** The tail of this count's work queue. */
  chain: Promise<unknown>;
  /** Open sockets per station code (socket ids), for presence. */
  present: Map<string, Set<string>>;
  lostTimers: Map<string, NodeJS.Timeout>;
  /** When the oldest event in the outbox was committed. */
  outboxSince?: number;
  /** A broadcast of the outbox is set for the next turn of the event loop. */
  flushQueued?: boolean;
  /** Broadcasts the outbox when its oldest event has waited COALESCE_MS, if no commit has done so first. */
  flushTimer?: NodeJS.Timeout | null;
  /** Who waits for events up to a seq to reach the room (see broadcasted()). */
  broadcastWaiters?: { seq: number; resolve: () => void }[];
}

/**
 * The longest a committed event waits for the commits behind it before it is broadcast. While answers stream in,
 * each commit would otherwise be a message to every socket of the room; held back, a poll's answers go out as one.
 */
export const COALESCE_MS = 25;

export const countRoom = (countId: number) => `count:${countId}`;

/**
 * The clock's next moment per state object (states are never changed in place): a command asks whether anything
 * is due before deciding, and the timer is re-armed after it, on the same projected state.
 */
const nextDueCache = new WeakMap<CountState, number | null>();
function nextDueOf(state: CountState): number | null {
  let at = nextDueCache.get(state);
  if (at === undefined) {
    at = nextDueAt(state);
    nextDueCache.set(state, at);
  }
  return at;
}

export function eventDto(e: StoredEvent): CountEventDto {
  return {
    countId: e.countId,
    seq: e.seq,
    type: e.type,
    at: e.at,
    actor: e.actor ? { userId: e.actor.userId ?? 0, name: e.actor.name } : null,
    station: e.station,
    payload: e.payload,
    prevHash: e.prevHash,
    hash: e.hash,
  } as CountEventDto;
}

export interface CountServiceDeps {
  log: EventLog;
  /** Sends stored events, in seq order, to everyone watching the count. */
  broadcast: (countId: number, events: CountEventDto[]) => void;
  now?: () => number;
  /** Called with every batch of stored events after it is folded in (mail on a scrub, the list's status). */
  onEvents?: (count: { id: number; teamId: number; state: CountState }, events: CountEventDto[]) => void;
  logError?: (message: string, error?: unknown) => void;
  /** After a failed commit, the wait before the count is read back from its log (tests shorten it). */
  reviveAfterMs?: number;
  /** How long committed events may wait for the commits behind them before they are broadcast (COALESCE_MS). */
  coalesceMs?: number;
  /**
   * With a shared log (several processes): whether a socket of someone manning `station` is in the count's
   * room on any process, asked before a station is logged as lost (its socket may be on another process).
   */
  stationPresentElsewhere?: (countId: number, station: string, state: CountState) => Promise<boolean>;
  /** With a shared log: tells the other processes that this count's log grew (they fold it in, see appendedElsewhere). */
  announce?: (countId: number, lastSeq: number) => void;
}

export class CountService {
  private readonly counts = new Map<number, LiveCount>();
  private readonly loading = new Map<number, Promise<LiveCount>>();
  /** The open sockets of a count dropped after a failed commit, handed to it when it is read back. */
  private readonly orphanPresence = new Map<number, Map<string, Set<string>>>();
  private readonly now: () => number;
  private closed = false;
  /** The log is shared with other processes (PostgreSQL): every change is decided under the log's lock. */
  private readonly shared: boolean;

  constructor(private readonly deps: CountServiceDeps) {
    this.now = deps.now ?? Date.now;
    this.shared = deps.log.shared;
  }

  /**
   * The count as this server holds it, loaded from its log on first use. 404 for another team's or no count.
   * With a shared log, first folds in what other processes appended, so the state served is current.
   */
  async get(teamId: number, countId: number, options: { fresh?: boolean } = {}): Promise<LiveCount> {
    const c = await this.load(countId);
    if (!c || c.teamId !== teamId) throw notFound('There is no such count.');
    if (this.shared && options.fresh !== false) await this.enqueue(c, () => this.refresh(c));
    return c;
  }

  // ------------------------------------------------ shared log (several processes on PostgreSQL)

  /**
   * Folds events another process appended (committed, and broadcast to the room by that process) into this
   * process's copy: the state, the command answers, the clock's timer. Events at or below the known seq are
   * skipped, so reading the same events twice is harmless.
   */
  private foldOthers(c: LiveCount, stored: StoredEvent[]): void {
    const fresh = stored.filter((e) => e.seq > c.state.lastSeq);
    if (fresh.length === 0) return;
    const events = fresh.map(eventDto);
    c.state = replay(events as unknown as CountEvent[], c.state);
    c.projected = c.state;
    fresh.forEach((e, i) => {
      if (!e.commandId) return;
      c.commands.set(e.commandId, [...(c.commands.get(e.commandId) ?? []), events[i]!]);
    });
    this.schedule(c);
  }

  /**
   * Another process appended to a count up to `lastSeq`: if this process holds the count, it folds the events in,
   * so its clock's timer follows the count (and goes on if the other process stops).
   */
  appendedElsewhere(countId: number, lastSeq: number): void {
    const c = this.counts.get(countId);
    if (!c || this.closed || lastSeq <= c.state.lastSeq) return;
    void this.enqueue(c, () => this.refresh(c)).catch((error) => this.deps.logError?.(`count ${countId}: catching up failed`, error));
  }

  /** Reads what other processes appended since this process last looked (no lock: a plain read). */
  private async refresh(c: LiveCount): Promise<void> {
    if (this.counts.get(c.id) !== c) return;
    this.foldOthers(c, await this.deps.log.read(c.id, { sinceSeq: c.state.lastSeq }));
  }

  /**
   * The shared log's one way to change a count: in one transaction holding the count's lock, fold in what other
   * processes appended, let the clock's due events come first, then `make` decides on that state (throwing
   * refuses, and nothing is written). Resolves after the commit, once folded and broadcast, with the events
   * `make` asked for (or, for a commandId already stored, that command's first answer). Call from inside the
   * count's queue. Slower than the single-process path: each decision waits for its own commit.
   */
  private async locked(
    c: LiveCount,
    make: (state: CountState, now: number) => readonly EventDraft[],
    commandId?: string,
  ): Promise<CountEventDto[]> {
    let earlier: CountEventDto[] | undefined;
    const now = this.now();
    const { stored } = await this.deps.log.exclusive(c.id, c.state.lastSeq, (others) => {
      this.foldOthers(c, others);
      earlier = commandId ? c.commands.get(commandId) : undefined;
      if (earlier) return [];
      const timed = (drafts: readonly EventDraft[]) => drafts.map((d) => ({ ...d, at: d.at ?? now }) as EventDraft & { at: number });
      const due = timed(dueEvents(c.state, now));
      const after = due.length ? replay(stampEvents(c.state.lastSeq, due, now), c.state) : c.state;
      const drafts = timed(make(after, now));
      const asLog = (list: (EventDraft & { at: number })[], id: string | null) => ({
        commandId: id,
        drafts: list.map((d) => ({ type: d.type, payload: d.payload, actor: d.actor, station: d.station, at: d.at })),
      });
      return [asLog(due, null), asLog(drafts, commandId ?? null)];
    });
    if (earlier) return earlier;
    const [dueStored = [], madeStored = []] = stored;
    const all = [...dueStored, ...madeStored].map(eventDto);
    if (all.length > 0) {
      c.state = replay(all as unknown as CountEvent[], c.state);
      c.projected = c.state;
      const made = madeStored.map(eventDto);
      if (commandId && made.length) c.commands.set(commandId, made);
      this.publish(c, all);
      this.deps.announce?.(c.id, c.state.lastSeq);
      try {
        this.deps.onEvents?.(c, all);
      } catch (error) {
        this.deps.logError?.('count event listener failed', error);
      }
    }
    this.schedule(c);
    return madeStored.map(eventDto);
  }

  private async load(countId: number): Promise<LiveCount | null> {
    const have = this.counts.get(countId);
    if (have) return have;
    let pending = this.loading.get(countId);
    if (!pending) {
      pending = (async () => {
        const row = await Count.findByPk(countId);
        if (!row) throw notFound('There is no such count.');
        const stored = await this.deps.log.read(countId);
        const events = stored.map(eventDto);
        const commands = new Map<string, CountEventDto[]>();
        stored.forEach((e, i) => {
          if (!e.commandId) return;
          const list = commands.get(e.commandId) ?? [];
          list.push(events[i]!);
          commands.set(e.commandId, list);
        });
        const state = replay(events as unknown as CountEvent[]);
        const present = this.orphanPresence.get(countId) ?? new Map<string, Set<string>>();
        this.orphanPresence.delete(countId);
        const live: LiveCount = {
          id: countId,
          teamId: row.teamId as number,
          state,
          projected: state,
          inflight: new Map(),
          tail: Promise.resolve(),
          outbox: [],
          commands,
          timer: null,
          chain: Promise.resolve(),
          present,
          lostTimers: new Map(),
        };
        this.counts.set(countId, live);
        this.schedule(live);
        // A station the log shows connected with no socket here (after a restart, or one that left while the
        // count was out of memory) shows as lost unless it comes back within the grace time.
        for (const [station, s] of Object.entries(state.stations)) {
          if (s.presence === 'connected' && (present.get(station)?.size ?? 0) === 0) this.armLost(live, station);
        }
        return live;
      })();
      this.loading.set(countId, pending);
      pending.finally(() => this.loading.delete(countId)).catch(() => {});
    }
    try {
      return await pending;
    } catch (error) {
      if (error instanceof HttpError && error.status === 404) return null;
      throw error;
    }
  }

  /** Runs `fn` after everything queued for this count. */
  private enqueue<T>(c: LiveCount, fn: () => Promise<T>): Promise<T> {
    const run = c.chain.then(fn, fn);
    c.chain = run.catch(() => {});
    return run;
  }

  /**
   * Hands drafts to the log and folds them into the projected state at once; the promise resolves with the stored
   * events after their commit, once they are folded into the served state and broadcast. Call only from inside
   * the count's queue, so projected seqs follow the log's.
   */
  private submit(c: LiveCount, drafts: readonly EventDraft[], commandId?: string): Promise<CountEventDto[]> {
    if (drafts.length === 0) return Promise.resolve([]);
    const now = this.now();
    const timed = drafts.map((d) => ({ ...d, at: d.at ?? now }) as EventDraft & { at: number });
    c.projected = replay(stampEvents(c.projected.lastSeq, timed, now), c.projected);
    const committed = this.deps.log
      .append(
        c.id,
        timed.map((d) => ({ type: d.type, payload: d.payload, actor: d.actor, station: d.station, at: d.at, commandId: commandId ?? null })),
      )
      .then(
        (stored) => {
          const events = stored.map(eventDto);
          c.state = replay(events as unknown as CountEvent[], c.state);
          if (commandId) {
            c.commands.set(commandId, events);
            c.inflight.delete(commandId);
          }
          this.publish(c, events);
          try {
            this.deps.onEvents?.(c, events);
          } catch (error) {
            this.deps.logError?.('count event listener failed', error);
          }
          return events;
        },
        (error: unknown) => {
          // The projection now runs ahead of the log: forget this count and read it back from the log.
          if (commandId) c.inflight.delete(commandId);
          this.drop(c, error);
          throw error;
        },
      );
    if (commandId) c.inflight.set(commandId, committed);
    c.tail = committed.catch(() => {});
    this.schedule(c);
    return committed;
  }

  /**
   * Forgets a count whose commit failed (its projection runs ahead of its log) and reads it back from the log
   * after REVIVE_AFTER_MS, unless its next use has done so already. Its timers stop; its open sockets carry over.
   */
  private drop(c: LiveCount, error: unknown): void {
    if (this.counts.get(c.id) !== c) return; // already dropped by an earlier failure
    this.counts.delete(c.id);
    // Committed events held back for the commit that failed go out now.
    this.flush(c);
    if (c.timer) clearTimeout(c.timer);
    c.timer = null;
    for (const t of c.lostTimers.values()) clearTimeout(t);
    c.lostTimers.clear();
    this.orphanPresence.set(c.id, c.present);
    this.deps.logError?.(`count ${c.id}: a commit failed; reading the count back from its log`, error);
    this.revive(c.id);
  }

  private revive(countId: number): void {
    if (this.closed) return;
    const timer = setTimeout(() => {
      if (this.closed || this.counts.has(countId)) return;
      this.load(countId).catch((error) => {
        this.deps.logError?.(`count ${countId}: reading it back failed; trying again`, error);
        this.revive(countId);
      });
    }, this.deps.reviveAfterMs ?? REVIVE_AFTER_MS);
    timer.unref?.();
  }

  /**
   * Committed events go out to the room as one message, in seq order, on the next turn of the event loop. While
   * more of the count's events are decided and on their way to the disk, the message waits for their commit too
   * (for at most COALESCE_MS): a poll's answers, committed in a few groups, reach every socket as one message
   * instead of one per group. Nobody hears of an event before its commit either way.
   */
  private publish(c: LiveCount, events: CountEventDto[]) {
    if (c.outbox.length === 0) c.outboxSince = this.now();
    c.outbox.push(...events);
    if (c.flushQueued) return;
    const waited = this.now() - (c.outboxSince ?? 0);
    const wait = this.deps.coalesceMs ?? COALESCE_MS;
    if (c.projected.lastSeq > c.state.lastSeq && waited < wait) {
      // A commit that takes long (a busy database) must not hold the events before it back.
      if (!c.flushTimer) {
        c.flushTimer = setTimeout(() => this.flush(c), wait - waited);
        c.flushTimer.unref?.();
      }
      return;
    }
    c.flushQueued = true;
    setImmediate(() => this.flush(c));
  }

  /** Broadcasts what the outbox holds, then lets go whoever waited for those events to go out. */
  private flush(c: LiveCount) {
    c.flushQueued = false;
    if (c.flushTimer) clearTimeout(c.flushTimer);
    c.flushTimer = null;
    const out = c.outbox.splice(0);
    if (out.length) this.deps.broadcast(c.id, out);
    if (!c.broadcastWaiters?.length) return;
    // Every committed event has gone out now (the outbox is empty); a count dropped or closed lets everyone go.
    const gone = this.counts.get(c.id) !== c || this.closed;
    c.broadcastWaiters = c.broadcastWaiters.filter((w) => {
      if (w.seq > c.state.lastSeq && !gone) return true;
      w.resolve();
      return false;
    });
  }

  /**
   * Resolves once the count's events up to `seq` have been handed to its room (at once if they have been, or if
   * the count is no longer served from memory). A socket answers a command after this, so the answer and the
   * events it names reach the socket together, the events first.
   */
  broadcasted(countId: number, seq: number): Promise<void> {
    const c = this.counts.get(countId);
    // A committed event is in the outbox until it goes out: one that is not there has gone.
    const waiting = c && (seq > c.state.lastSeq || (c.outbox.length > 0 && c.outbox[0]!.seq <= seq));
    if (!c || this.closed || !waiting) return Promise.resolve();
    return new Promise((resolve) => (c.broadcastWaiters ??= []).push({ seq, resolve }));
  }

  /** The clock's own events up to now (steps reached, built-in holds, poll time-outs, T-0). */
  private catchUp(c: LiveCount): Promise<CountEventDto[]> {
    const now = this.now();
    const next = nextDueOf(c.projected);
    if (next === null || next > now) return Promise.resolve([]);
    return this.submit(c, dueEvents(c.projected, now));
  }

  private schedule(c: LiveCount): void {
    const at = this.closed || this.counts.get(c.id) !== c ? null : nextDueOf(c.projected);
    // Most commands (an answer, a reading) leave the next moment where it was: keep the timer already set.
    if (at !== null && c.timer && c.timerAt === at) return;
    if (c.timer) clearTimeout(c.timer);
    c.timer = null;
    c.timerAt = null;
    if (at === null) return;
    c.timerAt = at;
    // setTimeout holds at most about 24.8 days; a count's next moment is never that far, but stay safe.
    const delay = Math.min(Math.max(0, at - this.now()), 2 ** 31 - 1);
    c.timer = setTimeout(() => {
      c.timer = null;
      c.timerAt = null;
      // Shared: the other processes' timers fire too; whoever comes second finds nothing due once caught up.
      if (this.shared) {
        void this.enqueue(c, () => this.locked(c, () => [])).catch((error) => this.deps.logError?.(`count ${c.id}: clock events failed`, error));
        return;
      }
      void this.enqueue(c, async () => {
        const done = this.catchUp(c);
        // A timer that fired a moment early found nothing due: set it again (after events, submit already has).
        this.schedule(c);
        return { done };
      })
        .then((r) => r.done)
        .catch((error) => this.deps.logError?.(`count ${c.id}: clock events failed`, error));
    }, delay);
    c.timer.unref?.();
  }

  /**
   * One command from one person: the same path for a socket event and for POST /api/counts/:id/commands.
   * A retried commandId answers the events of its first run and appends nothing.
   */
  async command(teamId: number, countId: number, actor: CountActor, command: CountCommand & { commandId?: string }): Promise<CountEventDto[]> {
    const c = await this.get(teamId, countId, { fresh: false });
    if (this.shared) {
      const { commandId, ...cmd } = command;
      return this.enqueue(c, () =>
        this.locked(
          c,
          (state, now) => {
            const decision = decide(state, cmd as CountCommand, {
              now,
              actor: { userId: actor.id, name: actor.name, roles: actor.roles },
              mannedStations: mannedStations(state, actor.id),
            });
            if (!decision.ok) throw new HttpError(decision.status, refusalCode(decision.status), decision.error);
            return decision.events;
          },
          commandId,
        ),
      );
    }
    // The queue only decides and hands over; the answer waits for the commit outside it.
    const committed = await this.enqueue(c, async (): Promise<{ done: Promise<CountEventDto[]> }> => {
      // Dropped after a failed commit while this waited: decide on the count as its log has it.
      if (this.counts.get(c.id) !== c) return { done: this.command(teamId, countId, actor, command) };
      const { commandId, ...cmd } = command;
      if (commandId) {
        const before = c.commands.get(commandId) ?? c.inflight.get(commandId);
        if (before) return { done: Promise.resolve(before) };
      }
      void this.catchUp(c).catch(() => {});
      const decision = decide(c.projected, cmd as CountCommand, {
        now: this.now(),
        actor: { userId: actor.id, name: actor.name, roles: actor.roles },
        mannedStations: mannedStations(c.projected, actor.id),
      });
      if (!decision.ok) throw new HttpError(decision.status, refusalCode(decision.status), decision.error);
      return { done: this.submit(c, decision.events, commandId) };
    });
    return committed.done;
  }

  /** Creates the count's first event; the row must already exist. */
  async start(countId: number, created: EventDraft): Promise<LiveCount> {
    const row = await Count.findByPk(countId);
    if (!row) throw notFound('There is no such count.');
    const live: LiveCount = {
      id: countId,
      teamId: row.teamId as number,
      state: initialCountState(),
      projected: initialCountState(),
      inflight: new Map(),
      tail: Promise.resolve(),
      outbox: [],
      commands: new Map(),
      timer: null,
      chain: Promise.resolve(),
      present: new Map(),
      lostTimers: new Map(),
    };
    this.counts.set(countId, live);
    if (this.shared) {
      await this.enqueue(live, () => this.locked(live, () => [created]));
      return live;
    }
    await (await this.enqueue(live, async () => ({ done: this.submit(live, [created]) }))).done;
    return live;
  }

  /** The server's check of the count's hash chain from the database, with the last hash. */
  async verify(teamId: number, countId: number) {
    await this.get(teamId, countId, { fresh: false });
    const verdict = await this.deps.log.verify(countId);
    const [last] = (await this.deps.log.read(countId, { sinceSeq: Math.max(0, (verdict.ok ? verdict.count : 0) - 1) })).slice(-1);
    return { ...verdict, lastHash: verdict.ok ? (last?.hash ?? null) : null };
  }

  /** The events after `sinceSeq`, read from the log (which holds the hashes). */
  async eventsSince(teamId: number, countId: number, sinceSeq = 0): Promise<CountEventDto[]> {
    await this.get(teamId, countId, { fresh: false });
    return (await this.deps.log.read(countId, { sinceSeq })).map(eventDto);
  }

  /**
   * At start-up: every count that was counting when the server stopped is brought up to now and put on hold.
   * The clock never runs on by itself after a restart; the conductor resumes once the stations have been checked.
   */
  async recover(): Promise<number[]> {
    const rows = await Count.findAll({ attributes: ['id', 'status'] });
    const held: number[] = [];
    for (const row of rows) {
      if (row.status === 'scrubbed' || row.status === 'complete') continue;
      const c = await this.load(row.id);
      if (!c) continue;
      if (this.shared) {
        const hold = await this.enqueue(c, () => this.locked(c, (state) => restartHoldDrafts(state)));
        if (hold.length) held.push(c.id);
        continue;
      }
      const done = await this.enqueue(c, async () => {
        void this.catchUp(c).catch(() => {});
        const hold = restartHoldDrafts(c.projected);
        if (hold.length) held.push(c.id);
        return this.submit(c, hold);
      });
      await done;
    }
    return held;
  }

  // ---------------------------------------------------------------- presence

  /** A socket of someone who mans stations of this count is here: the stations show as connected. */
  async connect(c: LiveCount, socketId: string, userId: number): Promise<void> {
    const stations = mannedStations(c.state, userId);
    if (!stations.length) return;
    if (this.shared) {
      await this.enqueue(c, async () => {
        if (this.counts.get(c.id) !== c || hasEnded(c.state)) return;
        for (const station of stations) {
          const set = c.present.get(station) ?? new Set<string>();
          set.add(socketId);
          c.present.set(station, set);
          const lost = c.lostTimers.get(station);
          if (lost) clearTimeout(lost);
          c.lostTimers.delete(station);
        }
        await this.locked(c, (state) =>
          hasEnded(state)
            ? []
            : stations
                .filter((station) => state.stations[station]?.presence !== 'connected')
                .map((station) => ({ type: 'station:connected', payload: { station }, actor: null, station }) as EventDraft),
        );
      });
      return;
    }
    const done = await this.enqueue(c, async (): Promise<unknown> => {
      if (this.counts.get(c.id) !== c) {
        // Dropped after a failed commit while this waited: mark the station on the count as read back.
        const fresh = await this.load(c.id);
        return fresh ? this.connect(fresh, socketId, userId) : undefined;
      }
      const drafts: EventDraft[] = [];
      for (const station of stations) {
        // A count that has ended keeps its log as it closed: presence is no longer part of it.
        if (hasEnded(c.projected)) break;
        const set = c.present.get(station) ?? new Set<string>();
        set.add(socketId);
        c.present.set(station, set);
        const lost = c.lostTimers.get(station);
        if (lost) {
          clearTimeout(lost);
          c.lostTimers.delete(station);
        }
        if (c.projected.stations[station]?.presence !== 'connected') {
          drafts.push({ type: 'station:connected', payload: { station }, actor: null, station } as EventDraft);
        }
      }
      return this.submit(c, drafts);
    });
    await done;
  }

  /** A socket left: a station with no connection left for STATION_GRACE_MS shows as lost. */
  disconnect(countId: number, socketId: string): void {
    const c = this.counts.get(countId);
    if (!c) return;
    for (const [station, set] of c.present) {
      if (!set.delete(socketId) || set.size > 0) continue;
      this.armLost(c, station);
    }
  }

  /** The station shows as lost if no connection of it is back within STATION_GRACE_MS. */
  private armLost(c: LiveCount, station: string): void {
    if (c.lostTimers.has(station) || this.closed || hasEnded(c.projected)) return;
    const timer = setTimeout(() => {
      c.lostTimers.delete(station);
      if ((c.present.get(station)?.size ?? 0) > 0 || this.counts.get(c.id) !== c) return;
      if (this.shared) {
        void this.enqueue(c, async () => {
          // The station's socket may be on another process: only the room across processes can tell.
          if (await this.deps.stationPresentElsewhere?.(c.id, station, c.state)) return;
          await this.locked(c, (state) =>
            (c.present.get(station)?.size ?? 0) > 0 || state.stations[station]?.presence !== 'connected' || hasEnded(state)
              ? []
              : [{ type: 'station:lost', payload: { station }, actor: null, station } as EventDraft],
          );
        }).catch((error) => this.deps.logError?.(`count ${c.id}: presence failed`, error));
        return;
      }
      void this.enqueue(c, async () => {
        if ((c.present.get(station)?.size ?? 0) > 0 || c.projected.stations[station]?.presence !== 'connected' || hasEnded(c.projected)) return;
        await this.submit(c, [{ type: 'station:lost', payload: { station }, actor: null, station } as EventDraft]);
      }).catch((error) => this.deps.logError?.(`count ${c.id}: presence failed`, error));
    }, STATION_GRACE_MS);
    timer.unref?.();
    c.lostTimers.set(station, timer);
  }

  /** Stops every timer; nothing is appended after this. */
  close(): void {
    this.closed = true;
    for (const c of this.counts.values()) {
      // What was committed and held back goes out before the sockets close.
      this.flush(c);
      if (c.timer) clearTimeout(c.timer);
      for (const t of c.lostTimers.values()) clearTimeout(t);
      c.lostTimers.clear();
    }
  }

  /** Waits for every queued append (for a clean shutdown and for tests). */
  async settle(): Promise<void> {
    await Promise.all([...this.counts.values()].map(async (c) => {
      await c.chain;
      await c.tail;
    }));
  }
}

/** The stations this person mans in this count's crew. */
export function mannedStations(state: CountState, userId: number): string[] {
  return (state.plan?.crew ?? []).filter((s) => s.userIds.includes(userId)).map((s) => s.station);
}

function refusalCode(status: number): string {
  return status === 403 ? 'forbidden' : status === 409 ? 'count_conflict' : 'command_refused';
}
