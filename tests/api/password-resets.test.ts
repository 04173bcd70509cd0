import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PasswordReset, User } from '../../server/models';
import { createUser, DEMO, mailsTo, outbox, sleep, tokenFromLink, uniqueEmail, waitForMails } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

let t: TestApp;
let admin: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  admin = await t.client(DEMO.admin);
});
afterAll(() => t.stop());

async function requestReset(email: string, mailsBefore = 0) {
  const anon = await t.client();
  const res = await anon.post('/api/password-resets', { email }).expect(202);
  expect(res.body).toEqual({ ok: true });
  const mails = await waitForMails(admin, email, mailsBefore + 1);
  return tokenFromLink(mails[0]!.text, 'reset-password');
}

async function canSignIn(email: string, password: string): Promise<boolean> {
  const res = await (await t.client()).post('/api/auth/login', { email, password });
  return res.status === 200;
}

describe('requesting a reset', () => {
  it('for a known e-mail answers 202 and mails a reset link', async () => {
    const u = await createUser({});
    const anon = await t.client();
    const res = await anon.post('/api/password-resets', { email: u.email.toUpperCase() }).expect(202);
    expect(res.body).toEqual({ ok: true });
    const [mail] = await waitForMails(admin, u.email);
    expect(mail!.subject).toBe('Reset your Holdfire password');
    expect(mail!.text).toContain(`reset the Holdfire password for ${u.email}`);
    const token = tokenFromLink(mail!.text, 'reset-password');
    expect(token.length).toBeGreaterThanOrEqual(40);
    const row = await PasswordReset.findOne({ where: { userId: u.id } });
    expect(row!.usedAt).toBeNull();
    const hours = (row!.expiresAt.getTime() - Date.now()) / 3_600_000;
    expect(hours).toBeGreaterThan(0.9);
    expect(hours).toBeLessThanOrEqual(1);
  });

  it('for an unknown e-mail answers the same 202 body and sends no mail', async () => {
    const known = await createUser({});
    const unknownEmail = uniqueEmail('ghost');
    const c = await t.client();
    const a = await c.post('/api/password-resets', { email: known.email }).expect(202);
    const b = await c.post('/api/password-resets', { email: unknownEmail }).expect(202);
    expect(b.body).toEqual(a.body);
    expect(b.text).toBe(a.text);
    await waitForMails(admin, known.email);
    await sleep(150);
    expect(await mailsTo(admin, unknownEmail)).toEqual([]);
    expect((await outbox(admin)).some((m) => m.to.includes('ghost'))).toBe(false);
  });

  it('for an inactive account answers 202 and sends no mail', async () => {
    const u = await createUser({ active: false });
    await (await t.client()).post('/api/password-resets', { email: u.email }).expect(202);
    await sleep(150);
    expect(await mailsTo(admin, u.email)).toEqual([]);
    expect(await PasswordReset.count({ where: { userId: u.id } })).toBe(0);
  });

  it('rejects a malformed e-mail with 400', async () => {
    const res = await (await t.client()).post('/api/password-resets', { email: 'nope' }).expect(400);
    expect(res.body.details).toEqual([expect.objectContaining({ path: 'email' })]);
  });
});

describe('completing a reset', () => {
  it('sets the new password: the old one fails, the new one works', async () => {
    const u = await createUser({ password: 'the-old-password' });
    const token = await requestReset(u.email);
    const before = (await User.findByPk(u.id))!.passwordHash;

    const res = await (await t.client()).post('/api/password-resets/complete', { token, password: 'the-new-password' }).expect(204);
    expect(res.text).toBe('');
    expect((await User.findByPk(u.id))!.passwordHash).not.toBe(before);
    expect(await canSignIn(u.email, 'the-old-password')).toBe(false);
    expect(await canSignIn(u.email, 'the-new-password')).toBe(true);
  });

  it('is single use: the second completion is 410 and does not change the password', async () => {
    const u = await createUser({ password: 'the-old-password' });
    const token = await requestReset(u.email);
    const c = await t.client();
    await c.post('/api/password-resets/complete', { token, password: 'first-new-password' }).expect(204);
    const again = await c.post('/api/password-resets/complete', { token, password: 'second-new-password' }).expect(410);
    expect(again.body).toEqual({ error: 'This reset link has expired or was used already. Ask for a new one.', code: 'expired' });
    expect(await canSignIn(u.email, 'first-new-password')).toBe(true);
    expect(await canSignIn(u.email, 'second-new-password')).toBe(false);
  });

  it('an expired token is 410 and the password stays', async () => {
    const u = await createUser({ password: 'the-old-password' });
    const token = await requestReset(u.email);
    await PasswordReset.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: u.id } });
    const res = await (await t.client()).post('/api/password-resets/complete', { token, password: 'never-applied-pw' }).expect(410);
    expect(res.body.code).toBe('expired');
    expect(await canSignIn(u.email, 'the-old-password')).toBe(true);
    expect(await canSignIn(u.email, 'never-applied-pw')).toBe(false);
  });

  it('an unknown token is 410, a malformed token or weak password 400', async () => {
    const c = await t.client();
    const unknown = await c.post('/api/password-resets/complete', { token: 'Q'.repeat(43), password: 'whatever-password' }).expect(410);
    expect(unknown.body.code).toBe('expired');
    const malformed = await c.post('/api/password-resets/complete', { token: 'bad token!', password: 'whatever-password' }).expect(400);
    expect(malformed.body.details).toEqual([expect.objectContaining({ path: 'token' })]);

    const u = await createUser({ password: 'the-old-password' });
    const token = await requestReset(u.email);
    const weak = await c.post('/api/password-resets/complete', { token, password: 'short' }).expect(400);
    expect(weak.body.details).toEqual([expect.objectContaining({ path: 'password' })]);
    // A rejected attempt does not use up the token.
    await c.post('/api/password-resets/complete', { token, password: 'now-long-enough' }).expect(204);
  });

  it('a reset for an account deactivated after the request is 410', async () => {
    const u = await createUser({ password: 'the-old-password' });
    const token = await requestReset(u.email);
    await User.update({ active: false }, { where: { id: u.id } });
    const res = await (await t.client()).post('/api/password-resets/complete', { token, password: 'new-password-123' }).expect(410);
    expect(res.body.code).toBe('expired');
  });
});

describe('reset-link requests are limited per address', () => {
  it('answers 429 after twenty requests in an hour from one address', async () => {
    const c = await t.client();
    const ip = '198.51.100.77';
    for (let i = 0; i < 20; i++) {
      await c.post('/api/password-resets', { email: `nobody-${i}@ternvalley.test` }).set('X-Forwarded-For', ip).expect(202);
    }
    const refused = await c.post('/api/password-resets', { email: 'pad@ternvalley.test' }).set('X-Forwarded-For', ip).expect(429);
    expect(refused.body.code).toBe('rate_limited');
    // Another address is not affected.
    await c.post('/api/password-resets', { email: 'nobody@ternvalley.test' }).set('X-Forwarded-For', '198.51.100.78').expect(202);
  });
});
