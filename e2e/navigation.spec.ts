import { expect, storageStateFor, test, type RoleName } from './fixtures';

const everyone = ['Hazards', 'Procedures', 'Live count', 'Records', 'Profile'];
const adminOnly = ['People', 'Mail outbox'];

const expectedRoles: Record<RoleName, string> = {
  admin: 'admin',
  conductor: 'conductor',
  safety: 'safety',
  operator: 'operator',
  auditor: 'auditor',
};

for (const role of Object.keys(expectedRoles) as RoleName[]) {
  test.describe(`${role} navigation`, () => {
    test.use({ storageState: storageStateFor(role) });

    test(`${role} sees the right areas and the server knows the role`, async ({ page, consoleErrors }) => {
      void consoleErrors;
      await page.goto('/');
      const nav = page.getByRole('navigation', { name: /main/i });
      for (const name of everyone) await expect(nav.getByRole('link', { name, exact: true })).toBeVisible();
      for (const name of adminOnly) {
        if (role === 'admin') await expect(nav.getByRole('link', { name, exact: true })).toBeVisible();
        else await expect(nav.getByRole('link', { name, exact: true })).toHaveCount(0);
      }
      const me = await page.request.get('/api/auth/me');
      expect(me.status()).toBe(200);
      expect((await me.json()).roles).toEqual([expectedRoles[role]]);
    });
  });
}

test.describe('access refused', () => {
  test.use({ storageState: storageStateFor('operator') });

  test('an operator is refused the people page, in the page and by the API', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto('/admin/people');
    await expect(page.getByRole('heading', { level: 1 })).toContainText(/access/i);
    await expect(page.getByRole('button', { name: 'Send invitation' })).toHaveCount(0);
    const res = await page.request.get('/api/users');
    expect(res.status()).toBe(403);
  });
});

test('signed out, an app page sends you to sign in and back', async ({ page }) => {
  await page.goto('/records');
  await expect(page).toHaveURL(/\/sign-in\?next=%2Frecords/);
  await page.getByLabel('E-mail').fill('auditor@ternvalley.test');
  await page.getByLabel('Password', { exact: true }).fill('kestrel-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/records$/);
});

test('a wrong password is refused with a clear message', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('pad@ternvalley.test');
  await page.getByLabel('Password', { exact: true }).fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('E-mail or password is not right.');
});

test('an unknown address shows the 404 page', async ({ page }) => {
  await page.goto('/no-such-page');
  await expect(page.getByRole('heading', { level: 1 })).toContainText(/not found|no page/i);
});
