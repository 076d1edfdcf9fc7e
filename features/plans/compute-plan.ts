/**
 * What the server stores for a plan: the validated plan and the engine's report computed from it.
 * The server re-validates and recomputes on every write; it is the record, whatever the browser showed.
 */
import { evaluate } from '@/lib/engine/evaluate';
import { profileFor } from '@/lib/engine/profiles';
import type { ChannelReport, Verdict } from '@/lib/engine/report';
import { parsePlan } from '@/lib/engine/validate';

export interface ComputedPlanBody {
  plan: Record<string, unknown>;
  report: ChannelReport;
  worstVerdict: Verdict | null;
  profileId: string;
  application: string;
}

const verdictRank: Record<Verdict, number> = { meets: 0, marginal: 1, fails: 2 };

/**
 * The worst verdict among a report's checks (fails > marginal > meets), or null when there are none
 * or the value is not a report.
 */
export function worstVerdictOf(report: unknown): Verdict | null {
  const checks = (report as { checks?: unknown } | null | undefined)?.checks;
  if (!Array.isArray(checks)) return null;
  let worst: Verdict | null = null;
  for (const check of checks) {
    const verdict = (check as { verdict?: unknown } | null)?.verdict;
    if (verdict !== 'meets' && verdict !== 'marginal' && verdict !== 'fails') continue;
    if (worst === null || verdictRank[verdict] > verdictRank[worst]) worst = verdict;
  }
  return worst;
}

/**
 * Validates a plan and computes its report.
 * @param input the plan as received (any JSON)
 * @throws PlanValidationError listing every offending field (dotted paths)
 */
export function computePlan(input: unknown): ComputedPlanBody {
  const plan = parsePlan(input);
  const report = evaluate(plan);
  const profile = profileFor(plan.profileId, plan.customProfile);
  return {
    plan: plan as unknown as Record<string, unknown>,
    report,
    worstVerdict: worstVerdictOf(report),
    profileId: plan.profileId,
    application: profile.application,
  };
}
