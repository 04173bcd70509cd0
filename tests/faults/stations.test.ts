import { connect as tcpConnect, createServer as tcpServer, type AddressInfo, type Socket as TcpSocket } from 'node:net';
import type { Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CountEventDto } from '../../src/contract/count';
import type { CountEvent } from '../../src/domain/count/events';
import { reduce, replay } from '../../src/domain/count/reduce';
import { initialCountState, type CountState } from '../../src/domain/count/state';
import { stateDto } from '../../server/routes/counts.routes';
import { CountEvent as CountEventRow } from '../../server/models';
import { DEMO, signInWithCookie } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { connected, demoRevision, eventRecorder, openSocket } from '../helpers/counts';

/**
 * Stations that drop off and come back, and commands that arrive twice or in the wrong order, against the real
 * server over real sockets. The 30 s offline station runs concurrently with the other tests of this file.
 */
let t: TestApp;
let url: string;
let conductorHttp: TestClient;
const sockets: Socket[] = [];
const cookies = new Map<string, string>();

beforeAll(async () => {
  t = await startTestApp();
  await new Promise<void>((resolve) => t.holdfire.httpServer.listen(0, '127.0.0.1', resolve));
  url = `http://127.0.0.1:${(t.holdfire.httpServer.address() as AddressInfo).port}`;
  conductorHttp = await t.client(DEMO.conductor);
  for (const email of [DEMO.conductor, DEMO.propellants, DEMO.pad]) cookies.set(email, (await signInWithCookie(t, email)).cookie);
});
afterAll(async () => {
  for (const s of sockets.splice(0)) s.disconnect();
  await t.stop();
});

async function socketOf(email: string) {
  const socket = openSocket(url, cookies.get(email)!);
  sockets.push(socket);
  await connected(socket);
  return socket;
}

/** An event as the tests read it: the payload as plain fields. */
type Ev = CountEventDto & { payload: Record<string, string> };
type Reply = { data?: { events: Ev[] }; error?: string };
const send = (s: Socket, countId: number, command: object): Promise<Reply> => s.timeout(10_000).emitWithAck('count:command', { countId, command: command as never });
const join = (s: Socket, countId: number, sinceSeq: number): Promise<{ data?: { events: CountEventDto[]; state: CountState }; error?: string }> =>
  s.timeout(10_000).emitWithAck('count:join', { countId, sinceSeq });
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function startedCount(name: string) {
  const rev = await demoRevision(conductorHttp);
  const id = (await conductorHttp.post('/api/counts', { ...rev, name }).expect(201)).body.id as number;
  const tc = await socketOf(DEMO.conductor);
  const pad = await socketOf(DEMO.pad);
  const tcEvents = eventRecorder(tc);
  for (const s of [tc, pad]) expect((await join(s, id, 0)).data).toBeTruthy();
  expect((await send(tc, id, { type: 'count:start' })).data).toBeTruthy();
  return { id, tc, pad, tcEvents };
}

/**
 * A TCP relay between one client and the server that can lose the server's answers: once `loseAnswers()` is
 * called, the next bytes from the client still reach the server, and from then on nothing comes back (a link
 * that dies just after sending). `cut()` then closes the client's side, as the phone finds the link gone.
 */
