/**
 * Checks of the report against the requirement profile. A check is 'marginal' when it passes
 * by less than 10 % of its limit (our convention), 'fails' when it does not pass.
 */
import { MARGINAL_FRACTION } from './constants';
import type { LimitSpec } from './profiles';
import type { Check, StageId, Verdict } from './report';

/**
 * Relative margin of a value against a limit: (limit − value)/|limit| for an upper limit,
 * (value − limit)/|limit| for a lower one; with a zero limit, the difference itself.
 */
export function checkMargin(value: number, limit: number, sense: 'atMost' | 'atLeast'): number {
  const diff = sense === 'atMost' ? limit - value : value - limit;
  return limit === 0 ? diff : diff / Math.abs(limit);
}

/** Verdict from a margin: < 0 fails, < 10 % marginal (our convention), else meets. */
export function verdictFromMargin(margin: number): Verdict {
  if (!(margin >= 0)) return 'fails';
  return margin < MARGINAL_FRACTION ? 'marginal' : 'meets';
}

/** Builds one check. */
export function makeCheck(
  id: string,
  title: string,
  value: number,
  unit: string,
  sense: 'atMost' | 'atLeast',
  spec: Pick<LimitSpec, 'value' | 'source' | 'sourceVerified'>,
  stageId: StageId,
): Check {
  const margin = checkMargin(value, spec.value, sense);
  return { id, title, value, limit: spec.value, unit, sense, margin, verdict: verdictFromMargin(margin), source: spec.source, sourceVerified: spec.sourceVerified, stageId };
}
