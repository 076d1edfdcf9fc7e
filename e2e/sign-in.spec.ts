import { expect, test } from '@playwright/test';
import { demoAccounts } from './fixtures/accounts';

const engineer = demoAccounts[1];

test('a signed-out visit to /programs lands on /sign-in with the way back', async ({ page }) => {
  await page.goto('/programs');
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Fprograms$/);
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
});

test('a wrong password shows the neutral error and stays signed out', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(engineer.email);
  await page.getByLabel('Password').fill('definitely-not-it');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByText('E-mail or password is incorrect')).toBeVisible();
  await expect(page).toHaveURL(/\/sign-in/);
});

test('sign in, follow the callback, then sign out', async ({ page }) => {
  await page.goto('/parts');
  await page.getByLabel('E-mail').fill(engineer.email);
  await page.getByLabel('Password').fill(engineer.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/parts$/, { timeout: 30_000 });
  await expect(page.getByRole('heading', { name: 'Parts' })).toBeVisible();
  // Sign-out runs in the browser: wait until the page's scripts have loaded.
  await page.waitForLoadState('networkidle');
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/sign-in/, { timeout: 30_000 });
  await page.goto('/programs');
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=/);
});
