import { expect, test } from '@playwright/test';
import { demoAccounts, roleLabel, storageStateFor } from './fixtures/accounts';

const caution = /Channelsmith is a planning aid, not a certification\. The device must be verified by test to IEC 60601-1/;

for (const account of demoAccounts) {
  test.describe(`as ${account.role}`, () => {
    test.use({ storageState: storageStateFor(account.role) });

    test('the shell shows name, role, workspace, navigation by role and the caution', async ({ page }) => {
      await page.goto('/programs');
      await expect(page.getByRole('heading', { name: 'Programs' })).toBeVisible();
      await expect(page.getByLabel('Signed in as')).toContainText(account.name);
      await expect(page.getByLabel('Signed in as')).toContainText(roleLabel[account.role]);
      await expect(page.getByRole('banner')).toContainText('Larkspur Biosignals');
      await expect(page.getByRole('note', { name: 'Caution' })).toHaveText(caution);
      const nav = page.getByRole('navigation', { name: 'Main' });
      await expect(nav.getByRole('link', { name: 'Programs' })).toBeVisible();
      await expect(nav.getByRole('link', { name: 'Parts' })).toBeVisible();
      if (account.role === 'admin') {
        await expect(nav.getByRole('link', { name: 'Members' })).toBeVisible();
      } else {
        await expect(nav.getByRole('link', { name: 'Members' })).toHaveCount(0);
      }
    });

    test('/members is for admins only', async ({ page }) => {
      await page.goto('/members');
      if (account.role === 'admin') {
        await expect(page.getByRole('table', { name: 'Members of the workspace and their roles' })).toBeVisible();
        await expect(page.getByRole('cell', { name: 'rhea.reviewer@larkspur.example' })).toBeVisible();
      } else {
        await expect(page.getByText('Only admins can manage members.')).toBeVisible();
        await expect(page.getByRole('table')).toHaveCount(0);
        await expect(page.getByRole('button', { name: 'Send invitation' })).toHaveCount(0);
      }
    });

    test('GET /api/members answers by role', async ({ page }) => {
      const response = await page.request.get('/api/members');
      expect(response.status()).toBe(account.role === 'admin' ? 200 : 403);
    });
  });
}
