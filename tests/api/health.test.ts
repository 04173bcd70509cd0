import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../helpers/app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.stop());

describe('GET /api/health', () => {
  it('answers ok without a session', async () => {
    const c = await t.client();
    const res = await c.get('/api/health').expect(200);
    expect(res.body).toEqual({ status: 'ok' });
  });

  it('sends a CSP that allows only our own scripts and styles', async () => {
    const c = await t.client();
    const res = await c.get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("style-src 'self'");
    expect(csp).not.toContain('unsafe-inline');
  });
});
