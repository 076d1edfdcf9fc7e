/// <reference lib="webworker" />
/**
 * The tolerance (Monte Carlo) run, off the main thread so the workspace stays responsive.
 * Progress is posted per chunk; a cancel message aborts the run between chunks.
 */
import { runMonteCarlo } from '@/lib/engine/monte-carlo';
import type { ToleranceReply, ToleranceRequest } from '@/features/plan-workspace/hooks/tolerance-protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const running = new Map<number, AbortController>();

function reply(message: ToleranceReply): void {
  scope.postMessage(message);
}

scope.onmessage = (event: MessageEvent<ToleranceRequest>) => {
  const message = event.data;
  if (message.type === 'cancel') {
    running.get(message.runId)?.abort();
    return;
  }
  if (message.type !== 'run') return;
  const controller = new AbortController();
  running.set(message.runId, controller);
  const started = performance.now();
  runMonteCarlo(message.plan, {
    trials: message.trials,
    seed: message.seed,
    distribution: message.distribution,
    signal: controller.signal,
    onProgress: (done, total) => reply({ type: 'progress', runId: message.runId, done, total }),
  })
    .then((result) => reply({ type: 'result', runId: message.runId, result, elapsedMs: performance.now() - started }))
    .catch((cause: unknown) => {
      if (controller.signal.aborted) reply({ type: 'cancelled', runId: message.runId });
      else reply({ type: 'error', runId: message.runId, message: cause instanceof Error ? cause.message : String(cause) });
    })
    .finally(() => running.delete(message.runId));
};
