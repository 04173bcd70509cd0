import { afterAll, describe, expect, it } from 'vitest';
import type { RouteDef } from '../../server/http/route';
import { DEMO_USERS } from '../../server/db/seed';
import { ROLES, type Role } from '../../src/domain/people/roles';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

/**
 * Walks the route table. The app starts at collection time so every route gets its own test, and a route added
 * later is covered without touching this file.
 */
const t: TestApp = await startTestApp();
afterAll(() => t.stop());
const table: RouteDef[] = t.holdfire.routes;

const SAMPLE_PARAMS: Record<string, string> = { id: '1', token: 'A'.repeat(43) };

function urlOf(r: RouteDef): string {
  return '/api' + r.path.replace(/:(\w+)/g, (_m, name: string) => SAMPLE_PARAMS[name] ?? '1');
}

function call(c: TestClient, r: RouteDef) {
  const url = urlOf(r);
  if (r.method === 'get') return c.get(url);
  return c.agent[r.method](url).set('X-CSRF-Token', c.csrf).send({});
}

const label = (r: RouteDef) => `${r.method.toUpperCase()} /api${r.path}`;
const nonPublic = table.filter((r) => r.access !== 'public');
const roleRestricted = table.filter((r): r is RouteDef & { access: readonly Role[] } => Array.isArray(r.access));
const publicRoutes = table.filter((r) => r.access === 'public');

/** A demo user holding none of the roles, and one holding at least one of them. */
function demoLacking(roles: readonly Role[]) {
  return DEMO_USERS.find((u) => !u.roles.some((r) => roles.includes(r)));
}
function demoHolding(roles: readonly Role[]) {
  return DEMO_USERS.find((u) => u.roles.some((r) => roles.includes(r)));
}

const clients = new Map<string, TestClient>();
async function as(email: string): Promise<TestClient> {
  if (!clients.has(email)) clients.set(email, await t.client(email));
  return clients.get(email)!;
}

describe('the route table', () => {
  it('has every route with a valid access rule', () => {
    expect(table.length).toBeGreaterThanOrEqual(15);
    for (const r of table) {
      const ok =
        r.access === 'public' ||
        r.access === 'signed-in' ||
        (Array.isArray(r.access) && r.access.length > 0 && r.access.every((role) => (ROLES as readonly string[]).includes(role)));
      expect(ok, `${label(r)} access ${JSON.stringify(r.access)}`).toBe(true);
    }
  });

  it('has no duplicate method + path', () => {
    const keys = table.map(label);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('keeps the sensitive routes restricted as intended', () => {
    const access = (method: string, path: string) => table.find((r) => r.method === method && r.path === path)?.access;
    expect(access('get', '/users')).toEqual(['admin']);
    expect(access('patch', '/users/:id')).toEqual(['admin']);
    expect(access('get', '/invitations')).toEqual(['admin']);
    expect(access('post', '/invitations')).toEqual(['admin']);
    expect(access('get', '/mail/outbox')).toEqual(['admin']);
    expect(access('get', '/auth/me')).toBe('signed-in');
    expect(access('patch', '/profile')).toBe('signed-in');
    expect(access('post', '/profile/password')).toBe('signed-in');
    // Only these may be public; a new public route must be added here on purpose.
    expect(publicRoutes.map(label).sort()).toEqual(
      [
        'GET /api/auth/csrf',
        'GET /api/health',
        'GET /api/invitations/by-token/:token',
        'GET /api/setup',
        'POST /api/auth/login',
        'POST /api/auth/logout',
        'POST /api/invitations/accept',
        'POST /api/password-resets',
        'POST /api/password-resets/complete',
        'POST /api/setup',
      ].sort(),
    );
  });
});

describe('anonymous callers', () => {
  it.each(nonPublic.map((r) => [label(r), r] as const))('%s → 401 unauthenticated', async (_label, r) => {
    const anon = await t.client(); // has a valid CSRF token, so the 401 is the access rule and not CSRF
    const res = await call(anon, r);
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: 'Sign in to continue.', code: 'unauthenticated' });
  });

  it.each(publicRoutes.map((r) => [label(r), r] as const))('%s is reachable without a session', async (_label, r) => {
    const anon = await t.client();
    const res = await call(anon, r);
    expect([401, 403]).not.toContain(res.status);
    expect(res.status).toBeLessThan(500);
  });
});

describe('signed-in users without the role', () => {
  it.each(roleRestricted.map((r) => [label(r), r] as const))('%s → 403 forbidden for a user lacking the role', async (_label, r) => {
    const lacking = demoLacking(r.access);
    expect(lacking, `a demo user without ${r.access.join('/')}`).toBeDefined();
    const res = await call(await as(lacking!.email), r);
    expect(res.status).toBe(403);
    expect(res.body).toEqual({ error: 'Your roles do not allow this.', code: 'forbidden' });
  });

  it.each(roleRestricted.map((r) => [label(r), r] as const))('%s is not refused for a user holding the role', async (_label, r) => {
    const holder = demoHolding(r.access);
    expect(holder).toBeDefined();
    const res = await call(await as(holder!.email), r);
    expect([401, 403]).not.toContain(res.status);
    expect(res.status).toBeLessThan(500);
  });

  it.each(nonPublic.filter((r) => r.access === 'signed-in').map((r) => [label(r), r] as const))(
    '%s is open to every role',
    async (_label, r) => {
      for (const u of DEMO_USERS) {
        const res = await call(await as(u.email), r);
        expect([401, 403], `${u.email}`).not.toContain(res.status);
      }
    },
  );

  it('an operator gets 403 on GET /api/users and POST /api/invitations, and no invitation is made', async () => {
    const op = await as(DEMO.propellants);
    const users = await op.get('/api/users').expect(403);
    expect(users.body.code).toBe('forbidden');
    const inv = await op.post('/api/invitations', { email: 'sneaky@example.test', roles: ['admin'] }).expect(403);
    expect(inv.body.code).toBe('forbidden');
    const admin = await as(DEMO.admin);
    const list = await admin.get('/api/invitations').expect(200);
    expect(list.body.map((i: { email: string }) => i.email)).not.toContain('sneaky@example.test');
  });

  it('an auditor cannot change roles, including their own', async () => {
    const auditor = await as(DEMO.auditor);
    const me = await auditor.get('/api/auth/me').expect(200);
    const res = await auditor.patch(`/api/users/${me.body.id}`, { roles: ['admin'] }).expect(403);
    expect(res.body.code).toBe('forbidden');
    const after = await auditor.get('/api/auth/me').expect(200);
    expect(after.body.roles).toEqual(['auditor']);
  });
});

describe('unknown API paths', () => {
  it('GET of an unknown /api path is a 404 JSON error, signed in or not', async () => {
    for (const c of [await t.client(), await as(DEMO.admin)]) {
      const res = await c.get('/api/no-such-thing').expect(404);
      expect(res.headers['content-type']).toMatch(/application\/json/);
      expect(res.body).toEqual({ error: 'No API route GET /no-such-thing.', code: 'not_found' });
    }
  });

  it('an unknown method on a known path is a 404 JSON error', async () => {
    const admin = await as(DEMO.admin);
    const res = await admin.agent.delete('/api/users/1').set('X-CSRF-Token', admin.csrf).expect(404);
    expect(res.body.code).toBe('not_found');
    // And the user is still there.
    const users = await admin.get('/api/users').expect(200);
    expect(users.body.some((u: { id: number }) => u.id === 1)).toBe(true);
  });
});
