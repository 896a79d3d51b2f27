/** An answer the server refused, with its message and the field errors to show beside fields. */
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

/** JSON fetch against Loamwork's API; a refusal becomes an ApiError carrying the server's own words. */
export async function apiFetch<T>(url: string, init?: RequestInit): Promise<T> {
  const res = await fetch(url, { ...init, headers: { "content-type": "application/json", ...(init?.headers ?? {}) } });
  const body = await res.json().catch(() => ({}));
  if (!res.ok) throw new ApiError(body.error ?? `The server answered ${res.status}.`, res.status, body.fieldErrors, body.details);
  return body as T;
}
