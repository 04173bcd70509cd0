import type { AddressInfo } from 'node:net';
import type { Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, signInWithCookie } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { connected, demoRevision, eventRecorder, openSocket } from '../helpers/counts';
import type { CountEvent } from '../../src/domain/count/events';
import { reduce, replay } from '../../src/domain/count/reduce';
import { tAt, type CountState } from '../../src/domain/count/state';

/**
 * The live count over socket.io with several real clients, each with its own signed-in session: the conductor,
 * two station operators (PROP, PAD) and an auditor. Commands are acknowledged after they are stored, and every
 * client in the count's room receives the same events.
 */
let t: TestApp;
let url: string;
const sockets: Socket[] = [];
let conductorHttp: TestClient;

beforeAll(async () => {
  t = await startTestApp();
  await new Promise<void>((resolve) => t.holdfire.httpServer.listen(0, '127.0.0.1', resolve));
  url = `http://127.0.0.1:${(t.holdfire.httpServer.address() as AddressInfo).port}`;
  conductorHttp = await t.client(DEMO.conductor);
});
afterEach(() => {
  for (const s of sockets.splice(0)) s.disconnect();
});
afterAll(() => t.stop());

async function person(email: string) {
  const { cookie } = await signInWithCookie(t, email);
  const socket = openSocket(url, cookie);
  sockets.push(socket);
  await connected(socket);
  return { socket, events: eventRecorder(socket) };
}

type Reply = { data?: { events: { type: string; payload: Record<string, unknown>; seq: number }[] }; error?: string };
const send = (s: Socket, countId: number, command: object): Promise<Reply> => s.timeout(5000).emitWithAck('count:command', { countId, command: command as never });

async function startedCount() {
  const rev = await demoRevision(conductorHttp);
  const res = await conductorHttp.post('/api/counts', { ...rev, name: `Socket run ${Date.now()}` }).expect(201);
  const id = res.body.id as number;
  const tc = await person(DEMO.conductor);
  const prop = await person(DEMO.propellants);
  const pad = await person(DEMO.pad);
  for (const p of [tc, prop, pad]) {
    const joined = await p.socket.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: 0 });
    expect(joined.data.events[0].type).toBe('count:created');
  }
  // Joining marks the stations each person mans as connected.
  await tc.events.waitFor((e) => e.type === 'station:connected' && e.payload.station === 'PAD');
  const started = await send(tc.socket, id, { type: 'count:start' });
  expect(started.data?.events.map((e) => e.type)).toContain('count:started');
  return { id, tc, prop, pad };
}

