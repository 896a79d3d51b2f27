import type { z, ZodType } from "zod";
import { api, type ApiName } from "./catalog";
import { genUploader } from "uploadthing/client";
import type { recordPhotoUploadSchema } from "@/lib/schemas/record-photo";
import { announceWrite } from "./record-changes";

/**
 * The browser's one way to call Loamwork's JSON API: by operation name, with the path built from the
 * catalogue and the input and answer typed by the catalogue's zod schemas. Every write goes through
 * `sendWrite`, so a layer that must see each write (an outbox with idempotency keys) wraps one function.
 */
type Op<N extends ApiName> = (typeof api)[N];
type PathNames<P extends string> = P extends `${string}{${infer K}}${infer Rest}` ? K | PathNames<Rest> : never;

/** The path's {placeholders}, each a string. */
export type ApiParams<N extends ApiName> = { [K in PathNames<Op<N>["path"]>]: string };
/** A body as the schema accepts it; a query as a URL carries it (strings, the server coerces). */
export type ApiInput<N extends ApiName> =
  Op<N> extends { input: infer Z extends ZodType }
    ? Op<N> extends { from: "query" }
      ? { [K in keyof z.input<Z>]?: string | number | null }
      : z.input<Z>
    : undefined;
/** The answer as the browser receives it (timestamps as ISO strings); unknown where no screen reads it. */
export type ApiAnswer<N extends ApiName> = Op<N> extends { response: infer Z extends ZodType } ? z.output<Z> : unknown;

/** A refused or failed call: the server's message, its status, and its messages per field. */
/** What a request that got no answer at all (no network, server down) says. */
export const NO_ANSWER = "The server could not be reached.";

export class ApiError extends Error {
  override name = "ApiError";
  constructor(
    message: string,
    readonly status: number,
    readonly fieldErrors: Record<string, string[]> = {},
    readonly details?: unknown,
    /** The server's reason code (lib/api/offline.ts `reasonCodes`): what a device may offer to resolve it. */
    readonly code?: string,
  ) {
    super(message);
  }

  /** True when the server named the fields at fault (their messages go next to the fields). */
  get hasFieldErrors(): boolean {
    return Object.keys(this.fieldErrors).length > 0;
  }

  /** One named part of the refusal's details (a distance, the numbers of finds left outside). */
  detail(key: string): unknown {
    return this.details && typeof this.details === "object"
      ? (this.details as Record<string, unknown>)[key]
      : undefined;
  }
}

/** One request, ready to send and plain enough to store (an outbox keeps these). */
export type ApiRequest = {
  operation: ApiName;
  method: string;
  url: string;
  headers: Record<string, string>;
  body?: string;
};
export type CallOptions = { signal?: AbortSignal; headers?: Record<string, string> };

/** Builds the request of an operation: path from the catalogue, query or JSON body as it declares. */
export function buildRequest<N extends ApiName>(
  name: N,
  params: ApiParams<N>,
  input?: ApiInput<N>,
  headers: Record<string, string> = {},
): ApiRequest {
  const op = api[name] as { method: string; path: string; from?: string };
  const values = params as Record<string, string>;
  let url = op.path.replace(/\{(\w+)\}/g, (_, key: string) => {
    const value = values[key];
    if (!value) throw new Error(`${name}: the path needs ${key}`);
    return encodeURIComponent(value);
  });
  const from = op.from ?? (op.method === "GET" || op.method === "DELETE" ? "query" : "body");
  if (from === "query" && input) {
    const query = new URLSearchParams();
    for (const [k, v] of Object.entries(input as Record<string, unknown>))
      if (v !== undefined && v !== null && v !== "") query.set(k, String(v));
    const text = query.toString();
    if (text) url += `?${text}`;
  }
  if (from !== "body") return { operation: name, method: op.method, url, headers };
  return {
    operation: name,
    method: op.method,
    url,
    headers: { ...headers, "content-type": "application/json" },
    body: JSON.stringify(input ?? {}),
  };
}

/** Sends one request; a refusal becomes an ApiError in the server's words. */
export async function sendRequest(req: ApiRequest, signal?: AbortSignal): Promise<unknown> {
  let res: Response;
  try {
    res = await fetch(req.url, { method: req.method, headers: req.headers, body: req.body, signal });
  } catch (err) {
    // An abort or our own timeout stays what it is; anything else fetch throws means no answer came back.
    if (err instanceof DOMException) throw err;
    throw new ApiError(NO_ANSWER, 0);
  }
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (!res.ok) {
    const b = (body ?? {}) as {
      error?: unknown;
      code?: unknown;
      fieldErrors?: Record<string, string[]>;
      details?: unknown;
    };
    throw new ApiError(
      typeof b.error === "string" ? b.error : `The server answered ${res.status}.`,
      res.status,
      b.fieldErrors ?? {},
      b.details,
      typeof b.code === "string" ? b.code : undefined,
    );
  }
  return body;
}

/** What handles writes on a device that may be offline (lib/offline/write-path.ts); null = straight to the server. */
export type WriteHandler = (req: ApiRequest, signal?: AbortSignal) => Promise<unknown>;
let writeHandler: WriteHandler | null = null;

