/**
 * Engine benchmarks, one process, medians over repeated runs:
 *   node --import tsx scripts/bench.ts
 * evaluate() per demo plan (target ≤ 1 ms median), the 2,000-point response sweep,
 * Monte Carlo of 10,000 trials (target ≤ 0.5 s), then the waveform and ngspice hooks.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { evaluate } from '@/lib/engine/evaluate';
import { runMonteCarloSync } from '@/lib/engine/monte-carlo';
import { parsePlan } from '@/lib/engine/validate';

const demoDir = new URL('../lib/engine/demo-plans/', import.meta.url);

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Median wall time of `fn` in ms over `runs` runs after `warmup` untimed runs. */
function time(fn: () => void, runs: number, warmup = Math.min(20, runs)): number {
  for (let i = 0; i < warmup; i++) fn();
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    samples.push(performance.now() - t0);
  }
  return median(samples);
}

type Row = { what: string; medianMs: number; targetMs?: number };
const rows: Row[] = [];

const plans = readdirSync(demoDir)
  .filter((f) => f.endsWith('.json'))
  .sort()
  .map((f) => ({ file: f, plan: JSON.parse(readFileSync(new URL(f, demoDir), 'utf8')) as unknown }));

for (const { file, plan } of plans) rows.push({ what: `evaluate ${file}`, medianMs: time(() => evaluate(plan), 200), targetMs: 1 });
const first = plans[0].plan;
rows.push({ what: 'evaluate with a 2,000-point response sweep', medianMs: time(() => evaluate(first, { responsePoints: 2000 }), 30) });
rows.push({
  what: 'Monte Carlo, 10,000 trials',
  medianMs: time(() => runMonteCarloSync(first, { trials: 10_000, seed: 1, distribution: 'normal' }), 7, 2),
  targetMs: 500,
});

// ---------------------------------------------------------------------------------------------
// HOOK: waveform simulation and the ngspice comparison (lib/engine/waveforms.ts and
// scripts/ngspice.ts, maintained alongside the reference tests). Loaded dynamically so that this
// script still runs if either is missing or changes shape; failures are reported, not fatal.
// ---------------------------------------------------------------------------------------------
try {
  const { simulateWaveforms } = await import('@/lib/engine/waveforms');
  const plan = parsePlan(first);
  rows.push({ what: 'waveforms: 10 s at 2 kHz', medianMs: time(() => simulateWaveforms(plan, { durationS: 10, sampleRateHz: 2000, seed: 1 }), 5, 1) });
} catch (e) {
  process.stdout.write(`waveform hook skipped: ${e instanceof Error ? e.message : String(e)}\n`);
}
let spiceMs: number | null = null;
try {
  const { runNgspiceAcNoise } = await import('./ngspice');
  const plan = parsePlan(first);
  spiceMs = time(() => runNgspiceAcNoise(plan), 3, 1);
  rows.push({ what: 'ngspice .ac + .noise of the same chain (external process)', medianMs: spiceMs });
} catch (e) {
  process.stdout.write(`ngspice hook skipped: ${e instanceof Error ? e.message : String(e)}\n`);
}

const evalMedian = median(rows.filter((r) => r.what.startsWith('evaluate ') && r.what.endsWith('.json')).map((r) => r.medianMs));
process.stdout.write('\nmedian wall time (ms)\n');
for (const r of rows) {
  const target = r.targetMs === undefined ? '' : `  target ≤ ${r.targetMs} ms: ${r.medianMs <= r.targetMs ? 'met' : 'NOT met'} (${(r.medianMs / r.targetMs).toFixed(2)} × target)`;
  process.stdout.write(`  ${r.what.padEnd(60)} ${r.medianMs.toFixed(3).padStart(10)}${target}\n`);
}
if (spiceMs !== null) process.stdout.write(`\nngspice run ÷ evaluate(): ${(spiceMs / evalMedian).toFixed(0)} ×\n`);
