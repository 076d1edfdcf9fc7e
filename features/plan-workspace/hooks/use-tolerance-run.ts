'use client';
/**
 * Runs the tolerance analysis in a Web Worker with progress and cancel. The worker is created
 * on the first run and ended when the workspace unmounts.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { MonteCarloResult } from '@/lib/engine/monte-carlo';
import type { ToleranceReply, ToleranceRequest } from '@/features/plan-workspace/hooks/tolerance-protocol';

export interface ToleranceSettings {
  trials: number;
  seed: number;
  distribution: 'uniform' | 'normal';
}

export type ToleranceState =
  | { kind: 'idle' }
  | { kind: 'running'; runId: number; done: number; total: number }
  | { kind: 'done'; result: MonteCarloResult; elapsedMs: number; planKey: string; settings: ToleranceSettings }
  | { kind: 'cancelled' }
  | { kind: 'error'; message: string };

export function useToleranceRun() {
  const workerRef = useRef<Worker | null>(null);
  const runIdRef = useRef(0);
  const pending = useRef<{ planKey: string; settings: ToleranceSettings } | null>(null);
  const [state, setState] = useState<ToleranceState>({ kind: 'idle' });

  useEffect(
    () => () => {
      workerRef.current?.terminate();
      workerRef.current = null;
    },
    [],
  );

  const worker = useCallback((): Worker => {
    if (workerRef.current) return workerRef.current;
    const w = new Worker(new URL('./tolerance.worker.ts', import.meta.url), { type: 'module' });
    w.onmessage = (event: MessageEvent<ToleranceReply>) => {
      const m = event.data;
      if (m.runId !== runIdRef.current) return; // an older, cancelled run
      if (m.type === 'progress') setState({ kind: 'running', runId: m.runId, done: m.done, total: m.total });
      else if (m.type === 'result') {
        const meta = pending.current ?? { planKey: '', settings: { trials: m.result.trials, seed: m.result.seed, distribution: m.result.distribution } };
        setState({ kind: 'done', result: m.result, elapsedMs: m.elapsedMs, ...meta });
      } else if (m.type === 'cancelled') setState({ kind: 'cancelled' });
      else setState({ kind: 'error', message: m.message });
    };
    w.onerror = (event) => {
      event.preventDefault();
      setState({ kind: 'error', message: event.message || 'the tolerance worker stopped unexpectedly' });
      workerRef.current?.terminate();
      workerRef.current = null;
    };
    workerRef.current = w;
    return w;
  }, []);

  const start = useCallback(
    (plan: unknown, settings: ToleranceSettings) => {
      runIdRef.current += 1;
      const runId = runIdRef.current;
      pending.current = { planKey: JSON.stringify(plan), settings };
      setState({ kind: 'running', runId, done: 0, total: settings.trials });
      const request: ToleranceRequest = { type: 'run', runId, plan, ...settings };
      try {
        worker().postMessage(request);
      } catch (cause) {
        setState({ kind: 'error', message: cause instanceof Error ? cause.message : String(cause) });
      }
    },
    [worker],
  );

  const cancel = useCallback(() => {
    const runId = runIdRef.current;
    workerRef.current?.postMessage({ type: 'cancel', runId } satisfies ToleranceRequest);
    // Ignore anything the cancelled run still sends.
    runIdRef.current += 1;
    setState({ kind: 'cancelled' });
  }, []);

  return { state, start, cancel };
}
