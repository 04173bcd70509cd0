/**
 * The live counts this server is the authority for. Every change goes one way: the clock's due events are
 * appended first, then `decide` turns a person's command into facts, the event log commits them, and only then
 * are they folded into the state here and broadcast to the count's room. One promise chain per count keeps
 * decisions in order, so two commands never decide on the same stale state.
 */
import type { CountCommand } from '../../src/domain/count/commands';
import { decide } from '../../src/domain/count/commands';
import { dueEvents, nextDueAt, restartHoldDrafts } from '../../src/domain/count/due';
import type { CountEvent, EventDraft } from '../../src/domain/count/events';
import { replay } from '../../src/domain/count/reduce';
import { initialCountState, type CountState } from '../../src/domain/count/state';
import type { CountEventDto } from '../../src/contract/count';
import type { Role } from '../../src/domain/people/roles';
import { HttpError, notFound } from '../http/errors';
import { Count } from '../models';
import type { EventLog, StoredEvent } from './log';

/** How long a station's last connection may be gone before the count shows it as lost. */
export const STATION_GRACE_MS = 5000;

export interface CountActor {
  id: number;
  teamId: number;
  name: string;
  roles: readonly Role[];
}

interface LiveCount {
  id: number;
  teamId: number;
  state: CountState;
  /** commandId -> the events that command appended, so a retry gets the first answer. */
  commands: Map<string, CountEventDto[]>;
  timer: NodeJS.Timeout | null;
  /** The tail of this count's work queue. */
  chain: Promise<unknown>;
  /** Open sockets per station code (socket ids), for presence. */
  present: Map<string, Set<string>>;
  lostTimers: Map<string, NodeJS.Timeout>;
}

export const countRoom = (countId: number) => `count:${countId}`;

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
  /** Sends one stored event to everyone watching the count. */
  broadcast: (countId: number, event: CountEventDto) => void;
  now?: () => number;
  /** Called with every batch of stored events after it is folded in (mail on a scrub, the list's status). */
  onEvents?: (count: { id: number; teamId: number; state: CountState }, events: CountEventDto[]) => void;
  logError?: (message: string, error?: unknown) => void;
}

export class CountService {
  private readonly counts = new Map<number, LiveCount>();
  private readonly loading = new Map<number, Promise<LiveCount>>();
  private readonly now: () => number;
  private closed = false;

  constructor(private readonly deps: CountServiceDeps) {
    this.now = deps.now ?? Date.now;
  }

  /** The count as this server holds it, loaded from its log on first use. 404 for another team's or no count. */
  async get(teamId: number, countId: number): Promise<LiveCount> {
    const c = await this.load(countId);
    if (!c || c.teamId !== teamId) throw notFound('There is no such count.');
    return c;
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
        const live: LiveCount = {
          id: countId,
          teamId: row.teamId as number,
          state: replay(events),
          commands,
          timer: null,
          chain: Promise.resolve(),
          present: new Map(),
          lostTimers: new Map(),
        };
        this.counts.set(countId, live);
        this.schedule(live);
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

  /** Appends drafts, folds the stored events in, broadcasts them, and re-arms the clock's timer. */
  private async append(c: LiveCount, drafts: EventDraft[], commandId?: string): Promise<CountEventDto[]> {
    if (drafts.length === 0) return [];
    const stored = await this.deps.log.append(
      c.id,
      drafts.map((d) => ({ type: d.type, payload: d.payload, actor: d.actor, station: d.station, at: d.at, commandId: commandId ?? null })),
    );
    const events = stored.map(eventDto);
    c.state = replay(events as unknown as CountEvent[], c.state);
    if (commandId) c.commands.set(commandId, events);
    for (const e of events) this.deps.broadcast(c.id, e);
    this.schedule(c);
    try {
      this.deps.onEvents?.(c, events);
    } catch (error) {
      this.deps.logError?.('count event listener failed', error);
    }
    return events;
  }

  /** The clock's own events up to now (steps reached, built-in holds, poll time-outs, T-0). */
  private async catchUp(c: LiveCount): Promise<CountEventDto[]> {
    return this.append(c, dueEvents(c.state, this.now()));
  }

  private schedule(c: LiveCount): void {
    if (c.timer) clearTimeout(c.timer);
    c.timer = null;
    if (this.closed) return;
    const at = nextDueAt(c.state);
    if (at === null) return;
    // setTimeout holds at most about 24.8 days; a count's next moment is never that far, but stay safe.
    const delay = Math.min(Math.max(0, at - this.now()), 2 ** 31 - 1);
    c.timer = setTimeout(() => {
      c.timer = null;
      void this.enqueue(c, () => this.catchUp(c)).catch((error) => this.deps.logError?.(`count ${c.id}: clock events failed`, error));
    }, delay);
    c.timer.unref?.();
  }

  /**
   * One command from one person: the same path for a socket event and for POST /api/counts/:id/commands.
   * A retried commandId answers the events of its first run and appends nothing.
   */
  async command(teamId: number, countId: number, actor: CountActor, command: CountCommand & { commandId?: string }): Promise<CountEventDto[]> {
    const c = await this.get(teamId, countId);
    return this.enqueue(c, async () => {
      const { commandId, ...cmd } = command;
      if (commandId) {
        const before = c.commands.get(commandId);
        if (before) return before;
      }
      await this.catchUp(c);
      const manned = mannedStations(c.state, actor.id);
      const decision = decide(c.state, cmd as CountCommand, {
        now: this.now(),
        actor: { userId: actor.id, name: actor.name, roles: actor.roles },
        mannedStations: manned,
      });
      if (!decision.ok) throw new HttpError(decision.status, refusalCode(decision.status), decision.error);
      return this.append(c, decision.events, commandId);
    });
  }

  /** Creates the count's first event; the row must already exist. */
  async start(countId: number, created: EventDraft): Promise<LiveCount> {
    const row = await Count.findByPk(countId);
    if (!row) throw notFound('There is no such count.');
    const live: LiveCount = {
      id: countId,
      teamId: row.teamId as number,
      state: initialCountState(),
      commands: new Map(),
      timer: null,
      chain: Promise.resolve(),
      present: new Map(),
      lostTimers: new Map(),
    };
    this.counts.set(countId, live);
    await this.enqueue(live, () => this.append(live, [created]));
    return live;
  }

  /** The events after `sinceSeq`, read from the log (which holds the hashes). */
  async eventsSince(teamId: number, countId: number, sinceSeq = 0): Promise<CountEventDto[]> {
    await this.get(teamId, countId);
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
      await this.enqueue(c, async () => {
        await this.catchUp(c);
        const hold = restartHoldDrafts(c.state);
        if (hold.length) {
          await this.append(c, hold);
          held.push(c.id);
        }
      });
    }
    return held;
  }

