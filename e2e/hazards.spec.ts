import { expect, storageStateFor, test } from './fixtures';

test.describe.configure({ mode: 'serial' });

const title = `Igniter lead chafes on the thrust frame ${Date.now()}`;
let hazardUrl = '';

test.describe('safety officer', () => {
  test.use({ storageState: storageStateFor('safety') });

  test('records a hazard with mitigations, sees the residual risk and asks for acceptance', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto('/hazards/new');
    await page.getByLabel('Title').fill(title);
    await page.getByLabel('System').selectOption({ label: 'Igniter' });
    await page.getByLabel('Phase').selectOption({ label: 'Firing' });
    await page.getByLabel('Description').fill('The igniter cable rubs on the frame edge during engine vibration.');
    await page.getByRole('button', { name: 'Add cause' }).click();
    await page.getByRole('textbox', { name: /^Cause/ }).first().fill('Cable routed over a sharp frame edge');
    await page.getByLabel('Initial severity').selectOption('1');
    await page.getByLabel('Initial likelihood').selectOption('C');
    // MIL-STD-882E Table III: severity 1 (Catastrophic) x likelihood C (Occasional) -> High.
    await expect(page.getByText(/High/).first()).toBeVisible();
    await page.getByRole('button', { name: 'Add hazard' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toContainText(title);
    hazardUrl = page.url();

    await page.getByRole('button', { name: 'Add a mitigation' }).click();
    const form = page.getByRole('form', { name: 'Add mitigation' });
    await form.getByLabel('Kind (MIL-STD-882E order of precedence)').selectOption({ index: 2 });
    await form.getByLabel('What is done').fill('Route the lead through a grommeted bulkhead fitting and clamp it every 150 mm.');
    await form.getByLabel('Owner').fill('Aiko Brennan');
    await form.getByLabel('How it is verified').fill('Inspection before each firing, photo in the pad log.');
    await form.getByRole('button', { name: 'Add mitigation' }).click();
    await expect(page.getByText('Route the lead through a grommeted bulkhead fitting and clamp it every 150 mm.', { exact: true })).toBeVisible();

    await page.getByRole('button', { name: 'Edit hazard' }).click();
    await page.getByLabel('Residual severity').selectOption('1');
    await page.getByLabel('Residual likelihood').selectOption('D');
    // MIL-STD-882E Table III: 1 x D -> Serious, which needs two different people to accept.
    await page.getByRole('button', { name: 'Save changes' }).click();
    // The form closes only once the server has saved; the preview inside the form says "Serious" before that.
    await expect(page.getByRole('button', { name: 'Save changes' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'Edit hazard' })).toBeVisible();
    await expect(page.getByText(/Serious/).first()).toBeVisible();

    await page.getByRole('button', { name: 'Start mitigating' }).click();
    await expect(page.getByRole('button', { name: 'Start mitigating' })).toHaveCount(0);
    await page.getByRole('button', { name: 'Ask for acceptance' }).click();
    await expect(page.getByRole('button', { name: 'Accept as Safety officer' })).toBeVisible();
    await expect(page.getByText('Still missing:')).toBeVisible();
    await expect(page.getByText('Not changed')).toHaveCount(0);

    const id = hazardUrl.split('/').pop();
    const api = await (await page.request.get(`/api/hazards/${id}`)).json();
    expect(api).toMatchObject({ initialRisk: 'high', residualRisk: 'serious', status: 'awaiting-acceptance' });
  });

  test('the safety officer signs first; one signature is not enough for a serious risk', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(hazardUrl);
    await page.getByRole('button', { name: 'Accept as Safety officer' }).click();
    await expect(page.getByText('Still missing:')).toBeVisible();
    await expect(page.getByText('Priya Halloran as Safety officer')).toBeVisible();
    const id = hazardUrl.split('/').pop();
    expect((await (await page.request.get(`/api/hazards/${id}`)).json()).status).toBe('awaiting-acceptance');
  });
});

test.describe('administrator as test director', () => {
  test.use({ storageState: storageStateFor('admin') });

  test('the second person accepts and the hazard is accepted', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(hazardUrl);
    await page.getByRole('button', { name: 'Accept as Administrator (test director)' }).click();
    await expect(page.getByText('All acceptances recorded')).toBeVisible();
    const id = hazardUrl.split('/').pop();
    expect((await (await page.request.get(`/api/hazards/${id}`)).json()).status).toBe('accepted');
  });
});

test.describe('auditor', () => {
  test.use({ storageState: storageStateFor('auditor') });

  test('reads the history and cannot edit', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto(hazardUrl);
    await expect(page.getByRole('heading', { name: 'History' })).toBeVisible();
    await expect(page.getByText('Priya Halloran').first()).toBeVisible();
    await expect(page.getByRole('button', { name: 'Edit hazard' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'Add a mitigation' })).toHaveCount(0);
    const id = hazardUrl.split('/').pop();
    const history = await page.request.get(`/api/hazards/${id}/history`);
    expect(history.status()).toBe(200);
    const refused = await page.request.patch(`/api/hazards/${id}`, { data: { title: 'changed' } });
    expect(refused.status()).toBe(403);
  });

  test('the heat-map filters the register', async ({ page, consoleErrors }) => {
    void consoleErrors;
    await page.goto('/hazards');
    const rows = page.locator('table:has(#hazard-table-caption) tbody tr');
    await expect(rows.first()).toBeVisible();
    const before = await rows.count();
    const cell = page.getByRole('button', { name: /, [1-9]\d* hazards?$/ }).first();
    const label = (await cell.getAttribute('aria-label')) ?? '';
    const expected = Number(/, (\d+) hazards?$/.exec(label)![1]);
    await cell.click();
    await expect(page.getByRole('list', { name: 'Active filters' })).toBeVisible();
    await expect(rows).toHaveCount(expected);
    expect(expected).toBeLessThan(before);
  });
});
