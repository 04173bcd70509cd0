import { expectAccessible, expect, storageStateFor, test, type RoleName } from './fixtures';

// Every page is its own test on its own page: the workers share them out instead of one worker walking them all.
test.describe.configure({ mode: 'parallel' });

const viewports = [
  { name: 'phone', width: 390, height: 844 },
  { name: 'desktop', width: 1280, height: 800 },
];
const themes = ['daylight', 'night'] as const;

// `long`: a page many screens tall (a 60-step procedure); its screenshot is the first screen, since a full-page
// capture of it takes longer than the rest of the tour page and shows nothing the scroll test does not.
const pages: { role: RoleName | null; path: string; name: string; long?: boolean }[] = [
  { role: null, path: '/sign-in', name: 'sign-in' },
  { role: null, path: '/reset-password', name: 'reset-request' },
  { role: 'conductor', path: '/', name: 'home-conductor' },
  { role: 'safety', path: '/hazards', name: 'hazards' },
  { role: 'safety', path: '/hazards/1', name: 'hazard-detail' },
  { role: 'safety', path: '/hazards/new', name: 'hazard-new' },
  { role: 'auditor', path: '/hazards/print/1', name: 'hazard-print' },
  { role: 'operator', path: '/hazards/tools', name: 'engineering-checks' },
  { role: 'operator', path: '/hazards/propellants', name: 'propellants' },
  { role: 'safety', path: '/hazards/propellants/lox', name: 'propellant-lox' },
  { role: 'safety', path: '/hazards/propellants/ethanol/cautions', name: 'propellant-cautions-edit' },
  { role: 'auditor', path: '/hazards/matrices', name: 'risk-matrices' },
  { role: 'auditor', path: '/hazards/matrices/mil-std-882e', name: 'risk-matrix-builtin' },
  { role: 'safety', path: '/hazards/matrices/marsh-end-site-checks', name: 'risk-matrix-team' },
  { role: 'safety', path: '/hazards/matrices/new', name: 'risk-matrix-new' },
  { role: 'admin', path: '/hazards/matrices/marsh-end-site-checks/edit', name: 'risk-matrix-edit' },
  { role: 'conductor', path: '/procedures', name: 'procedures' },
  { role: 'conductor', path: '/procedures/1', name: 'procedure' },
  { role: 'auditor', path: '/procedures/1/revisions/1', name: 'procedure-released', long: true },
  { role: 'conductor', path: '/procedures/1/revisions/2/edit', name: 'procedure-editor', long: true },
  { role: 'safety', path: '/procedures/1/diff?from=1&to=2', name: 'procedure-diff', long: true },
  { role: 'auditor', path: '/procedures/1/revisions/2/print', name: 'procedure-print', long: true },
  { role: 'admin', path: '/procedures/stations', name: 'stations' },
  { role: 'conductor', path: '/procedures/1/crew', name: 'crew-plans' },
  { role: 'operator', path: '/counts', name: 'counts' },
  // The demo's second count, at its recorder hold (server/db/seed-counts.ts), and its report.
  { role: 'auditor', path: '/counts/2/replay?at=1748681735000', name: 'count-replay' },
  { role: 'auditor', path: '/counts/2/report', name: 'count-report' },
  { role: 'operator', path: '/counts/2/data', name: 'sensor-data' },
  { role: 'auditor', path: '/anomalies', name: 'anomalies' },
  { role: 'safety', path: '/anomalies/1', name: 'anomaly' },
  { role: 'auditor', path: '/records', name: 'records' },
  { role: 'admin', path: '/admin/people', name: 'people' },
  { role: 'admin', path: '/admin/mail', name: 'mail' },
  { role: 'operator', path: '/profile', name: 'profile' },
  { role: 'operator', path: '/admin/people', name: 'forbidden' },
  { role: 'conductor', path: '/nowhere', name: 'not-found' },
];

for (const p of pages) {
  test.describe(p.name, () => {
    if (p.role) test.use({ storageState: storageStateFor(p.role) });

    test(`${p.name}: accessible and screenshotted in both themes at phone and desktop size`, async ({ page, consoleErrors }) => {
      void consoleErrors;
      // One load, two axe scans and four screenshots: more than one ordinary journey's time.
      test.setTimeout(120_000);
      await page.setViewportSize({ width: viewports[0]!.width, height: viewports[0]!.height });
      await page.goto(p.path);
      await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
      await page.evaluate(() => document.fonts.ready);
      // A 60-step procedure repeats one step component: axe reads the first two steps of each kind, not all sixty
      // (the rest is the same markup; scanning it tripled the page's time). The screenshots show every step.
      const exclude: string[] = [];
      if (p.long) {
        await page.evaluate(() => {
          const seen = new Map<string, number>();
          document.querySelectorAll<HTMLElement>('[data-step-kind]').forEach((el) => {
            const kind = el.dataset.stepKind ?? '';
            seen.set(kind, (seen.get(kind) ?? 0) + 1);
            if (seen.get(kind)! > 2) el.setAttribute('data-tour-same-as-above', '');
          });
        });
        exclude.push('[data-tour-same-as-above]');
      }
      for (const theme of themes) {
        // The theme changes as it does when another tab of the app changes it: no reload.
        await page.evaluate((t) => {
          localStorage.setItem('holdfire.theme', t);
          window.dispatchEvent(new StorageEvent('storage', { key: 'holdfire.theme', newValue: t }));
        }, theme);
        await expect(page.locator('html')).toHaveAttribute('data-theme', theme);
        for (const vp of theme === 'daylight' ? viewports : [...viewports].reverse()) {
          await page.setViewportSize({ width: vp.width, height: vp.height });
          await page.evaluate(() => window.scrollTo(0, 0));
          // Nothing may force the page wider than the phone.
          const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
          expect(overflow, `${p.name} ${vp.name} scrolls sideways`).toBeLessThanOrEqual(0);
          // Every rule once per page, at desk size in daylight; at night on the phone, the colours again (contrast
          // is what a theme changes). A scan costs more than a load and a screenshot together.
          if (theme === 'daylight' && vp.name === 'desktop') await expectAccessible(page, `${p.name} ${theme} ${vp.name}`, { exclude });
          if (theme === 'night' && vp.name === 'phone') await expectAccessible(page, `${p.name} ${theme} ${vp.name}`, { rules: ['color-contrast'], exclude });
          await page.screenshot({ path: `e2e/screenshots/${p.name}-${vp.name}-${theme}.png`, fullPage: !p.long });
          if (p.long) {
            // And one screen further down, where the steps are, to look at them too.
            const step = page.locator('[data-step-key]').nth(3);
            if (await step.count()) {
              await step.scrollIntoViewIfNeeded();
              await page.screenshot({ path: `e2e/screenshots/${p.name}-${vp.name}-${theme}-steps.png` });
            }
          }
        }
      }
    });
  });
}
