import type { APIRequestContext, Locator, Page } from '@playwright/test';
import { makePng } from '../tests/helpers/png';
import { expect, storageStateFor, test } from './fixtures';

/**
 * The procedure journey on a procedure of its own (imported from the demo's released revision), so the demo
 * procedure the tour photographs stays as seeded: import with every problem listed, reorder steps by mouse and
 * keyboard, save and reload, field-level checks, a photo on a step, two-person release, the printed cautions and
 * photo, and a reader who cannot edit.
 */
test.describe.configure({ mode: 'serial' });

const name = `Kestrel-2 cold-flow rehearsal ${Date.now()}`;
const photoCaption = 'Keep-out rope at the stand gate';
let procedureId = 0;

async function csrf(request: APIRequestContext): Promise<string> {
  return (await (await request.get('/api/auth/csrf')).json()).csrfToken as string;
}

/** The step keys of one phase's list, in the order the page shows them. */
async function stepOrder(page: Page, phaseName: string): Promise<string[]> {
  const list = page.getByRole('list', { name: `Steps of ${phaseName}` });
  return list.locator(':scope > li[data-step-key]').evaluateAll((items) => items.map((li) => li.getAttribute('data-step-key') ?? ''));
}

/** The browser logs the refused request a test provokes on purpose; take exactly that one off the list. */
function expectRefusalLogged(consoleErrors: string[], status: number) {
  const i = consoleErrors.findIndex((e) => e.includes(`status of ${status}`));
  expect(i, `the browser logged the ${status} answer`).toBeGreaterThanOrEqual(0);
  consoleErrors.splice(i, 1);
}

const handleOf = (page: Page, key: string): Locator => page.locator(`[data-step-key="${key}"] [data-drag-handle]`);

async function demoExport(request: APIRequestContext) {
  const res = await request.get('/api/procedures/1/revisions/1/export');
  expect(res.status()).toBe(200);
  return res.json();
}

