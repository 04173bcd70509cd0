/**
 * A fake socket for the count screens: the same on/off/emit-with-ack surface the page uses, answering
 * count:join from a list of events and clock:sync with the client's own time, so a test drives the page by
 * pushing count:events facts and by dropping and restoring the connection.
 */
import type { CountEventDto } from '../../src/contract/count';
import type { CountEventPayloads, CountEventType } from '../../src/domain/count/events';
import { replay } from '../../src/domain/count/reduce';
import type { HoldfireSocket } from '../../src/lib/socket';
import { CREATED, kestrelPlan } from '../domain/count-fixture';

type Fn = (...args: unknown[]) => void;

export interface Emitted {
  event: string;
  payload: Record<string, unknown>;
}

export class FakeSocket {
  connected = true;
  events: CountEventDto[];
  emitted: Emitted[] = [];
  /** When set, count:command is answered with the events it returns (or a refusal); otherwise never answered. */
  answerCommand: ((command: Record<string, unknown>) => { data: { events: CountEventDto[] } } | { error: string }) | null = null;
  /** How far the server's clock is ahead of this device's: clock:sync answers with the device time plus this. */
  serverAheadMs = 0;
  private handlers = new Map<string, Set<Fn>>();

  constructor(events: CountEventDto[]) {
    this.events = events;
  }

  on(event: string, fn: Fn) {
    if (!this.handlers.has(event)) this.handlers.set(event, new Set());
    this.handlers.get(event)!.add(fn);
    return this;
  }

  off(event: string, fn: Fn) {
    this.handlers.get(event)?.delete(fn);
    return this;
  }

  emit(event: string, payload: Record<string, unknown>, ack?: (reply: unknown) => void) {
    this.emitted.push({ event, payload });
    if (!ack) return this;
    if (event === 'clock:sync') ack({ data: { clientSentAt: payload.clientSentAt, serverAt: (payload.clientSentAt as number) + this.serverAheadMs } });
    if (event === 'count:join') {
      const since = payload.sinceSeq as number;
      ack({ data: { events: this.events.filter((e) => e.seq > since), state: replay(this.events) } });
    }
    if (event === 'count:command' && this.answerCommand) ack(this.answerCommand(payload.command as Record<string, unknown>));
    return this;
  }

  connect() {
    return this;
  }

  disconnect() {
    return this;
  }

  /** A fact from the server: stored (so a re-join hands it out again) and pushed to the page. */
  push(e: CountEventDto) {
    if (!this.events.some((x) => x.seq === e.seq)) this.events.push(e);
    this.fire('count:events', [e]);
  }

  drop() {
    this.connected = false;
    this.fire('disconnect', 'transport close');
  }

  restore() {
    this.connected = true;
    this.fire('connect');
  }

  commands() {
    return this.emitted.filter((e) => e.event === 'count:command').map((e) => e.payload.command as Record<string, unknown>);
  }

  asSocket(): HoldfireSocket {
    return this as unknown as HoldfireSocket;
  }

  private fire(event: string, ...args: unknown[]) {
    for (const fn of [...(this.handlers.get(event) ?? [])]) fn(...args);
  }
}

/** A stored event of count 5, at `CREATED + seconds`. */
export function ev<T extends CountEventType>(
  seq: number,
  type: T,
  payload: CountEventPayloads[T],
  who: { seconds?: number; actor?: { userId: number; name: string } | null; station?: string | null } = {},
): CountEventDto {
  return {
    seq,
    type,
    payload,
    at: CREATED + (who.seconds ?? seq) * 1000,
    actor: who.actor ?? null,
    station: who.station ?? null,
    countId: 5,
    prevHash: 'x',
    hash: 'y',
  } as CountEventDto;
}

export const TC = { userId: 1, name: 'Avery Quill' };
export const PROP = { userId: 2, name: 'Rowan Fenn' };

/** Created (the Kestrel-2 plan: user 1 mans TC, user 2 mans PROP), started, and PROP's first step due. */
export function startedCount(): CountEventDto[] {
  return [
    ev(1, 'count:created', kestrelPlan(), { actor: TC }),
    ev(2, 'count:started', {}, { actor: TC }),
    ev(3, 'step:reached', { stepKey: 's1' }),
    ev(4, 'step:reached', { stepKey: 's2' }),
  ];
}

export function countDetail(events: CountEventDto[]) {
  return {
    id: 5,
    name: 'Kestrel-2 hot fire 3',
    procedureId: 7,
    procedureName: 'Kestrel-2 hot fire',
    revisionNumber: 3,
    status: 'counting',
    createdBy: TC,
    createdAt: new Date(CREATED).toISOString(),
    startedAt: new Date(CREATED + 2000).toISOString(),
    t0At: null,
    closedAt: null,
    windowEnd: null,
    state: replay(events),
  };
}