/** The signed-in user's outbox takes every write from here on (null hands them back to the network). */
export function handleWrites(handler: WriteHandler | null): void {
  writeHandler = handler;
}

/** The one function every write (POST, PATCH, DELETE) passes through. */
export function sendWrite(req: ApiRequest, signal?: AbortSignal): Promise<unknown> {
  return writeHandler ? writeHandler(req, signal) : sendRequest(req, signal);
}

/** Calls an operation by name: `apiClient.call("findsCreate", { siteId }, body)`. */
async function call<N extends ApiName>(
  name: N,
  params: ApiParams<N>,
  input?: ApiInput<N>,
  options: CallOptions = {},
): Promise<ApiAnswer<N>> {
  const req = buildRequest(name, params, input, options.headers);
  if (req.method === "GET") return (await sendRequest(req, options.signal)) as ApiAnswer<N>;
  const answer = await sendWrite(req, options.signal);
  // A write kept in the device's outbox changed nothing on the server yet: reading the server again (offline,
  // a failed read makes the router load the whole page) would only lose what is on screen. The sync announces.
  if (!keptOnDevice(answer)) announceWrite(req);
  return answer as ApiAnswer<N>;
}

/**
 * True when a write's answer says it was kept in the device's outbox (no connection): the server has not seen
 * it yet, and the page says so rather than "saved".
 */
export function keptOnDevice(answer: unknown): answer is { pending: true } {
  return typeof answer === "object" && answer !== null && (answer as { pending?: unknown }).pending === true;
}

/** The URL of a GET operation (links, downloads, event streams). */
function url<N extends ApiName>(name: N, params: ApiParams<N>, input?: ApiInput<N>): string {
  return buildRequest(name, params, input).url;
}

// Uploads ------------------------------------------------------------------------------------------

/** A file and what it is of, for an upload route of the uploadthing router (/api/uploadthing). */
export type UploadRequest = {
  slug: "recordPhoto";
  file: File;
  input: z.input<typeof recordPhotoUploadSchema>;
  headers: Record<string, string>;
};
/** What the router answers once the file is stored and recorded. */
export type UploadAnswer = { photoId: string; number: number | null; pending?: boolean };

let uploader: ReturnType<typeof genUploader> | null = null;

/** Sends one upload through the uploadthing SDK; a refusal becomes an ApiError like the JSON API's. */
export async function sendUpload(req: UploadRequest, signal?: AbortSignal): Promise<UploadAnswer> {
  let res: { serverData: unknown }[];
  try {
    uploader ??= genUploader({ package: "loamwork", url: "/api/uploadthing" });
    res = await uploader.uploadFiles(
      req.slug as never,
      {
        files: [req.file],
        input: req.input as never,
        headers: req.headers,
        signal,
      } as never,
    );
  } catch (err) {
    if (err instanceof DOMException) throw err;
    const e = err as { code?: string; message?: string; cause?: unknown };
    const refusal = e?.cause as { status?: unknown; reason?: unknown; fieldErrors?: unknown } | undefined;
    if (refusal && typeof refusal === "object" && typeof refusal.status === "number")
      throw new ApiError(
        e.message ?? "The upload was refused.",
        refusal.status,
        (refusal.fieldErrors as Record<string, string[]> | null) ?? {},
        undefined,
        typeof refusal.reason === "string" ? refusal.reason : undefined,
      );
    // A refusal the router made before Loamwork's checks (type, size) has a code and the router's words.
    if (e?.code && ["BAD_REQUEST", "FORBIDDEN", "NOT_FOUND", "TOO_LARGE", "FILE_LIMIT_EXCEEDED"].includes(e.code))
      throw new ApiError(e.message ?? "The upload was refused.", e.code === "FORBIDDEN" ? 403 : 400);
    throw new ApiError(NO_ANSWER, 0);
  }
  const data = res[0]?.serverData as
    | { photoId: string | null; number?: number | null; error?: string | null; status?: number; reason?: string | null }
    | undefined;
  if (!data) throw new ApiError("The server did not say whether the photo was recorded.", 500);
  if (data.error || !data.photoId)
    throw new ApiError(
      data.error ?? "The photo was not recorded.",
      data.status ?? 400,
      {},
      undefined,
      data.reason ?? undefined,
    );
  return { photoId: data.photoId, number: data.number ?? null };
}

/** What handles uploads on a device that may be offline; null = straight to the server. */
export type UploadHandler = (req: UploadRequest, signal?: AbortSignal) => Promise<UploadAnswer>;
let uploadHandler: UploadHandler | null = null;

/** The signed-in user's outbox takes every upload from here on (null hands them back to the network). */
export function handleUploads(handler: UploadHandler | null): void {
  uploadHandler = handler;
}

/**
 * Uploads a file to an upload route: the one way the browser sends a file, through the device's outbox when it
 * has one.
 */
async function upload(
  slug: UploadRequest["slug"],
  file: File,
  input: UploadRequest["input"],
  options: CallOptions = {},
): Promise<UploadAnswer> {
  const req: UploadRequest = {
    slug,
    file,
    input,
    headers: { "idempotency-key": crypto.randomUUID(), ...options.headers },
  };
  return uploadHandler ? uploadHandler(req, options.signal) : sendUpload(req, options.signal);
}

export const apiClient = { call, url, upload };
