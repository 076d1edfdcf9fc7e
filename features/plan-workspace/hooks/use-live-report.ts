'use client';
/**
 * Live results: the engine runs in the browser on the draft plan, debounced, with its time
 * measured by the User Timing API (performance.mark / performance.measure).
 */
import { useEffect, useRef, useState } from 'react';
import { evaluate } from '@/lib/engine/evaluate';
import type { ChannelReport } from '@/lib/engine/report';
import type { ChannelPlan } from '@/lib/engine/plan';
import { safeParsePlan, type PlanIssue } from '@/lib/engine/validate';

export interface LiveReport {
  /** The validated plan the report belongs to. */
  plan: ChannelPlan | null;
  /** The latest report of a valid plan (kept while the draft is invalid, marked stale). */
  report: ChannelReport | null;
  /** Validation issues of the current draft (empty when valid). */
  issues: PlanIssue[];
  /** True when the report belongs to an earlier draft than the one shown. */
  stale: boolean;
  /** Duration of the last engine run, ms. */
  engineMs: number | null;
  /** A failure of the engine itself (never expected; shown rather than crashing). */
  engineError: string | null;
}

let runCounter = 0;

/** Runs the engine once with timing; never throws. */
export function runEngine(draft: unknown): LiveReport {
  const parsed = safeParsePlan(draft);
  if (!parsed.success) return { plan: null, report: null, issues: parsed.error.issues, stale: true, engineMs: null, engineError: null };
  runCounter += 1;
  const start = `channelsmith-engine-start-${runCounter}`;
  const end = `channelsmith-engine-end-${runCounter}`;
  const hasTiming = typeof performance !== 'undefined' && typeof performance.mark === 'function';
  if (hasTiming) performance.mark(start);
  const t0 = typeof performance !== 'undefined' ? performance.now() : Date.now();
  try {
    const report = evaluate(parsed.data);
    let engineMs = (typeof performance !== 'undefined' ? performance.now() : Date.now()) - t0;
    if (hasTiming) {
      performance.mark(end);
      const measure = performance.measure('channelsmith-engine', start, end);
      if (measure && typeof measure.duration === 'number') engineMs = measure.duration;
      performance.clearMarks(start);
      performance.clearMarks(end);
      performance.clearMeasures('channelsmith-engine');
    }
    return { plan: parsed.data, report, issues: [], stale: false, engineMs, engineError: null };
  } catch (cause) {
    return { plan: null, report: null, issues: [], stale: true, engineMs: null, engineError: cause instanceof Error ? cause.message : String(cause) };
  }
}

/**
 * The live report of `draft`, recomputed `delayMs` after the last change.
 * @param draft the plan being edited (any JSON; validated before the engine runs)
 * @param delayMs debounce delay, ms (default 150)
 */
export function useLiveReport(draft: unknown, delayMs = 150): LiveReport {
  // The first report is computed during render so results show at once; its timing is not shown (it may be the server's).
  const [state, setState] = useState<LiveReport>(() => ({ ...runEngine(draft), engineMs: null }));
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      // The first render's report may come from the server render; time the engine once in this browser.
      first.current = false;
      const measured = runEngine(draft);
      if (measured.report) setState(measured);
      return;
    }
    const timer = setTimeout(() => {
      const next = runEngine(draft);
      // Keep the last good report on screen while the draft is invalid, marked stale.
      setState((prev) => (next.report ? next : { ...next, plan: prev.plan, report: prev.report, engineMs: prev.engineMs }));
    }, delayMs);
    return () => clearTimeout(timer);
  }, [draft, delayMs]);
  return state;
}
