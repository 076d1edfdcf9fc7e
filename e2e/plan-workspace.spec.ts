/**
 * The plan workspace end to end: an engineer creates a plan from the wearable-ECG template, drives
 * the first stage into saturation, sees the failing check, applies the suggestion, saves and
 * reloads; a unit typo is an inline error; a reviewer gets no edit controls; two editors of the
 * same plan: the second save is refused with the offer to reload. Each result view is attached.
 */
import { expect, test, type Page, type TestInfo } from '@playwright/test';
import { storageStateFor } from './fixtures/accounts';

test.describe.configure({ mode: 'serial' });
// Creating a plan, live results and six result views take a while on a cold server.
test.setTimeout(180_000);

let planUrl = '';

async function attach(page: Page, testInfo: TestInfo, name: string) {
  await testInfo.attach(name, { body: await page.screenshot({ fullPage: true }), contentType: 'image/png' });
}

/** Opens the instrumentation stage's form from the chain row (unless it is open already). */
async function openInstrumentationStage(page: Page) {
  const card = page.getByLabel('Channel stages').getByRole('button', { name: 'Open instrumentation stage' });
  if ((await card.getAttribute('aria-expanded')) !== 'true') await card.click();
  return page.getByLabel('Gain resistance Rg');
}

test.describe('as engineer', () => {
  test.use({ storageState: storageStateFor('engineer') });

  test('create from the wearable-ECG template, saturate, see the failing check, apply the fix, save and reload', async ({ page }, testInfo) => {
    await page.goto('/programs');
    await page.getByRole('link', { name: 'Two-lead wearable ECG patch' }).click();
    await page.getByLabel('Start from').selectOption('template');
    await page.getByLabel('Template').selectOption('wearable-ecg-patch');
    await page.getByLabel('Plan name (optional)').fill(`E2E patch ${Date.now()}`);
    await page.getByRole('button', { name: 'Create plan' }).click();
    await expect(page).toHaveURL(/\/programs\/\d+\/plans\/\d+$/, { timeout: 60_000 });
    planUrl = new URL(page.url()).pathname;

    // The template's Rg = 19.9 kΩ (G1 = 3.5); 2.49 kΩ gives G1 = 1 + 2·24.9k/2.49k = 21, past the ≈4.7 the offset allows.
    const rg = await openInstrumentationStage(page);
    await rg.fill('2.49 kΩ');
    await rg.blur();
    await page.getByRole('tab', { name: 'Levels' }).click();
    await expect(page.getByText(/saturat/).first()).toBeVisible();
    await attach(page, testInfo, 'levels-saturated');

    await page.getByRole('tab', { name: 'Checks' }).click();
    await expect(page.getByRole('cell', { name: 'fails' }).first()).toBeVisible();
    await attach(page, testInfo, 'checks-failing');
    await page.getByRole('button', { name: 'Apply suggestion' }).first().click();
    await expect(page.getByText(/^Applied: /)).toBeVisible();

    const rgAfterFix = await (await openInstrumentationStage(page)).inputValue();
    expect(rgAfterFix).not.toBe('2.49 kΩ');
    await page.getByRole('button', { name: 'Save plan' }).click();
    await expect(page.getByText(/Saved \(version 2\)/)).toBeVisible();

    await page.reload();
    await expect(await openInstrumentationStage(page)).toHaveValue(rgAfterFix);
    for (const view of ['Levels', 'Noise', 'Mains', 'Response', 'Waveforms', 'Checks']) {
      await page.getByRole('tab', { name: view }).click();
      await page.waitForTimeout(500);
      await attach(page, testInfo, `view-${view.toLowerCase()}`);
    }
  });

  test('a unit typo is an inline error at the field', async ({ page }, testInfo) => {
    await page.goto(planUrl);
    const rg = await openInstrumentationStage(page);
    await rg.fill('47 nF');
    await rg.blur();
    await expect(rg).toHaveAttribute('aria-invalid', 'true');
    const describedBy = (await rg.getAttribute('aria-describedby')) ?? '';
    const errorText = await page.locator(`[id="${describedBy.split(' ')[0]}"]`).textContent();
    expect(errorText).toMatch(/resistance/i);
    await attach(page, testInfo, 'unit-typo');
  });
});

test.describe('as reviewer', () => {
  test.use({ storageState: storageStateFor('reviewer') });

  test('opens the same plan and finds no edit controls', async ({ page }, testInfo) => {
    await page.goto(planUrl);
    await expect(page.getByRole('tab', { name: 'Checks' })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Save plan' })).toHaveCount(0);
    await page.getByLabel('Channel stages').getByRole('button', { name: 'Open instrumentation stage' }).click();
    await expect(page.getByRole('textbox')).toHaveCount(0);
    await page.getByRole('tab', { name: 'Checks' }).click();
    await expect(page.getByRole('button', { name: 'Apply suggestion' })).toHaveCount(0);
    await attach(page, testInfo, 'reviewer-read-only');
  });
});

test('two editors of one plan: the second save is refused and offers to reload', async ({ browser }, testInfo) => {
  const first = await browser.newContext({ storageState: storageStateFor('engineer') });
  const second = await browser.newContext({ storageState: storageStateFor('admin') });
  const a = await first.newPage();
  const b = await second.newPage();
  await a.goto(planUrl);
  await b.goto(planUrl);

  const rgA = await openInstrumentationStage(a);
  await rgA.fill('15 kΩ');
  await rgA.blur();
  await a.getByRole('button', { name: 'Save plan' }).click();
  await expect(a.getByText(/^Saved \(version \d+\)/)).toBeVisible();

  const rgB = await openInstrumentationStage(b);
  await rgB.fill('16 kΩ');
  await rgB.blur();
  await b.getByRole('button', { name: 'Save plan' }).click();
  await expect(b.getByText(/Someone else saved this plan/)).toBeVisible();
  await attach(b, testInfo, 'stale-save-refused');
  await b.getByRole('button', { name: 'Reload their version' }).click();
  await expect(await openInstrumentationStage(b)).toHaveValue(await rgA.inputValue());
  await first.close();
  await second.close();
});