test.describe('test conductor', () => {
  test.use({ storageState: storageStateFor('conductor') });

  test('imports a procedure file; a bad file lists every problem at once and imports nothing', async ({ page, consoleErrors }) => {
    const doc = await demoExport(page.request);
    const before = (await (await page.request.get('/api/procedures')).json()).length;

    const broken = structuredClone(doc);
    broken.procedure.name = name;
    broken.phases[0].steps[2].t = 'T-3';
    broken.phases[1].steps[0].station = 'NOPE';
    await page.goto('/procedures');
    await page.getByLabel('Procedure file').setInputFiles({ name: 'broken.holdfire.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(broken)) });
    await page.getByRole('button', { name: 'Import procedure' }).click();
    const problems = page.getByRole('alert').filter({ hasText: 'nothing was imported' });
    await expect(problems).toBeVisible();
    await expect(problems.getByRole('listitem')).toHaveCount(2);
    await expect(problems).toContainText('Phase 1 (Pad set-up), step 3, time');
    await expect(problems).toContainText('Phase 2 (Leak checks), step 1, station');
    expect((await (await page.request.get('/api/procedures')).json()).length).toBe(before);
    expectRefusalLogged(consoleErrors, 400);

    const good = structuredClone(doc);
    good.procedure.name = name;
    await page.getByLabel('Procedure file').setInputFiles({ name: 'good.holdfire.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(good)) });
    await page.getByRole('button', { name: 'Import procedure' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(name);
    procedureId = Number(/\/procedures\/(\d+)$/.exec(page.url())![1]);
    expect(procedureId).toBeGreaterThan(1);
    await expect(page.getByRole('heading', { name: 'Revision 1' })).toBeVisible();
  });

  test('drags a step into place with the mouse, moves one from the keyboard, saves, and the order survives a reload', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(`/procedures/${procedureId}/revisions/1/edit`);
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Edit revision 1', { timeout: 20_000 }); // a 60-step editor on a busy machine
    const start = await stepOrder(page, 'Pad set-up');
    expect(start.slice(0, 4)).toEqual(['brief', 'headcount-1', 'wind', 'flag-up']);

    // Mouse: pick the untimed flag step up by its handle and drop it on the wind reading above it.
    const target = page.locator('[data-step-key="wind"]');
    await target.evaluate((el) => el.scrollIntoView({ block: 'center' }));
    const from = (await handleOf(page, 'flag-up').boundingBox())!;
    const to = (await target.boundingBox())!;
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
    await page.mouse.down();
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2 - 8, { steps: 4 });
    await page.mouse.move(to.x + 40, to.y + 8, { steps: 20 });
    await page.mouse.up();
    await expect.poll(() => stepOrder(page, 'Pad set-up').then((o) => o.slice(0, 4))).toEqual(['brief', 'headcount-1', 'flag-up', 'wind']);
    await expect(page.getByText('Unsaved changes', { exact: true })).toBeVisible();

    // From the keyboard: the head count's Down button moves it one place (the dnd-kit keyboard drag is left out
    // here: its arrow keys were dropped on a busy machine; see the closing note).
    await page.locator('[data-move="headcount-1:down"]').focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => stepOrder(page, 'Pad set-up').then((o) => o.slice(0, 4))).toEqual(['brief', 'flag-up', 'headcount-1', 'wind']);

    // The plain buttons do the same across a phase boundary: the last pad set-up step goes down into leak checks.
    const lastKey = start[start.length - 1]!;
    await page.locator(`[data-move="${lastKey}:down"]`).click();
    await expect.poll(() => stepOrder(page, 'Leak checks').then((o) => o[0])).toBe(lastKey);
    await expect(page.locator(`[data-move="${lastKey}:down"]`)).toBeFocused();
    await page.locator(`[data-move="${lastKey}:up"]`).click();
    await expect.poll(() => stepOrder(page, 'Pad set-up').then((o) => o.at(-1))).toBe(lastKey);

    await page.getByRole('button', { name: 'Save draft' }).click();
    await expect(page.getByText('Draft saved')).toBeVisible();
    await page.reload();
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Edit revision 1', { timeout: 20_000 }); // a 60-step editor on a busy machine
    await expect.poll(() => stepOrder(page, 'Pad set-up').then((o) => o.slice(0, 4))).toEqual(['brief', 'flag-up', 'headcount-1', 'wind']);
    const saved = await (await page.request.get(`/api/procedures/${procedureId}/revisions/1`)).json();
    expect(saved.phases[0].steps.slice(0, 4).map((s: { key: string }) => s.key)).toEqual(['brief', 'flag-up', 'headcount-1', 'wind']);
  });

  test('shows a broken rule at the field, refuses to save it, and guards unsaved changes', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(`/procedures/${procedureId}/revisions/1/edit`);
    await page.getByRole('button', { name: 'Edit step 4', exact: true }).click();
    const step = page.locator('[data-step-key="wind"]');
    const time = step.getByLabel('Count time');
    await time.fill('T-3:00:00');
    // The step before it is at T-2:00:00: a time earlier than that breaks the order of the list.
    await expect(step.getByRole('alert').filter({ hasText: 'times never go back down the list' })).toBeVisible();
    await expect(time).toHaveAttribute('aria-invalid', 'true');
    await step.getByLabel('Maximum (redline)').fill('');
    await expect(step.getByRole('alert').filter({ hasText: 'at least one limit' })).toBeVisible();
    await page.getByRole('button', { name: 'Save draft' }).click();
    await expect(page.getByText(/2 problems to fix before saving/)).toBeVisible();

    // Leaving now asks first; staying keeps the edits.
    await page.getByRole('link', { name: 'Back to the procedure' }).click();
    const dialog = page.getByRole('alertdialog', { name: 'Leave without saving?' });
    await expect(dialog).toBeVisible();
    await dialog.getByRole('button', { name: 'Stay and keep editing' }).click();
    await expect(dialog).toHaveCount(0);
    await expect(time).toHaveValue('T-3:00:00');
    await page.getByRole('link', { name: 'Back to the procedure' }).click();
    await page.getByRole('alertdialog').getByRole('button', { name: 'Leave and discard changes' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(name);
    const kept = await (await page.request.get(`/api/procedures/${procedureId}/revisions/1`)).json();
    expect(kept.phases[0].steps[3]).toMatchObject({ key: 'wind', tSeconds: -6900 });
  });

  test('attaches a photo to a step of the draft; the revision page shows it beside that step', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(`/procedures/${procedureId}/revisions/1`);
    await page.getByRole('button', { name: 'Attach a diagram or photo' }).click();
    const form = page.getByRole('form', { name: 'Attach a diagram or photo' });
    await form.getByLabel('File').setInputFiles({ name: 'stand-gate.png', mimeType: 'image/png', buffer: makePng(64, 40, [60, 140, 90]) });
    await form.getByLabel('Caption (optional)').fill(photoCaption);
    await form.getByLabel('Attach to').selectOption('walkdown');
    await form.getByRole('button', { name: 'Attach file' }).click();
    await expect(page.getByText(`Added “${photoCaption}”.`)).toBeVisible({ timeout: 15_000 });

    const img = page.locator('[data-step-key="walkdown"]').getByRole('img', { name: `Image: ${photoCaption}` });
    await img.scrollIntoViewIfNeeded(); // it loads lazily
    await expect(img).toBeVisible();
    await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth)).toBe(64);
    const rev = await (await page.request.get(`/api/procedures/${procedureId}/revisions/1`)).json();
    expect(rev.attachments).toEqual([expect.objectContaining({ stepKey: 'walkdown', caption: photoCaption })]);

    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(`/procedures/${procedureId}/revisions/1`);
    await expect(page.locator('[data-step-key="walkdown"]').getByRole('img', { name: `Image: ${photoCaption}` })).toBeAttached();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow, 'revision page with a photo scrolls sideways at 390 px').toBeLessThanOrEqual(0);
  });

  test('signs as test conductor; one signature does not release', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(`/procedures/${procedureId}/revisions/1`);
    await expect(page.getByText('Holdfire is a planning and record aid, not a safety authority.').first()).toBeVisible();
    await expect(page.getByRole('button', { name: 'Sign as safety officer' })).toHaveCount(0);
    await page.getByRole('button', { name: 'Sign as test conductor' }).click();
    await page.getByRole('button', { name: 'Confirm signature' }).click();
    const signoffs = page.getByRole('list', { name: 'Sign-offs' });
    await expect(signoffs.getByRole('listitem').filter({ hasText: 'Test conductor' })).toContainText('Marek Lindqvist');
    await expect(signoffs.getByRole('listitem').filter({ hasText: 'Safety officer' })).toContainText('Waiting for a safety officer');
    const rev = await (await page.request.get(`/api/procedures/${procedureId}/revisions/1`)).json();
    expect(rev.status).toBe('draft');
  });
});

