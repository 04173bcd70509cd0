import type { APIRequestContext, Browser, Page } from '@playwright/test';
import { DEMO_PASSWORD, expect, storageStateFor, test } from './fixtures';

/**
 * The live count across three screens: the conductor at a desk and two stations on phones. Written against
 * the count contract; not yet run.
 */

const phone = { width: 390, height: 844 };

async function csrf(request: APIRequestContext): Promise<string> {
  return (await (await request.get('/api/auth/csrf')).json()).csrfToken as string;
}

async function signedInPhone(browser: Browser, email: string): Promise<Page> {
  const context = await browser.newContext({ viewport: phone });
  const page = await context.newPage();
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeAttached();
  return page;
}

async function pressAndHold(page: Page) {
  const hold = page.getByRole('button', { name: /HOLD/ });
  await hold.hover();
  await page.mouse.down();
  await expect(page.getByText(/Keep holding/)).toBeVisible();
  // Held for longer than the 1.5 s the button asks for.
  await page.waitForTimeout(1800);
  await page.mouse.up();
}

test.describe('a live count', () => {
  test.use({ storageState: storageStateFor('conductor') });

  test('conductor creates and starts a count, PROP and PAD answer GO, PROP holds and clears, the conductor resumes', async ({ page, browser, consoleErrors }) => {
    void consoleErrors;
    test.setTimeout(60_000);
    const procedure = await (await page.request.get('/api/procedures/1')).json();

    await page.goto('/counts');
    await page.getByRole('button', { name: 'New count' }).click();
    const form = page.getByRole('form', { name: 'New count' });
    await form.getByLabel('Procedure').selectOption(String(procedure.id));
    await expect(form.getByText(/will be counted/)).toBeVisible();
    await form.getByLabel('Name').fill('Kestrel-2 cold-flow rehearsal');
    await form.getByRole('button', { name: 'Create count' }).click();
    await expect(page).toHaveURL(/\/counts\/\d+$/);
    const url = new URL(page.url());

    const prop = await signedInPhone(browser, 'propellants@ternvalley.test');
    const pad = await signedInPhone(browser, 'pad@ternvalley.test');
    await prop.goto(`${url.pathname}?view=station&station=PROP`);
    await pad.goto(`${url.pathname}?view=station&station=PAD`);
    await expect(prop.getByRole('region', { name: 'Your steps' })).toBeVisible();
    await expect(pad.getByRole('region', { name: 'Your steps' })).toBeVisible();

    await page.getByRole('button', { name: 'Start the count' }).click();
    await page.getByRole('button', { name: 'Yes, start' }).click();
    await expect(page.getByText('COUNTING')).toBeVisible();
    await expect(prop.getByText('COUNTING')).toBeVisible();

    const board = page.getByRole('region', { name: 'Stations' });
    await expect(board.getByRole('row').filter({ hasText: 'PROP' })).toContainText('connected');
    await expect(board.getByRole('row').filter({ hasText: 'PAD' })).toContainText('connected');

    await page.getByRole('button', { name: 'Open a poll' }).click();
    const opener = page.getByRole('form', { name: 'Open a poll' });
    const boxes = opener.getByRole('group', { name: 'Stations to ask' }).getByRole('checkbox');
    for (const box of await boxes.all()) {
      const name = (await box.evaluate((el) => el.closest('label')?.textContent ?? '')).trim();
      await box.setChecked(name === 'PROP' || name === 'PAD');
    }
    await opener.getByRole('button', { name: 'Open poll' }).click();

    for (const station of [prop, pad]) {
      const asked = station.getByRole('region', { name: 'Your go/no-go' });
      await expect(asked).toBeVisible();
      await asked.getByRole('button', { name: 'GO', exact: true }).click();
    }
    const log = page.getByRole('region', { name: 'Count log' });
    await expect(log).toContainText('PROP answered GO');
    await expect(log).toContainText('PAD answered GO');
    await expect(log).toContainText('closed: all GO');

    await pressAndHold(prop);
    const holdForm = prop.getByRole('form', { name: 'Call a hold from PROP' });
    await holdForm.getByLabel('Category').selectOption('propellant');
    await holdForm.getByLabel('Reason').fill('Vent valve slow to close');
    await holdForm.getByRole('button', { name: 'Call HOLD' }).click();

    const banner = page.getByRole('region', { name: 'Hold' });
    await expect(banner).toContainText('Propellant: Vent valve slow to close');
    await expect(page.getByText('HOLDING')).toBeVisible();

    await prop.getByRole('region', { name: 'Hold' }).getByRole('button', { name: /Clear hold/ }).click();
    await expect(banner).toContainText('cleared');
    await page.getByRole('button', { name: 'Resume the count' }).click();
    await page.getByRole('button', { name: 'Yes, resume' }).click();
    await expect(page.getByText('COUNTING')).toBeVisible();
    await expect(log).toContainText('Count resumed');

    await prop.context().close();
    await pad.context().close();
  });

  test('a 25-second procedure reaches T-0 and the conductor declares the firing complete', async ({ page, browser, consoleErrors }) => {
    void consoleErrors;
    test.setTimeout(60_000);
    const stamp = Date.now().toString(36);
    const doc = {
      format: 'holdfire.procedure',
      version: 1,
      procedure: { name: `Short rehearsal ${stamp}`, purpose: 'Rehearse the last seconds of a count.', testArticle: 'Kestrel-2', site: 'Marsh End test site', stations: ['TC'] },
      phases: [
        {
          key: 'terminal',
          name: 'Terminal count',
          steps: [
            { key: 'arm', kind: 'action', t: 'T-0:20', station: 'TC', instruction: 'Announce terminal count on the loop.', hazards: [], propellants: [], note: '' },
            { key: 'after', kind: 'action', t: 'T+0:05', station: 'TC', instruction: 'Announce shutdown.', hazards: [], propellants: [], note: '' },
          ],
        },
      ],
    };
    const conductorToken = await csrf(page.request);
    const imported = await page.request.post('/api/procedures/import', { data: doc, headers: { 'X-CSRF-Token': conductorToken } });
    expect(imported.status()).toBe(201);
    const p = await imported.json();
    const signed = await page.request.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { data: { as: 'conductor' }, headers: { 'X-CSRF-Token': conductorToken } });
    expect(signed.ok()).toBe(true);
    const safety = await browser.newContext({ storageState: storageStateFor('safety') });
    const released = await safety.request.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { data: { as: 'safety' }, headers: { 'X-CSRF-Token': await csrf(safety.request) } });
    expect(released.ok()).toBe(true);
    await safety.close();

    const revision = (await (await page.request.get(`/api/procedures/${p.id}`)).json()).revisions.find((r: { number: number }) => r.number === 1);
    const created = await page.request.post('/api/counts', {
      data: { procedureId: p.id, revisionId: revision.id, name: `Short rehearsal count ${stamp}` },
      headers: { 'X-CSRF-Token': conductorToken },
    });
    expect(created.status()).toBe(201);
    const count = await created.json();

    await page.goto(`/counts/${count.id}`);
    await expect(page.getByRole('timer')).toHaveText('T-00:00:20');
    await page.getByRole('button', { name: 'Start the count' }).click();
    await page.getByRole('button', { name: 'Yes, start' }).click();
    const log = page.getByRole('region', { name: 'Count log' });
    await expect(log).toContainText('T-0 reached', { timeout: 30_000 });
    await expect(page.getByRole('timer')).toHaveText(/^T\+/);
    await page.getByRole('button', { name: 'Firing complete' }).click();
    await page.getByRole('button', { name: 'Yes, firing complete' }).click();
    await expect(page.getByText('COMPLETE', { exact: true })).toBeVisible();
  });
});