async function lossyLink(serverUrl: string) {
  const port = Number(new URL(serverUrl).port);
  let armed = false;
  let losing = false;
  const open: TcpSocket[] = [];
  const relay = tcpServer((client) => {
    const upstream = tcpConnect(port, '127.0.0.1');
    open.push(client, upstream);
    client.on('data', (d) => {
      upstream.write(d);
      if (armed) losing = true;
    });
    upstream.on('data', (d) => losing || client.write(d));
    client.on('close', () => upstream.destroy());
    upstream.on('close', () => client.destroy());
    client.on('error', () => {});
    upstream.on('error', () => {});
  });
  await new Promise<void>((resolve) => relay.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${(relay.address() as AddressInfo).port}`,
    loseAnswers: () => (armed = true),
    cut: () => new Promise<void>((resolve) => {
      for (const s of open) s.destroy();
      relay.close(() => resolve());
    }),
  };
}

/** The client's way of keeping a count (as useLiveCount does): fold by seq, skip what it has, note what is odd. */
function station() {
  let state: CountState = initialCountState();
  const folded: number[] = [];
  const twice: number[] = [];
  const gaps: number[] = [];
  return {
    get state() {
      return state;
    },
    folded,
    twice,
    gaps,
    fold(events: readonly CountEventDto[]) {
      for (const e of [...events].sort((a, b) => a.seq - b.seq)) {
        if (e.seq <= state.lastSeq) continue;
        if (e.seq !== state.lastSeq + 1) gaps.push(e.seq);
        state = reduce(state, e as unknown as CountEvent);
        folded.push(e.seq);
      }
    },
    /** Broadcasts received on a socket: a seq seen twice on the wire is recorded, then skipped. */
    listen(socket: Socket) {
      const wire = new Set<number>();
      socket.on('count:events', (list: CountEventDto[]) => {
        for (const e of list) {
          if (wire.has(e.seq)) twice.push(e.seq);
          wire.add(e.seq);
        }
        this.fold(list);
      });
    },
  };
}

describe.concurrent('faults of stations and commands', () => {
  it('a station offline for 30 s while the count goes on catches up from its last seq, nothing lost or doubled', { timeout: 90_000 }, async () => {
    const { id, tc, pad, tcEvents } = await startedCount('Offline station run');
    const prop = station();
    const phone = await socketOf(DEMO.propellants);
    prop.listen(phone);
    const first = await join(phone, id, 0);
    prop.fold(first.data!.events);
    await tcEvents.waitFor((e) => e.type === 'station:connected' && e.station === 'PROP');
    await sleep(200);
    const lastSeen = prop.state.lastSeq;
    phone.disconnect();

    // While PROP is away: polls that ask it time out and hold the count, PAD holds and clears, polls without it
    // pass, and PROP shows as lost. A command PROP gives meanwhile waits on the phone with its id (useLiveCount).
    const offlineUntil = Date.now() + 30_000;
    const queued = { commandId: 'prop-offline-1', type: 'hold:call', category: 'propellant', reason: 'LOX vent line frosting at the flange' };
    let rounds = 0;
    while (Date.now() < offlineUntil - 7000) {
      rounds += 1;
      const opened = await send(tc, id, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 5 });
      const pollId = opened.data!.events[0]!.payload.pollId as string;
      expect((await send(pad, id, { type: 'poll:answer', pollId, station: 'PAD', answer: 'go' })).data).toBeTruthy();
      const hold = await tcEvents.waitFor((e) => e.type === 'hold:called' && (e.payload as { reason?: string }).reason!.includes('PROP'), 15_000);
      expect((await send(tc, id, { type: 'hold:clear', holdId: hold.payload.holdId })).data).toBeTruthy();
      expect((await send(tc, id, { type: 'count:resume' })).data).toBeTruthy();
      const padHold = await send(pad, id, { type: 'hold:call', category: 'hardware', reason: `Round ${rounds}: igniter lead rerouted` });
      const padHoldId = padHold.data!.events[0]!.payload.holdId;
      expect((await send(pad, id, { type: 'hold:clear', holdId: padHoldId })).data).toBeTruthy();
      expect((await send(tc, id, { type: 'count:resume' })).data).toBeTruthy();
      const padOnly = await send(tc, id, { type: 'poll:open', stations: ['PAD'], timeoutSeconds: 60 });
      const answered = await send(pad, id, { type: 'poll:answer', pollId: padOnly.data!.events[0]!.payload.pollId, station: 'PAD', answer: 'go' });
      expect(answered.data!.events.map((e) => e.type)).toContain('poll:closed');
      // Tie this round's hold to its own poll: wait until the next round's hold cannot be this one.
      tcEvents.events.splice(0);
    }
    await sleep(Math.max(0, offlineUntil - Date.now()));
    const during = (await conductorHttp.get(`/api/counts/${id}/events?sinceSeq=${lastSeen}`).expect(200)).body as CountEventDto[];
    expect(during.some((e) => e.type === 'station:lost' && e.station === 'PROP')).toBe(true);
    expect(during.filter((e) => e.type === 'poll:closed').length).toBeGreaterThanOrEqual(2 * rounds);

    // Back: a new socket joins from the last seq the phone had.
    const back = await socketOf(DEMO.propellants);
    prop.listen(back);
    const rejoined = await join(back, id, lastSeen);
    const missed = rejoined.data!.events.map((e) => e.seq);
    expect(missed[0]).toBe(lastSeen + 1);
    expect(missed).toEqual(missed.map((_, i) => lastSeen + 1 + i));
    prop.fold(rejoined.data!.events);
    // The queued command goes out with its id, and once more as a retry whose first answer was lost.
    const sentOnce = await send(back, id, queued);
    const sentTwice = await send(back, id, queued);
    expect(sentOnce.data!.events.map((e) => e.type)).toEqual(['hold:called']);
    expect(sentTwice.data!.events).toEqual(sentOnce.data!.events);
    const holdId = sentOnce.data!.events[0]!.payload.holdId;
    expect((await send(back, id, { type: 'hold:clear', holdId })).data).toBeTruthy();
    const resumed = await send(tc, id, { type: 'count:resume' });
    const lastSeq = resumed.data!.events.at(-1)!.seq;
    for (let waited = 0; prop.state.lastSeq < lastSeq && waited < 5000; waited += 20) await sleep(20);

    const all = (await conductorHttp.get(`/api/counts/${id}/events`).expect(200)).body as CountEventDto[];
    expect(prop.gaps).toEqual([]);
    expect(prop.twice).toEqual([]);
    expect(prop.folded).toEqual(all.map((e) => e.seq));
    expect(all.filter((e) => e.type === 'hold:called' && (e.payload as { reason: string }).reason === queued.reason)).toHaveLength(1);
    // The phone's fold equals the server's: the replay of the log, and the live state the server serves.
    expect(prop.state).toEqual(replay(all as unknown as CountEvent[]));
    const served = (await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body as CountState;
    expect(served.lastSeq).toBe(prop.state.lastSeq);
    expect(stateDto(prop.state, served.clock.running ? served.clock.anchorAt! : Date.now())).toEqual(served);
  });

  it('the same command id twice (at once, then again, over the socket and HTTP) acts once and answers the first events', async () => {
    const { id, tc } = await startedCount('Double press run');
    const laptop = await socketOf(DEMO.propellants);
    const phone = await socketOf(DEMO.propellants);
    const hold = { type: 'hold:call', commandId: 'prop-press-1', category: 'hardware', reason: 'Check valve chatter on the LOX line' };
    const [a, b] = await Promise.all([send(laptop, id, hold), send(phone, id, hold)]);
    expect(a.data!.events.map((e) => e.type)).toEqual(['hold:called']);
    expect(b.data!.events).toEqual(a.data!.events);
    const again = await send(phone, id, hold);
    expect(again.data!.events).toEqual(a.data!.events);
    const prop = await t.client(DEMO.propellants);
    const overHttp = await prop.post(`/api/counts/${id}/commands`, hold).expect(200);
    expect(overHttp.body.events).toEqual(a.data!.events);
    // A retry answers the first run whatever else it carries (docs/count-log.md): it never acts a second time.
    const changed = await send(phone, id, { ...hold, reason: 'Second thoughts' });
    expect(changed.data!.events).toEqual(a.data!.events);
    const rows = await CountEventRow.findAll({ where: { countId: id, commandId: 'prop-press-1' } });
    expect(rows.map((r) => r.seq)).toEqual(a.data!.events.map((e) => e.seq));
    expect((await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body.status).toBe('holding');
    expect((await send(laptop, id, { type: 'hold:clear', holdId: a.data!.events[0]!.payload.holdId })).data).toBeTruthy();
    void tc;
  });

  it('a command whose answer was lost with the connection is retried with its id: the first answer comes back', async () => {
    const { id, tcEvents } = await startedCount('Lost answer run');
    const link = await lossyLink(url);
    const first = openSocket(link.url, cookies.get(DEMO.conductor)!);
    await connected(first);
    const command = { type: 'poll:open', commandId: 'tc-poll-lost-ack', stations: ['PROP', 'PAD'], timeoutSeconds: 600 };
    // The command reaches the server; its answer is lost on the way back, and then the link is gone.
    let answered = false;
    link.loseAnswers();
    first.emit('count:command', { countId: id, command: command as never }, () => (answered = true));
    // The conductor's desk sees the poll open: the command ran although its answer went nowhere.
    const opened = await tcEvents.waitFor((e) => e.type === 'poll:opened', 5000);
    await link.cut();
    first.disconnect();
    expect(answered, 'the first answer was not lost; the test proved nothing').toBe(false);
    const retry = await send(await socketOf(DEMO.conductor), id, command);
    expect(retry.data!.events.map((e) => ({ seq: e.seq, hash: e.hash }))).toEqual([{ seq: opened.seq, hash: (opened as unknown as CountEventDto).hash }]);
    const polls = (await conductorHttp.get(`/api/counts/${id}/events`).expect(200)).body.filter((e: CountEventDto) => e.type === 'poll:opened');
    expect(polls).toHaveLength(1);
  });

  it('commands in the wrong order are refused in words and append nothing', async () => {
    const { id, tc, pad } = await startedCount('Wrong order run');
    const prop = await socketOf(DEMO.propellants);
    const lastSeq = async () => ((await conductorHttp.get(`/api/counts/${id}/state`).expect(200)).body as CountState).lastSeq;
    const refused = async (s: Socket, command: object, message: RegExp) => {
      const before = await lastSeq();
      const reply = await send(s, id, command);
      expect(reply.error, JSON.stringify(command)).toMatch(message);
      expect(reply.data).toBeUndefined();
      expect(await lastSeq()).toBe(before);
    };
    // An answer before its poll, a clear before its hold, a resume before any hold, a second start.
    await refused(prop, { type: 'poll:answer', pollId: 'P1', station: 'PROP', answer: 'go' }, /No poll is open/);
    await refused(tc, { type: 'hold:clear', holdId: 'H1' }, /There is no hold H1 in this count/);
    await refused(tc, { type: 'count:resume' }, /The count is not holding/);
    await refused(tc, { type: 'count:start' }, /The count has already started/);
    // Over HTTP the same refusal is a 409 with the message.
    const before = await lastSeq();
    const http = await conductorHttp.post(`/api/counts/${id}/commands`, { type: 'count:resume' }).expect(409);
    expect(http.body).toMatchObject({ code: 'count_conflict', error: 'The count is not holding.' });
    expect(await lastSeq()).toBe(before);

    // An answer to a poll that has closed and been replaced arrives late.
    const p1 = (await send(tc, id, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600 })).data!.events[0]!.payload.pollId as string;
    await send(prop, id, { type: 'poll:answer', pollId: p1, station: 'PROP', answer: 'go' });
    await send(pad, id, { type: 'poll:answer', pollId: p1, station: 'PAD', answer: 'go' });
    const p2 = (await send(tc, id, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600 })).data!.events[0]!.payload.pollId as string;
    await refused(prop, { type: 'poll:answer', pollId: p1, station: 'PROP', answer: 'nogo', reason: 'Late' }, new RegExp(`Poll ${p1} has closed; poll ${p2} is open now`));

    // A resume and the clear it depends on, sent at once in the wrong order: the resume is refused, the clear done.
    await send(prop, id, { type: 'poll:answer', pollId: p2, station: 'PROP', answer: 'go' });
    await send(pad, id, { type: 'poll:answer', pollId: p2, station: 'PAD', answer: 'go' });
    const hold = (await send(prop, id, { type: 'hold:call', category: 'hardware', reason: 'Regulator creep' })).data!.events[0]!.payload.holdId as string;
    const [resume, clear] = await Promise.all([send(tc, id, { type: 'count:resume' }), send(prop, id, { type: 'hold:clear', holdId: hold })]);
    expect(resume.error).toMatch(/Clear every hold first/);
    expect(clear.data!.events.map((e) => e.type)).toEqual(['hold:cleared']);
    await refused(prop, { type: 'hold:clear', holdId: hold }, new RegExp(`Hold ${hold} is already cleared`));
    expect((await send(tc, id, { type: 'count:resume' })).data!.events.map((e) => e.type)).toEqual(['count:resumed']);
  });
});
