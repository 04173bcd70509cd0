import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invitation, User } from '../../server/models';
import { DEMO, mailsTo, sleep, tokenFromLink, uniqueEmail, waitForMails } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

let t: TestApp;
let admin: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  admin = await t.client(DEMO.admin);
});
afterAll(() => t.stop());

/** Invites `email` as the admin and returns the token from the mail that arrives. */
async function invite(email: string, roles: string[] = ['operator'], mailsBefore = 0) {
  const res = await admin.post('/api/invitations', { email, roles }).expect(201);
  const mails = await waitForMails(admin, email, mailsBefore + 1);
  return { res, mail: mails[0]!, token: tokenFromLink(mails[0]!.text, 'invite') };
}

describe('POST /api/invitations', () => {
  it('creates the invitation (201) and mails a one-time link', async () => {
    const email = uniqueEmail('invitee');
    const { res, mail, token } = await invite(email, ['operator', 'conductor']);
    expect(res.body).toEqual({
      id: expect.any(Number),
      email,
      roles: ['conductor', 'operator'],
      expiresAt: expect.any(String),
      acceptedAt: null,
      createdAt: expect.any(String),
    });
    const days = (Date.parse(res.body.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(6.9);
    expect(days).toBeLessThanOrEqual(7);

    expect(Object.keys(mail).sort()).toEqual(['id', 'sentAt', 'subject', 'text', 'to']);
    expect(mail.to).toBe(email);
    expect(mail.subject).toBe('You are invited to Tern Valley Rocketry Collective on Holdfire');
    expect(mail.text).toContain('Ines Okafor invited you');
    expect(mail.text).toContain('Test conductor, Station operator');
    expect(mail.text).toMatch(new RegExp(`http://holdfire\\.test/invite/${token}(\\s|$)`));
    expect(token.length).toBeGreaterThanOrEqual(40);
    expect(Number.isNaN(Date.parse(mail.sentAt))).toBe(false);

    // Only the hash is stored.
    const row = await Invitation.findByPk(res.body.id);
    expect(row!.tokenHash).not.toContain(token);
    expect(row!.tokenHash).toMatch(/^[0-9a-f]{64}$/);

    const pending = await admin.get('/api/invitations').expect(200);
    expect(pending.body.map((i: { email: string }) => i.email)).toContain(email);
  });

  it('normalises the e-mail address', async () => {
    const email = uniqueEmail('mixedcase');
    const res = await admin.post('/api/invitations', { email: `  ${email.toUpperCase()} `, roles: ['auditor'] }).expect(201);
    expect(res.body.email).toBe(email);
    await waitForMails(admin, email);
  });

  it('is 409 already_exists for the e-mail of an existing user, and sends nothing', async () => {
    const res = await admin.post('/api/invitations', { email: DEMO.pad, roles: ['admin'] }).expect(409);
    expect(res.body).toEqual({ error: 'Someone with this e-mail already has an account.', code: 'already_exists' });
    expect(await Invitation.count({ where: { email: DEMO.pad } })).toBe(0);
    await sleep(100);
    expect(await mailsTo(admin, DEMO.pad)).toEqual([]);
  });

  it.each([
    ['no roles', { email: 'x@example.test', roles: [] }, 'roles'],
    ['an unknown role', { email: 'x@example.test', roles: ['root'] }, 'roles.0'],
    ['a bad e-mail', { email: 'not-an-email', roles: ['operator'] }, 'email'],
    ['a huge e-mail', { email: 'a'.repeat(300) + '@example.test', roles: ['operator'] }, 'email'],
    ['an extra field', { email: 'x@example.test', roles: ['operator'], teamId: 2 }, '(body)'],
  ])('rejects %s with 400 and creates nothing', async (_name, body, path) => {
    const count = await Invitation.count();
    const res = await admin.post('/api/invitations', body).expect(400);
    expect(res.body.code).toBe('validation_failed');
    expect(res.body.details).toEqual(expect.arrayContaining([expect.objectContaining({ path })]));
    expect(await Invitation.count()).toBe(count);
  });

  it('re-inviting replaces the earlier pending invitation: the old token stops working', async () => {
    const email = uniqueEmail('reinvite');
    const first = await invite(email, ['operator']);
    const second = await invite(email, ['safety'], 1);
    expect(second.token).not.toBe(first.token);

    const old = await request(t.holdfire.app).get(`/api/invitations/by-token/${first.token}`).expect(404);
    expect(old.body.code).toBe('not_found');
    const fresh = await request(t.holdfire.app).get(`/api/invitations/by-token/${second.token}`).expect(200);
    expect(fresh.body.roles).toEqual(['safety']);
    expect(await Invitation.count({ where: { email } })).toBe(1);

    const anon = await t.client();
    await anon.post('/api/invitations/accept', { token: first.token, name: 'Old Link', password: 'long-enough-pw' }).expect(404);
    expect(await User.count({ where: { email } })).toBe(0);
  });
});

describe('accepting an invitation', () => {
  it('shows the invitation by token, then accept (201) creates the user and signs them in with the invited roles', async () => {
    const email = uniqueEmail('accept');
    const { token } = await invite(email, ['safety', 'auditor']);

    const preview = await request(t.holdfire.app).get(`/api/invitations/by-token/${token}`).expect(200);
    expect(preview.body).toEqual({ email, roles: ['safety', 'auditor'], expiresAt: expect.any(String) });

    const c = await t.client();
    const res = await c.post('/api/invitations/accept', { token, name: '  Rosa Quill ', password: 'a-long-new-password' }).expect(201);
    expect(res.body).toEqual({ id: expect.any(Number), email, name: 'Rosa Quill', roles: ['safety', 'auditor'] });

    const me = await c.get('/api/auth/me').expect(200);
    expect(me.body).toEqual(res.body);
    const row = await User.findOne({ where: { email } });
    expect(row).toMatchObject({ name: 'Rosa Quill', roles: ['safety', 'auditor'], active: true });
    expect(row!.passwordHash).not.toContain('a-long-new-password');

    // The new password works for a fresh sign-in.
    await (await t.client()).post('/api/auth/login', { email, password: 'a-long-new-password' }).expect(200);

    // It is no longer pending.
    const pending = await admin.get('/api/invitations').expect(200);
    expect(pending.body.map((i: { email: string }) => i.email)).not.toContain(email);
    const inv = await Invitation.findOne({ where: { email } });
    expect(inv!.acceptedAt).toBeInstanceOf(Date);
  });

  it('a second accept of the same link is 409 used and creates nobody', async () => {
    const email = uniqueEmail('twice');
    const { token } = await invite(email);
    await (await t.client()).post('/api/invitations/accept', { token, name: 'First', password: 'first-password-1' }).expect(201);

    const c = await t.client();
    const res = await c.post('/api/invitations/accept', { token, name: 'Second', password: 'second-password-2' }).expect(409);
    expect(res.body).toEqual({ error: 'This invitation has been used already. Sign in instead.', code: 'used' });
    await c.get('/api/auth/me').expect(401);
    const users = await User.findAll({ where: { email } });
    expect(users.map((u) => u.name)).toEqual(['First']);
    await request(t.holdfire.app).get(`/api/invitations/by-token/${token}`).expect(409);
    // The second password did not replace the first.
    await (await t.client()).post('/api/auth/login', { email, password: 'second-password-2' }).expect(401);
  });

  it('an expired invitation is 410 expired for the preview and the accept', async () => {
    const email = uniqueEmail('expired');
    const { token } = await invite(email);
    await Invitation.update({ expiresAt: new Date(Date.now() - 60_000) }, { where: { email } });

    const preview = await request(t.holdfire.app).get(`/api/invitations/by-token/${token}`).expect(410);
    expect(preview.body).toEqual({ error: 'This invitation has expired. Ask your administrator for a new one.', code: 'expired' });
    const c = await t.client();
    const res = await c.post('/api/invitations/accept', { token, name: 'Late', password: 'too-late-password' }).expect(410);
    expect(res.body.code).toBe('expired');
    expect(await User.count({ where: { email } })).toBe(0);
    await c.get('/api/auth/me').expect(401);
    // Expired invitations are not listed as pending.
    const pending = await admin.get('/api/invitations').expect(200);
    expect(pending.body.map((i: { email: string }) => i.email)).not.toContain(email);
  });

  it('an unknown token is 404, a malformed one 400', async () => {
    const unknown = await request(t.holdfire.app).get(`/api/invitations/by-token/${'Z'.repeat(43)}`).expect(404);
    expect(unknown.body.code).toBe('not_found');
    const bad = await request(t.holdfire.app).get('/api/invitations/by-token/short').expect(400);
    expect(bad.body.code).toBe('validation_failed');
    expect(bad.body.details).toEqual([expect.objectContaining({ path: 'token' })]);
  });

  it('a too-short password or missing name is 400, and the invitation stays usable', async () => {
    const email = uniqueEmail('weakpw');
    const { token } = await invite(email);
    const c = await t.client();
    const short = await c.post('/api/invitations/accept', { token, name: 'Weak', password: 'short' }).expect(400);
    expect(short.body.details).toEqual([expect.objectContaining({ path: 'password' })]);
    const noName = await c.post('/api/invitations/accept', { token, name: '   ', password: 'long-enough-pw' }).expect(400);
    expect(noName.body.details).toEqual([expect.objectContaining({ path: 'name' })]);
    const tooLong = await c.post('/api/invitations/accept', { token, name: 'n', password: 'p'.repeat(73) }).expect(400);
    expect(tooLong.body.details).toEqual([expect.objectContaining({ path: 'password' })]);
    expect(await User.count({ where: { email } })).toBe(0);
    await c.post('/api/invitations/accept', { token, name: 'Strong', password: 'long-enough-pw' }).expect(201);
  });

  it('accept is 409 already_exists if an account with that e-mail appeared meanwhile', async () => {
    const email = uniqueEmail('raced');
    const { token } = await invite(email);
    await User.create({ teamId: 1, email, name: 'Already Here', passwordHash: 'x', roles: ['operator'] });
    const res = await (await t.client()).post('/api/invitations/accept', { token, name: 'Newcomer', password: 'long-enough-pw' }).expect(409);
    expect(res.body.code).toBe('already_exists');
    expect((await User.findAll({ where: { email } })).map((u) => u.name)).toEqual(['Already Here']);
  });
});
