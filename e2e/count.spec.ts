import type { APIRequestContext, Browser, Page } from '@playwright/test';
import { DEMO_PASSWORD, expect, expectAccessible, storageStateFor, test } from './fixtures';

/**
 * The live count across three screens: the conductor at a desk and two stations on phones, through a poll, a
 * hold called by press-and-hold, its clear, the resume and T-0; then every count screen in both themes at phone
 * and desktop size, checked with axe and photographed.
 */

const phone = { width: 390, height: 844 };

async function csrf(request: APIRequestContext): Promise<string> {
  return (await (await request.get('/api/auth/csrf')).json()).csrfToken as string;
}

async function signedInPhone(browser: Browser, email: string): Promise<Page> {
  // Signed out to begin with: a context made inside a test would otherwise take the test's stored session.
  const context = await browser.newContext({ viewport: phone, storageState: { cookies: [], origins: [] } });
  const page = await context.newPage();
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  // On a phone the sign-out button sits in the folded menu: leaving the sign-in page is the sign.
  await expect(page).not.toHaveURL(/sign-in/);
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

/** A released procedure of a few dozen seconds (PROP and PAD are manned by the demo crew plan). */
async function shortCount(page: Page, browser: Browser, seconds: number): Promise<number> {
  const stamp = Date.now().toString(36);
  const doc = {
    format: 'holdfire.procedure',
    version: 1,
    procedure: { name: `Short rehearsal ${stamp}`, purpose: 'Rehearse the last seconds of a count.', testArticle: 'Kestrel-2', site: 'Marsh End test site', stations: ['TC', 'PROP', 'PAD'] },
    phases: [
      {
        key: 'terminal',
        name: 'Terminal count',
        steps: [
          { key: 'arm', kind: 'action', t: `T-0:${String(seconds).padStart(2, '0')}`, station: 'TC', instruction: 'Announce terminal count on the loop.', hazards: [], propellants: [], note: '' },
          { key: 'press', kind: 'verification', t: null, station: 'PROP', instruction: 'LOX tank at run pressure, vent closed.', hazards: [], propellants: ['lox'], note: '' },
          { key: 'after', kind: 'action', t: 'T+0:05', station: 'PAD', instruction: 'Announce shutdown; vent both tanks.', hazards: [], propellants: [], note: '' },
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
    // Terminal count from T-5 s, so a hold before then may resume instead of recycling.
    data: { procedureId: p.id, revisionId: revision.id, name: `Short rehearsal count ${stamp}`, terminalCountSeconds: -5, recycleToSeconds: -30 },
    headers: { 'X-CSRF-Token': conductorToken },
  });
  expect(created.status()).toBe(201);
  return (await created.json()).id as number;
}

test.describe('a live count', () => {
  test.use({ storageState: storageStateFor('conductor') });

  test('the conductor creates a count from the form', async ({ page, consoleErrors }) => {
    void consoleErrors;
    const procedure = await (await page.request.get('/api/procedures/1')).json();
    await page.goto('/counts');
    await page.getByRole('button', { name: 'New count' }).click();
    const form = page.getByRole('form', { name: 'New count' });
    await form.getByLabel('Procedure').selectOption(String(procedure.id));
    await expect(form.getByText(/will be counted/)).toBeVisible();
    await form.getByLabel('Name').fill('Kestrel-2 static fire, run 3');
    await form.getByRole('button', { name: 'Create count' }).click();
    await expect(page).toHaveURL(/\/counts\/\d+$/);
    await expect(page.getByRole('timer')).toHaveText('T-02:00:00');
  });

  test('two phones and the conductor run the demo procedure, picked up at T-0:45: a poll, a hold by press-and-hold, its clear, a recycle, the resume and T-0', async ({ page, browser, consoleErrors }) => {
    void consoleErrors;
    test.setTimeout(150_000);
    const procedure = await (await page.request.get('/api/procedures/1')).json();
    const revision = procedure.revisions.find((r: { status: string }) => r.status === 'released');
    const created = await page.request.post('/api/counts', {
      // Terminal count from T-20 s, so the hold at about T-0:35 may resume; the recycle goes back to T-0:45.
      data: { procedureId: 1, revisionId: revision.id, name: `Kestrel-2 rehearsal ${Date.now().toString(36)}`, terminalCountSeconds: -20, recycleToSeconds: -45 },
      headers: { 'X-CSRF-Token': await csrf(page.request) },
    });
    expect(created.status()).toBe(201);
    const id = (await created.json()).id as number;
    await page.goto(`/counts/${id}`);
    await expect(page.getByRole('timer')).toHaveText('T-02:00:00');

    const prop = await signedInPhone(browser, 'propellants@ternvalley.test');
    const pad = await signedInPhone(browser, 'pad@ternvalley.test');
    await prop.goto(`/counts/${id}?view=station&station=PROP`);
    await pad.goto(`/counts/${id}?view=station&station=PAD`);
    await expect(prop.getByRole('region', { name: 'Your steps' })).toBeVisible();
    await expect(pad.getByRole('region', { name: 'Your steps' })).toBeVisible();
    const board = page.getByRole('region', { name: 'Stations' });
    await expect(board.getByRole('row').filter({ hasText: 'PROP' })).toContainText('connected');
    await expect(board.getByRole('row').filter({ hasText: 'PAD' })).toContainText('connected');

    // The rehearsal picks the count up at T-0:45: the two hours of steps before are skipped, and logged so.
    await page.getByRole('button', { name: 'Start the count' }).click();
    const start = page.getByRole('group', { name: 'Confirm: Start the count' });
    await start.getByLabel('Start at').fill('T-0:45');
    await start.getByRole('button', { name: 'Yes, start' }).click();
    await expect(page.getByText('COUNTING')).toBeVisible();
    await expect(prop.getByText('COUNTING')).toBeVisible();
    const log = page.getByRole('region', { name: 'Count log' });
    await expect(log).toContainText(/Count picked up at T-0:45 by Marek Lindqvist; \d+ earlier steps skipped/);
    // The demo's own step at T-0:30 comes due for RANGE with its caution beside it.
    await expect(log).toContainText('RANGE step due: Siren', { timeout: 20_000 });

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
    await expect(log).toContainText('PROP answered GO');
    await expect(log).toContainText('PAD answered GO');
    await expect(log).toContainText('closed: all GO');

    await pressAndHold(prop);
    const holdForm = prop.getByRole('form', { name: 'Call a hold from PROP' });
    await holdForm.getByLabel('Category').selectOption('propellant');
    await holdForm.getByLabel('Reason').fill('Vent valve slow to close');
    await holdForm.getByRole('button', { name: 'Call HOLD' }).click();

    const banner = page.getByRole('region', { name: 'Hold', exact: true });
    await expect(banner).toContainText('Propellant: Vent valve slow to close');
    await expect(page.getByText('HOLDING')).toBeVisible();
    await expect(pad.getByText('HOLDING')).toBeVisible();
    // The clock stands still for everyone while the count holds.
    const held = await page.getByRole('timer').textContent();
    await page.waitForTimeout(1500);
    await expect(page.getByRole('timer')).toHaveText(held!);
    await prop.screenshot({ path: 'e2e/screenshots/count-station-holding-phone-daylight.png', fullPage: true });
    await page.screenshot({ path: 'e2e/screenshots/count-console-holding-desktop-daylight.png', fullPage: true });

    await prop.getByRole('region', { name: 'Hold', exact: true }).getByRole('button', { name: /Clear hold/ }).click();
    await expect(banner).toContainText('cleared');
    // The conductor recycles to the start before resuming: the steps after it open again.
    await page.getByRole('button', { name: 'Recycle' }).click();
    const recycle = page.getByRole('group', { name: 'Confirm: Recycle' });
    await recycle.getByLabel('Recycle to').fill('T-0:45');
    await recycle.getByLabel('Why recycle?').fill('Run the last poll again after the vent valve check');
    await recycle.getByRole('button', { name: 'Yes, recycle' }).click();
    await expect(log).toContainText('Recycled to T-00:00:45');
    await expect(page.getByRole('timer')).toHaveText('T-00:00:45');
    await expect(prop.getByRole('timer')).toHaveText('T-00:00:45');
    await page.getByRole('button', { name: 'Resume the count' }).click();
    await page.getByRole('button', { name: 'Yes, resume' }).click();
    await expect(page.getByText('COUNTING')).toBeVisible();
    await expect(log).toContainText('Count resumed');

    await expect(log).toContainText('T-0 reached', { timeout: 60_000 });
    await expect(page.getByRole('timer')).toHaveText(/^T\+/);
    await expect(prop.getByRole('timer')).toHaveText(/^T\+/);
    await page.getByRole('button', { name: 'Firing complete' }).click();
    await page.getByRole('button', { name: 'Yes, firing complete' }).click();
    await expect(page.getByText(/SAFING|COMPLETE/).first()).toBeVisible();

    // The count report, from the log: the hold, the recycle, both stations' answers.
    await page.getByRole('link', { name: 'Count report' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toContainText('Count report: Kestrel-2 rehearsal');
    const holds = page.getByRole('region', { name: 'Holds' });
    await expect(holds).toContainText('1 hold, the count stood');
    await expect(holds.getByRole('row').filter({ hasText: 'h1' })).toContainText('PROP (Tomasz Reyes)');
    await expect(page.getByRole('region', { name: 'Recycles' })).toContainText('to T-0:45 by Marek Lindqvist: Run the last poll again');
    const polls = page.getByRole('region', { name: 'Go/no-go polls' });
    await expect(polls.getByRole('row').filter({ hasText: 'PAD' })).toBeVisible();
    await expect(page.getByRole('region', { name: 'T-0, planned and actual' })).toContainText('late');
    await expectAccessible(page, 'count report daylight desktop');
    await page.screenshot({ path: 'e2e/screenshots/count-report-desktop-daylight.png', fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow, 'count report scrolls sideways on a phone').toBeLessThanOrEqual(0);
    await page.screenshot({ path: 'e2e/screenshots/count-report-phone-daylight.png', fullPage: true });

    // The replay: back from the end of the log to the hold, its reason and who called it, with the clock standing there.
    await page.goto(`/counts/${id}/replay`);
    await expect(page.getByRole('timer')).toHaveText(/^T\+/);
    await page.getByRole('button', { name: 'Previous hold' }).click();
    await expect(page.getByRole('region', { name: 'Hold', exact: true })).toContainText('Propellant: Vent valve slow to close');
    await expect(page.getByRole('region', { name: 'Hold', exact: true })).toContainText('called by PROP (Tomasz Reyes)');
    await expect(page).toHaveURL(/replay\?at=\d+/);
    await expectAccessible(page, 'count replay daylight phone');
    await page.screenshot({ path: 'e2e/screenshots/count-replay-phone-daylight.png', fullPage: true });

    await prop.context().close();
    await pad.context().close();
  });

  test('every count screen passes axe in both themes at phone and desktop size', async ({ page, browser, consoleErrors }) => {
    void consoleErrors;
    test.setTimeout(180_000);
    const id = await shortCount(page, browser, 50);
    const token = await csrf(page.request);
    const cmd = (body: object) => page.request.post(`/api/counts/${id}/commands`, { data: body, headers: { 'X-CSRF-Token': token } });
    expect((await cmd({ type: 'count:start' })).ok()).toBe(true);
    expect((await cmd({ type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600 })).ok()).toBe(true);

    // Each screen in both themes; the console and the watch view at desk size in one theme and phone size in the
    // other, the station panel (a phone screen) at phone size in both. The list of counts is in the tour.
    const views = [
      { name: 'count-console', who: 'conductor' as const, path: `/counts/${id}`, sizes: { daylight: 'desktop', night: 'phone' } },
      { name: 'count-station', who: 'operator' as const, path: `/counts/${id}?view=station&station=PROP`, sizes: { daylight: 'phone', night: 'phone' } },
      { name: 'count-watch', who: 'auditor' as const, path: `/counts/${id}`, sizes: { daylight: 'phone', night: 'desktop' } },
    ];
    for (const theme of ['daylight', 'night'] as const) {
      for (const v of views) {
        const context = await browser.newContext({ storageState: storageStateFor(v.who) });
        await context.addInitScript((t) => localStorage.setItem('holdfire.theme', t), theme);
        const p = await context.newPage();
        for (const size of [v.sizes[theme]]) {
          await p.setViewportSize(size === 'phone' ? phone : { width: 1280, height: 800 });
          await p.goto(v.path);
          await expect(p.getByRole('heading', { level: 1 })).toBeVisible();
          await expect(p.getByRole('timer')).toBeVisible();
          await p.evaluate(() => document.fonts.ready);
          const overflow = await p.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
          expect(overflow, `${v.name} ${size} scrolls sideways`).toBeLessThanOrEqual(0);
          if (v.name === 'count-watch') {
            // The auditor checks the record: the chain recomputed in this browser with Web Crypto, and by the server.
            await p.getByRole('button', { name: 'Check the record' }).click();
            const verdict = p.getByRole('region', { name: 'Record check' }).getByRole('status');
            await expect(verdict).toContainText(/Checked in this browser: intact: \d+ events/);
            await expect(verdict).toContainText(/Checked on the server: intact/);
          }
          // Every rule in daylight; at night the colours again, as in the tour (contrast is what a theme changes).
          await expectAccessible(p, `${v.name} ${theme} ${size}`, theme === 'night' ? { rules: ['color-contrast'] } : {});
          await p.screenshot({ path: `e2e/screenshots/${v.name}-${size}-${theme}.png`, fullPage: true });
        }
        await context.close();
      }
    }
  });
});
