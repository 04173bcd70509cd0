import { expect, expectAccessible, storageStateFor, test } from './fixtures';

// The demo's second count (server/db/seed-counts.ts): fired after a walker on the footpath (RANGE, T-23:40), a
// recorder fault (DATA, T-7:10) and an igniter fault at T-0:41 that sent it back to T-10:00.
test.use({ storageState: storageStateFor('auditor') });

test('an auditor finds what happened at a count time, who called that hold and why, sees T-0 on the recorded data, and whether the record changed', async ({ page, consoleErrors }) => {
  void consoleErrors;
  await page.goto('/counts');
  await page.getByRole('link', { name: 'Kestrel-2 static fire 2' }).first().click();
  await page.getByRole('link', { name: 'Replay' }).first().click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Replay: Kestrel-2 static fire 2');

  await page.getByLabel('Go to a count time').fill('T-7:10');
  await page.getByRole('button', { name: 'Go', exact: true }).click();
  await expect(page.getByRole('status').filter({ hasText: 'The clock read T-7:10' })).toBeVisible();
  const hold = page.getByRole('region', { name: 'Hold' });
  await expect(hold).toContainText('Stand recorder stopped writing: memory card full.');
  await expect(hold).toContainText('called by DATA (Noor Fairweather)');
  await expect(page.getByRole('timer')).toHaveText(/T-00:07:10/);

  await page.getByRole('button', { name: 'Previous hold' }).click();
  await expect(hold).toContainText('Walker with a dog on the footpath');
  await expect(hold).toContainText('called by RANGE (Dev Castellano)');
  // The instant shown is in the address, to send to someone.
  expect(new URL(page.url()).searchParams.get('at')).toMatch(/^\d+$/);

  await page.getByRole('button', { name: 'Check the record' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'intact' }).first()).toBeVisible();
  await expect(page.getByText(/BROKEN/)).toHaveCount(0);

  await expectAccessible(page, 'replay at a hold, desktop');
  await page.setViewportSize({ width: 390, height: 844 });
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow, 'replay scrolls sideways on a phone').toBeLessThanOrEqual(0);

  // The recorded data of the same count, on the count's own timeline: T-0 marked on the plot.
  await page.getByRole('link', { name: 'Sensor data' }).first().click();
  const plot = page.getByRole('img', { name: /Plot of .* against seconds from T-0/ }).first();
  await expect(plot).toBeVisible();
  await expect(plot.getByText('T-0', { exact: true })).toBeVisible();
  await page.goBack();

  await page.getByRole('link', { name: 'Count report' }).first().click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Kestrel-2 static fire 2');
  await expect(page.getByText('Walker with a dog on the footpath').first()).toBeVisible();
});
