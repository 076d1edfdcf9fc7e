import { expect, test } from '@playwright/test';
import { storageStateFor } from './fixtures/accounts';

/**
 * An engineer takes the electrode CSV template, fills it with one bad row, sees the problem in the
 * preview, fixes it and imports; then uploads a bench record to a revision of the wearable-patch plan
 * and sees measured beside predicted. A reviewer sees the library without any write control.
 */
test.describe('part library import and bench records', () => {
  test.use({ storageState: storageStateFor('engineer') });

  test('template → preview error → fix → import', async ({ page }) => {
    const run = Date.now().toString(36);
    await page.goto('/parts');
    await page.getByRole('button', { name: 'Import from CSV' }).click();
    await page.getByLabel('Part kind').selectOption('electrode');

    // The template as the download link serves it.
    const templateLink = page.getByRole('link', { name: /Download the electrode type template/ });
    const template = await (await page.request.get((await templateLink.getAttribute('href'))!)).text();
    const [header, example] = template.trim().split('\n');
    expect(header.split(',')).toContain('rsOhm');
    const good = example.replace('generic dry electrode', `e2e dry electrode ${run}`);
    // Second row: a capacitance where the series resistance goes.
    const bad = example.replace('generic dry electrode', `e2e wet electrode ${run}`).replace('1 kΩ', '1 kF');
    const file = (rows: string[]) => ({ name: 'electrodes.csv', mimeType: 'text/csv', buffer: Buffer.from([header, ...rows].join('\n')) });

    await page.getByLabel('CSV file').setInputFiles(file([good, bad]));
    await page.getByRole('button', { name: 'Check file' }).click();
    const problems = page.getByRole('table', { name: 'Problems in the file' });
    await expect(problems).toBeVisible();
    await expect(problems.getByRole('row')).toHaveCount(2);
    await expect(problems).toContainText('rsOhm');
    await expect(problems).toContainText('1 kF');
    await expect(problems).toContainText('series resistance');
    await expect(page.getByRole('button', { name: /Import \d+ part/ })).toBeDisabled();

    await page.getByLabel('CSV file').setInputFiles(file([good, bad.replace('1 kF', '2.2 kΩ')]));
    await page.getByRole('button', { name: 'Check file' }).click();
    await expect(page.getByText('No problems: 2 parts ready to import.')).toBeVisible();
    await page.getByRole('button', { name: 'Import 2 parts' }).click();
    await expect(page.getByText('Imported 2 electrode type parts.')).toBeVisible();

    await page.getByLabel('Search').fill(`e2e wet electrode ${run}`);
    const table = page.getByRole('table', { name: 'Part library' });
    await expect(table.getByRole('row')).toHaveCount(2);
    await expect(table).toContainText('2.2 kΩ');
  });

  test('bench record on a revision: measured vs predicted', async ({ page }) => {
    // A revision of the wearable-patch plan to attach the record to (frozen through the revisions API).
    const programs = (await (await page.request.get('/api/programs')).json()).programs as { id: string; name: string }[];
    const program = programs.find((p) => p.name === 'Two-lead wearable ECG patch')!;
    const plans = (await (await page.request.get(`/api/programs/${program.id}/plans`)).json()).plans as { id: string; version: number; name: string }[];
    const plan = plans.find((p) => p.name === 'Larkspur two-lead wearable ECG patch') ?? plans[0];
    const frozen = await page.request.post(`/api/plans/${plan.id}/revisions`, { data: { changeSummary: 'bench comparison (e2e)', planVersion: plan.version } });
    expect([201, 409]).toContain(frozen.status());

    // 12 s at 500 Hz, referred to input, in µV: 20 mV DC, 30 µV at 10 Hz, 8 µV at 50 Hz.
    const lines = ['time (s),lead I'];
    for (let i = 0; i < 6000; i++) {
      const t = i / 500;
      const uV = 20_000 + 30 * Math.cos(2 * Math.PI * 10 * t) + 8 * Math.sin(2 * Math.PI * 50 * t);
      lines.push(`${t.toFixed(3)},${uV.toFixed(4)}`);
    }
    await page.goto(`/programs/${program.id}/plans/${plan.id}/bench`);
    await expect(page.getByRole('heading', { name: 'Bench records' })).toBeVisible();
    await page.getByLabel('Record file').setInputFiles({ name: 'patch-bench.csv', mimeType: 'text/csv', buffer: Buffer.from(lines.join('\n')) });
    await page.getByLabel('Unit of CSV values').selectOption('uV');
    await page.getByRole('button', { name: 'Upload and analyse' }).click();
    await expect(page.getByText(/Stored "patch-bench.csv" \(CSV, channel lead I\)/)).toBeVisible({ timeout: 30_000 });

    const comparison = page.getByRole('table', { name: 'Measured vs predicted' });
    await expect(comparison).toBeVisible({ timeout: 30_000 });
    const offsetRow = comparison.getByRole('row', { name: /DC offset/ });
    // 20 mV measured, below the plan's worst-case bound: within.
    await expect(offsetRow.getByRole('cell').nth(1)).toHaveText('20 mV');
    await expect(offsetRow).toContainText('within');
    // A 30 µV cosine has rms 30/√2 = 21.2 µV.
    await expect(comparison.getByRole('row', { name: /in-band noise rms/ }).getByRole('cell').nth(1)).toHaveText('21.2 µV');
    await expect(page.getByRole('figure', { name: 'Trace referred to input' })).toBeVisible();
    await expect(page.getByRole('figure', { name: 'Amplitude spectral density referred to input' })).toBeVisible();
  });
});

test.describe('reviewer', () => {
  test.use({ storageState: storageStateFor('reviewer') });
  test('sees the library without write controls', async ({ page }) => {
    await page.goto('/parts');
    await expect(page.getByRole('heading', { name: 'Parts' })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Import from CSV' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'New part' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: /^Edit/ })).toHaveCount(0);
  });
});
