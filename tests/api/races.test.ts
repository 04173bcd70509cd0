import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Team, User } from '../../server/models';
import { DEMO, tokenFromLink, uniqueEmail, waitForMails } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

/**
 * Double submits (a double click, a retry after a slow answer) of the one-time actions. Exactly one may win;
 * the others must get the ordinary conflict answer, never a 500.
 */

describe('concurrent first-admin setup', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp({ seed: 'none' });
  });
  afterAll(() => t.stop());

  it('creates exactly one admin; the other requests get 409 already_set_up', async () => {
    const clients = await Promise.all([t.client(), t.client(), t.client()]);
    const results = await Promise.all(
      clients.map((c, i) =>
        c.post('/api/setup', { teamName: `Team ${i}`, name: `Admin ${i}`, email: `admin${i}@race.test`, password: 'race-password-1' }),
      ),
    );
    const statuses = results.map((r) => r.status).sort();
    expect(statuses, JSON.stringify(results.map((r) => r.body))).toEqual([201, 409, 409]);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.code).toBe('already_set_up');
    expect(await User.count()).toBe(1);
    expect(await Team.count()).toBe(1);
  });
});

describe('concurrent accepts of one invitation', () => {
  let t: TestApp;
  let admin: TestClient;
  beforeAll(async () => {
    t = await startTestApp();
    admin = await t.client(DEMO.admin);
  });
  afterAll(() => t.stop());

  it('creates exactly one user; the other request gets 409, not 500', async () => {
    const email = uniqueEmail('double');
    await admin.post('/api/invitations', { email, roles: ['operator'] }).expect(201);
    const [mail] = await waitForMails(admin, email);
    const token = tokenFromLink(mail!.text, 'invite');

    const [a, b] = await Promise.all([t.client(), t.client()]);
    const results = await Promise.all([
      a!.post('/api/invitations/accept', { token, name: 'Click One', password: 'double-click-pw' }),
      b!.post('/api/invitations/accept', { token, name: 'Click Two', password: 'double-click-pw' }),
    ]);
    const statuses = results.map((r) => r.status).sort();
    expect(statuses, JSON.stringify(results.map((r) => r.body))).toEqual([201, 409]);
    expect(await User.count({ where: { email } })).toBe(1);
  });

  it('a reset link used twice at once changes the password only once', async () => {
    const email = DEMO.auditor;
    await (await t.client()).post('/api/password-resets', { email }).expect(202);
    const [mail] = await waitForMails(admin, email);
    const token = tokenFromLink(mail!.text, 'reset-password');

    const [a, b] = await Promise.all([t.client(), t.client()]);
    const results = await Promise.all([
      a!.post('/api/password-resets/complete', { token, password: 'reset-choice-one' }),
      b!.post('/api/password-resets/complete', { token, password: 'reset-choice-two' }),
    ]);
    const statuses = results.map((r) => r.status).sort();
    expect(statuses, JSON.stringify(results.map((r) => r.body))).toEqual([204, 410]);
  });
});
