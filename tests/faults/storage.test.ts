import path from 'node:path';
import type { AddressInfo } from 'node:net';
import type { Socket } from 'socket.io-client';
import sqlite3 from 'sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CountEventDto } from '../../src/contract/count';
import type { CountEvent } from '../../src/domain/count/events';
import { replay } from '../../src/domain/count/reduce';
import type { CountState } from '../../src/domain/count/state';
import { CountEvent as CountEventRow } from '../../server/models';
import { DEMO, signInWithCookie } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { connected, demoRevision, openSocket } from '../helpers/counts';

/**
 * The count's log meets a database it cannot write: locked by another writer for longer than the busy timeout
 * and its retries, or full (SQLite's page limit on the log's connection stands in for a full disk: the same
 * SQLITE_FULL a full disk gives). Commands are refused in words (503 over HTTP), nothing refused is stored,
 * nothing acknowledged is lost, and the count takes commands again once the fault clears.
 */
let t: TestApp;
let url: string;
let conductorHttp: TestClient;
let propHttp: TestClient;
const sockets: Socket[] = [];

beforeAll(async () => {
  // A short busy timeout so a locked database refuses within about two seconds (100 ms, then the log's retries).
  t = await startTestApp({ env: { HOLDFIRE_DB_BUSY_TIMEOUT_MS: '100' } });
  await new Promise<void>((resolve) => t.holdfire.httpServer.listen(0, '127.0.0.1', resolve));
  url = `http://127.0.0.1:${(t.holdfire.httpServer.address() as AddressInfo).port}`;
  conductorHttp = await t.client(DEMO.conductor);
  propHttp = await t.client(DEMO.propellants);
});
afterAll(async () => {
  for (const s of sockets.splice(0)) s.disconnect();
  await t.stop();
});

type Ev = CountEventDto & { payload: Record<string, string> };
type Reply = { data?: { events: Ev[] }; error?: string };

function run(db: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((resolve, reject) => db.run(sql, (error: Error | null) => (error ? reject(error) : resolve())));
}
function get<R>(db: sqlite3.Database, sql: string): Promise<R> {
  return new Promise((resolve, reject) => db.get(sql, (error: Error | null, row: R) => (error ? reject(error) : resolve(row))));
}

/** A started count with the conductor's and PROP's sockets; every event acknowledged or broadcast is kept. */
async function startedCount(name: string) {
  const rev = await demoRevision(conductorHttp);
  const id = (await conductorHttp.post('/api/counts', { ...rev, name }).expect(201)).body.id as number;
  const seen = new Map<number, string>();
  const socketOf = async (email: string) => {
    const s = openSocket(url, (await signInWithCookie(t, email)).cookie);
    sockets.push(s);
    await connected(s);
    s.on('count:events', (list: Ev[]) => list.forEach((e) => seen.set(e.seq, e.hash)));
    expect((await s.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: 0 })).data).toBeTruthy();
    return s;
  };
  const tc = await socketOf(DEMO.conductor);
  const prop = await socketOf(DEMO.propellants);
  const send = async (s: Socket, command: object): Promise<Reply> => {
    const reply: Reply = await s.timeout(20_000).emitWithAck('count:command', { countId: id, command: command as never });
    for (const e of reply.data?.events ?? []) seen.set(e.seq, e.hash);
    return reply;
  };
  expect((await send(tc, { type: 'count:start' })).data).toBeTruthy();
  return { id, tc, prop, send, seen };
}