describe('polls over the socket', () => {
  it('passes when every asked station answers GO; every client sees the same close', async () => {
    const { id, tc, prop, pad } = await startedCount();
    const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], question: 'Go for loading?', timeoutSeconds: 120 });
    const pollId = opened.data!.events[0]!.payload.pollId as string;
    await prop.events.waitFor((e) => e.type === 'poll:opened' && e.payload.pollId === pollId);
    await pad.events.waitFor((e) => e.type === 'poll:opened');

    // What reaches PROP's socket, in the order it arrives: the room's events, and the answer to its command.
    const arrivals: string[] = [];
    prop.socket.on('count:events', (list: { seq: number }[]) => arrivals.push(...list.map((e) => `event ${e.seq}`)));
    const a = await new Promise<Reply>((resolve) =>
      prop.socket.emit('count:command', { countId: id, command: { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' } }, (reply: Reply) => {
        arrivals.push('answer');
        resolve(reply);
      }),
    );
    expect(a.data?.events.map((e) => e.type)).toEqual(['poll:answered']);
    // The answer comes after the room's broadcast of its events: the socket has folded them when it is answered.
    expect(arrivals).toEqual([`event ${a.data!.events[0]!.seq}`, 'answer']);
    const b = await send(pad.socket, id, { type: 'poll:answer', pollId, station: 'PAD', answer: 'go' });
    expect(b.data?.events.map((e) => e.type)).toEqual(['poll:answered', 'poll:closed']);
    for (const p of [tc, prop, pad]) {
      const closed = await p.events.waitFor((e) => e.type === 'poll:closed');
      expect(closed.payload).toMatchObject({ pollId, result: 'go', nogo: [], missing: [] });
    }
    // Same seqs, same order, for everyone.
    const seqs = (p: typeof tc) => p.events.events.map((e) => e.seq);
    expect(seqs(prop).slice(-3)).toEqual(seqs(tc).slice(-3));
    const state = (await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body;
    expect(state.status).toBe('counting');
  });

  it('a NO-GO fails the poll and holds the count with the station and its reason', async () => {
    const { id, tc, prop, pad } = await startedCount();
    const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 120 });
    const pollId = opened.data!.events[0]!.payload.pollId as string;
    await send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PROP', answer: 'nogo', reason: 'Vent valve slow to close' });
    await send(pad.socket, id, { type: 'poll:answer', pollId, station: 'PAD', answer: 'go' });
    const hold = await tc.events.waitFor((e) => e.type === 'hold:called');
    expect(hold.payload).toMatchObject({ source: 'poll' });
    expect(hold.payload.reason).toContain('PROP');
    expect(hold.payload.reason).toContain('Vent valve slow to close');
    const state = (await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body;
    expect(state.status).toBe('holding');
    expect(state.clock.running).toBe(false);
  });

  it('a station that does not answer fails the poll when it times out', async () => {
    const { id, tc, prop } = await startedCount();
    const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 5 });
    const pollId = opened.data!.events[0]!.payload.pollId as string;
    await send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' });
    const closed = await tc.events.waitFor((e) => e.type === 'poll:closed', 15_000);
    expect(closed.payload).toMatchObject({ pollId, result: 'nogo', missing: ['PAD'] });
    const hold = await tc.events.waitFor((e) => e.type === 'hold:called');
    expect(hold.payload.reason).toContain('PAD');
  });

  it('an operator cannot answer for another station; an auditor cannot call a hold', async () => {
    const { id, tc, prop } = await startedCount();
    const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 120 });
    const pollId = opened.data!.events[0]!.payload.pollId as string;
    const wrong = await send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PAD', answer: 'go' });
    expect(wrong.error).toMatch(/belongs to PAD/);

    const auditor = await person(DEMO.auditor);
    const joined = await auditor.socket.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: 0 });
    expect(joined.data.state.status).toBe('counting');
    const refused = await send(auditor.socket, id, { type: 'hold:call', category: 'other', reason: 'Looks odd' });
    expect(refused.error).toMatch(/Only the crew can call a hold/);
    const bad = await send(auditor.socket, id, { type: 'hold:call', category: 'nonsense' });
    expect(bad.error).toBe('That command is not valid.');
    const state = (await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body;
    expect(state.hold).toBeNull();
  });
});

describe('joining again', () => {
  it('a rejoin is answered with the events after its seq and no state; a first join also gets the whole state', async () => {
    const { id, tc, prop } = await startedCount();
    for (let k = 0; k < 3; k += 1) {
      const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP'], timeoutSeconds: 120 });
      const pollId = opened.data!.events[0]!.payload.pollId as string;
      const answered = await send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' });
      expect(answered.data?.events.map((e) => e.type)).toEqual(['poll:answered', 'poll:closed']);
    }
    // An auditor watches: joining appends no presence event.
    const auditor = await person(DEMO.auditor);
    const first = await auditor.socket.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: 0 });
    const last = first.data.state.lastSeq as number;
    expect(first.data.events.at(-1).seq).toBe(last);
    // The whole state carries every closed poll with its answers: what a rejoin is spared.
    expect(first.data.state.polls).toHaveLength(3);

    const rejoin = await auditor.socket.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: last - 2 });
    expect(rejoin.data.events.map((e: { seq: number }) => e.seq)).toEqual([last - 1, last]);
    expect(rejoin.data.state).toBeNull();
    const upToDate = await auditor.socket.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: last });
    expect(upToDate.data).toEqual({ events: [], state: null });
  });
});

