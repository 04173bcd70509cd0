import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Team, User } from '../../server/models';
import { startTestApp, type TestApp } from '../helpers/app';

// The models are process-wide, so the two apps here run one after the other, never together.

describe('an empty install (HOLDFIRE_SEED=none)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp({ seed: 'none' });
  });
  afterAll(() => t.stop());

  const admin = { teamName: 'Gannet Propulsion Lab', name: 'Aoife Strand', email: 'aoife@gannet.test', password: 'first-admin-pw' };

  it('GET /api/setup says it needs a first admin, and nobody can sign in', async () => {
    const res = await request(t.holdfire.app).get('/api/setup').expect(200);
    expect(res.body).toEqual({ needsFirstAdmin: true, teamName: null });
    expect(await User.count()).toBe(0);
    const c = await t.client();
    await c.post('/api/auth/login', { email: 'admin@ternvalley.test', password: 'kestrel-demo' }).expect(401);
  });

  it('rejects a bad setup body with 400 and creates nothing', async () => {
    const c = await t.client();
    const res = await c.post('/api/setup', { ...admin, password: 'short', email: 'not-an-email' }).expect(400);
    expect(res.body.code).toBe('validation_failed');
    expect(res.body.details.map((d: { path: string }) => d.path).sort()).toEqual(['email', 'password']);
    const extra = await c.post('/api/setup', { ...admin, roles: ['admin', 'auditor'] }).expect(400);
    expect(extra.body.code).toBe('validation_failed');
    expect(await User.count()).toBe(0);
    expect((await request(t.holdfire.app).get('/api/setup')).body.needsFirstAdmin).toBe(true);
  });

  it('POST /api/setup creates the team and the admin (201) and signs them in', async () => {
    const c = await t.client();
    const res = await c.post('/api/setup', { ...admin, email: ' Aoife@Gannet.TEST ' }).expect(201);
    expect(res.body).toEqual({ id: expect.any(Number), email: admin.email, name: admin.name, roles: ['admin'] });
    await c.refreshCsrf();
    const me = await c.get('/api/auth/me').expect(200);
    expect(me.body).toEqual(res.body);
    // Signed in as an admin for real: admin-only routes answer.
    const users = await c.get('/api/users').expect(200);
    expect(users.body.map((u: { email: string }) => u.email)).toEqual([admin.email]);

    expect(await Team.count()).toBe(1);
    expect((await Team.findOne())!.name).toBe(admin.teamName);
    const status = await request(t.holdfire.app).get('/api/setup').expect(200);
    expect(status.body).toEqual({ needsFirstAdmin: false, teamName: admin.teamName });

    await (await t.client()).post('/api/auth/login', { email: admin.email, password: admin.password }).expect(200);
  });

  it('a second POST /api/setup is 409 already_set_up and changes nothing', async () => {
    const c = await t.client();
    const res = await c
      .post('/api/setup', { teamName: 'Hijack Team', name: 'Mallory', email: 'mallory@evil.test', password: 'mallory-password' })
      .expect(409);
    expect(res.body).toEqual({ error: 'Holdfire is set up already. Sign in instead.', code: 'already_set_up' });
    expect(await User.count()).toBe(1);
    expect(await User.count({ where: { email: 'mallory@evil.test' } })).toBe(0);
    expect((await Team.findOne())!.name).toBe(admin.teamName);
    await c.get('/api/auth/me').expect(401);
  });
});

describe('a demo install', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.stop());

  it('GET /api/setup says no first admin is needed, and POST is refused', async () => {
    const res = await request(t.holdfire.app).get('/api/setup').expect(200);
    expect(res.body).toEqual({ needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
    const c = await t.client();
    const post = await c
      .post('/api/setup', { teamName: 'Other', name: 'Someone', email: 'someone@else.test', password: 'someone-password' })
      .expect(409);
    expect(post.body.code).toBe('already_set_up');
    expect(await User.count({ where: { email: 'someone@else.test' } })).toBe(0);
  });
});
