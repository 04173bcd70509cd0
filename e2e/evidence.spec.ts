import type { APIRequestContext, Page } from '@playwright/test';
import { makePng } from '../tests/helpers/png';
import { DEMO_PASSWORD, expect, expectAccessible, ROLE_USERS, storageStateFor, test } from './fixtures';

test.describe.configure({ mode: 'serial' });

// Demo hazards the other journeys and the screenshot tour do not change.
const PHOTO_HAZARD = 'GN2 pressurant bottle or tank rupture';
const CALC_HAZARD = 'Chamber liner or cooling-jacket collapse';
const label = `Regulator gauge at MEOP before the run ${Date.now()}`;

interface Hz {
  id: number;
  code: string;
  title: string;
  mitigations: { id: number; description: string; evidence: { id: number; kind: string; label: string; file: { url: string } | null; data: { calc?: string } }[] }[];
}

async function hazardNamed(request: APIRequestContext, title: string): Promise<Hz> {
  const list = (await (await request.get('/api/hazards')).json()) as Hz[];
  const found = list.find((h) => h.title === title);
  expect(found, title).toBeDefined();
  return found!;
}

/** The first mitigation in the order the page lists them (MIL-STD-882E precedence). */
async function firstListedMitigation(request: APIRequestContext, id: number) {
  const h = (await (await request.get(`/api/hazards/${id}`)).json()) as Hz;
  return h.mitigations[0]!;
}

/**
 * The safety officer in a session of this spec's own. A CSRF token is per session and fetching one replaces
 * the last, so sharing the saved safety session with another spec writing in parallel would make each
 * refuse the other's next write.
 */
async function signInAsSafety(page: Page) {
  const { csrfToken } = await (await page.request.get('/api/auth/csrf')).json();
  const res = await page.request.post('/api/auth/login', { headers: { 'X-CSRF-Token': csrfToken }, data: { email: ROLE_USERS.safety, password: DEMO_PASSWORD } });
  expect(res.status()).toBe(200);
}

async function imageLoaded(page: Page, name: string) {
  const img = page.getByRole('img', { name });
  await expect(img).toBeVisible();
  await img.scrollIntoViewIfNeeded(); // it loads lazily
  // Decoded, so the CSP and the download route let the browser show it.
  await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth)).toBe(64);
}

