import { z } from 'zod';

/** POST /api/bench-records/[recordId]/withdraw */
export const withdrawBodySchema = z.object({
  reason: z
    .string({ error: 'reason must be text' })
    .trim()
    .min(1, { message: 'reason is required: say why the record is withdrawn' })
    .max(500, { message: 'reason must be at most 500 characters' }),
});
