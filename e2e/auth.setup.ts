import { expect, test as setup } from '@playwright/test';
import { demoAccounts, roleLabel, storageStateFor } from './fixtures/accounts';

for (const account of demoAccounts) {
  setup(`sign in as ${account.role}`, async ({ page }) => {
    await page.goto('/sign-in');
    // The form signs in from the browser: wait until its scripts have loaded.
    await page.waitForLoadState('networkidle');
    await page.getByLabel('E-mail').fill(account.email);
    await page.getByLabel('Password').fill(account.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page).toHaveURL(/\/programs$/, { timeout: 30_000 });
    await expect(page.getByLabel('Signed in as')).toContainText(roleLabel[account.role]);
    await page.context().storageState({ path: storageStateFor(account.role) });
  });
}