/** Nothing acknowledged is missing, the chain verifies, and the served state is the replay of the log. */
async function intact(id: number, seen: Map<number, string>) {
  const events = (await conductorHttp.get(`/api/counts/${id}/events`).expect(200)).body as CountEventDto[];
  const stored = new Map(events.map((e) => [e.seq, e.hash]));
  expect([...seen].filter(([seq, hash]) => stored.get(seq) !== hash)).toEqual([]);
  expect((await conductorHttp.get(`/api/counts/${id}/verify`).expect(200)).body).toMatchObject({ ok: true, count: events.length });
  const served = (await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body as CountState;
  const replayed = replay(events as unknown as CountEvent[]);
  expect({ lastSeq: served.lastSeq, status: served.status, hold: served.hold, holds: served.holds }).toEqual({
    lastSeq: replayed.lastSeq,
    status: replayed.status,
    hold: replayed.hold,
    holds: replayed.holds,
  });
  return events;
}

const storedFor = async (countId: number, commandId: string) => CountEventRow.count({ where: { countId, commandId } });

/** Tries `attempt` until it gives data (the count is read back from its log about a second after a failed commit). */
async function recovered(attempt: () => Promise<Reply>, ms = 10_000): Promise<Reply> {
  const until = Date.now() + ms;
  for (;;) {
    const reply = await attempt();
    if (reply.data || Date.now() > until) return reply;
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('the count log on a database it cannot write', () => {
  it('locked by another writer: refused in words (503 busy over HTTP), nothing stored, and it works once the lock is gone', async () => {
    const { id, prop, send, seen } = await startedCount('Locked database run');
    const other = await new Promise<sqlite3.Database>((resolve, reject) => {
      const db: sqlite3.Database = new sqlite3.Database(path.join(t.dataDir, 'holdfire.sqlite'), (error) => (error ? reject(error) : resolve(db)));
    });
    const hold = { type: 'hold:call', category: 'hardware', reason: 'Fuel valve position indicator flickers' };
    let overSocket: Reply;
    let overHttp;
    await run(other, 'BEGIN IMMEDIATE');
    try {
      overSocket = await send(prop, { ...hold, commandId: 'locked-socket' });
      overHttp = await propHttp.post(`/api/counts/${id}/commands`, { ...hold, commandId: 'locked-http' });
      expect(await storedFor(id, 'locked-socket')).toBe(0);
      expect(await storedFor(id, 'locked-http')).toBe(0);
    } finally {
      await run(other, 'ROLLBACK');
      await new Promise<void>((resolve) => other.close(() => resolve()));
    }
    expect(overSocket.data).toBeUndefined();
    expect(overSocket.error).toBe('The server is busy and saved nothing. Try again in a moment.');
    expect(overHttp.status).toBe(503);
    expect(overHttp.headers['retry-after']).toBe('2');
    expect(overHttp.body).toEqual({ code: 'busy', error: 'The server is busy and saved nothing. Try again in a moment.' });

    // The lock is gone: the same command, sent again with its id, is stored once.
    const retried = await recovered(() => send(prop, { ...hold, commandId: 'locked-socket' }));
    expect(retried.data!.events.map((e) => e.type)).toEqual(['hold:called']);
    expect(await storedFor(id, 'locked-socket')).toBe(1);
    const events = await intact(id, seen);
    expect(events.filter((e) => e.type === 'hold:called')).toHaveLength(1);
  });

  it('full: refused in words (503 storage_full over HTTP), nothing refused is stored, nothing acknowledged lost, and it goes on once there is room', async () => {
    const { id, tc, prop, send, seen } = await startedCount('Full disk run');
    // The log writes on its own connection (server/counts/log-writer.ts); the page limit is set there.
    const writer = (t.holdfire.eventLog as unknown as { writer: { connection(): Promise<{ db: sqlite3.Database }> } }).writer;
    const { db } = await writer.connection();
    const { page_count: pages } = await get<{ page_count: number }>(db, 'PRAGMA page_count');
    await get(db, `PRAGMA max_page_count = ${pages}`);

    // PROP calls and clears holds until the file has no room left for the next event.
    const refusedIds: string[] = [];
    let refusal: Reply | null = null;
    let openHold: string | null = null;
    for (let i = 0; i < 300 && !refusal; i++) {
      const commandId = `full-${i}`;
      const reply: Reply = openHold
        ? await send(prop, { type: 'hold:clear', holdId: openHold, commandId })
        : await send(prop, { type: 'hold:call', category: 'data', reason: `Recorder ${i} shows a gap`, commandId });
      if (reply.error) {
        refusal = reply;
        refusedIds.push(commandId);
      } else openHold = openHold ? null : reply.data!.events[0]!.payload.holdId!;
    }
    expect(refusal?.error).toBe('The server’s disk is full and it saved nothing. Tell the administrator; try again once space is freed.');
    const overHttp = await recovered(async () => {
      const res = await conductorHttp.post(`/api/counts/${id}/commands`, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600, commandId: 'full-http' });
      return res.status === 503 ? { error: res.body.error, data: undefined } : { data: res.body };
    }, 0);
    expect(overHttp.error).toMatch(/disk is full and it saved nothing/);
    refusedIds.push('full-http');
    for (const commandId of refusedIds) expect(await storedFor(id, commandId), commandId).toBe(0);
    await intact(id, seen);

    // Room again: the refused commands go through, each once, and the count carries on.
    await get(db, 'PRAGMA max_page_count = 1073741823');
    const last = refusedIds[0]!;
    const again = await recovered(() =>
      send(prop, openHold ? { type: 'hold:clear', holdId: openHold, commandId: last } : { type: 'hold:call', category: 'data', reason: 'Recorder gap again', commandId: last }),
    );
    expect(again.data, again.error).toBeTruthy();
    expect(await storedFor(id, last)).toBe(again.data!.events.length);
    if (!openHold) {
      const holdId = again.data!.events[0]!.payload.holdId!;
      expect((await send(prop, { type: 'hold:clear', holdId })).data).toBeTruthy();
    }
    expect((await send(tc, { type: 'count:resume' })).data!.events.map((e) => e.type)).toEqual(['count:resumed']);
    const poll = await conductorHttp.post(`/api/counts/${id}/commands`, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600, commandId: 'full-http' }).expect(200);
    expect(poll.body.events.map((e: Ev) => e.type)).toEqual(['poll:opened']);
    const events = await intact(id, seen);
    expect(events.at(-1)!.type).toBe('poll:opened');
  });
});
