import 'server-only';
import type { z } from 'zod';
import { AppError } from '@/features/auth/errors';

/**
 * Reads and validates a JSON request body.
 * @throws AppError 'invalid-input' naming each offending field
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
  throw zodError(result.error);
}

/** An AppError 'invalid-input' from a zod error: one message naming each field, and the field errors. */
export function zodError(error: z.ZodError): AppError {
  const fieldErrors: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const field = issue.path.map(String).join('.') || '_';
    (fieldErrors[field] ??= []).push(issue.message);
  }
  const summary = Object.entries(fieldErrors)
    .map(([field, messages]) => (field === '_' ? messages.join('; ') : `${field}: ${messages.join('; ')}`))
    .join('; ');
  return new AppError('invalid-input', summary, fieldErrors);
}

/**
 * An id from the URL: a positive whole number; anything else names no row ("not found").
 * @throws AppError 'not-found'
 */
export function parseIdParam(value: string, what: string): number {
  if (!/^[1-9][0-9]{0,15}$/.test(value) || !Number.isSafeInteger(Number(value))) throw new AppError('not-found', `No such ${what}.`);
  return Number(value);
}

/** Multipart overhead allowed above the file limit before the body is refused unread. */
const MULTIPART_SLACK_BYTES = 64 * 1024;

/**
 * Reads a multipart form whose `file` field must hold at most `maxBytes`. A declared body larger
 * than the limit is refused before it is read.
 * @throws AppError 'invalid-input' naming the field and the limit
 */
export async function readUploadForm(
  request: Request,
  { maxBytes, limitText }: { maxBytes: number; limitText: string },
): Promise<{ form: FormData; file: File; bytes: Uint8Array }> {
  const declared = Number(request.headers.get('content-length') ?? NaN);
  if (Number.isFinite(declared) && declared > maxBytes + MULTIPART_SLACK_BYTES) {
    throw new AppError('invalid-input', `file: the upload is ${(declared / (1024 * 1024)).toFixed(1)} MB; the limit is ${limitText}`, {
      file: [`the file is larger than ${limitText}`],
    });
  }
  if (!(request.headers.get('content-type') ?? '').toLowerCase().startsWith('multipart/form-data')) {
    throw new AppError('invalid-input', 'The request must be a multipart form with a file field.', { file: ['no file was sent'] });
  }
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    throw new AppError('invalid-input', 'The upload could not be read as a multipart form; nothing was stored.', { file: ['the upload was unreadable'] });
  }
  const file = form.get('file');
  if (!(file instanceof File)) throw new AppError('invalid-input', 'file: choose a file to upload', { file: ['choose a file to upload'] });
  if (file.size > maxBytes) {
    throw new AppError('invalid-input', `file: the file is ${(file.size / (1024 * 1024)).toFixed(1)} MB; the limit is ${limitText}`, {
      file: [`the file is larger than ${limitText}`],
    });
  }
  const bytes = new Uint8Array(await file.arrayBuffer());
  return { form, file, bytes };
}

/** The form's text fields (files left out), for zod. */
export function formFields(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, value] of form.entries()) if (typeof value === 'string') out[key] = value;
  return out;
}
