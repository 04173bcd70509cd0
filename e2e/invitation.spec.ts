import { expect, storageStateFor, test } from './fixtures';

test.use({ storageState: storageStateFor('admin') });

test('an invitation arrives in the outbox and its link completes sign-up', async ({ page, browser, consoleErrors }) => {
  void consoleErrors;
  const email = `cryo-${Date.now()}@ternvalley.test`;
  await page.goto('/admin/people');
  const form = page.getByRole('form', { name: 'Invite someone' });
  await form.getByLabel('E-mail').fill(email);
  await form.getByRole('checkbox', { name: /Station operator/ }).check();
  await form.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(email).first()).toBeVisible();

  await page.getByRole('navigation', { name: /main/i }).getByRole('link', { name: 'Mail outbox', exact: true }).click();
  await expect(page.getByText(email).first()).toBeVisible();
  const outbox = await (await page.request.get('/api/mail/outbox')).json();
  const message = outbox.find((m: { to: string }) => m.to === email);
  expect(message.subject).toContain('Tern Valley Rocketry Collective');
  const link = /http:\/\/localhost:\d+\/invite\/[A-Za-z0-9_-]+/.exec(message.text)?.[0];
  expect(link).toBeTruthy();

  // The invitee has no session of their own yet.
  const context = await browser.newContext({ storageState: { cookies: [], origins: [] } });
  const invitee = await context.newPage();
  await invitee.goto(link!);
  await expect(invitee.getByText(email)).toBeVisible();
  await invitee.getByLabel('Your name').fill('Rosa Dunmore');
  await invitee.getByLabel('Password', { exact: true }).fill('cold-flow-2026');
  await invitee.getByRole('button', { name: 'Create account' }).click();
  await expect(invitee.getByRole('button', { name: 'Sign out' })).toBeVisible();
  const me = await (await invitee.request.get('/api/auth/me')).json();
  expect(me).toMatchObject({ email, name: 'Rosa Dunmore', roles: ['operator'] });

  // The link works once.
  const again = await context.newPage();
  await again.goto(link!);
  await expect(again.getByRole('heading', { level: 1 })).toBeVisible();
  await expect(again.getByRole('button', { name: 'Create account' })).toHaveCount(0);
  await context.close();
});
