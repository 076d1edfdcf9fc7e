/**
 * Runs the SciPy reference script (`scipy_reference.py`) with Debian's /usr/bin/python3 and
 * python3-scipy. One process per batch of requests; JSON in, JSON out.
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const script = fileURLToPath(new URL('./scipy_reference.py', import.meta.url));
/** Debian's interpreter: the `python3` on PATH may be another installation without SciPy. */
const python = '/usr/bin/python3';

export type ScipyRequest =
  | { kind: 'lowpass'; family: 'butterworth' | 'bessel'; order: number; fcHz: number; fHz: number[] }
  | { kind: 'highpass'; order: number; fcHz: number; fHz: number[] }
  | { kind: 'poles'; family: 'butterworth' | 'bessel'; order: number }
  | { kind: 'enbw'; family: 'butterworth' | 'bessel'; order: number }
  | { kind: 'lsim'; hpOrder: number; fcHz: number; amplitudeV: number; widthS: number; delayS: number; durationS: number; stepS: number };

export interface ScipyBatch {
  versions: { scipy: string; numpy: string };
  results: Record<string, number[] | number>[];
}

/**
 * Runs a batch of SciPy reference computations.
 * @throws a clear error when python3 or SciPy is missing
 */
export function runScipy(requests: ScipyRequest[]): ScipyBatch {
  try {
    const out = execFileSync(python, [script], { input: JSON.stringify({ requests }), encoding: 'utf8', timeout: 120_000, maxBuffer: 256 * 1024 * 1024 });
    return JSON.parse(out) as ScipyBatch;
  } catch (error) {
    const e = error as { stderr?: string; message: string };
    throw new Error(`SciPy reference failed (needs ${python} with python3-scipy): ${e.message}\n${e.stderr ?? ''}`);
  }
}
