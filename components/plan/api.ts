/** The plan's JSON calls: errors carry the server's message, field errors and details. */
export class ApiError extends Error {
  constructor(message: string, readonly status: number, readonly fieldErrors: Record<string, string[]> = {}, readonly details: ErrorDetails | undefined = undefined) {
    super(message);
  }
}

/** What a refusal carries beside its message: how far outside the trench a find fell, which finds an outline leaves out. */
type ErrorDetails = { distance?: number; outside?: number[] } & Record<string, unknown>;
type ErrorBody = { error?: string; fieldErrors?: Record<string, string[]>; details?: ErrorDetails };

export async function apiCall<T>(url: string, init?: { method?: string; body?: unknown }): Promise<T> {
  const res = await fetch(url, {
    method: init?.method ?? "GET",
    headers: init?.body === undefined ? undefined : { "content-type": "application/json" },
    body: init?.body === undefined ? undefined : JSON.stringify(init.body),
  });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = null;
  }
  if (!res.ok) {
    const body = json as ErrorBody | null;
    throw new ApiError(body?.error ?? `The server answered ${res.status}.`, res.status, body?.fieldErrors ?? {}, body?.details);
  }
  return json as T;
}

export type FindRow = {
  id: string;
  number: number;
  x: number;
  y: number;
  z: number | null;
  count: number | null;
  weightG: number | null;
  description: string;
  method: string;
  recordedAt: string;
  recordedBy: string | null;
  trenchId: string;
  contextId: string;
  contextNumber: number;
  contextState: "open" | "awaiting" | "signed_off";
  classId: string;
  classCode: string;
  classLabel: string;
};

export type ClassRow = { id: string; code: string; label: string; colour: string; symbol: string; humanRemains: boolean };
export type ContextRow = { id: string; number: number; type: string; state: "open" | "awaiting" | "signed_off"; signedOffAt: string | null; extent?: { type: "Polygon"; coordinates: [number, number][][] } | null };

/** Every find of a trench, 500 a page, pages after the first fetched together. */
export async function fetchAllFinds(siteId: string, trenchId: string): Promise<FindRow[]> {
  const page = (n: number) => apiCall<{ total: number; rows: FindRow[] }>(`/api/sites/${siteId}/finds?trenchId=${trenchId}&pageSize=500&page=${n}`);
  const first = await page(1);
  const pages = Math.ceil(first.total / 500);
  const rest = await Promise.all(Array.from({ length: Math.max(0, pages - 1) }, (_, i) => page(i + 2)));
  return [first, ...rest].flatMap((p) => p.rows);
}
