import 'server-only';
import type { z } from 'zod';
import { AppError } from '@/features/auth/errors';

/**
 * Reads and validates a JSON request body.
 * @throws AppError 'invalid-input' with a message naming each offending field (and field errors)
 */
export async function parseJsonBody<T>(request: Request, schema: z.ZodType<T>): Promise<T> {
  let raw: unknown;
  try {
    raw = await request.json();
  } catch {
    throw new AppError('invalid-input', 'The request body must be valid JSON.');
  }
  const result = schema.safeParse(raw);
  if (result.success) return result.data;
  const fieldErrors: Record<string, string[]> = {};
  for (const issue of result.error.issues) {
    const field = issue.path.map(String).join('.') || '_';
    (fieldErrors[field] ??= []).push(issue.message);
  }
  const summary = Object.entries(fieldErrors)
    .map(([field, messages]) => (field === '_' ? messages.join('; ') : `${field}: ${messages.join('; ')}`))
    .join('; ');
  throw new AppError('invalid-input', summary, fieldErrors);
}

/**
 * An id from the URL: a positive whole number. Anything else cannot name a row, so it is "not found".
 * @throws AppError 'not-found'
 */
export function parseIdParam(value: string, what: string): number {
  if (!/^[1-9][0-9]{0,15}$/.test(value)) throw new AppError('not-found', `No such ${what}.`);
  const id = Number(value);
  if (!Number.isSafeInteger(id)) throw new AppError('not-found', `No such ${what}.`);
  return id;
}
