/**
 * Browser-side JSON calls to the plans API. A refusal becomes an `ApiError` carrying the
 * server's message (which names the field and the reason), so forms can show it as it is.
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fieldErrors?: Record<string, string[]>;
  constructor(status: number, code: string, message: string, fieldErrors?: Record<string, string[]>) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fieldErrors = fieldErrors;
  }
}

/** Sends a request and returns the parsed JSON body, or throws ApiError. */
export async function fetchJson<T>(url: string, init?: RequestInit): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, {
      ...init,
      headers: { accept: 'application/json', ...(init?.body ? { 'content-type': 'application/json' } : {}), ...init?.headers },
    });
  } catch {
    throw new ApiError(0, 'network', 'The server could not be reached; nothing was changed. Try again.');
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
      error?.fieldErrors && typeof error.fieldErrors === 'object' ? (error.fieldErrors as Record<string, string[]>) : undefined,
    );
  }
  return body as T;
}
