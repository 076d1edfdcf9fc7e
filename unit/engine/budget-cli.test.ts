import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'scripts/budget.ts', ...args], { encoding: 'utf8' });

describe('budget CLI', () => {
  it('prints a JSON report for a demo plan', () => {
    const r = run('lib/engine/demo-plans/emg-sleeve.json', '--format', 'json');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).planName).toBe('Larkspur surface-EMG sleeve');
  });

  it('exits with 2 and lists every field error for a bad plan', () => {
    const dir = mkdtempSync(join(tmpdir(), 'budget-'));
    const file = join(dir, 'bad.json');
    writeFileSync(file, JSON.stringify({ schemaVersion: 1, name: 'x', mainsHz: 55 }));
    const r = run(file);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('mainsHz: mains frequency must be 50 or 60 Hz');
    expect(r.stderr).toContain('instrumentation: is required');
  });
});