  // ---------------------------------------------------------------- presence

  /** A socket of someone who mans stations of this count is here: the stations show as connected. */
  async connect(c: LiveCount, socketId: string, userId: number): Promise<void> {
    const stations = mannedStations(c.state, userId);
    if (!stations.length) return;
    await this.enqueue(c, async () => {
      const drafts: EventDraft[] = [];
      for (const station of stations) {
        const set = c.present.get(station) ?? new Set<string>();
        set.add(socketId);
        c.present.set(station, set);
        const lost = c.lostTimers.get(station);
        if (lost) {
          clearTimeout(lost);
          c.lostTimers.delete(station);
        }
        if (c.state.stations[station]?.presence !== 'connected') {
          drafts.push({ type: 'station:connected', payload: { station }, actor: null, station } as EventDraft);
        }
      }
      await this.append(c, drafts);
    });
  }

  /** A socket left: a station with no connection left for STATION_GRACE_MS shows as lost. */
  disconnect(countId: number, socketId: string): void {
    const c = this.counts.get(countId);
    if (!c) return;
    for (const [station, set] of c.present) {
      if (!set.delete(socketId) || set.size > 0 || c.lostTimers.has(station) || this.closed) continue;
      const timer = setTimeout(() => {
        c.lostTimers.delete(station);
        if ((c.present.get(station)?.size ?? 0) > 0) return;
        void this.enqueue(c, async () => {
          if ((c.present.get(station)?.size ?? 0) > 0 || c.state.stations[station]?.presence !== 'connected') return;
          await this.append(c, [{ type: 'station:lost', payload: { station }, actor: null, station } as EventDraft]);
        }).catch((error) => this.deps.logError?.(`count ${c.id}: presence failed`, error));
      }, STATION_GRACE_MS);
      timer.unref?.();
      c.lostTimers.set(station, timer);
    }
  }

  /** Stops every timer; nothing is appended after this. */
  close(): void {
    this.closed = true;
    for (const c of this.counts.values()) {
      if (c.timer) clearTimeout(c.timer);
      for (const t of c.lostTimers.values()) clearTimeout(t);
      c.lostTimers.clear();
    }
  }

  /** Waits for every queued append (for a clean shutdown and for tests). */
  async settle(): Promise<void> {
    await Promise.all([...this.counts.values()].map((c) => c.chain));
  }
}

/** The stations this person mans in this count's crew. */
export function mannedStations(state: CountState, userId: number): string[] {
  return (state.plan?.crew ?? []).filter((s) => s.userIds.includes(userId)).map((s) => s.station);
}

function refusalCode(status: number): string {
  return status === 403 ? 'forbidden' : status === 409 ? 'count_conflict' : 'command_refused';
}
