import session from 'express-session';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { throttleTouch } from '../../server/auth/session-touch';
import { Session } from '../../server/models';
import { DEMO, sessionCookieLine, signInWithCookie, sleep, withCookie } from '../helpers/api';
import { startTestApp, type TestApp } from '../helpers/app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.stop());

/** The session id inside a signed `holdfire.sid=s%3A<sid>.<signature>` cookie. */
function sidOf(cookie: string): string {
  const value = decodeURIComponent(cookie.split('=')[1]!);
  return value.slice(2, value.lastIndexOf('.'));
}

describe('session expiry in the database', () => {
  it('is not rewritten on every request: reading pages does not compete with the count log for the write lock', async () => {
    const { cookie } = await signInWithCookie(t, DEMO.auditor);
    const sid = sidOf(cookie);
    const first = await withCookie(t, cookie).get('/api/auth/me').expect(200);
    const before = (await Session.findByPk(sid))!.expires!.getTime();
    await sleep(20);
    for (let i = 0; i < 5; i++) {
      const res = await withCookie(t, cookie).get('/api/auth/me').expect(200);
      // The cookie still rolls on every response (rolling sessions), so the browser's expiry moves on.
      expect(sessionCookieLine(res)).toMatch(/Expires=/);
    }
    expect(sessionCookieLine(first)).toMatch(/Expires=/);
    expect((await Session.findByPk(sid))!.expires!.getTime()).toBe(before);
  });
});

describe('throttleTouch', () => {
  it('lets a touch through once per window per session, and again after a destroy', async () => {
    let clock = 1_000_000;
    const store = new session.MemoryStore();
    const touched: string[] = [];
    const original = store.touch.bind(store);
    store.touch = (sid, s, cb) => {
      touched.push(sid);
      original(sid, s, cb);
    };
    throttleTouch(store, 60_000, () => clock);
    const data = { cookie: { originalMaxAge: 1000, expires: new Date(clock + 1000) } } as unknown as session.SessionData;
    let answered = 0;
    const cb = () => {
      answered += 1;
    };

    store.touch('a', data, cb);
    store.touch('a', data, cb);
    store.touch('b', data, cb);
    clock += 59_999;
    store.touch('a', data, cb);
    expect(touched).toEqual(['a', 'b']);
    clock += 1;
    store.touch('a', data, cb);
    expect(touched).toEqual(['a', 'b', 'a']);
    store.destroy('a', () => {});
    store.touch('a', data, cb);
    expect(touched).toEqual(['a', 'b', 'a', 'a']);
    await new Promise((resolve) => setImmediate(resolve)); // MemoryStore answers on a later turn
    // Every call answers, skipped or not, so express-session always finishes the response.
    expect(answered).toBe(6);
  });
});
