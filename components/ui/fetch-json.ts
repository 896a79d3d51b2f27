/** Error from a Loamwork JSON route, carrying the server's message and field errors. */
export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly fieldErrors?: Record<string, string[]>,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

/** fetch + JSON for the app's own routes; a refusal becomes an ApiError with the server's words. */
export async function fetchJson<T>(url: string, init?: { method?: string; body?: unknown; signal?: AbortSignal }): Promise<T> {
  const res = await fetch(url, {
    method: init?.method ?? (init?.body === undefined ? "GET" : "POST"),
    headers: init?.body === undefined ? undefined : { "content-type": "application/json" },
    body: init?.body === undefined ? undefined : JSON.stringify(init.body),
    signal: init?.signal,
  });
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (!res.ok) {
    const b = (body ?? {}) as { error?: string; fieldErrors?: Record<string, string[]>; details?: unknown };
    throw new ApiError(b.error ?? `The server answered ${res.status}.`, res.status, b.fieldErrors, b.details);
  }
  return body as T;
}
