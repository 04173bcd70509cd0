import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS } from '../../server/db/seed';
import { Invitation, User } from '../../server/models';
import { createUser, DEMO, mailsTo, sessionCookie, sessionCookieLine, signInWithCookie, uniqueEmail, withCookie } from '../helpers/api';
import { startTestApp, type TestApp } from '../helpers/app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.stop());

const BAD_CREDENTIALS = { error: 'E-mail or password is not right.', code: 'bad_credentials' };

describe('sign-in', () => {
  it.each(DEMO_USERS.map((u) => [u.email, u] as const))('%s signs in and /api/auth/me shows its roles', async (email, demo) => {
    const c = await t.client();
    const login = await c.post('/api/auth/login', { email, password: 'kestrel-demo' }).expect(200);
    const dbUser = await User.findOne({ where: { email } });
    expect(login.body).toEqual({ id: dbUser!.id, email, name: demo.name, roles: demo.roles });
    expect(login.body).not.toHaveProperty('passwordHash');

    const me = await c.get('/api/auth/me').expect(200);
    expect(me.body).toEqual({ id: dbUser!.id, email, name: demo.name, roles: demo.roles });
  });

  it('accepts the e-mail in any case and with spaces around it', async () => {
    const c = await t.client();
    const res = await c.post('/api/auth/login', { email: '  Conductor@TernValley.TEST ', password: 'kestrel-demo' }).expect(200);
    expect(res.body.email).toBe(DEMO.conductor);
    expect(res.body.roles).toEqual(['conductor']);
  });

  it('anonymous /api/auth/me is 401 unauthenticated', async () => {
    const res = await request(t.holdfire.app).get('/api/auth/me').expect(401);
    expect(res.body).toEqual({ error: 'Sign in to continue.', code: 'unauthenticated' });
    expect(res.headers['content-type']).toMatch(/application\/json/);
  });

  it('a bad password and an unknown e-mail give the identical 401 body, and no session', async () => {
    const c1 = await t.client();
    const badPassword = await c1.post('/api/auth/login', { email: DEMO.admin, password: 'not-the-password' });
    const c2 = await t.client();
    const unknown = await c2.post('/api/auth/login', { email: 'nobody@ternvalley.test', password: 'kestrel-demo' });

    expect(badPassword.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(badPassword.body).toEqual(BAD_CREDENTIALS);
    expect(unknown.body).toEqual(badPassword.body);
    expect(unknown.text).toBe(badPassword.text);
    await c1.get('/api/auth/me').expect(401);
    await c2.get('/api/auth/me').expect(401);
  });

  it('an inactive account gets the same 401 body as a wrong password', async () => {
    const u = await createUser({ active: false });
    const c = await t.client();
    const res = await c.post('/api/auth/login', { email: u.email, password: u.password }).expect(401);
    expect(res.body).toEqual(BAD_CREDENTIALS);
    await c.get('/api/auth/me').expect(401);
  });

  it('a login body with missing or extra fields is 400 validation_failed', async () => {
    const c = await t.client();
    const missing = await c.post('/api/auth/login', { email: DEMO.admin }).expect(400);
    expect(missing.body.code).toBe('validation_failed');
    expect(missing.body.details).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'password' })]));

    const extra = await c.post('/api/auth/login', { email: DEMO.admin, password: 'kestrel-demo', remember: true }).expect(400);
    expect(extra.body.code).toBe('validation_failed');
    await c.get('/api/auth/me').expect(401);
  });
});

