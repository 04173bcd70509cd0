import AxeBuilder from '@axe-core/playwright';
import { test as base, expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'kestrel-demo';

export const ROLE_USERS = {
  admin: 'admin@ternvalley.test',
  conductor: 'conductor@ternvalley.test',
  safety: 'safety@ternvalley.test',
  operator: 'propellants@ternvalley.test',
  auditor: 'auditor@ternvalley.test',
} as const;
export type RoleName = keyof typeof ROLE_USERS;

export const storageStateFor = (role: RoleName) => `e2e/.auth/${role}.json`;

/** Every page must pass axe with no serious or critical violation. */
export async function expectAccessible(page: Page, context: string, options: { rules?: string[]; exclude?: string[] } = {}) {
  // Only violations are read: asking axe for nothing else spares it gathering and sending back every passing node.
  const builder = new AxeBuilder({ page }).options({ resultTypes: ['violations'] });
  if (options.rules) builder.withRules(options.rules);
  for (const selector of options.exclude ?? []) builder.exclude(selector);
  const results = await builder.analyze();
  const bad = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(bad.map((v) => `${context}: ${v.id} (${v.impact}) ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
}

/** Fails the test on any console error or CSP refusal the page produced. */
export const test = base.extend<{ consoleErrors: string[] }>({
  consoleErrors: async ({ page }, use) => {
    const errors: string[] = [];
    page.on('console', (msg) => {
      // A 401 from /api/auth/me is how a signed-out page learns it is signed out; the browser logs it.
      if (msg.type() === 'error' && !/status of 401/.test(msg.text())) errors.push(msg.text());
    });
    page.on('pageerror', (error) => errors.push(error.message));
    await use(errors);
    expect(errors, 'browser console errors').toEqual([]);
  },
});

export { expect };
