import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS } from '../../server/db/seed';
import { User } from '../../server/models';
import { createUser, DEMO, signInWithCookie, withCookie } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

let t: TestApp;
let admin: TestClient;
let adminId: number;
beforeAll(async () => {
  t = await startTestApp();
  admin = await t.client(DEMO.admin);
  adminId = (await admin.get('/api/auth/me').expect(200)).body.id;
});
afterAll(() => t.stop());

async function snapshot(id: number) {
  const u = await User.findByPk(id);
  return { roles: u!.roles, active: u!.active, name: u!.name, email: u!.email, passwordHash: u!.passwordHash };
}

describe('GET /api/users', () => {
  it('lists the team, sorted by name, without password hashes', async () => {
    const res = await admin.get('/api/users').expect(200);
    const users = res.body as { id: number; email: string; name: string; roles: string[]; active: boolean; createdAt: string }[];
    for (const demo of DEMO_USERS) {
      const u = users.find((x) => x.email === demo.email);
      expect(u, demo.email).toMatchObject({ name: demo.name, roles: demo.roles, active: true });
      expect(Number.isNaN(Date.parse(u!.createdAt))).toBe(false);
    }
    const names = users.map((u) => u.name);
    expect(names).toEqual([...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
    for (const u of users) expect(Object.keys(u).sort()).toEqual(['active', 'createdAt', 'email', 'id', 'name', 'roles']);
  });
});

describe('PATCH /api/users/:id', () => {
  it('changes roles (stored in canonical order, deduplicated) and the change shows in the list and in their session', async () => {
    const u = await createUser({ roles: ['operator'] });
    const { client: them } = await signInWithCookie(t, u.email, u.password);

    const res = await admin.patch(`/api/users/${u.id}`, { roles: ['safety', 'conductor', 'safety'] }).expect(200);
    expect(res.body).toMatchObject({ id: u.id, email: u.email, roles: ['conductor', 'safety'], active: true });
    expect((await snapshot(u.id)).roles).toEqual(['conductor', 'safety']);

    const list = await admin.get('/api/users').expect(200);
    expect(list.body.find((x: { id: number }) => x.id === u.id).roles).toEqual(['conductor', 'safety']);
    // The session reads the user afresh on each request, so the new roles apply at once.
    expect((await them.get('/api/auth/me').expect(200)).body.roles).toEqual(['conductor', 'safety']);
  });

  it('a role taken away takes effect on the next request of an existing session', async () => {
    const u = await createUser({ roles: ['admin', 'operator'] });
    const { client: them } = await signInWithCookie(t, u.email, u.password);
    await them.get('/api/users').expect(200);
    await admin.patch(`/api/users/${u.id}`, { roles: ['operator'] }).expect(200);
    const res = await them.get('/api/users').expect(403);
    expect(res.body.code).toBe('forbidden');
  });

  it('deactivating a user stops their existing session and their sign-in; reactivating lets them back', async () => {
    const u = await createUser({ roles: ['operator'] });
    const { client: them, cookie } = await signInWithCookie(t, u.email, u.password);
    await them.get('/api/auth/me').expect(200);

    const res = await admin.patch(`/api/users/${u.id}`, { active: false }).expect(200);
    expect(res.body).toMatchObject({ id: u.id, active: false, roles: ['operator'] });
    expect((await snapshot(u.id)).active).toBe(false);

    const me = await them.get('/api/auth/me').expect(401);
    expect(me.body.code).toBe('unauthenticated');
    await withCookie(t, cookie).get('/api/auth/me').expect(401);
    const fresh = await t.client();
    const login = await fresh.post('/api/auth/login', { email: u.email, password: u.password }).expect(401);
    expect(login.body.code).toBe('bad_credentials');

    await admin.patch(`/api/users/${u.id}`, { active: true }).expect(200);
    await (await t.client()).post('/api/auth/login', { email: u.email, password: u.password }).expect(200);
  });

  it('refuses to let an admin deactivate themselves (400 self_deactivation)', async () => {
    const before = await snapshot(adminId);
    const res = await admin.patch(`/api/users/${adminId}`, { active: false }).expect(400);
    expect(res.body).toEqual({ error: 'You cannot deactivate your own account.', code: 'self_deactivation' });
    expect(await snapshot(adminId)).toEqual(before);
    await admin.get('/api/auth/me').expect(200);
  });

  it('protects the last active admin (400 last_admin) and allows the change once there is another', async () => {
    const before = await snapshot(adminId);
    const res = await admin.patch(`/api/users/${adminId}`, { roles: ['operator'] }).expect(400);
    expect(res.body).toEqual({
      error: 'This is the last active administrator: make someone else an administrator first.',
      code: 'last_admin',
    });
    expect(await snapshot(adminId)).toEqual(before);
    await admin.patch(`/api/users/${adminId}`, { roles: ['operator'], active: true }).expect(400);
    expect(await snapshot(adminId)).toEqual(before);

    // Keeping admin among the roles is fine.
    const keep = await admin.patch(`/api/users/${adminId}`, { roles: ['admin', 'conductor'] }).expect(200);
    expect(keep.body.roles).toEqual(['admin', 'conductor']);

    // An inactive admin does not count as another admin.
    const dormant = await createUser({ roles: ['admin'], active: false });
    await admin.patch(`/api/users/${adminId}`, { roles: ['conductor'] }).expect(400);

    // With a second active admin, the first may step down; the second then is the last and is protected.
    const second = await createUser({ roles: ['admin'] });
    const secondClient = await t.client(second.email, second.password);
    await admin.patch(`/api/users/${adminId}`, { roles: ['conductor'] }).expect(200);
    expect((await snapshot(adminId)).roles).toEqual(['conductor']);
    const last = await secondClient.patch(`/api/users/${second.id}`, { roles: ['operator'] }).expect(400);
    expect(last.body.code).toBe('last_admin');

    // Restore the demo admin for the other tests.
    await secondClient.patch(`/api/users/${adminId}`, { roles: ['admin'] }).expect(200);
    await admin.patch(`/api/users/${second.id}`, { active: false }).expect(200);
    expect((await snapshot(adminId)).roles).toEqual(['admin']);
    expect((await snapshot(dormant.id)).active).toBe(false);
  });

  it('is 404 for a user id that does not exist', async () => {
    const res = await admin.patch('/api/users/999999', { roles: ['operator'] }).expect(404);
    expect(res.body).toEqual({ error: 'No such user.', code: 'not_found' });
  });

  const badBodies: [string, unknown, string][] = [
    ['roles []', { roles: [] }, 'roles'],
    ['an unknown role', { roles: ['pilot'] }, 'roles.0'],
    ['roles as a string', { roles: 'admin' }, 'roles'],
    ['too many roles', { roles: ['admin', 'conductor', 'safety', 'operator', 'auditor', 'admin'] }, 'roles'],
    ['active as a string', { active: 'false' }, 'active'],
    ['an extra field', { roles: ['operator'], email: 'taken@over.test' }, '(body)'],
    ['a huge role string', { roles: ['x'.repeat(100_000)] }, 'roles.0'],
    ['neither roles nor active', {}, '(body)'],
  ];
  it.each(badBodies)('rejects %s with 400 validation_failed and changes nothing', async (_name, body, path) => {
    const u = await createUser({ roles: ['operator'] });
    const before = await snapshot(u.id);
    const res = await admin.patch(`/api/users/${u.id}`, body as object).expect(400);
    expect(res.body.code).toBe('validation_failed');
    expect(res.body.error).toBe('Some fields are not valid.');
    expect(res.body.details).toEqual(expect.arrayContaining([expect.objectContaining({ path, message: expect.any(String) })]));
    expect(await snapshot(u.id)).toEqual(before);
  });

  it.each(['abc', '0', '-1', '1.5', '1e3x'])('rejects the id %j with 400 and details on id', async (id) => {
    const res = await admin.patch(`/api/users/${id}`, { roles: ['operator'] }).expect(400);
    expect(res.body.code).toBe('validation_failed');
    expect(res.body.details).toEqual([expect.objectContaining({ path: 'id' })]);
    expect((await snapshot(adminId)).roles).toEqual(['admin']);
  });
});