describe('CSRF', () => {
  it('a POST without X-CSRF-Token is 403 csrf_invalid and changes nothing', async () => {
    const admin = await t.client(DEMO.admin);
    const email = uniqueEmail('nocsrf');
    const res = await admin.agent.post('/api/invitations').send({ email, roles: ['operator'] }).expect(403);
    expect(res.body).toEqual({ error: 'This form has expired. Reload the page and try again.', code: 'csrf_invalid' });

    expect(await Invitation.count({ where: { email } })).toBe(0);
    const list = await admin.get('/api/invitations').expect(200);
    expect(list.body.map((i: { email: string }) => i.email)).not.toContain(email);
    expect(await mailsTo(admin, email)).toEqual([]);

    // The same request with the token goes through, so the 403 above was the missing token and nothing else.
    await admin.post('/api/invitations', { email, roles: ['operator'] }).expect(201);
    expect(await Invitation.count({ where: { email } })).toBe(1);
  });

  it('a PATCH with a wrong token is refused and the user is unchanged', async () => {
    const admin = await t.client(DEMO.admin);
    const target = await createUser({ roles: ['operator'] });
    const res = await admin.agent
      .patch(`/api/users/${target.id}`)
      .set('X-CSRF-Token', 'forged-token-value')
      .send({ roles: ['admin'] })
      .expect(403);
    expect(res.body.code).toBe('csrf_invalid');
    expect((await User.findByPk(target.id))!.roles).toEqual(['operator']);
  });

  it('a CSRF token from another session is refused', async () => {
    const attacker = await t.client(DEMO.propellants);
    const victim = await t.client(DEMO.admin);
    const email = uniqueEmail('crosscsrf');
    const res = await victim.agent
      .post('/api/invitations')
      .set('X-CSRF-Token', attacker.csrf)
      .send({ email, roles: ['admin'] })
      .expect(403);
    expect(res.body.code).toBe('csrf_invalid');
    expect(await Invitation.count({ where: { email } })).toBe(0);
  });

  it('the login itself needs a CSRF token (no login CSRF)', async () => {
    const agent = request.agent(t.holdfire.app);
    const res = await agent.post('/api/auth/login').send({ email: DEMO.admin, password: 'kestrel-demo' }).expect(403);
    expect(res.body.code).toBe('csrf_invalid');
    await agent.get('/api/auth/me').expect(401);
  });

  it('the pre-login CSRF token stops working after sign-in', async () => {
    const c = await t.client();
    const before = c.csrf;
    await c.post('/api/auth/login', { email: DEMO.conductor, password: 'kestrel-demo' }).expect(200);
    const res = await c.agent.patch('/api/profile').set('X-CSRF-Token', before).send({ name: 'Hijacked' }).expect(403);
    expect(res.body.code).toBe('csrf_invalid');
    expect((await User.findOne({ where: { email: DEMO.conductor } }))!.name).toBe('Marek Lindqvist');
  });

  it('a second tab of the same session fetching a token does not void the first tab’s', async () => {
    const c = await t.client(DEMO.safety);
    const first = c.csrf;
    const second = (await c.agent.get('/api/auth/csrf').expect(200)).body.csrfToken;
    expect(second).toBe(first);
    await c.agent.patch('/api/profile').set('X-CSRF-Token', first).send({ name: 'Priya Halloran' }).expect(200);
  });
});

describe('sessions', () => {
  it('the session id changes at login and the pre-login id is never signed in (no fixation)', async () => {
    const c = await t.client();
    const csrfRes = await c.agent.get('/api/auth/csrf').expect(200);
    c.csrf = csrfRes.body.csrfToken;
    const preLogin = sessionCookie(csrfRes);
    expect(preLogin).toMatch(/^holdfire\.sid=.+/);

    const login = await c.post('/api/auth/login', { email: DEMO.admin, password: 'kestrel-demo' }).expect(200);
    const postLogin = sessionCookie(login);
    expect(postLogin).toMatch(/^holdfire\.sid=.+/);
    expect(postLogin).not.toBe(preLogin);

    await withCookie(t, preLogin!).get('/api/auth/me').expect(401);
    const me = await withCookie(t, postLogin!).get('/api/auth/me').expect(200);
    expect(me.body.email).toBe(DEMO.admin);
  });

  it('logout ends the session on the server, not just in the browser', async () => {
    const { client, cookie } = await signInWithCookie(t, DEMO.safety);
    await withCookie(t, cookie).get('/api/auth/me').expect(200);

    const out = await client.post('/api/auth/logout').expect(204);
    expect(out.text).toBe('');
    const me = await client.get('/api/auth/me').expect(401);
    expect(me.body.code).toBe('unauthenticated');
    // A copy of the old cookie (stolen, or kept by a second tab) no longer authenticates either.
    await withCookie(t, cookie).get('/api/auth/me').expect(401);
  });

  it('logout without a session is harmless', async () => {
    const c = await t.client();
    await c.post('/api/auth/logout').expect(204);
    await c.get('/api/auth/me').expect(401);
  });

  it('a garbage or tampered session cookie is simply not signed in', async () => {
    const { cookie } = await signInWithCookie(t, DEMO.auditor);
    const tampered = cookie.slice(0, -3) + (cookie.endsWith('AAA') ? 'BBB' : 'AAA');
    const res = await withCookie(t, tampered).get('/api/auth/me').expect(401);
    expect(res.body.code).toBe('unauthenticated');
    await withCookie(t, 'holdfire.sid=s%3Anot-a-session.bad').get('/api/auth/me').expect(401);
  });

  it('the session cookie is httpOnly, SameSite=Lax, and not Secure on an http APP_URL', async () => {
    const c = await t.client();
    const res = await c.post('/api/auth/login', { email: DEMO.data, password: 'kestrel-demo' }).expect(200);
    const line = sessionCookieLine(res);
    expect(line).toBeDefined();
    const flags = line!.split(';').map((p) => p.trim().toLowerCase());
    expect(flags).toContain('httponly');
    expect(flags).toContain('samesite=lax');
    expect(flags).toContain('path=/');
    expect(flags).not.toContain('secure');
    expect(flags.some((f) => f.startsWith('expires='))).toBe(true);
    expect(res.headers['strict-transport-security']).toBeUndefined();
  });
});
