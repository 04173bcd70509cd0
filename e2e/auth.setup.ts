import { expect, test } from '@playwright/test';
import { DEMO_PASSWORD, ROLE_USERS, storageStateFor, type RoleName } from './fixtures';

for (const role of Object.keys(ROLE_USERS) as RoleName[]) {
  test(`sign in as ${role}`, async ({ page }) => {
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(ROLE_USERS[role]);
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
    await page.context().storageState({ path: storageStateFor(role) });
  });
}
