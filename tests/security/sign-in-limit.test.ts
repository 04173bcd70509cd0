import { afterAll, describe, expect, it } from 'vitest';
import { DEMO } from '../helpers/api';
import { caller, startSecurityApp } from './support';

/**
 * Ways around the sign-in limits that tests/api/auth-rate-limit.test.ts does not try: the same account written
 * differently, from a new address each time, and with bodies that fail validation.
 */
const t = await startSecurityApp({ signInLimits: { windowMs: 60_000, limit: 3 } });
afterAll(() => t.stop());

describe('sign-in limits', () => {
  it('case, spaces and a new address per try do not reset the per-account count', async () => {
    const c = await caller(t, null);
    const variants = [DEMO.range.toUpperCase(), `  ${DEMO.range}  `, DEMO.range.replace('range', 'Range')];
    for (const [i, email] of variants.entries()) {
      const res = await c.agent.post('/api/auth/login').set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', `10.9.0.${i + 1}`).send({ email, password: 'guess' });
      expect(res.status).toBe(401);
    }
    const blocked = await c.agent.post('/api/auth/login').set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', '10.9.0.99').send({ email: DEMO.range, password: 'kestrel-demo' });
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe('rate_limited');
    await c.agent.get('/api/auth/me').expect(401);
  });

  it('refused bodies count as failures for the address, so malformed floods are limited too', async () => {
    const c = await caller(t, null);
    for (let i = 0; i < 3; i++) {
      const res = await c.agent.post('/api/auth/login').set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', '10.9.1.1').send({ email: ['x'], password: {} });
      expect(res.status).toBe(400);
    }
    const blocked = await c.agent.post('/api/auth/login').set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', '10.9.1.1').send({ email: DEMO.data, password: 'kestrel-demo' });
    expect(blocked.status).toBe(429);
  });
});
