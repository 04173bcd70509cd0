import { expect, storageStateFor, test } from './fixtures';

test.use({ storageState: storageStateFor('conductor') });

test('the night theme is switched on, remembered across reloads, and switched off', async ({ page, consoleErrors }) => {
  void consoleErrors;
  await page.goto('/');
  const html = page.locator('html');
  await expect(html).toHaveAttribute('data-theme', 'daylight');
  const toggle = page.getByRole('button', { name: 'Night theme' });
  await toggle.click();
  await expect(html).toHaveAttribute('data-theme', 'night');
  await expect(toggle).toHaveAttribute('aria-pressed', 'true');
  const background = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
  await page.reload();
  await expect(html).toHaveAttribute('data-theme', 'night');
  // Night is dark: the body background's luminance stays low.
  const [r, g, b] = background.match(/\d+/g)!.map(Number);
  expect(0.2126 * r + 0.7152 * g + 0.0722 * b).toBeLessThan(40);
  await page.getByRole('button', { name: 'Night theme' }).click();
  await expect(html).toHaveAttribute('data-theme', 'daylight');
});

test('the fonts ship with the app', async ({ page }) => {
  await page.goto('/');
  await page.evaluate(() => document.fonts.ready);
  const families = await page.evaluate(() => [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family));
  expect(families.some((f) => /Atkinson Hyperlegible/.test(f))).toBe(true);
});
