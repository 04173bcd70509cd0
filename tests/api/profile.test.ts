import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../server/models';
import { createUser } from '../helpers/api';
import { startTestApp, type TestApp } from '../helpers/app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.stop());

async function canSignIn(email: string, password: string): Promise<boolean> {
  return (await (await t.client()).post('/api/auth/login', { email, password })).status === 200;
}

describe('PATCH /api/profile', () => {
  it('changes the signed-in user’s name (trimmed) and nothing else', async () => {
    const u = await createUser({ name: 'Old Name', roles: ['operator'] });
    const c = await t.client(u.email, u.password);
    const res = await c.patch('/api/profile', { name: '  New Name  ' }).expect(200);
    expect(res.body).toEqual({ id: u.id, email: u.email, name: 'New Name', roles: ['operator'] });
    expect((await c.get('/api/auth/me').expect(200)).body.name).toBe('New Name');
    const row = await User.findByPk(u.id);
    expect(row).toMatchObject({ name: 'New Name', roles: ['operator'], active: true });
  });

  it.each([
    ['an empty name', { name: '   ' }, 'name'],
    ['a 121-character name', { name: 'n'.repeat(121) }, 'name'],
    ['a huge name', { name: 'n'.repeat(150_000) }, 'name'],
    ['a non-string name', { name: 42 }, 'name'],
    ['an attempt to change roles', { name: 'Sneaky', roles: ['admin'] }, '(body)'],
  ])('rejects %s with 400 and keeps the name', async (_label, body, path) => {
    const u = await createUser({ name: 'Steady Name', roles: ['operator'] });
    const c = await t.client(u.email, u.password);
    const res = await c.patch('/api/profile', body).expect(400);
    expect(res.body.code).toBe('validation_failed');
    expect(res.body.details).toEqual(expect.arrayContaining([expect.objectContaining({ path })]));
    expect(await User.findByPk(u.id)).toMatchObject({ name: 'Steady Name', roles: ['operator'] });
  });
});

describe('POST /api/profile/password', () => {
  it('needs the current password: a wrong one is 400 bad_password with details on currentPassword', async () => {
    const u = await createUser({ password: 'current-password' });
    const c = await t.client(u.email, u.password);
    const before = (await User.findByPk(u.id))!.passwordHash;
    const res = await c.post('/api/profile/password', { currentPassword: 'not-my-password', newPassword: 'brand-new-password' }).expect(400);
    expect(res.body).toEqual({
      error: 'Your current password is not right.',
      code: 'bad_password',
      details: [{ path: 'currentPassword', message: 'Not your current password' }],
    });
    expect((await User.findByPk(u.id))!.passwordHash).toBe(before);
    expect(await canSignIn(u.email, 'current-password')).toBe(true);
    expect(await canSignIn(u.email, 'brand-new-password')).toBe(false);
  });

  it('with the right current password sets the new one (204): old fails, new works, session stays', async () => {
    const u = await createUser({ password: 'current-password' });
    const c = await t.client(u.email, u.password);
    const res = await c.post('/api/profile/password', { currentPassword: 'current-password', newPassword: 'brand-new-password' }).expect(204);
    expect(res.text).toBe('');
    expect(await canSignIn(u.email, 'current-password')).toBe(false);
    expect(await canSignIn(u.email, 'brand-new-password')).toBe(true);
    await c.get('/api/auth/me').expect(200);
  });

  it('rejects a weak new password with 400 on newPassword and keeps the old one', async () => {
    const u = await createUser({ password: 'current-password' });
    const c = await t.client(u.email, u.password);
    const res = await c.post('/api/profile/password', { currentPassword: 'current-password', newPassword: 'short' }).expect(400);
    expect(res.body.code).toBe('validation_failed');
    expect(res.body.details).toEqual([expect.objectContaining({ path: 'newPassword' })]);
    expect(await canSignIn(u.email, 'current-password')).toBe(true);
  });

  it('is 401 when not signed in', async () => {
    const c = await t.client();
    const res = await c.post('/api/profile/password', { currentPassword: 'x', newPassword: 'brand-new-password' }).expect(401);
    expect(res.body.code).toBe('unauthenticated');
  });
});
