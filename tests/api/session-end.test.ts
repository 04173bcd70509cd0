import type { AddressInfo } from 'node:net';
import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { newToken } from '../../server/auth/tokens';
import { PasswordReset, Session } from '../../server/models';
import { createUser, DEMO, signInWithCookie, withCookie } from '../helpers/api';
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

/** A connected socket on the given session cookie, recording the reason it was told its session ended. */
async function openSocket(cookie: string): Promise<{ socket: Socket; ended: Promise<string>; closed: Promise<string> }> {
  const socket = connect(url, { transports: ['websocket'], reconnection: false, forceNew: true, timeout: 3000, extraHeaders: { cookie } });
  sockets.push(socket);
  const ended = new Promise<string>((resolve) => socket.once('session:ended', (p: { reason: string }) => resolve(p.reason)));
  const closed = new Promise<string>((resolve) => socket.once('disconnect', (why) => resolve(why)));
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });
  return { socket, ended, closed };
}

const within = <T>(p: Promise<T>, ms = 3000) =>
  Promise.race([p, new Promise<never>((_, reject) => setTimeout(() => reject(new Error('timed out')), ms))]);

async function stillConnected(socket: Socket) {
  const reply = await socket.timeout(3000).emitWithAck('clock:sync', { clientSentAt: 1 });
  expect(reply.data.clientSentAt).toBe(1);
}

describe('ending sessions', () => {
  it('signing out closes that session’s sockets and tells them why; another session of the same person stays', async () => {
    const a = await signInWithCookie(t, DEMO.range);
    const b = await signInWithCookie(t, DEMO.range);
    const sa = await openSocket(a.cookie);
    const sb = await openSocket(b.cookie);
    await a.client.post('/api/auth/logout').expect(204);
    expect(await within(sa.ended)).toBe('signed-out');
    // 'io server disconnect': the server closed it, not the network.
    expect(await within(sa.closed)).toBe('io server disconnect');
    expect(sa.socket.connected).toBe(false);
    await stillConnected(sb.socket);
    await withCookie(t, b.cookie).get('/api/auth/me').expect(200);
  });

  it('deactivating a person closes their sockets and ends every stored session', async () => {
    const u = await createUser({ roles: ['operator'] });
    const one = await signInWithCookie(t, u.email, u.password);
    const two = await signInWithCookie(t, u.email, u.password);
    const s1 = await openSocket(one.cookie);
    const s2 = await openSocket(two.cookie);
    const admin = await t.client(DEMO.admin);
    await admin.patch(`/api/users/${u.id}`, { active: false }).expect(200);
    expect(await within(s1.ended)).toBe('deactivated');
    expect(await within(s2.ended)).toBe('deactivated');
    await withCookie(t, one.cookie).get('/api/auth/me').expect(401);
    const stored = (await Session.findAll()).filter((s) => (s.data ?? '').includes(`"user":${u.id}`));
    expect(stored).toHaveLength(0);
  });

  it('changing roles closes the person’s sockets so they reconnect with the new roles, but keeps them signed in', async () => {
    const u = await createUser({ roles: ['operator'] });
    const me = await signInWithCookie(t, u.email, u.password);
    const s = await openSocket(me.cookie);
    const admin = await t.client(DEMO.admin);
    await admin.patch(`/api/users/${u.id}`, { roles: ['operator', 'auditor'] }).expect(200);
    expect(await within(s.ended)).toBe('roles-changed');
    const again = await withCookie(t, me.cookie).get('/api/auth/me').expect(200);
    expect(again.body.roles).toEqual(['operator', 'auditor']);
  });

  it('changing one’s password signs out the other sessions and keeps this one', async () => {
    const u = await createUser({ roles: ['operator'] });
    const here = await signInWithCookie(t, u.email, u.password);
    const elsewhere = await signInWithCookie(t, u.email, u.password);
    const sHere = await openSocket(here.cookie);
    const sElsewhere = await openSocket(elsewhere.cookie);
    await here.client.post('/api/profile/password', { currentPassword: u.password, newPassword: 'a-new-long-passphrase' }).expect(204);
    expect(await within(sElsewhere.ended)).toBe('password-changed');
    await withCookie(t, elsewhere.cookie).get('/api/auth/me').expect(401);
    await withCookie(t, here.cookie).get('/api/auth/me').expect(200);
    await stillConnected(sHere.socket);
  });

  it('completing a password reset ends every session of that person', async () => {
    const u = await createUser({ roles: ['operator'] });
    const signedIn = await signInWithCookie(t, u.email, u.password);
    const s = await openSocket(signedIn.cookie);
    const { token, hash } = newToken();
    await PasswordReset.create({ userId: u.id, tokenHash: hash, expiresAt: new Date(Date.now() + 3_600_000), usedAt: null });
    const anon = await t.client();
    await anon.post('/api/password-resets/complete', { token, password: 'reset-long-passphrase' }).expect(204);
    expect(await within(s.ended)).toBe('password-reset');
    await withCookie(t, signedIn.cookie).get('/api/auth/me').expect(401);
  });
});
