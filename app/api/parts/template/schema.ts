import { z } from 'zod';
import { partKinds } from '@/lib/parts/part-kinds';

/** GET /api/parts/template?kind=electrode */
export const templateQuerySchema = z.object({
  kind: z.enum(partKinds, { error: `kind must be one of ${partKinds.join(', ')}` }),
});
