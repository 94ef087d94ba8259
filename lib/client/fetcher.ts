import type { ApiError } from "./send-json";

/** What a failed read says: the route's own message and status, or that there was no connection. */
export class FetchError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code: string,
  ) {
    super(message);
    this.name = "FetchError";
  }
}

/**
 * The fetcher handed to swr: a same-origin GET of one of our route handlers, answering its JSON.
 * A non-2xx answer throws a FetchError carrying the route's message, so screens can show it.
 */
export async function fetchJson<T>(url: string): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, { credentials: "same-origin", headers: { Accept: "application/json" } });
  } catch {
    throw new FetchError("No connection to the server. Try again when you have signal.", 0, "OFFLINE");
  }
  const payload = (await response.json().catch(() => null)) as { error?: ApiError } | T | null;
  if (!response.ok) {
    const error = (payload as { error?: ApiError } | null)?.error;
    throw new FetchError(
      error?.message ?? `The server answered ${response.status}.`,
      response.status,
      error?.code ?? "UNKNOWN",
    );
  }
  return payload as T;
}
