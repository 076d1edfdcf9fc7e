import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RationaleInputError } from '@/features/rationale-export/rationale-input';
import { renderRationalePdf, type RenderProgress } from '@/features/rationale-export/render-pdf';
import { demoRationaleInput } from './fixtures';

const CAUTION =
  'Channelsmith is a planning aid, not a certification. The device must be verified by test to IEC 60601-1 and the applicable particular standards; local regulations and qualified engineers decide. Patient leakage and defibrillation protection must be designed and tested separately.';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'rationale-pdf-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function pdfPages(file: string): number {
  const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
  const m = /^Pages:\s+(\d+)/m.exec(info);
  if (!m) throw new Error(`pdfinfo gave no page count:\n${info}`);
  return Number(m[1]);
}
function pageText(file: string, page?: number): string {
  const range = page === undefined ? [] : ['-f', String(page), '-l', String(page)];
  return execFileSync('pdftotext', [...range, file, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
}
/** pdftotext breaks lines where the layout does; compare with whitespace collapsed. */
const flat = (t: string) => t.replace(/\s+/g, ' ');

describe('renderRationalePdf on a demo plan with a failing check', () => {
  const input = demoRationaleInput('wearable-ecg-patch-high-gain.json', { withBench: true, comments: 3 });
  const file = path.join(dir, 'high-gain.pdf');
  const progress: RenderProgress[] = [];
  let pages = 0;
  let text = '';

  beforeAll(async () => {
    const bytes = await renderRationalePdf(input, { onProgress: (p) => progress.push(p) });
    expect(bytes).toBeInstanceOf(Uint8Array);
    expect(Buffer.from(bytes.subarray(0, 5)).toString('latin1')).toBe('%PDF-');
    fs.writeFileSync(file, bytes);
    pages = pdfPages(file);
    text = flat(pageText(file));
  }, 120_000);

  it('renders one PNG per page that pdfinfo reports, and the page count fits the content', () => {
    execFileSync('pdftoppm', ['-r', '50', '-png', file, path.join(dir, 'page')]);
    const pngs = fs.readdirSync(dir).filter((f) => f.startsWith('page') && f.endsWith('.png'));
    expect(pngs.length).toBe(pages);
    // Title page, then five sections that start on a page of their own (inputs, levels,
    // response, noise, checks); the inputs fill more than one page: at least 7 pages.
    expect(pages).toBeGreaterThanOrEqual(7);
    expect(pages).toBeLessThanOrEqual(16);
    for (let i = 1; i <= pages; i += 1) {
      const t = flat(pageText(file, i));
      expect(t, `page ${i}`).toContain(`Page ${i} of ${pages}`);
      // Title block and caution in every page's header and footer.
      expect(t, `page ${i}`).toContain(`Revision ${input.revision.label} (in review)`);
      expect(t, `page ${i}`).toContain(input.revision.contentHash);
      expect(t, `page ${i}`).toContain(CAUTION);
    }
    expect(flat(pageText(file, 1))).toContain('Design rationale');
    expect(flat(pageText(file, 2))).toContain('1 Inputs');
  });

  it('contains the revision label, the content hash, the cautions and every verdict word', () => {
    expect(text).toContain('Revision B (in review)');
    expect(text).toContain('B, in review');
    expect(text).toContain(input.revision.contentHash);
    expect(text).toContain(CAUTION);
    for (const c of input.report.checks) expect(text).toContain(c.verdict);
    // This plan fails the offset check: both words appear in the checks table.
    expect(input.report.checks.some((c) => c.verdict === 'fails')).toBe(true);
    expect(input.report.checks.some((c) => c.verdict === 'meets')).toBe(true);
  });

  it('lists every check title, with unverified sources marked', () => {
    for (const c of input.report.checks) expect(text).toContain(c.title.replace(/\s+/g, ' '));
    expect(text).toContain('[unverified');
  });

  it('never claims compliance or certification', () => {
    expect(text).not.toMatch(/\bcompliant\b|\bcompliance\b|\bcertified\b/i);
  });

  it('shows the plots with their axis titles and units', () => {
    for (const title of ['Node voltage (V)', 'Frequency (Hz)', 'Magnitude (dB)', 'Phase (degrees)', 'Time (s)', 'Noise density (V/rtHz)', 'CMRR (dB)', 'Interference referred to input, peak-to-peak (V)']) {
      expect(text).toContain(title);
    }
  });

  it('shows the inputs with units and sources, the review record and the bench comparison', () => {
    expect(text).toContain('24.9 kΩ'); // R of the first stage in the demo plan
    expect(text).toContain('2.49 kΩ'); // Rg of the high-gain variant
    expect(text).toContain('470 pF');
    expect(text).toContain('Source of the part values: generic micropower rail-to-rail CMOS op-amp, 25 nV/rtHz (invented demo part)');
    expect(text).toContain('Mira Okonkwo-Lund');
    expect(text).toContain('changes requested');
    expect(text).toContain('(a DIFFERENT content: not this revision)');
    expect(text).toContain('patch-proto-2 bench run 1 (CSV)');
    expect(text).toContain('outside');
  });

  it('reports progress in order, ending at 1', () => {
    expect(progress.map((p) => p.step)).toEqual(['validating', 'preparing', 'laying-out', 'done']);
    const fractions = progress.map((p) => p.fraction);
    expect([...fractions].sort((a, b) => a - b)).toEqual(fractions);
    expect(fractions.at(-1)).toBe(1);
  });
});

describe('renderRationalePdf page count follows the content', () => {
  it('adds pages for a long review record and none for a missing bench record', async () => {
    const short = await renderRationalePdf(demoRationaleInput('wearable-ecg-patch.json', { comments: 0 }));
    const long = await renderRationalePdf(demoRationaleInput('wearable-ecg-patch.json', { comments: 120 }));
    const shortFile = path.join(dir, 'short.pdf');
    const longFile = path.join(dir, 'long.pdf');
    fs.writeFileSync(shortFile, short);
    fs.writeFileSync(longFile, long);
    const shortPages = pdfPages(shortFile);
    const longPages = pdfPages(longFile);
    // 120 comment rows of two lines each (about 18 pt) fill at least three more A4 pages.
    expect(longPages).toBeGreaterThanOrEqual(shortPages + 3);
    const shortText = flat(pageText(shortFile));
    expect(shortText).toContain('No comments.');
    expect(shortText).toContain('No bench record is attached to this revision.');
  }, 180_000);
});

describe('renderRationalePdf input errors', () => {
  it('refuses bad input with the field named, before rendering anything', async () => {
    const input = demoRationaleInput('wearable-ecg-patch.json');
    const progress: RenderProgress[] = [];
    await expect(renderRationalePdf({ ...input, program: { name: '  ' } }, { onProgress: (p) => progress.push(p) })).rejects.toThrow('program.name: program name must not be empty');
    expect(progress.map((p) => p.step)).toEqual(['validating']);
    await expect(renderRationalePdf({ ...input, review: { ...input.review, signatures: [{ ...input.review.signatures[0], meaning: 'ok' }] } })).rejects.toThrow(
      'review.signatures.0.meaning: signature meaning must be approved or changes-requested',
    );
    await expect(renderRationalePdf(undefined)).rejects.toBeInstanceOf(RationaleInputError);
  });
});
