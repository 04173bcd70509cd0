import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessionCookieLine } from '../helpers/api';
import { startTestApp, type TestApp } from '../helpers/app';

// Its own file: the models are process-wide, so one app per test file.
let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ env: { APP_URL: 'https://holdfire.example.org' } });
});
afterAll(() => t.stop());

describe('an https APP_URL', () => {
  it('marks the session cookie Secure (behind a TLS-terminating proxy on loopback)', async () => {
    expect(t.holdfire.config.secureCookies).toBe(true);
    // supertest talks plain http; the trusted loopback proxy says the client connection was https.
    const res = await request(t.holdfire.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https').expect(200);
    const line = sessionCookieLine(res);
    expect(line).toBeDefined();
    const flags = line!.split(';').map((p) => p.trim().toLowerCase());
    expect(flags).toContain('secure');
    expect(flags).toContain('httponly');
    expect(flags).toContain('samesite=lax');
  });

  it('never sends the Secure cookie over a plain http connection', async () => {
    const res = await request(t.holdfire.app).get('/api/auth/csrf').expect(200);
    expect(sessionCookieLine(res)).toBeUndefined();
  });

  it('sends HSTS and upgrade-insecure-requests', async () => {
    const res = await request(t.holdfire.app).get('/api/health').set('X-Forwarded-Proto', 'https').expect(200);
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(res.headers['content-security-policy']).toContain('upgrade-insecure-requests');
  });
});
