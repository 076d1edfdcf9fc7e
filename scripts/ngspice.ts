/**
 * Runs ngspice (Debian package `ngspice`, batch mode) on netlists generated from channel plans
 * and parses the results. Node-only (spawns a process, writes a temp dir). Used by the
 * reference tests and by `npm run bench`.
 *
 * Many netlists run in one ngspice process: a driver file `source`s each netlist, whose own
 * `.control` block runs its analysis and writes its results with `wrdata`.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ChannelPlan } from '@/lib/engine/plan';
import { planToNetlist, type NetlistOptions } from '@/lib/engine/spice-netlist';

/** Nodes written by the AC analyses (see `planToNetlist`). */
export const acProbeNodes = ['in', 'va-vb', 'ina', 'hp', 'g2', 'lp', 'adc'] as const;
export type AcProbeNode = (typeof acProbeNodes)[number];

/** A complex response per node over a frequency grid. */
export interface AcSweep {
  frequencyHz: number[];
  /** Per node: real and imaginary parts, V/V (relative to the 1 V test source). */
  re: Record<AcProbeNode, number[]>;
  im: Record<AcProbeNode, number[]>;
}

export interface NoiseSweep {
  frequencyHz: number[];
  /** Output noise density at the ADC input, V/√Hz. */
  outputVPerRtHz: number[];
  /** ngspice's input-referred density (output ÷ |gain from the differential source|), V/√Hz. */
  inputVPerRtHz: number[];
  /** ngspice's own integral of the output density over the sweep, V rms. */
  outputTotalVrms: number;
}

export interface NgspiceJob {
  plan: ChannelPlan;
  options: NetlistOptions;
}

export interface NgspiceJobResult {
  netlist: string;
  ac?: AcSweep;
  cmrr?: AcSweep;
  noise?: NoiseSweep;
  tran?: { timeS: number[]; vd: number[]; ina: number[]; hp: number[]; adc: number[] };
}

/** ngspice's version line, or a clear error when it is not installed. */
export function ngspiceVersion(): string {
  try {
    const out = execFileSync('ngspice', ['--version'], { encoding: 'utf8', timeout: 10_000 });
    const line = out.split('\n').find((l) => /ngspice-\d+/.test(l));
    return line ? line.replace(/\*/g, '').trim() : out.trim();
  } catch (error) {
    throw new Error(`ngspice is not available (install the Debian package ngspice): ${(error as Error).message}`);
  }
}

/** Parses a `wrdata` file written with `wr_singlescale` and `wr_vecnames`. */
function readColumns(path: string): { names: string[]; rows: number[][] } {
  if (!existsSync(path)) throw new Error(`ngspice did not write ${path}`);
  const lines = readFileSync(path, 'utf8').split('\n').filter((l) => l.trim() !== '');
  const names = lines[0].trim().split(/\s+/);
  const rows = lines.slice(1).map((l) => l.trim().split(/\s+/).map(Number));
  return { names, rows };
}

function parseAc(path: string): AcSweep {
  const { rows } = readColumns(path);
  const re = {} as Record<AcProbeNode, number[]>;
  const im = {} as Record<AcProbeNode, number[]>;
  acProbeNodes.forEach((node, k) => {
    re[node] = rows.map((r) => r[1 + 2 * k]);
    im[node] = rows.map((r) => r[2 + 2 * k]);
  });
  return { frequencyHz: rows.map((r) => r[0]), re, im };
}

/**
 * Runs several netlists in one ngspice process and returns the parsed results in order.
 * @param jobs plans with their netlist options (`controlOutputPrefix` is set here)
 */
