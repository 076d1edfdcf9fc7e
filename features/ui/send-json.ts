/**
 * Sends a JSON request from the browser and reads the app's error body ({ error: { message,
 * fieldErrors } }) into one result the forms show.
 */
export type SendResult<T> = { ok: true; data: T } | { ok: false; message: string; fieldErrors: Record<string, string[]> };

export async function sendJson<T>(url: string, method: string, body?: unknown): Promise<SendResult<T>> {
  let response: Response;
  try {
    response = await fetch(url, {
      method,
      headers: { 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    return { ok: false, message: 'The server could not be reached; nothing was changed.', fieldErrors: {} };
  }
  const payload = (await response.json().catch(() => null)) as
    | (T & { error?: { message?: string; fieldErrors?: Record<string, string[]> } })
    | null;
  if (response.ok && payload) return { ok: true, data: payload };
  return {
    ok: false,
    message: payload?.error?.message ?? `The server answered ${response.status}; nothing was changed.`,
    fieldErrors: payload?.error?.fieldErrors ?? {},
  };
}
