import { expectAccessible, expect, storageStateFor, test } from './fixtures';
for (const p of [{ path: '/hazards', name: 'hazards' }, { path: '/hazards/1', name: 'hazard-detail' }, { path: '/procedures/1/revisions/1', name: 'released' }]) {
  test.describe(p.name, () => {
    test.use({ storageState: storageStateFor('safety') });
    test(`timing ${p.name}`, async ({ page }) => {
      test.setTimeout(120_000);
      await page.setViewportSize({ width: 1280, height: 800 });
      await page.goto(p.path);
      await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
      await page.evaluate(() => document.fonts.ready);
      const t0 = Date.now();
      await expectAccessible(page, 'x');
      console.log(p.name, 'axe full', Date.now() - t0);
      const t1 = Date.now();
      await expectAccessible(page, 'x', { rules: ['color-contrast'] });
      console.log(p.name, 'axe contrast', Date.now() - t1);
    });
  });
}
