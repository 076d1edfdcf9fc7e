/**
 * Engine benchmarks, one process, medians over repeated runs:
 *   node --import tsx scripts/bench.ts
 * evaluate() per demo plan (target ≤ 1 ms median), the 2,000-point response sweep,
 * Monte Carlo of 10,000 trials (target ≤ 0.5 s), the live-edit step the plan workspace runs on each
 * keystroke (validate + evaluate, target ≤ 16 ms), the waveform and ngspice hooks (the engine's AC +
 * noise analysis at ngspice's point count: target ≤ 0.25 ms, ≥ 100 × faster than ngspice), and, when a
 * production build exists, the first-load JavaScript of the workspace page from the build's own
 * bundle statistics.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { evaluate } from '@/lib/engine/evaluate';
import { resolvePlan } from '@/lib/engine/model';
import { runMonteCarloSync } from '@/lib/engine/monte-carlo';
import { noiseBudget } from '@/lib/engine/noise';
import { profileFor } from '@/lib/engine/profiles';
import { frequencyResponse } from '@/lib/engine/response';
import { parsePlan, safeParsePlan } from '@/lib/engine/validate';

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
// The workspace's per-keystroke step (features/plan-workspace/hooks/use-live-report.ts): the draft is
// validated, then evaluated. The browser shows the same figure, measured with performance marks, beside
// the results ("engine: … ms").
for (const { file, plan } of plans) {
  rows.push({
    what: `keystroke step (validate + evaluate) ${file}`,
    medianMs: time(() => {
      const parsed = safeParsePlan(plan);
      if (parsed.success) evaluate(parsed.data);
    }, 200),
    targetMs: 16,
  });
}

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
let sameAnalysisMs: number | null = null;
let equalGridMs: number | null = null;
try {
  const { runNgspiceAcNoise } = await import('./ngspice');
  const { defaultSweep } = await import('@/lib/engine/spice-netlist');
  const plan = parsePlan(first);
  // The engine's own AC + noise analysis (frequency response with its corners, integrated RTI
  // noise by contributor): on the grids the report uses, and on ngspice's grid (decades × points
  // per decade) for an equal point count. Warmed up longer: each run is well under a millisecond.
  // The ≥ 100 × target compares the same analysis, so it is judged at the equal point count; the
  // 0.25 ms target on that row keeps it met with margin against ngspice's ~30 ms here.
  const sweep = defaultSweep(plan);
  const points = Math.round(Math.log10(sweep.stopHz / sweep.startHz) * sweep.pointsPerDecade) + 1;
  const resolved = resolvePlan(plan, profileFor(plan.profileId, plan.customProfile));
  sameAnalysisMs = time(() => {
    frequencyResponse(resolved);
    noiseBudget(resolved);
  }, 200, 200);
  rows.push({ what: "engine AC + noise, the report's grids (200 + 240 points)", medianMs: sameAnalysisMs });
  equalGridMs = time(() => {
    frequencyResponse(resolved, points);
    noiseBudget(resolved, points);
  }, 200, 200);
  rows.push({ what: `engine AC + noise on ngspice's grid (${points} points each)`, medianMs: equalGridMs, targetMs: 0.25 });
  spiceMs = time(() => runNgspiceAcNoise(plan), 5, 1);
  rows.push({ what: `ngspice .ac + .noise of the same chain, ${points} points (process)`, medianMs: spiceMs });
} catch (e) {
  process.stdout.write(`ngspice hook skipped: ${e instanceof Error ? e.message : String(e)}\n`);
}

const evalMedian = median(rows.filter((r) => r.what.startsWith('evaluate ') && r.what.endsWith('.json')).map((r) => r.medianMs));
process.stdout.write('\nmedian wall time (ms)\n');
for (const r of rows) {
  const target = r.targetMs === undefined ? '' : `  target ≤ ${r.targetMs} ms: ${r.medianMs <= r.targetMs ? 'met' : 'NOT met'} (${(r.medianMs / r.targetMs).toFixed(2)} × target)`;
  process.stdout.write(`  ${r.what.padEnd(74)} ${r.medianMs.toFixed(3).padStart(10)}${target}\n`);
}
if (spiceMs !== null) {
  process.stdout.write(`\nngspice run ÷ the whole evaluate() (every analysis and check): ${(spiceMs / evalMedian).toFixed(0)} ×\n`);
  if (sameAnalysisMs !== null && equalGridMs !== null) {
    const ratio = spiceMs / equalGridMs;
    process.stdout.write(`ngspice run ÷ the engine's AC + noise analysis as the report uses it: ${(spiceMs / sameAnalysisMs).toFixed(0)} ×\n`);
    process.stdout.write(`ngspice run ÷ the engine's same AC + noise analysis on ngspice's grid (equal point count): ${ratio.toFixed(0)} ×  target ≥ 100 ×: ${ratio >= 100 ? 'met' : 'NOT met'}\n`);
  }
}

// First-load JavaScript of the plan workspace, from the production build's bundle statistics
// (`next build` writes them to <distDir>/diagnostics/route-bundle-stats.json). Plotly is loaded
// lazily when a result view opens, so it must not be among these chunks.
const distDir = process.env.NEXT_DIST_DIR ?? '.next';
const statsFile = `${distDir}/diagnostics/route-bundle-stats.json`;
if (existsSync(statsFile)) {
  type RouteStats = { route: string; firstLoadUncompressedJsBytes: number; firstLoadChunkPaths: string[] };
  const stats = JSON.parse(readFileSync(statsFile, 'utf8')) as RouteStats[];
  const kB = (bytes: number) => `${(bytes / 1024).toFixed(0)} kB`;
  process.stdout.write(`\nfirst-load JavaScript from ${statsFile} (raw / gzip level 9)\n`);
  for (const route of ['/programs/[programId]/plans/[planId]', '/programs/[programId]', '/sign-in']) {
    const entry = stats.find((s) => s.route === route);
    if (!entry) continue;
    let raw = 0;
    let gzip = 0;
    let plotly = false;
    for (const chunk of entry.firstLoadChunkPaths) {
      const bytes = readFileSync(chunk.replace(/^\.next\//, `${distDir}/`));
      raw += bytes.length;
      gzip += gzipSync(bytes, { level: 9 }).length;
      plotly ||= bytes.includes('plotly.js');
    }
    process.stdout.write(`  ${route.padEnd(60)} ${kB(raw).padStart(8)} / ${kB(gzip).padStart(7)}  ${plotly ? 'Plotly INCLUDED' : 'without Plotly'}\n`);
  }
} else {
  process.stdout.write(`\nno production build at ${distDir} (run npx next build first for the first-load JavaScript figures)\n`);
}
