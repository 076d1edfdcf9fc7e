/**
 * Browser-side JSON calls to the app's route handlers (JSON or a FormData body). A refusal becomes an
 * `ApiError` carrying the server's message (which names the field and the reason), its field errors and
 * the whole body (an import preview lists every problem there).
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fieldErrors?: Record<string, string[]>;
  readonly body: unknown;
  constructor(status: number, code: string, message: string, body: unknown, fieldErrors?: Record<string, string[]>) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.body = body;
    this.fieldErrors = fieldErrors;
  }
}

/** Sends a request (JSON or a FormData body) and returns the parsed JSON body, or throws ApiError. */
export async function fetchJson<T>(url: string, init?: RequestInit): Promise<T> {
  let response: Response;
  const isForm = typeof FormData !== 'undefined' && init?.body instanceof FormData;
  try {
    response = await fetch(url, {
      ...init,
      headers: { accept: 'application/json', ...(init?.body && !isForm ? { 'content-type': 'application/json' } : {}), ...init?.headers },
    });
  } catch {
    throw new ApiError(0, 'network', 'The server could not be reached; nothing was changed. Try again.', undefined);
  }
  let body: unknown;
  try {
    body = await response.json();
  } catch {
    body = undefined;
  }
  if (!response.ok) {
    const error = (body as { error?: { code?: unknown; message?: unknown; fieldErrors?: unknown } } | undefined)?.error;
    throw new ApiError(
      response.status,
      typeof error?.code === 'string' ? error.code : 'unexpected',
      typeof error?.message === 'string' ? error.message : `The server answered ${response.status}.`,
      body,
      error?.fieldErrors && typeof error.fieldErrors === 'object' ? (error.fieldErrors as Record<string, string[]>) : undefined,
    );
  }
  return body as T;
}
