import { z } from 'zod';

const unknownKeys = (issue: { code?: string; keys?: string[] }) =>
  issue.code === 'unrecognized_keys' ? `unknown field: ${(issue.keys ?? []).join(', ')}` : 'the request body must be a JSON object';

/** POST /api/plans/[planId]/revisions: freeze the plan as it is stored at `planVersion`. */
export const freezeRevisionBodySchema = z.strictObject(
  {
    changeSummary: z
      .string({ error: 'changeSummary must be text' })
      .trim()
      .min(1, { message: 'changeSummary is required: say what changed since the last revision' })
      .max(4000, { message: 'changeSummary must be at most 4000 characters' }),
    planVersion: z
      .number({ error: 'planVersion must be a number' })
      .int({ message: 'planVersion must be a whole number' })
      .min(1, { message: 'planVersion must be at least 1' }),
  },
  { error: unknownKeys },
);
export type FreezeRevisionBody = z.infer<typeof freezeRevisionBodySchema>;
