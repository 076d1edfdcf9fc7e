/**
 * The part body of the create and edit requests: the kind, then the fields of that kind's zod
 * schema (lib/parts/part-kinds), numbers in SI units. Messages name the field and the reason.
 */
import { z } from 'zod';
import { partKinds, partSchemaByKind, type PartKind, type PartStatus } from '@/lib/parts/part-kinds';

/** The part as the library stores it. */
export interface PartContentInput {
  kind: PartKind;
  name: string;
  description: string;
  status: PartStatus;
  sourceNote: string;
  values: Record<string, number | string>;
}

export type PartInputResult =
  | { ok: true; part: PartContentInput }
  | { ok: false; message: string; fieldErrors: Record<string, string[]> };

const kindSchema = z.object({ kind: z.enum(partKinds, { error: `kind must be one of ${partKinds.join(', ')}` }) });

/**
 * Validates a part body. With `fixedKind` (an edit), the body's kind must match it or be absent.
 * @param raw the parsed JSON body
 */
export function validatePartInput(raw: unknown, fixedKind?: PartKind): PartInputResult {
  const body = raw !== null && typeof raw === 'object' && !Array.isArray(raw) ? (raw as Record<string, unknown>) : null;
  if (!body) return { ok: false, message: 'The request body must be a JSON object describing the part.', fieldErrors: {} };
  const withKind = fixedKind ? { ...body, kind: body.kind ?? fixedKind } : body;
  const kind = kindSchema.safeParse(withKind);
  if (!kind.success) return { ok: false, message: kind.error.issues[0].message, fieldErrors: { kind: [kind.error.issues[0].message] } };
  if (fixedKind && kind.data.kind !== fixedKind) {
    const message = `kind cannot change (this part is ${fixedKind}); create a new part instead`;
    return { ok: false, message, fieldErrors: { kind: [message] } };
  }
  const schema = partSchemaByKind[kind.data.kind];
  const allowed = new Set(Object.keys((schema as unknown as z.ZodObject).shape));
  const unknownFields = Object.keys(withKind).filter((k) => !allowed.has(k));
  const fieldErrors: Record<string, string[]> = {};
  for (const f of unknownFields) fieldErrors[f] = [`${f} is not a field of ${kind.data.kind} parts`];
  const parsed = schema.safeParse(withKind);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = issue.path.map(String).join('.') || '_';
      (fieldErrors[field] ??= []).push(issue.message);
    }
  }
  if (!parsed.success || unknownFields.length > 0) {
    const summary = Object.entries(fieldErrors)
      .map(([field, messages]) => `${field}: ${messages.join('; ')}`)
      .join('; ');
    return { ok: false, message: summary, fieldErrors };
  }
  const { kind: k, name, description, status, sourceNote, ...values } = parsed.data;
  return { ok: true, part: { kind: k, name, description, status, sourceNote, values: values as Record<string, number | string> } };
}
