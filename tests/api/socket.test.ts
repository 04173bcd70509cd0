import type { AddressInfo } from 'node:net';
import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../server/models';
import { estimateOffset, serverTime, type ClockSyncSample } from '../../src/domain/count/clockSync';
import { createUser, DEMO, signInWithCookie } from '../helpers/api';
import { startTestApp, type TestApp } from '../helpers/app';

let t: TestApp;
let url: string;
const sockets: Socket[] = [];

beforeAll(async () => {
  t = await startTestApp();
  await new Promise<void>((resolve) => t.holdfire.httpServer.listen(0, '127.0.0.1', resolve));
  url = `http://127.0.0.1:${(t.holdfire.httpServer.address() as AddressInfo).port}`;
});
afterEach(() => {
  for (const s of sockets.splice(0)) s.disconnect();
});
afterAll(() => t.stop());

function open(cookie?: string): Socket {
  const socket = connect(url, {
    transports: ['websocket'],
    reconnection: false,
    forceNew: true,
    timeout: 3000,
    ...(cookie ? { extraHeaders: { cookie } } : {}),
  });
  sockets.push(socket);
  return socket;
}

/** Resolves 'connected' or the connect_error message. */
function outcome(socket: Socket): Promise<string> {
  return new Promise((resolve) => {
    socket.once('connect', () => resolve('connected'));
    socket.once('connect_error', (err) => resolve(`error: ${err.message}`));
  });
}

describe('socket.io', () => {
  it('refuses a connection without a session', async () => {
    expect(await outcome(open())).toBe('error: Sign in to connect.');
  });

  it('refuses a connection with a forged session cookie', async () => {
    expect(await outcome(open('holdfire.sid=s%3Aforged.signature'))).toBe('error: Sign in to connect.');
  });

  it('with a signed-in session, clock:sync acks { data: { clientSentAt, serverAt } }', async () => {
    const { cookie } = await signInWithCookie(t, DEMO.conductor);
    const socket = open(cookie);
    expect(await outcome(socket)).toBe('connected');
    const clientSentAt = Date.now();
    const before = Date.now();
    const reply = await socket.timeout(3000).emitWithAck('clock:sync', { clientSentAt });
    const after = Date.now();
    expect(reply).toEqual({ data: { clientSentAt, serverAt: expect.any(Number) } });
    expect(reply.data.serverAt).toBeGreaterThanOrEqual(before);
    expect(reply.data.serverAt).toBeLessThanOrEqual(after);
  });

  it('a device whose clock is 7.3 s slow learns the server time within 50 ms from a burst of four exchanges', async () => {
    const { cookie } = await signInWithCookie(t, DEMO.propellants);
    const socket = open(cookie);
    expect(await outcome(socket)).toBe('connected');
    // The phone's clock, as useLiveCount reads it (Date.now), running 7300 ms behind the server's.
    const skew = -7300;
    const deviceNow = () => Date.now() + skew;
    const samples: ClockSyncSample[] = [];
    for (let i = 0; i < 4; i++) {
      const clientSentAt = deviceNow();
      const reply = await socket.timeout(3000).emitWithAck('clock:sync', { clientSentAt });
      samples.push({ clientSentAt, serverAt: reply.data.serverAt, clientReceivedAt: deviceNow() });
    }
    const est = estimateOffset(samples)!;
    expect(est.samples).toBe(4);
    // RFC 5905: the error of an exchange's offset is at most half its round-trip delay.
    expect(Math.abs(est.offset - 7300)).toBeLessThanOrEqual(est.delay / 2 + 1);
    // The clock the screens draw, from the device clock and that offset, against the server's clock now.
    expect(Math.abs(serverTime(deviceNow(), est) - Date.now())).toBeLessThanOrEqual(50);
  });

  it.each([
    ['a string time', { clientSentAt: 'now' }],
    ['no payload fields', {}],
    ['an extra field', { clientSentAt: 1, admin: true }],
    ['null', null],
    ['a number', 5],
  ])('clock:sync with %s acks an error', async (_label, payload) => {
    const { cookie } = await signInWithCookie(t, DEMO.data);
    const socket = open(cookie);
    expect(await outcome(socket)).toBe('connected');
    const reply = await socket.timeout(3000).emitWithAck('clock:sync', payload as never);
    expect(reply).toEqual({ error: 'clock:sync needs { clientSentAt: number }' });
    // The connection survives a bad payload.
    const ok = await socket.timeout(3000).emitWithAck('clock:sync', { clientSentAt: 7 });
    expect(ok.data.clientSentAt).toBe(7);
  });

  it('clock:sync without an ack callback is ignored and the socket keeps working', async () => {
    const { cookie } = await signInWithCookie(t, DEMO.pad);
    const socket = open(cookie);
    expect(await outcome(socket)).toBe('connected');
    socket.emit('clock:sync', { clientSentAt: 1 } as never, undefined as never);
    const ok = await socket.timeout(3000).emitWithAck('clock:sync', { clientSentAt: 2 });
    expect(ok.data.clientSentAt).toBe(2);
  });

  it('after logout the old cookie no longer connects', async () => {
    const { client, cookie } = await signInWithCookie(t, DEMO.range);
    await client.post('/api/auth/logout').expect(204);
    expect(await outcome(open(cookie))).toBe('error: Sign in to connect.');
  });

  it('a deactivated user’s cookie no longer connects', async () => {
    const u = await createUser({});
    const { cookie } = await signInWithCookie(t, u.email, u.password);
    expect(await outcome(open(cookie))).toBe('connected');
    await User.update({ active: false }, { where: { id: u.id } });
    expect(await outcome(open(cookie))).toBe('error: Sign in to connect.');
  });
});
