/**
 * Export inputs built from the committed demo plans and the real engine (invented "Larkspur
 * Biosignals" people and review data).
 */
import fs from 'node:fs';
import path from 'node:path';
import { contentHash } from '@/features/rationale-export/content-hash';
import type { RationaleInputData } from '@/features/rationale-export/rationale-input';
import { evaluate } from '@/lib/engine/evaluate';
import { parsePlan } from '@/lib/engine/validate';

export const demoPlanFiles = ['wearable-ecg-patch.json', 'wearable-ecg-patch-high-gain.json', 'diagnostic-cart-12-lead.json', 'emg-sleeve.json'] as const;

/** A demo plan as written in its JSON file (before defaults). */
export function demoPlanJson(file: string): unknown {
  return JSON.parse(fs.readFileSync(path.join(process.cwd(), 'lib/engine/demo-plans', file), 'utf8'));
}

/**
 * A complete export input for a demo plan.
 * @param options.withBench attach a bench comparison
 * @param options.comments how many review comments to add
 */
export function demoRationaleInput(file: string, options: { withBench?: boolean; comments?: number; label?: string } = {}): RationaleInputData {
  const plan = parsePlan(demoPlanJson(file));
  const report = evaluate(plan);
  const hash = contentHash({ plan, report });
  const comments = Array.from({ length: options.comments ?? 2 }, (_, i) => ({
    stageId: i % 2 === 0 ? 'instrumentation' : undefined,
    checkId: i % 2 === 1 ? 'noise' : undefined,
    authorName: i % 2 === 0 ? 'Mira Okonkwo-Lund' : 'Tobias Feldgrün',
    at: new Date(Date.UTC(2025, 2, 4, 9 + i, 15)).toISOString(),
    body: i % 2 === 0 ? 'Please show the headroom at VA and VB with the ±300 mV offset applied; Rg looks tight.' : 'Noise budget is fine; the 6.6 × rms factor is common practice, keep the note.',
    resolved: i % 3 === 0,
  }));
  return {
    program: { name: 'Larkspur Biosignals: two-lead wearable ECG patch' },
    plan: { name: plan.name },
    revision: {
      label: options.label ?? 'B',
      state: 'in-review',
      createdAt: new Date(Date.UTC(2025, 2, 3, 14, 30)),
      createdByName: 'Ines Varga',
      changeSummary: 'Lowered the first-stage gain after the offset check; moved gain to the second stage.',
      contentHash: hash,
    },
    planInput: plan,
    report,
    review: {
      requestedAt: '2025-03-03T15:00:00.000Z',
      reviewers: [
        { name: 'Mira Okonkwo-Lund', role: 'reviewer' },
        { name: 'Tobias Feldgrün', role: 'reviewer' },
      ],
      comments,
      signatures: [
        { signerName: 'Mira Okonkwo-Lund', role: 'reviewer', meaning: 'approved', at: '2025-03-05T10:00:00.000Z', contentHash: hash },
        { signerName: 'Tobias Feldgrün', role: 'reviewer', meaning: 'changes-requested', at: '2025-03-05T11:30:00.000Z', contentHash: 'a'.repeat(64) },
      ],
    },
    bench: options.withBench
      ? {
          recordName: 'patch-proto-2 bench run 1 (CSV)',
          rows: [
            { quantity: 'DC offset at the ADC input', unit: 'V', predicted: 0.0123, measured: 0.0131, ratio: 0.0131 / 0.0123, within: true },
            { quantity: 'Noise RTI, rms', unit: 'V', predicted: report.noise.rtiRmsV, measured: report.noise.rtiRmsV * 1.4, ratio: 1.4, within: false },
            { quantity: 'Mains amplitude RTI, peak-to-peak', unit: 'V', predicted: report.interference.rtiPpV, measured: report.interference.rtiPpV * 0.8, ratio: 0.8, within: true },
          ],
        }
      : undefined,
    generatedAt: '2025-03-06T08:00:00.000Z',
    generatedByName: 'Ravi Castellanos',
  };
}
