import type { Page } from '@playwright/test';
import { DEMO_PASSWORD, expect, expectAccessible, ROLE_USERS, test } from './fixtures';

/** The safety officer in a session of this spec's own (a CSRF token is per session; see evidence.spec.ts). */
async function signInAsSafety(page: Page) {
  const { csrfToken } = await (await page.request.get('/api/auth/csrf')).json();
  const res = await page.request.post('/api/auth/login', { headers: { 'X-CSRF-Token': csrfToken }, data: { email: ROLE_USERS.safety, password: DEMO_PASSWORD } });
  expect(res.status()).toBe(200);
}

async function noSidewaysScroll(page: Page, what: string) {
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow, `${what} scrolls sideways`).toBeLessThanOrEqual(0);
}

test.use({ storageState: { cookies: [], origins: [] } });

test('a safety officer reports an anomaly, links a hazard, adds a corrective action and closes it once the action is done', async ({ page, consoleErrors }) => {
  await signInAsSafety(page);
  const title = `Cracked ferrule on the GN2 purge line ${Date.now()}`;

  await page.goto('/anomalies/new');
  const form = page.getByRole('form', { name: 'Report an anomaly' });
  await form.getByLabel('Title').fill(title);
  await form.getByLabel('What happened').fill('Found at the walk-down before loading: a hairline crack at the ferrule of the GN2 purge line.');
  await expect(form.getByRole('option', { name: '2 Critical' })).toBeAttached();
  await form.getByLabel('Severity').selectOption('2');
  await form.getByLabel('Immediate actions taken').fill('Purge line isolated and tagged out.');
  await form.getByRole('button', { name: 'Report anomaly' }).click();
  await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
  await expect(page.getByText('None: found outside a count')).toBeVisible();

  // Link a hazard of the register.
  const link = page.getByRole('form', { name: 'Link a hazard' });
  await expect(link.getByRole('option', { name: /^HZ-001 / })).toBeAttached();
  await link.getByLabel('Hazard to link').selectOption({ index: 1 });
  await link.getByRole('button', { name: 'Link hazard' }).click();
  await expect(page.getByText(/^Linked HZ-\d{3} /)).toBeVisible();
  await expect(page.getByRole('list', { name: 'Linked hazards' }).getByRole('link')).toHaveCount(1);

  // A corrective action, owned by a pad operator.
  const add = page.getByRole('form', { name: 'Add a corrective action' });
  await add.getByLabel('What is to be done').fill('Replace the purge line ferrule and leak-check the joint.');
  await expect(add.getByRole('option', { name: 'Aiko Brennan' })).toBeAttached();
  await add.getByLabel('Owner').selectOption({ label: 'Aiko Brennan' });
  await add.getByLabel('Due date').fill('2031-05-20');
  await add.getByRole('button', { name: 'Add corrective action' }).click();
  await expect(page.getByText('Added the corrective action; Aiko Brennan is told by e-mail.')).toBeVisible();

  // Closing is refused while the action is open.
  const close = page.getByRole('form', { name: 'Close the anomaly' });
  await expect(page.getByText(/not a safety authority/).first()).toBeVisible();
  await close.getByRole('button', { name: 'Close anomaly' }).click();
  await expect(page.getByText(/cannot be closed while a corrective action is not done/)).toBeVisible();
  // The browser logs the refused request; that one refusal is what this step expects, any other error still fails.
  await expect.poll(() => consoleErrors.filter((e) => /status of 409/.test(e)).length).toBe(1);
  consoleErrors.splice(consoleErrors.findIndex((e) => /status of 409/.test(e)), 1);

  await page.getByLabel(/^Status of “Replace the purge line/).selectOption('done');
  await expect(page.getByText('Marked done.')).toBeVisible();
  await close.getByRole('button', { name: 'Close anomaly' }).click();
  await expect(page.getByText(/ is closed\.$/)).toBeVisible();
  await expect(page.getByRole('heading', { level: 2, name: 'Closed' })).toBeVisible();
  await expect(page.getByRole('form', { name: 'Reopen the anomaly' })).toBeVisible();
  await expectAccessible(page, 'anomaly page, desk, daylight');
  await page.screenshot({ path: 'e2e/screenshots/anomaly-desk-daylight.png', fullPage: true });

  // On a phone at night: the list and the page fit the width.
  await page.setViewportSize({ width: 390, height: 844 });
  await page.evaluate(() => window.localStorage.setItem('holdfire.theme', 'night'));
  await page.reload();
  await expect(page.locator('html')).toHaveAttribute('data-theme', 'night');
  await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
  await noSidewaysScroll(page, 'anomaly page at 390 px');
  await page.screenshot({ path: 'e2e/screenshots/anomaly-phone-night.png', fullPage: true });
  await page.goto('/anomalies?status=closed');
  await expect(page.getByRole('link', { name: title })).toBeVisible();
  await noSidewaysScroll(page, 'anomaly list at 390 px');
  await page.screenshot({ path: 'e2e/screenshots/anomalies-phone-night.png', fullPage: true });
  await expectAccessible(page, 'anomaly list, phone, night', { rules: ['color-contrast'] });
  await page.goto('/anomalies/new');
  await expect(page.getByRole('form', { name: 'Report an anomaly' })).toBeVisible();
  await noSidewaysScroll(page, 'report form at 390 px');
  await page.screenshot({ path: 'e2e/screenshots/anomaly-new-phone-night.png', fullPage: true });
});
