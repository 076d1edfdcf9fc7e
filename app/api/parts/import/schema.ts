import { z } from 'zod';
import { partKinds } from '@/lib/parts/part-kinds';

const mappingSchema = z.record(z.string().max(200), z.string().max(100).nullable(), { error: 'mapping must map column headers to field names or null' });

/** The text fields of POST /api/parts/import (multipart, with the file in `file`). */
export const importFormSchema = z.object({
  kind: z.enum(partKinds, { error: `kind must be one of ${partKinds.join(', ')}` }),
  /** preview: validate and list problems; import: validate, then write everything or nothing. */
  mode: z.enum(['preview', 'import'], { error: 'mode must be preview or import' }),
  /** JSON of column header → field (or null to ignore the column); omitted: remembered or suggested. */
  mapping: z
    .string()
    .max(20_000, { message: 'mapping must be at most 20,000 characters' })
    .optional()
    .transform((text, ctx) => {
      if (text === undefined || text.trim() === '') return undefined;
      let raw: unknown;
      try {
        raw = JSON.parse(text);
      } catch {
        ctx.addIssue({ code: 'custom', message: 'mapping must be JSON' });
        return z.NEVER;
      }
      const parsed = mappingSchema.safeParse(raw);
      if (!parsed.success) {
        ctx.addIssue({ code: 'custom', message: parsed.error.issues[0].message });
        return z.NEVER;
      }
      return parsed.data;
    }),
});
