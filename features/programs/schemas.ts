/**
 * Inputs for programs, as zod schemas shared by the route handlers (server) and the forms
 * (client). Messages name the field and the constraint.
 */
import { z } from 'zod';

export const programNameSchema = z
  .string({ error: 'name must be text' })
  .trim()
  .min(1, { message: 'name is required' })
  .max(200, { message: 'name must be at most 200 characters' });

export const programDescriptionSchema = z
  .string({ error: 'description must be text' })
  .trim()
  .max(2000, { message: 'description must be at most 2000 characters' });

/** POST /api/programs */
export const createProgramInputSchema = z.strictObject(
  {
    name: programNameSchema,
    description: programDescriptionSchema.default(''),
  },
  { error: (issue) => (issue.code === 'unrecognized_keys' ? `unknown field: ${issue.keys.join(', ')}` : 'the request body must be a JSON object') },
);
export type CreateProgramInput = z.infer<typeof createProgramInputSchema>;

/** PATCH /api/programs/[programId]: rename, re-describe, archive or restore (at least one). */
export const updateProgramInputSchema = z
  .strictObject(
    {
      name: programNameSchema.optional(),
      description: programDescriptionSchema.optional(),
      archived: z.boolean({ error: 'archived must be true or false' }).optional(),
    },
    { error: (issue) => (issue.code === 'unrecognized_keys' ? `unknown field: ${issue.keys.join(', ')}` : 'the request body must be a JSON object') },
  )
  .refine((v) => v.name !== undefined || v.description !== undefined || v.archived !== undefined, {
    message: 'give at least one of name, description or archived',
  });
export type UpdateProgramInput = z.infer<typeof updateProgramInputSchema>;
