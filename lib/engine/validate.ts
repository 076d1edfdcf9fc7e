/**
 * Validation of channel plans: every offending field is listed with its path and the reason,
 * and nothing but `PlanValidationError` is ever thrown for bad input.
 */
import { crossFieldIssues, planSchema, type ChannelPlan } from './plan';
import { profileSchema } from './profiles';

/** One problem with one field; `path` is dotted (`instrumentation.rgOhm`, `` for the whole plan). */
export type PlanIssue = { path: string; message: string };

/** Thrown by `parsePlan` for any invalid plan; `issues` lists every offending field. */
export class PlanValidationError extends Error {
  readonly issues: PlanIssue[];
  constructor(issues: PlanIssue[]) {
    super(`Invalid channel plan: ${issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; ')}`);
    this.name = 'PlanValidationError';
    this.issues = issues;
  }
}

export type SafeParsePlanResult = { success: true; data: ChannelPlan } | { success: false; error: PlanValidationError };

function readAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = root;
  for (const key of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[key as string];
  }
  return v;
}

function dotted(path: readonly PropertyKey[]): string {
  return path.map((k) => String(k)).join('.');
}

type RawIssue = { code?: string; path: readonly PropertyKey[]; message: string };

function describe(input: unknown, issue: RawIssue): PlanIssue {
  const path = dotted(issue.path);
  if (issue.code !== 'custom' && path !== '' && readAt(input, issue.path) === undefined) {
    return { path, message: 'is required' };
  }
  if (issue.code === 'invalid_type' && path === '') return { path, message: 'the plan must be a JSON object' };
  if (issue.code === 'invalid_type' && !/must|required/.test(issue.message)) {
    return { path, message: 'must be an object' };
  }
  return { path, message: issue.message };
}

function collectIssues(input: unknown): { data?: ChannelPlan; issues: PlanIssue[] } {
  const result = planSchema.safeParse(input);
  const issues: PlanIssue[] = [];
  if (!result.success) {
    for (const issue of result.error.issues) issues.push(describe(input, issue as RawIssue));
    // zod skips refinements of an object whose fields failed; run the cross-field rules anyway.
    for (const issue of crossFieldIssues(input)) issues.push({ path: dotted(issue.path), message: issue.message });
  }
  const profileId = readAt(input, ['profileId']);
  const custom = readAt(input, ['customProfile']);
  if (profileId === 'custom' && custom !== undefined) {
    const profile = profileSchema.safeParse(custom);
    if (!profile.success) {
      for (const issue of profile.error.issues) {
        const d = describe(custom, issue as RawIssue);
        issues.push({ path: d.path ? `customProfile.${d.path}` : 'customProfile', message: d.path ? d.message : 'the custom profile must be an object' });
      }
    }
  }
  const seen = new Set<string>();
  const unique = issues.filter((i) => {
    const key = `${i.path}\u0000${i.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
  return { data: unique.length === 0 && result.success ? result.data : undefined, issues: unique };
}

/**
 * Validates a channel plan without throwing.
 * @param input anything (parsed JSON, form state)
 * @returns the typed plan, or a `PlanValidationError` listing every offending field
 */
export function safeParsePlan(input: unknown): SafeParsePlanResult {
  try {
    const { data, issues } = collectIssues(input);
    if (data !== undefined) return { success: true, data };
    return { success: false, error: new PlanValidationError(issues.length > 0 ? issues : [{ path: '', message: 'the plan is not valid' }]) };
  } catch (cause) {
    // Exotic inputs (throwing getters, proxies) must still end in a field error, never a crash.
    const reason = cause instanceof Error ? cause.message : String(cause);
    return { success: false, error: new PlanValidationError([{ path: '', message: `the plan could not be read (${reason})` }]) };
  }
}

/**
 * Validates a channel plan.
 * @param input anything
 * @returns the typed plan with defaults applied
 * @throws PlanValidationError listing every offending field (and nothing else)
 */
export function parsePlan(input: unknown): ChannelPlan {
  const result = safeParsePlan(input);
  if (!result.success) throw result.error;
  return result.data;
}
