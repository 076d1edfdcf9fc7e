import { z } from 'zod';

export { createPlanInputSchema as createPlanBodySchema } from '@/features/plans/schemas';

/** GET …/plans?archived=include lists archived plans too. */
export const listPlansQuerySchema = z.object({
  archived: z.enum(['include', 'exclude'], { error: 'archived must be include or exclude' }).default('exclude'),
});
