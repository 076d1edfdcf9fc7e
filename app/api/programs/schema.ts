import { z } from 'zod';

export { createProgramInputSchema as createProgramBodySchema } from '@/features/programs/schemas';

/** GET /api/programs?archived=include lists archived programs too. */
export const listProgramsQuerySchema = z.object({
  archived: z.enum(['include', 'exclude'], { error: 'archived must be include or exclude' }).default('exclude'),
});
