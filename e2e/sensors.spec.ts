import type { APIRequestContext } from '@playwright/test';
import { expect, expectAccessible, storageStateFor, test } from './fixtures';

/** Test data after a count: upload a small CSV, see it plotted on the count's timeline and in words, checked with axe. */

async function csrf(request: APIRequestContext): Promise<string> {
  return (await (await request.get('/api/auth/csrf')).json()).csrfToken as string;
}

// Invented readings at 100 Hz from T-30 s: 14 bar during a five-second burn, with 15.8 and 15.4 bar at T+1.00 and T+1.01 s.
// 6,000 rows, more than the plot's 4,000 points, so the plot is thinned and a zoom asks for detail.
function csv(): string {
  const rows = ['t_s,chamber_pressure (bar),thrust (kN)'];
  for (let i = 0; i < 6000; i++) {
    const p = i === 3100 ? 15.8 : i === 3101 ? 15.4 : i >= 3000 && i < 3500 ? 14 : 0;
    rows.push(`${((i - 3000) / 100).toFixed(2)},${p},${(p * 0.15).toFixed(3)}`);
  }
  return rows.join('\n') + '\n';
}

test.describe('sensor data', () => {
  test.use({ storageState: storageStateFor('conductor') });

  test('a conductor uploads a CSV to a new count and sees the plot with T-0 and the table; axe passes', async ({ page, consoleErrors }) => {
    void consoleErrors;
    const procedure = await (await page.request.get('/api/procedures/1')).json();
    const revision = procedure.revisions.find((r: { status: string }) => r.status === 'released');
    const created = await page.request.post('/api/counts', {
      data: { procedureId: 1, revisionId: revision.id, name: `Sensor review ${Date.now().toString(36)}` },
      headers: { 'X-CSRF-Token': await csrf(page.request) },
    });
    expect(created.status()).toBe(201);
    const id = (await created.json()).id as number;

    await page.goto(`/counts/${id}/data`);
    await expect(page.getByText('No sensor data has been added to this count yet.')).toBeVisible();
    await page.getByLabel('CSV file').setInputFiles({ name: 'run-3-engine.csv', mimeType: 'text/csv', buffer: Buffer.from(csv()) });
    await page.getByRole('button', { name: 'Upload test data' }).click();
    await expect(page.getByText('run-3-engine.csv: 6,000 rows, 2 channels.')).toBeVisible();

    const plot = page.getByRole('img', { name: /Plot of chamber_pressure, thrust against seconds from T-0/ });
    await expect(plot.locator('canvas')).toBeVisible();
    await expect(plot.getByText('T-0', { exact: true })).toBeVisible();
    const table = page.getByRole('table', { name: 'Each channel in numbers' });
    await expect(table.getByRole('row', { name: /chamber_pressure/ })).toContainText('15.80 bar at T+1.00 s');
    await expect(page.getByText(/The plot shows 4,000 of 6,000 rows/)).toBeVisible();

    // A limit set afterwards shows as a crossing in the table.
    await page.getByText('Edit limits').click();
    await page.getByRole('group', { name: 'chamber_pressure (bar)' }).getByLabel('High limit').fill('15');
    await page.getByRole('button', { name: 'Save limits' }).click();
    await expect(table.getByRole('row', { name: /chamber_pressure/ })).toContainText('Above 15.00 bar from T+1.00 s to T+1.02 s; furthest 15.80 bar at T+1.00 s');

    // Drag to zoom: the zoomed stretch is fetched in detail. Then reset.
    const detail = page.waitForRequest((r) => r.url().includes(`/sensors/`) && r.url().includes('&from='));
    await plot.scrollIntoViewIfNeeded();
    const box = (await plot.locator('.u-over').boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.4, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.7, box.y + box.height / 2, { steps: 5 });
    await page.mouse.up();
    await detail;
    await page.screenshot({ path: 'e2e/screenshots/sensor-data-desk-daylight-zoomed.png' });
    await page.getByRole('button', { name: 'Reset view' }).click();

    await expectAccessible(page, 'sensor data, desk, daylight');
    await page.setViewportSize({ width: 390, height: 844 });
    await page.evaluate(() => (document.documentElement.dataset.theme = 'night'));
    await expect(plot.locator('canvas')).toBeVisible();
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    await page.screenshot({ path: 'e2e/screenshots/sensor-data-phone-night.png', fullPage: true });
  });
});