test.describe('safety officer', () => {
  test.use({ storageState: storageStateFor('safety') });

  test('signs second and releases the revision, which is then read-only', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(`/procedures/${procedureId}/revisions/1`);
    await page.getByRole('button', { name: 'Sign as safety officer' }).click();
    // Wait for the server's answer itself, so a refusal shows its reason here instead of as a missing notice.
    const [signed] = await Promise.all([
      page.waitForResponse((r) => r.request().method() === 'POST' && r.url().endsWith(`/api/procedures/${procedureId}/revisions/1/signoffs`)),
      page.getByRole('button', { name: 'Confirm signature' }).click(),
    ]);
    expect(signed.status(), await signed.text()).toBe(201);
    await expect(page.getByText('Revision 1 is released')).toBeVisible();
    await expect(page.getByText('Revision 1: Released')).toBeVisible();
    await expect(page.getByText('Can be counted')).toBeVisible();
    await expect(page.getByRole('link', { name: 'Edit draft' })).toHaveCount(0);
    const signoffs = page.getByRole('list', { name: 'Sign-offs' });
    await expect(signoffs).toContainText('Marek Lindqvist');
    await expect(signoffs).toContainText('Priya Halloran');

    await page.goto(`/procedures/${procedureId}/revisions/1/edit`);
    await expect(page.getByText('Revision 1 is released and read-only')).toBeVisible();
    await expect(page.getByRole('button', { name: 'Save draft' })).toHaveCount(0);
    const frozen = await page.request.put(`/api/procedures/${procedureId}/revisions/1`, {
      data: { phases: [] },
      headers: { 'X-CSRF-Token': await csrf(page.request) },
    });
    expect(frozen.status()).toBe(409);
  });
});

test.describe('auditor', () => {
  test.use({ storageState: storageStateFor('auditor') });

  test('the printable copy shows each step’s cautions beside it and who signed', async ({ page, consoleErrors }) => {
    void consoleErrors;
    const rev = await (await page.request.get(`/api/procedures/${procedureId}/revisions/1`)).json();
    const walkdown = rev.phases[0].steps.find((s: { key: string }) => s.key === 'walkdown');
    const warning = walkdown.cautions.find((c: { level: string }) => c.level === 'warning');
    expect(warning, 'the walk-down step carries a warning').toBeTruthy();

    await page.goto(`/procedures/${procedureId}/revisions/1/print`);
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(name);
    const row = page.getByRole('row').filter({ hasText: walkdown.instruction });
    await expect(row).toHaveCount(1);
    const cautions = row.getByRole('list', { name: /^Cautions for step/ });
    await expect(cautions).toContainText('WARNING');
    await expect(cautions).toContainText(warning.text);
    await expect(row.getByRole('cell').nth(1)).toHaveText(walkdown.t);
    await expect(row.getByRole('img', { name: `Image: ${photoCaption}` })).toBeVisible();
    await expect(page.getByText('Signed in Holdfire by Marek Lindqvist')).toBeVisible();
    await expect(page.getByText('Signed in Holdfire by Priya Halloran')).toBeVisible();
    await expect(page.getByText('Draft — not for use in a count')).toHaveCount(0);
  });
});

test.describe('station operator', () => {
  test.use({ storageState: storageStateFor('operator') });

  test('reads procedures but cannot edit them, in the page and by the API', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto('/procedures');
    await expect(page.getByRole('link', { name })).toBeVisible();
    await expect(page.getByRole('button', { name: 'New procedure' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'Import procedure' })).toHaveCount(0);

    await page.goto('/procedures/1');
    await expect(page.getByRole('heading', { name: 'Revision 2' })).toBeVisible();
    await expect(page.getByRole('link', { name: 'Edit draft' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'Edit details' })).toHaveCount(0);

    await page.goto('/procedures/1/revisions/2');
    await expect(page.getByRole('button', { name: /^Sign as/ })).toHaveCount(0);
    await expect(page.getByRole('link', { name: 'Edit draft' })).toHaveCount(0);

    await page.goto('/procedures/1/revisions/2/edit');
    await expect(page.getByText('Read only')).toBeVisible();
    await expect(handleOf(page, 'brief')).toHaveCount(0);
    const refused = await page.request.put('/api/procedures/1/revisions/2', { data: { phases: [] }, headers: { 'X-CSRF-Token': await csrf(page.request) } });
    expect(refused.status()).toBe(403);
    const draft = await (await page.request.get('/api/procedures/1/revisions/2')).json();
    expect(draft.phases.length).toBeGreaterThan(0);
  });
});
