/**
 * Saving a channel plan: the request and response bodies of `PUT /api/plans/[planId]` as zod
 * schemas (the route handler imports these same schemas), and the client-side mutation.
 *
 * Optimistic concurrency: the client sends the version it loaded; the server refuses a stale
 * version with 409 and the current plan, so nothing is silently overwritten.
 */
import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';

/** Request body. `plan` is validated by the engine's plan schema on the server; here it is any JSON object. */
export const savePlanRequestSchema = z.object({
  plan: z.record(z.string(), z.unknown(), { error: 'plan must be a JSON object' }),
  version: z.number({ error: 'version must be a number' }).int({ message: 'version must be a whole number' }).min(0, { message: 'version must not be negative' }),
});
export type SavePlanRequest = z.infer<typeof savePlanRequestSchema>;

/** 200: saved; the new version and the server's report (the record). */
export const savePlanOkSchema = z.object({
  version: z.number().int(),
  report: z.unknown(),
});

/** 409: someone else saved first. */
export const savePlanStaleSchema = z.object({
  error: z.object({ code: z.literal('stale'), message: z.string() }),
  current: z.object({
    plan: z.record(z.string(), z.unknown()),
    version: z.number().int(),
    updatedByName: z.string(),
    updatedAt: z.string(),
  }),
});

/** 422: the plan is invalid; each issue names its field by a dotted path. */
export const savePlanInvalidSchema = z.object({
  error: z.object({
    code: z.literal('invalid'),
    message: z.string(),
    issues: z.array(z.object({ path: z.string(), message: z.string() })),
  }),
});

/** 403 (and any other refusal with a typed code). */
export const savePlanErrorSchema = z.object({
  error: z.object({ code: z.string(), message: z.string() }),
});

export type SavePlanOk = z.infer<typeof savePlanOkSchema>;
export type SavePlanStale = z.infer<typeof savePlanStaleSchema>;
export type SavePlanInvalid = z.infer<typeof savePlanInvalidSchema>;

/** What a save ended in, as the workspace handles it. */
export type SaveOutcome =
  | { kind: 'saved'; version: number; report: unknown }
  | { kind: 'stale'; message: string; current: SavePlanStale['current'] }
  | { kind: 'invalid'; message: string; issues: { path: string; message: string }[] }
  | { kind: 'refused'; status: number; code: string; message: string };

/**
 * Interprets the response of a save. Never throws for an unexpected body: it becomes a
 * `refused` outcome with a message saying what came back.
 * @param status HTTP status
 * @param body parsed JSON body (or undefined when it was not JSON)
 */
export function interpretSaveResponse(status: number, body: unknown): SaveOutcome {
  if (status === 200) {
    const ok = savePlanOkSchema.safeParse(body);
    if (ok.success) return { kind: 'saved', version: ok.data.version, report: ok.data.report };
  }
  if (status === 409) {
    const stale = savePlanStaleSchema.safeParse(body);
    if (stale.success) return { kind: 'stale', message: stale.data.error.message, current: stale.data.current };
  }
  if (status === 422) {
    const invalid = savePlanInvalidSchema.safeParse(body);
    if (invalid.success) return { kind: 'invalid', message: invalid.data.error.message, issues: invalid.data.error.issues };
  }
  const other = savePlanErrorSchema.safeParse(body);
  if (other.success) return { kind: 'refused', status, code: other.data.error.code, message: other.data.error.message };
  return { kind: 'refused', status, code: 'unexpected', message: `The server answered ${status} with a response the workspace could not read.` };
}

/**
 * Sends the plan.
 * @param planId the plan's id
 * @param request plan and the version it was based on
 */
export async function putPlan(planId: string, request: SavePlanRequest): Promise<SaveOutcome> {
  let response: Response;
  try {
    response = await fetch(`/api/plans/${encodeURIComponent(planId)}`, {
      method: 'PUT',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(request),
    });
  } catch {
    return { kind: 'refused', status: 0, code: 'network', message: 'The server could not be reached; your changes are kept here. Try again.' };
  }
  let body: unknown;
  try {
    body = await response.json();
  } catch {
    body = undefined;
  }
  return interpretSaveResponse(response.status, body);
}

/** Query key of a plan, for invalidation after a save. */
export const planQueryKey = (planId: string) => ['plans', planId] as const;

/**
 * The save mutation. Resolves with the outcome (stale and invalid are outcomes, not exceptions,
 * so the workspace can show them at their fields).
 */
export function useSavePlan(planId: string) {
  return useMutation({
    mutationKey: ['plans', planId, 'save'],
    mutationFn: (request: SavePlanRequest) => putPlan(planId, request),
  });
}
