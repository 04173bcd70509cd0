import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, sleep } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

/**
 * The app trusts a proxy on loopback, so X-Forwarded-For sets the client address the per-address limiter sees.
 * Each test uses its own addresses and accounts, so the tests share one app without sharing counters.
 */
const RATE_LIMITED = { error: 'Too many failed sign-ins. Wait 15 minutes, then try again.', code: 'rate_limited' };

function login(c: TestClient, ip: string, email: string, password: string) {
  return c.post('/api/auth/login', { email, password }).set('X-Forwarded-For', ip);
}

describe('sign-in rate limit (limit 3 per minute)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp({ signInLimits: { windowMs: 60_000, limit: 3 } });
  });
  afterAll(() => t.stop());

  it('after 3 failed logins the 4th is 429 rate_limited even with the right password', async () => {
    const c = await t.client();
    for (let i = 0; i < 3; i++) {
      const res = await login(c, '10.0.0.1', DEMO.conductor, 'wrong-password');
      expect(res.status).toBe(401);
      expect(res.body.code).toBe('bad_credentials');
    }
    const blocked = await login(c, '10.0.0.1', DEMO.conductor, 'kestrel-demo');
    expect(blocked.status).toBe(429);
    expect(blocked.body).toEqual(RATE_LIMITED);
    expect(blocked.headers['ratelimit']).toBeDefined();
    // Blocked means not signed in.
    await c.get('/api/auth/me').expect(401);
  });

  it('counts per account: failures from many addresses lock that account, not others', async () => {
    const c = await t.client();
    for (const ip of ['10.0.1.1', '10.0.1.2', '10.0.1.3']) {
      await login(c, ip, DEMO.safety, 'wrong-password').expect(401);
    }
    // A fresh address does not help the attacked account...
    const blocked = await login(c, '10.0.1.4', DEMO.safety, 'kestrel-demo');
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe('rate_limited');
    // ...the account key is normalised, so changing the case of the e-mail does not either...
    await login(c, '10.0.1.5', ' SAFETY@ternvalley.test', 'kestrel-demo').expect(429);
    // ...and another account from a fresh address signs in fine.
    const other = await t.client();
    const ok = await login(other, '10.0.1.6', DEMO.pad, 'kestrel-demo');
    expect(ok.status).toBe(200);
    expect(ok.body.email).toBe(DEMO.pad);
  });

  it('counts per address too: one address failing on several accounts is blocked for every account', async () => {
    const c = await t.client();
    for (const email of ['a@ternvalley.test', 'b@ternvalley.test', 'c@ternvalley.test']) {
      await login(c, '10.0.2.1', email, 'wrong-password').expect(401);
    }
    // Same address, an account that has had no failures, right password: still blocked by the address.
    const blocked = await login(c, '10.0.2.1', DEMO.range, 'kestrel-demo');
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe('rate_limited');
    // The same account from another address is fine.
    const ok = await login(await t.client(), '10.0.2.2', DEMO.range, 'kestrel-demo');
    expect(ok.status).toBe(200);
  });

  it('successful sign-ins are not counted: 5 good logins with limit 3 all pass', async () => {
    for (let i = 0; i < 5; i++) {
      const c = await t.client();
      const res = await login(c, '10.0.3.1', DEMO.data, 'kestrel-demo');
      expect(res.status, `login #${i + 1}`).toBe(200);
      await c.get('/api/auth/me').expect(200);
    }
    // And two failures after them are still under the limit: the good ones left no count behind.
    const c = await t.client();
    await login(c, '10.0.3.1', DEMO.data, 'wrong-password').expect(401);
    await login(c, '10.0.3.1', DEMO.data, 'wrong-password').expect(401);
    await login(c, '10.0.3.1', DEMO.data, 'kestrel-demo').expect(200);
  });
});

describe('sign-in rate limit window', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp({ signInLimits: { windowMs: 700, limit: 2 } });
  });
  afterAll(() => t.stop());

  it('lets the account in again once the window has passed', async () => {
    const c = await t.client();
    await login(c, '10.0.4.1', DEMO.auditor, 'wrong-password').expect(401);
    await login(c, '10.0.4.1', DEMO.auditor, 'wrong-password').expect(401);
    await login(c, '10.0.4.1', DEMO.auditor, 'kestrel-demo').expect(429);
    await sleep(1000);
    const res = await login(c, '10.0.4.1', DEMO.auditor, 'kestrel-demo');
    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['auditor']);
  });
});
