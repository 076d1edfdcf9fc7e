import { expect, test } from '@playwright/test';
import { storageStateFor } from './fixtures/accounts';
import { linkFromLatestMail } from './fixtures/maildev';

test('an admin invites a member, who sets a password from the e-mailed link and signs in', async ({ browser, baseURL }) => {
  const email = `new.member.${Date.now()}@larkspur.example`;
  const password = 'welcome-aboard-1';

  const adminContext = await browser.newContext({ storageState: storageStateFor('admin') });
  const admin = await adminContext.newPage();
  await admin.goto('/members');
  const inviteForm = admin.getByRole('form', { name: 'Invite a member' });
  await inviteForm.getByLabel('E-mail').fill(email);
  await inviteForm.getByLabel('Role').selectOption('engineer');
  await inviteForm.getByRole('button', { name: 'Send invitation' }).click();
  await expect(admin.getByText(`Invitation sent to ${email} as Engineer.`)).toBeVisible();
  await adminContext.close();

  const link = await linkFromLatestMail(email, `${baseURL}/invite/`);
  const inviteeContext = await browser.newContext();
  const invitee = await inviteeContext.newPage();
  await invitee.goto(link);
  await expect(invitee.getByRole('heading', { name: 'Join Larkspur Biosignals' })).toBeVisible();
  await invitee.getByLabel('Your name').fill('Nova Newman');
  await invitee.getByLabel('New password').fill(password);
  await invitee.getByLabel('Repeat the password').fill(password);
  await invitee.getByRole('button', { name: 'Create my account' }).click();
  await expect(invitee.getByText(`Your account for ${email} is ready.`)).toBeVisible();

  await invitee.getByRole('link', { name: 'Go to sign-in' }).click();
  await expect(invitee.getByLabel('E-mail')).toHaveValue(email);
  await invitee.getByLabel('Password').fill(password);
  await invitee.getByRole('button', { name: 'Sign in' }).click();
  await expect(invitee).toHaveURL(/\/programs$/);
  await expect(invitee.getByLabel('Signed in as')).toContainText('Nova Newman');
  await expect(invitee.getByLabel('Signed in as')).toContainText('Engineer');

  // The link works once.
  await invitee.goto(link);
  await expect(invitee.getByText('This invitation has already been used.')).toBeVisible();
  await inviteeContext.close();
});
