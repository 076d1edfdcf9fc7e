/**
 * Revisions and design review end to end: the engineer freezes a revision and requests a review;
 * the reviewer reads the e-mail from the fake SMTP inbox (maildev's REST API), follows the link,
 * comments on the high-pass stage and approves with a password signature; the revision shows
 * released; the regulator sees it, downloads the PDF and finds no write control; a second change
 * produces the next revision and the compare view shows what moved.
 */
import { expect, test, type Browser, type Page } from '@playwright/test';
import { storageStateFor, type DemoRole } from './fixtures/accounts';
import { linkFromLatestMail } from './fixtures/maildev';

test.describe.configure({ mode: 'serial' });
// The PDF export lays out every result and plot on the server: allow it time on a shared machine.
test.setTimeout(180_000);

const programName = 'Surface-EMG sleeve';
const planName = 'Larkspur surface-EMG sleeve';
let planId = '';
let planBase = '';
let revisionPath = '';
let revisionLabel = '';

async function pageAs(browser: Browser, role: DemoRole): Promise<Page> {
  const context = await browser.newContext({ storageState: storageStateFor(role) });
  return context.newPage();
}

/** The demo plan's ids through the API (the engineer's session). */
async function findPlan(page: Page) {
  const programs = (await (await page.request.get('/api/programs')).json()).programs as { id: string; name: string }[];
  const program = programs.find((p) => p.name === programName)!;
  const plans = (await (await page.request.get(`/api/programs/${program.id}/plans`)).json()).plans as { id: string; name: string }[];
  const plan = plans.find((p) => p.name === planName)!;
  return { programId: program.id, planId: plan.id };
}

async function freeze(page: Page, summary: string): Promise<string> {
  await page.goto(`${planBase}/revisions`);
  await page.waitForLoadState('networkidle');
  await page.getByLabel('Change summary').fill(summary);
  await page.getByRole('button', { name: /^Freeze revision [A-Z]+$/ }).click();
  const status = page.getByRole('status').filter({ hasText: /Revision [A-Z]+ frozen\./ });
  await expect(status).toBeVisible({ timeout: 30_000 });
  return /Revision ([A-Z]+) frozen/.exec((await status.textContent()) ?? '')![1];
}

test('the engineer freezes a revision and requests a review from the reviewer', async ({ browser }) => {
  const page = await pageAs(browser, 'engineer');
  const ids = await findPlan(page);
  planId = ids.planId;
  planBase = `/programs/${ids.programId}/plans/${ids.planId}`;
  revisionLabel = await freeze(page, 'EMG sleeve design for its review');

  await page.getByRole('link', { name: `Revision ${revisionLabel}`, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText(`Revision ${revisionLabel}`);
  revisionPath = new URL(page.url()).pathname;
  await page.waitForLoadState('networkidle');
  const form = page.getByRole('form', { name: 'Request a review' });
  await form.getByLabel(/Rhea Rautio/).check();
  await form.getByLabel('Message to the reviewers (optional)').fill('Please check the high-pass corner against motion artefacts.');
  await form.getByRole('button', { name: 'Send review request' }).click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('In review', { timeout: 30_000 });
  await page.context().close();
});

test('the reviewer follows the e-mailed link, comments on the high-pass stage and approves with a signature', async ({ browser, baseURL }) => {
  const link = await linkFromLatestMail('rhea.reviewer@larkspur.example', `${baseURL}/review/`);
  expect(new URL(link).pathname).toBe(`/review/${revisionPath.split('/').pop()}`);
  const page = await pageAs(browser, 'reviewer');
  await page.goto(link);
  await expect(page).toHaveURL(new RegExp(`${revisionPath}$`));
  await page.waitForLoadState('networkidle');

  const commentForm = page.getByRole('form', { name: 'Add a comment' });
  await commentForm.getByLabel('Comment on').selectOption('stage:high-pass');
  await commentForm.getByLabel('Comment', { exact: true }).fill('15 Hz second order keeps motion artefacts out; fine for surface EMG.');
  await commentForm.getByRole('button', { name: 'Add comment' }).click();
  const thread = page.getByRole('region', { name: /^Comments/ }).getByRole('listitem').filter({ hasText: '15 Hz second order keeps motion artefacts out' });
  await expect(thread).toBeVisible();
  await expect(thread).toContainText('High-pass');

  const signForm = page.getByRole('form', { name: 'Sign the review' });
  await signForm.getByLabel('Approve').check();
  await signForm.getByLabel('Password (your signature)').fill('larkspur-reviewer-1');
  await signForm.getByRole('button', { name: 'Sign' }).click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Released', { timeout: 30_000 });
  await expect(page.getByText(/Rhea Rautio \(Reviewer\) approved on/)).toBeVisible();
  await page.context().close();
});

test('the regulator sees the released revision, downloads its PDF and finds no write control', async ({ browser }) => {
  const page = await pageAs(browser, 'regulator');
  await page.goto('/released');
  const row = page.getByRole('row').filter({ hasText: planName }).filter({ hasText: `Revision ${revisionLabel}` });
  await row.getByRole('link', { name: `Revision ${revisionLabel}` }).click();
  await expect(page).toHaveURL(new RegExp(`${revisionPath}$`));
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Released');
  await page.waitForLoadState('networkidle');

  const download = page.waitForEvent('download', { timeout: 120_000 });
  await page.getByRole('button', { name: 'Download PDF rationale' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Preparing the PDF' })).toBeVisible();
  const file = await download;
  expect(file.suggestedFilename()).toMatch(new RegExp(`-revision-${revisionLabel}-rationale\\.pdf$`));

  // Read-only: no form, no text field, no button that writes.
  await expect(page.getByRole('form')).toHaveCount(0);
  await expect(page.getByRole('textbox')).toHaveCount(0);
  for (const name of ['Sign', 'Add comment', 'Reply', 'Resolve', 'Reopen', 'Send review request']) {
    await expect(page.getByRole('button', { name, exact: true })).toHaveCount(0);
  }
  await expect(page.getByRole('button', { name: /^Freeze revision/ })).toHaveCount(0);
  // What remains is reading: the two downloads and signing out.
  const buttons = await page.getByRole('button').allTextContents();
  expect(buttons.map((b) => b.trim()).sort()).toEqual(['Download JSON', 'Download PDF rationale', 'Sign out']);
  await page.context().close();
});

test('a second change produces the next revision and the compare view shows what moved', async ({ browser }) => {
  const page = await pageAs(browser, 'engineer');
  const current = (await (await page.request.get(`/api/plans/${planId}`)).json()).plan as { plan: { highPass: { fcHz: number } }; version: number };
  const oldCornerHz = current.plan.highPass.fcHz;
  const changed = structuredClone(current.plan);
  changed.highPass.fcHz = 20;
  const saved = await page.request.put(`/api/plans/${planId}`, { data: { plan: changed, version: current.version } });
  expect(saved.status()).toBe(200);

  const nextLabel = await freeze(page, 'High-pass corner moved to 20 Hz');
  expect(nextLabel).not.toBe(revisionLabel);
  await page.goto(`${planBase}/revisions/compare`);
  await expect(page.getByRole('heading', { level: 2 })).toContainText(`Revision ${revisionLabel} → revision ${nextLabel}`);
  const input = page.getByRole('row').filter({ hasText: 'highPass.fcHz' });
  await expect(input).toContainText(`${oldCornerHz} Hz`);
  await expect(input).toContainText('20 Hz');
  await expect(page.getByRole('row').filter({ hasText: 'Low −3 dB corner' }).first()).toContainText('moved');
  await page.context().close();
});
