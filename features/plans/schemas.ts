/**
 * Inputs for channel plans, as zod schemas shared by the route handlers and the forms.
 * The plan body itself is validated by the engine's `parsePlan` (every field, with dotted paths).
 */
import { z } from 'zod';
import { demoTemplateIds } from '@/features/plans/template-ids';

export const planNameSchema = z
  .string({ error: 'name must be text' })
  .trim()
  .min(1, { message: 'name is required' })
  .max(200, { message: 'name must be at most 200 characters' });

const idSchema = (what: string) =>
  z
    .union([z.string(), z.number()], { error: `${what} must be an id` })
    .transform((v) => String(v))
    .refine((v) => /^[1-9][0-9]{0,15}$/.test(v), { message: `${what} must be a positive whole number` })
    .transform((v) => Number(v));

const unknownKeys = (issue: { code?: string; keys?: string[] }) =>
  issue.code === 'unrecognized_keys' ? `unknown field: ${(issue.keys ?? []).join(', ')}` : 'the request body must be a JSON object';

/** POST /api/programs/[programId]/plans: a blank plan, a demo template, or a copy of a plan. */
export const createPlanInputSchema = z.discriminatedUnion(
  'source',
  [
    z.strictObject({ source: z.literal('blank'), name: planNameSchema }, { error: unknownKeys }),
    z.strictObject(
      {
        source: z.literal('template'),
        templateId: z.enum(demoTemplateIds, { error: `templateId must be one of ${demoTemplateIds.join(', ')}` }),
        name: planNameSchema.optional(),
      },
      { error: unknownKeys },
    ),
    z.strictObject(
      { source: z.literal('duplicate'), planId: idSchema('planId'), name: planNameSchema.optional() },
      { error: unknownKeys },
    ),
  ],
  { error: 'source must be blank, template or duplicate' },
);
export type CreatePlanInput = z.input<typeof createPlanInputSchema>;

/**
 * PUT /api/plans/[planId]: the same shape as the workspace editor's save request
 * (`features/plan-workspace/api/save-plan.ts`, kept in step by hand: features do not import each other).
 */
export const savePlanInputSchema = z.object(
  {
    plan: z.record(z.string(), z.unknown(), { error: 'plan must be a JSON object' }),
    version: z
      .number({ error: 'version must be a number' })
      .int({ message: 'version must be a whole number' })
      .min(0, { message: 'version must not be negative' }),
  },
  { error: 'the request body must be a JSON object' },
);
export type SavePlanInput = z.infer<typeof savePlanInputSchema>;

/** PATCH /api/plans/[planId]: rename, archive or restore (at least one). */
export const updatePlanInputSchema = z
  .strictObject(
    {
      name: planNameSchema.optional(),
      archived: z.boolean({ error: 'archived must be true or false' }).optional(),
    },
    { error: unknownKeys },
  )
  .refine((v) => v.name !== undefined || v.archived !== undefined, { message: 'give at least one of name or archived' });
export type UpdatePlanInput = z.infer<typeof updatePlanInputSchema>;
