import { z } from 'zod';
import { partKinds } from '@/lib/parts/part-kinds';

/** GET /api/parts?kind=converter */
export const listPartsQuerySchema = z.object({
  kind: z.enum(partKinds, { error: `kind must be one of ${partKinds.join(', ')}` }).optional(),
});