describe('holds and presence', () => {
  it('a station’s hold stops the clock for everyone; the clear and the resume reach everyone', async () => {
    const { id, tc, prop, pad } = await startedCount();
    const called = await send(prop.socket, id, { type: 'hold:call', category: 'hardware', reason: 'Igniter continuity reads open' });
    const holdId = called.data!.events[0]!.payload.holdId as string;
    for (const p of [tc, pad]) {
      const e = await p.events.waitFor((x) => x.type === 'hold:called');
      expect(e.payload).toMatchObject({ holdId, reason: 'Igniter continuity reads open', calledByStation: 'PROP' });
    }
    expect((await send(tc.socket, id, { type: 'count:resume' })).error).toMatch(/Clear every hold first/);
    await send(prop.socket, id, { type: 'hold:clear', holdId });
    await send(tc.socket, id, { type: 'count:resume' });
    await pad.events.waitFor((e) => e.type === 'count:resumed');
  });

  it('a station whose connection is gone for 5 s shows as lost, and a rejoin catches up from its last seq', async () => {
    const { id, tc, prop } = await startedCount();
    const lastSeq = Math.max(...prop.events.events.map((e) => e.seq));
    prop.socket.disconnect();
    const lost = await tc.events.waitFor((e) => e.type === 'station:lost' && e.payload.station === 'PROP', 15_000);
    expect(lost.station).toBe('PROP');

    const back = await person(DEMO.propellants);
    const joined = await back.socket.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: lastSeq });
    const missed = joined.data.events as { seq: number; type: string }[];
    expect(missed[0]!.seq).toBe(lastSeq + 1);
    expect(missed.map((e) => e.type)).toContain('station:lost');
    await tc.events.waitFor((e) => e.type === 'station:connected' && e.payload.station === 'PROP' && e.seq > lost.seq);
  });

  it('a count that does not exist cannot be joined', async () => {
    const { id } = await startedCount();
    const joined = await (await person(DEMO.data)).socket.timeout(5000).emitWithAck('count:join', { countId: id + 1000, sinceSeq: 0 });
    expect(joined.error).toBe('There is no such count.');
  });
});

describe('replay against the live count', () => {
  it('the state the server replays at each instant equals what an auditor folded from the broadcasts then', async () => {
    const { id, tc, prop, pad } = await startedCount();
    const auditor = await person(DEMO.auditor);
    const joined = await auditor.socket.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: 0 });
    // The auditor folds what it receives with the domain reducer, as the watch view does, and keeps each state.
    let live = replay(joined.data.events as CountEvent[]);
    const seen = new Map<number, { at: number; state: CountState }>();
    for (const e of joined.data.events as CountEvent[]) seen.set(e.seq, { at: e.at, state: replay((joined.data.events as CountEvent[]).filter((x) => x.seq <= e.seq)) });
    auditor.socket.on('count:events', (list: CountEvent[]) => {
      for (const e of list) {
        live = reduce(live, e);
        seen.set(e.seq, { at: e.at, state: live });
      }
    });

    const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600 });
    const pollId = opened.data!.events[0]!.payload.pollId;
    await send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' });
    await send(pad.socket, id, { type: 'poll:answer', pollId, station: 'PAD', answer: 'nogo', reason: 'Igniter continuity out of band' });
    const hold = (await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body.hold;
    await send(tc.socket, id, { type: 'hold:clear', holdId: hold.holdId });
    const resumed = await send(tc.socket, id, { type: 'count:resume' });
    const lastSeq = resumed.data!.events.at(-1)!.seq;
    await auditor.events.waitFor((e) => e.seq === lastSeq);

    // At each event's instant (the last event of that instant), the server's replay and the live fold agree.
    const instants = [...new Set([...seen.values()].map((s) => s.at))];
    expect(instants.length).toBeGreaterThan(5);
    for (const at of instants) {
      const lastAtInstant = [...seen.entries()].filter(([, s]) => s.at === at).sort(([a], [b]) => b - a)[0]![1].state;
      const replayed = (await conductorHttp.get(`/api/counts/${id}/state?at=${at}`).expect(200)).body;
      expect({ seq: replayed.lastSeq, status: replayed.status, t: replayed.clock.tSeconds, running: replayed.clock.running, hold: replayed.hold?.reason ?? null, poll: replayed.poll?.pollId ?? null }).toEqual({
        seq: lastAtInstant.lastSeq,
        status: lastAtInstant.status,
        t: tAt(lastAtInstant, at),
        running: lastAtInstant.clock.running,
        hold: lastAtInstant.hold?.reason ?? null,
        poll: lastAtInstant.poll?.pollId ?? null,
      });
    }
    // The hold from PAD's NO-GO is in the replay with its reason.
    expect([...seen.values()].some((s) => s.state.hold?.reason.includes('PAD no-go: Igniter continuity out of band'))).toBe(true);
  });
});
