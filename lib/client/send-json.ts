/** Calls one of Tautline's route handlers from a page and returns its answer or its error, never throws. */
export interface ApiError {
  code: string;
  message: string;
  fields?: Record<string, string[]>;
}

export type ApiResult<T> = { ok: true; data: T } | { ok: false; status: number; error: ApiError };

export async function sendJson<T = unknown>(
  method: "GET" | "POST" | "PATCH" | "DELETE",
  url: string,
  body?: unknown,
): Promise<ApiResult<T>> {
  let response: Response;
  try {
    response = await fetch(url, {
      method,
      headers: body === undefined ? undefined : { "Content-Type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: "same-origin",
    });
  } catch {
    return {
      ok: false,
      status: 0,
      error: { code: "OFFLINE", message: "No connection to the server. Try again when you have signal." },
    };
  }
  const payload = (await response.json().catch(() => null)) as { error?: ApiError } | T | null;
  if (response.ok) return { ok: true, data: payload as T };
  const error = (payload as { error?: ApiError } | null)?.error ?? {
    code: "UNKNOWN",
    message: `The server answered ${response.status}.`,
  };
  return { ok: false, status: response.status, error };
}