export function runNgspiceJobs(jobs: NgspiceJob[]): NgspiceJobResult[] {
  const dir = mkdtempSync(join(tmpdir(), 'channelsmith-ngspice-'));
  try {
    const prepared = jobs.map((job, index) => {
      const prefix = join(dir, `job${index}`);
      const netlist = planToNetlist(job.plan, { ...job.options, controlOutputPrefix: prefix });
      const file = `${prefix}.cir`;
      writeFileSync(file, netlist);
      return { job, prefix, file, netlist };
    });
    const driver = ['* Channelsmith: batch driver', '.control', ...prepared.map((p) => `source ${p.file}`), 'quit', '.endc', '.end', ''].join('\n');
    const driverFile = join(dir, 'driver.cir');
    writeFileSync(driverFile, driver);
    let log = '';
    try {
      log = execFileSync('ngspice', ['-b', driverFile], { encoding: 'utf8', timeout: 120_000, maxBuffer: 64 * 1024 * 1024, stdio: ['ignore', 'pipe', 'pipe'] });
    } catch (error) {
      const e = error as { stdout?: string; stderr?: string; message: string };
      throw new Error(`ngspice failed: ${e.message}\n${e.stdout ?? ''}\n${e.stderr ?? ''}`);
    }
    return prepared.map(({ job, prefix, netlist }) => {
      const result: NgspiceJobResult = { netlist };
      try {
        const analysis = job.options.analysis;
        if (analysis === 'ac') result.ac = parseAc(`${prefix}.ac.txt`);
        else if (analysis === 'cmrr') result.cmrr = parseAc(`${prefix}.cmrr.txt`);
        else if (analysis === 'noise') {
          result.ac = parseAc(`${prefix}.ac.txt`);
          const spectrum = readColumns(`${prefix}.noise.txt`).rows;
          const total = readColumns(`${prefix}.noise-total.txt`).rows[0];
          result.noise = {
            frequencyHz: spectrum.map((r) => r[0]),
            outputVPerRtHz: spectrum.map((r) => r[1]),
            inputVPerRtHz: spectrum.map((r) => r[2]),
            outputTotalVrms: total[1],
          };
        } else {
          const rows = readColumns(`${prefix}.tran.txt`).rows;
          result.tran = {
            timeS: rows.map((r) => r[0]),
            vd: rows.map((r) => r[1]),
            ina: rows.map((r) => r[2]),
            hp: rows.map((r) => r[3]),
            adc: rows.map((r) => r[4]),
          };
        }
      } catch (error) {
        throw new Error(`${(error as Error).message}\n--- ngspice log ---\n${log.slice(-4000)}`);
      }
      return result;
    });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * Runs one netlist as written (e.g. the user-facing export, with its own dot-analyses and
 * `.print` lines) in batch mode and returns ngspice's output.
 */
export function runNgspiceNetlist(netlist: string): string {
  const dir = mkdtempSync(join(tmpdir(), 'channelsmith-ngspice-'));
  try {
    const file = join(dir, 'netlist.cir');
    writeFileSync(file, netlist);
    try {
      return execFileSync('ngspice', ['-b', file], { encoding: 'utf8', timeout: 120_000, maxBuffer: 64 * 1024 * 1024, stdio: ['ignore', 'pipe', 'pipe'] });
    } catch (error) {
      const e = error as { stdout?: string; stderr?: string; message: string };
      throw new Error(`ngspice failed: ${e.message}\n${e.stdout ?? ''}\n${e.stderr ?? ''}`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Magnitude of a complex sample. */
export function magnitude(re: number, im: number): number {
  return Math.hypot(re, im);
}

/**
 * Linear interpolation of |H| in dB on a log-frequency grid.
 * @param sweep an AC sweep
 * @param node the probed node
 * @param fHz frequency inside the sweep, Hz
 * @returns magnitude, dB
 */
export function magnitudeDbAt(sweep: AcSweep, node: AcProbeNode, fHz: number): number {
  const f = sweep.frequencyHz;
  if (fHz < f[0] || fHz > f[f.length - 1]) throw new Error(`frequency ${fHz} Hz outside the sweep ${f[0]}–${f[f.length - 1]} Hz`);
  let i = f.findIndex((x) => x >= fHz);
  if (i <= 0) i = 1;
  const db = (k: number) => 20 * Math.log10(magnitude(sweep.re[node][k], sweep.im[node][k]));
  const t = (Math.log(fHz) - Math.log(f[i - 1])) / (Math.log(f[i]) - Math.log(f[i - 1]));
  return db(i - 1) + t * (db(i) - db(i - 1));
}

/**
 * Integral of a power spectral density over [loHz, hiHz] with the density (V²/Hz)
 * interpolated log-log between grid points (exact for power-law segments).
 * @param frequencyHz ascending grid, Hz
 * @param densityVPerRtHz density, V/√Hz
 * @returns rms, V
 */
export function integrateDensityVrms(frequencyHz: number[], densityVPerRtHz: number[], loHz: number, hiHz: number): number {
  let power = 0;
  for (let k = 1; k < frequencyHz.length; k += 1) {
    const a = Math.max(frequencyHz[k - 1], loHz);
    const b = Math.min(frequencyHz[k], hiHz);
    if (b <= a) continue;
    const f0 = frequencyHz[k - 1];
    const f1 = frequencyHz[k];
    const s0 = densityVPerRtHz[k - 1] ** 2;
    const s1 = densityVPerRtHz[k] ** 2;
    const slope = Math.log(s1 / s0) / Math.log(f1 / f0);
    const sAt = (f: number) => s0 * (f / f0) ** slope;
    if (Math.abs(slope + 1) < 1e-9) power += s0 * f0 * Math.log(b / a);
    else power += (sAt(b) * b - sAt(a) * a) / (slope + 1);
  }
  return Math.sqrt(power);
}

/**
 * The AC and noise analyses of a plan by ngspice, from 1 mHz to the sample rate (100 points per decade).
 * @returns the AC sweep of every probed node and the noise spectra at the ADC input
 */
export function runNgspiceAcNoise(plan: ChannelPlan, options: Omit<NetlistOptions, 'analysis'> = {}): { ac: AcSweep; noise: NoiseSweep; netlist: string } {
  const [result] = runNgspiceJobs([{ plan, options: { ...options, analysis: 'noise' } }]);
  if (!result.ac || !result.noise) throw new Error('ngspice returned no AC or noise results');
  return { ac: result.ac, noise: result.noise, netlist: result.netlist };
}
