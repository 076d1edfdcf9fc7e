/**
 * Messages between the workspace and the tolerance Web Worker.
 */
import type { MonteCarloResult } from '@/lib/engine/monte-carlo';

export type ToleranceRequest =
  | { type: 'run'; runId: number; plan: unknown; trials: number; seed: number; distribution: 'uniform' | 'normal' }
  | { type: 'cancel'; runId: number };

export type ToleranceReply =
  | { type: 'progress'; runId: number; done: number; total: number }
  | { type: 'result'; runId: number; result: MonteCarloResult; elapsedMs: number }
  | { type: 'cancelled'; runId: number }
  | { type: 'error'; runId: number; message: string };