test.describe('safety officer', () => {
  test.use({ storageState: { cookies: [], origins: [] } });
  test.beforeEach(({ page }) => signInAsSafety(page));

  test('uploads a photo as evidence on a demo hazard mitigation and sees it', async ({ page, consoleErrors }) => {
    void consoleErrors;
    test.slow(); // four themed, sized screenshots with an accessibility scan each
    const h = await hazardNamed(page.request, PHOTO_HAZARD);
    const mit = await firstListedMitigation(page.request, h.id);
    await page.goto(`/hazards/${h.id}`);
    await page.getByRole('button', { name: `Add a file as evidence for: ${mit.description.slice(0, 60)}` }).click();
    const form = page.getByRole('form', { name: /^Add a file as evidence for/ });
    await expect(form.getByText(/up to 10 MB/)).toBeVisible();
    await form.getByLabel('File').setInputFiles({ name: 'regulator-gauge.png', mimeType: 'image/png', buffer: makePng(64, 40, [200, 160, 40]) });
    await form.getByLabel('Label (optional)').fill(label);
    await form.getByRole('button', { name: 'Upload file' }).click();
    await expect(page.getByText(`Added “${label}”.`)).toBeVisible();
    await imageLoaded(page, `Photo: ${label}`);
    await expect(page.getByRole('link', { name: 'Download regulator-gauge.png' })).toBeVisible();

    const after = (await (await page.request.get(`/api/hazards/${h.id}`)).json()) as Hz;
    const ev = after.mitigations.find((m) => m.id === mit.id)!.evidence.find((e) => e.label === label);
    expect(ev?.kind).toBe('file');
    const file = await page.request.get(ev!.file!.url);
    expect(file.headers()['content-type']).toBe('image/png');
    expect(file.headers()['x-content-type-options']).toBe('nosniff');

    // The page with evidence on it, looked at in both themes at phone and desktop size.
    for (const theme of ['daylight', 'night'] as const) {
      await page.evaluate((t) => localStorage.setItem('holdfire.theme', t), theme);
      for (const vp of [
        { name: 'phone', width: 390, height: 844 },
        { name: 'desktop', width: 1280, height: 800 },
      ]) {
        await page.setViewportSize({ width: vp.width, height: vp.height });
        await page.goto(`/hazards/${h.id}`);
        await expect(page.locator('html')).toHaveAttribute('data-theme', theme);
        await imageLoaded(page, `Photo: ${label}`);
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
        expect(overflow, `hazard with evidence ${vp.name} scrolls sideways`).toBeLessThanOrEqual(0);
        await expectAccessible(page, `hazard with evidence ${theme} ${vp.name}`);
        await page.screenshot({ path: `e2e/screenshots/evidence-hazard-${vp.name}-${theme}.png` });
      }
    }
  });

  test('attaches a surge result from the checks page and sees it frozen on the hazard', async ({ page, consoleErrors }) => {
    void consoleErrors;
    test.slow(); // two accessibility scans of long pages
    const h = await hazardNamed(page.request, CALC_HAZARD);
    const mit = await firstListedMitigation(page.request, h.id);
    const expected = await (await page.request.get('/api/calc/surge?fluid=ethanol&velocityChangeMps=2.2')).json();
    const mpa = (expected.deltaPressurePa / 1e6).toLocaleString('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 });

    // On a phone, as at the stand.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto('/hazards/tools');
    const card = page.locator('section', { has: page.getByRole('form', { name: 'Valve surge (water hammer)' }) });
    await card.getByLabel('Liquid').selectOption({ label: 'Ethanol, 20 C' });
    await card.getByLabel(/Change in flow velocity/).fill('2.2');
    await card.getByRole('button', { name: 'Calculate' }).click();
    await expect(card.getByText(`${mpa} MPa`, { exact: false })).toBeVisible();
    await card.getByRole('button', { name: 'Attach this result to a hazard' }).click();
    const form = card.getByRole('form', { name: 'Attach the valve surge (water hammer) result to a hazard' });
    await form.getByLabel('Hazard').selectOption({ label: `${h.code} ${h.title}` });
    await form.getByLabel('Mitigation').selectOption({ index: 1 });
    await form.getByLabel('Label (optional)').fill('Surge at fuel lead, ethanol 2.2 m/s');
    await expectAccessible(page, 'checks page with the attach form');
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow, 'checks page with the attach form scrolls sideways').toBeLessThanOrEqual(0);
    await form.scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'e2e/screenshots/evidence-attach-phone-daylight.png' });
    await form.getByRole('button', { name: 'Attach result' }).click();
    const done = card.getByRole('status').filter({ hasText: 'Result attached' });
    await expect(done).toBeVisible();

    await done.getByRole('link', { name: `${h.code} ${h.title}` }).click();
    await expect(page.getByRole('heading', { level: 1 })).toContainText(h.code);
    const item = page.getByRole('list', { name: 'Evidence' }).getByRole('listitem').filter({ hasText: 'Surge at fuel lead, ethanol 2.2 m/s' });
    await expect(item.getByText(/Frozen result of the valve surge \(water hammer\) check, calculated/)).toBeVisible();
    await expect(item.getByText('Ethanol, 20 C')).toBeVisible();
    await expect(item.getByText(`${mpa} MPa`, { exact: false })).toBeVisible();
    await expect(item.getByText('Instantaneous (worst case)')).toBeVisible();

    const after = (await (await page.request.get(`/api/hazards/${h.id}`)).json()) as Hz;
    const frozen = after.mitigations.find((m) => m.id === mit.id)!.evidence.find((e) => e.label === 'Surge at fuel lead, ethanol 2.2 m/s');
    expect(frozen).toMatchObject({ kind: 'calc', data: { calc: 'surge' } });

    await expectAccessible(page, 'hazard with frozen calculation');
    await item.scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'e2e/screenshots/evidence-calc-phone-daylight.png' });
  });
});

test.describe('auditor', () => {
  test.use({ storageState: storageStateFor('auditor') });

  test('sees the evidence but no upload or remove control', async ({ page, consoleErrors }) => {
    void consoleErrors;
    const h = await hazardNamed(page.request, PHOTO_HAZARD);
    await page.goto(`/hazards/${h.id}`);
    await imageLoaded(page, `Photo: ${label}`);
    await expect(page.getByRole('link', { name: 'Download regulator-gauge.png' })).toBeVisible();
    await expect(page.getByRole('button', { name: /Add a file/ })).toHaveCount(0);
    await expect(page.getByRole('button', { name: /Remove evidence/ })).toHaveCount(0);
    await expect(page.getByLabel('File')).toHaveCount(0);

    await page.goto('/hazards/tools');
    const card = page.locator('section', { has: page.getByRole('form', { name: 'Oxygen percentage' }) });
    await card.getByRole('button', { name: 'Calculate' }).click();
    await expect(card.getByText('OSHA classification:')).toBeVisible();
    await expect(page.getByRole('button', { name: /Attach this result/ })).toHaveCount(0);
  });
});

test.describe('safety officer again', () => {
  test.use({ storageState: { cookies: [], origins: [] } });
  test.beforeEach(({ page }) => signInAsSafety(page));

  test('removes the photo after confirming, and the file is gone', async ({ page, consoleErrors }) => {
    void consoleErrors;
    const h = await hazardNamed(page.request, PHOTO_HAZARD);
    const before = (await (await page.request.get(`/api/hazards/${h.id}`)).json()) as Hz;
    const url = before.mitigations.flatMap((m) => m.evidence).find((e) => e.label === label)!.file!.url;
    await page.goto(`/hazards/${h.id}`);
    page.once('dialog', (d) => void d.accept());
    await page.getByRole('button', { name: `Remove evidence: ${label}` }).click();
    await expect(page.getByText(`Removed “${label}”.`)).toBeVisible();
    await expect(page.getByRole('img', { name: `Photo: ${label}` })).toHaveCount(0);
    expect((await page.request.get(url)).status()).toBe(404);
  });
});
