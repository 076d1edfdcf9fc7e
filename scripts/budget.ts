/**
 * Channel budget from the command line:
 *   node --import tsx scripts/budget.ts <plan.json> [--format json|table]
 * Exit codes: 0 report printed (checks may still fail: see the table), 1 usage or file error,
 * 2 invalid plan (every field error printed).
 */
import { readFileSync } from 'node:fs';
import { evaluate } from '@/lib/engine/evaluate';
import type { ChannelReport } from '@/lib/engine/report';
import { PlanValidationError } from '@/lib/engine/validate';

function usage(message: string): never {
  process.stderr.write(`${message}\nusage: npm run budget -- <plan.json> [--format json|table]\n`);
  process.exit(1);
}

/** Engineering notation with an SI prefix, e.g. 4.06e-9 V → "4.06 nV". */
function eng(value: number, unit: string): string {
  if (!['V', 'A', 'Hz', 'Ω', 'V/s'].includes(unit)) return `${value.toPrecision(4)} ${unit}`;
  if (value === 0 || !Number.isFinite(value)) return `${value} ${unit}`;
  const prefixes: [number, string][] = [[1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f']];
  const abs = Math.abs(value);
  const [scale, prefix] = prefixes.find(([s]) => abs >= s) ?? prefixes[prefixes.length - 1];
  return `${(value / scale).toPrecision(4)} ${prefix}${unit}`;
}

function table(r: ChannelReport): string {
  const lines: string[] = [];
  lines.push(`${r.planName} — profile ${r.profile.name} (engine ${r.engineVersion})`);
  lines.push(`gains: G1 ${r.gains.g1.toPrecision(4)}, Gd ${r.gains.gd}, G2 ${r.gains.g2}, total ${r.gains.totalGain.toPrecision(4)}; largest safe G1 ${r.maxFirstStageGain.toPrecision(4)} (${r.maxFirstStageGainDetail.limitingNode})`);
  lines.push('', 'levels:');
  for (const s of r.stages) for (const n of s.nodes) lines.push(`  ${s.name.padEnd(28)} ${n.name.padEnd(24)} ${n.minV.toFixed(3).padStart(8)} … ${n.maxV.toFixed(3).padStart(8)} V  range ${n.lowLimitV.toFixed(2)} … ${n.highLimitV.toFixed(2)} V  headroom ${n.headroomV.toFixed(3)} V`);
  lines.push('', `response: ${eng(r.response.lowCornerHz, 'Hz')} … ${eng(r.response.highCornerHz, 'Hz')}, mid-band ${r.response.midbandGainDb.toFixed(2)} dB, alias attenuation ${r.response.aliasAttenuationDb.toFixed(1)} dB`);
  lines.push(`noise: ${eng(r.noise.rtiRmsV, 'V')} rms, ${eng(r.noise.rtiPpV, 'V')} p-p RTI (${eng(r.noise.bandLowHz, 'Hz')} … ${eng(r.noise.bandHighHz, 'Hz')}); floor ${eng(r.noise.floorRmsV, 'V')} rms`);
  for (const c of [...r.noise.contributions].sort((a, b) => b.share - a.share)) lines.push(`  ${c.name.padEnd(48)} ${eng(c.rmsV, 'V').padStart(12)}  ${(c.share * 100).toFixed(1)} %`);
  lines.push(`CMRR: ${r.cmrr.dcDb.toFixed(1)} dB at DC, ${r.cmrr.mainsDb.toFixed(1)} dB at mains; interference ${eng(r.interference.rtiPpV, 'V')} p-p RTI (body ${eng(r.interference.bodyCmV, 'V')} rms)`);
  lines.push(`impulse test: ${eng(r.impulseTest.displacementV, 'V')}, ${eng(r.impulseTest.slopeVPerS, 'V/s')}; ADC LSB RTI ${eng(r.adc.lsbRtiV, 'V')}`);
  lines.push('', 'checks:');
  for (const c of r.checks) lines.push(`  ${c.verdict.padEnd(9)} ${c.title.padEnd(58)} ${eng(c.value, c.unit).padStart(16)} vs ${eng(c.limit, c.unit)}${c.sourceVerified ? '' : '  (source unverified)'}`);
  if (r.suggestions.length) lines.push('', 'suggestions:', ...r.suggestions.map((s) => `  ${s.title}: ${s.patch.path} = ${s.patch.value}. ${s.detail}`));
  if (r.warnings.length) lines.push('', 'warnings:', ...r.warnings.map((w) => `  ${w.message}`));
  lines.push('', 'A planning aid, not a certification: verify by test to IEC 60601-1 and the applicable particular standards.');
  return `${lines.join('\n')}\n`;
}

function main(argv: string[]): void {
  const args = argv.slice(2);
  let format: 'json' | 'table' = 'table';
  const files: string[] = [];
  for (let i = 0; i < args.length; i++) {
    if (args[i] === '--format') {
      const f = args[++i];
      if (f !== 'json' && f !== 'table') usage(`--format must be json or table (got ${f ?? 'nothing'})`);
      format = f;
    } else if (args[i].startsWith('--format=')) {
      const f = args[i].slice('--format='.length);
      if (f !== 'json' && f !== 'table') usage(`--format must be json or table (got ${f})`);
      format = f;
    } else files.push(args[i]);
  }
  if (files.length !== 1) usage('give exactly one plan file');
  let input: unknown;
  try {
    input = JSON.parse(readFileSync(files[0], 'utf8'));
  } catch (e) {
    usage(`cannot read ${files[0]}: ${e instanceof Error ? e.message : String(e)}`);
  }
  try {
    const report = evaluate(input);
    process.stdout.write(format === 'json' ? `${JSON.stringify(report, null, 2)}\n` : table(report));
  } catch (e) {
    if (e instanceof PlanValidationError) {
      process.stderr.write(`invalid plan ${files[0]}:\n${e.issues.map((i) => `  ${i.path || '(plan)'}: ${i.message}`).join('\n')}\n`);
      process.exit(2);
    }
    throw e;
  }
}

// A closed pipe (e.g. `| head`) is not an error.
process.stdout.on('error', (e: NodeJS.ErrnoException) => {
  if (e.code === 'EPIPE') process.exit(0);
  throw e;
});
main(process.argv);
