import {
  ApiError,
  NO_ANSWER,
  sendRequest,
  sendUpload,
  type ApiRequest,
  type UploadAnswer,
  type UploadRequest,
} from "@/lib/api/client";
import type { ApiName } from "@/lib/api/catalog";
import { toStored, type RelationKind, type RelationReading } from "@/lib/schemas/relation";
import type { Outbox } from "./outbox";
import type { OutboxEntry } from "./outbox-db";

/**
 * Where a write goes on a device that may have no connection. Online with nothing waiting, it is sent at
 * once with an idempotency key made here; if the connection drops on the way it is queued with that same
 * key (the server answers a replay with its first answer, so it is never written twice). Offline, or with
 * writes still waiting (order is kept), recording writes go into the outbox and the caller gets the answer
 * the server would give, marked `pending`: a find or context takes its final number from the device's block.
 * Writes that cannot wait (settings, sign-off, uploads) say plainly that they need a connection.
 */
export type WritePathDeps = {
  outbox: Outbox;
  online: () => boolean;
  send?: (req: ApiRequest, signal?: AbortSignal) => Promise<unknown>;
  /** A write was queued: the sync may start. */
  queued?: () => void;
  /** Relations of the site as last read plus those queued, for the loop check (lib/offline/relations.ts). */
  loopCheck?: (
    siteId: string,
    relation: { fromId: string; toId: string; kind: RelationKind },
  ) => Promise<string | null>;
  /** Called after a number was taken from a block: a new block may be due. */
  numberTaken?: (siteId: string, kind: "find" | "context") => void;
};

/** Operations a digger can make offline, and what each does to the outbox. */
type OfflineKind = "create" | "edit" | "delete" | "bulk";
const offlineOps: Partial<Record<ApiName, OfflineKind>> = {
  findsCreate: "create",
  findUpdate: "edit",
  findDelete: "delete",
  contextsCreate: "create",
  contextUpdate: "edit",
  relationsCreate: "create",
  relationDelete: "delete",
  // Counts by square are recorded at the sieve like finds; a square record replaces that square's counts in
  // its context and spit, so sending each in order leaves the last one entered.
  squareRecord: "create",
  squareDelete: "delete",
  // Levels are taken in the trench too: spits, and levelling runs booked against the site's benchmarks.
  spitsCreate: "create",
  spitUpdate: "edit",
  levelRunsCreate: "create",
  // Changes to many records at once (the register's bulk bar, processing in the finds shed): all or nothing
  // when they reach the server, which names any record that stops them.
  findsBulk: "bulk",
  samplesStatus: "bulk",
  samplesStore: "bulk",
  // Boxes are added and changed in the finds shed, often out of reach of a signal. A new box takes the next
  // number when it reaches the server unless one was given (a number taken meanwhile is refused then).
  boxesCreate: "create",
  boxUpdate: "edit",
  // A box made by mistake is deleted where it was noticed; the server refuses it on arrival if it holds anything.
  boxDelete: "delete",
  // A box emptied into another on the shelf is recorded there; on arrival the server moves what the box holds
  // then, or refuses (the other box deleted meanwhile, or nothing left in it) and the entry needs attention.
  boxEmpty: "bulk",
};

export const IDEMPOTENCY_HEADER = "idempotency-key";

/**
 * A request that never reached an answer: sendRequest turns fetch's own failure (no network, server down)
 * into ApiError status 0; or our own timeout. A programming error (a TypeError in our code) is not one: it
 * must surface, never make the device believe it is offline.
 */
export function isNetworkFailure(err: unknown): boolean {
  return (
    (err instanceof ApiError && err.status === 0 && err.message === NO_ANSWER) ||
    (err instanceof DOMException && err.name === "TimeoutError")
  );
}

/** True for the writes a digger can make offline (they are queued when the server cannot be reached). */
export function worksOffline(operation: ApiName): boolean {
  return Boolean(offlineOps[operation]);
}

/** /api/sites/{siteId}/… → siteId; the last path segment → the record's id. */
function pathIds(url: string): { siteId: string; recordId: string } {
  const parts = new URL(url, "http://device").pathname.split("/");
  return { siteId: parts[3] ?? "", recordId: parts[parts.length - 1] ?? "" };
}

const needsConnection = (req: ApiRequest) =>
  new ApiError(
    `This change (${req.operation}) needs a connection to the server; it was not made. Recording finds, context sheets, relations, counts by square, spits and levelling runs works offline, and so do changes to many finds or samples at once and the box register.`,
    0,
  );

export function createWritePath(deps: WritePathDeps) {
  const send = deps.send ?? sendRequest;

  return async function write(req: ApiRequest, signal?: AbortSignal): Promise<unknown> {
    const withKey: ApiRequest = {
      ...req,
      headers: { ...req.headers, [IDEMPOTENCY_HEADER]: req.headers[IDEMPOTENCY_HEADER] ?? crypto.randomUUID() },
    };
    const kind = offlineOps[req.operation];
    const nothingWaiting = (await deps.outbox.count()).waiting === 0;
    if (deps.online() && (nothingWaiting || !kind)) {
      try {
        return await send(withKey, signal);
      } catch (err) {
        if (!kind || !isNetworkFailure(err)) throw err;
        // The connection dropped on the way: queue it with the same key (a replay writes nothing twice).
      }
    }
    if (!kind) throw needsConnection(req);
    const answer = await queue(deps, withKey, kind);
    deps.queued?.();
    return answer;
  };
}

async function queue(deps: WritePathDeps, req: ApiRequest, kind: OfflineKind): Promise<unknown> {
  const { outbox } = deps;
  const { siteId, recordId } = pathIds(req.url);
  const body = req.body ? (JSON.parse(req.body) as Record<string, unknown>) : {};
  const base = {
    key: req.headers[IDEMPOTENCY_HEADER],
    siteId,
    operation: req.operation,
    method: req.method,
    url: req.url,
    headers: req.headers,
  };

  if (kind === "create") {
    const localId = crypto.randomUUID();
    if (req.operation === "squareRecord") {
      const label = `counts in square column ${String(body.col)}, row ${String(body.row)}`;
      await outbox.add({ ...base, localId, body: JSON.stringify(body), label });
      return { id: localId, ...body, pending: true };
    }
    if (req.operation === "relationsCreate") {
      const stored = toStored(String(body.contextId), body.reading as RelationReading, String(body.otherId));
      const loop = await deps.loopCheck?.(siteId, stored);
      if (loop)
        throw new ApiError(`That relation would make the matrix loop back on itself: ${loop}.`, 400, {
          otherId: [`That would make a loop: ${loop}.`],
        });
      await outbox.add({ ...base, localId, body: JSON.stringify(body), label: "relation" });
      return { id: localId, ...stored, pending: true };
    }
    // Spits are numbered by the digger within their context and levelling runs carry no number: no block.
    if (req.operation === "spitsCreate" || req.operation === "levelRunsCreate") {
      const spit = req.operation === "spitsCreate";
      await outbox.add({
        ...base,
        localId,
        body: JSON.stringify(body),
        label: spit ? `spit ${body.number}` : "levelling run",
      });
      const contextId = spit ? (new URL(req.url, "http://device").pathname.split("/")[5] ?? "") : undefined;
      return { id: localId, ...(spit && { contextId, topLevel: null, baseLevel: null }), ...body, pending: true };
    }
    if (req.operation === "boxesCreate") {
      const number = typeof body.number === "number" || typeof body.number === "string" ? Number(body.number) : null;
      await outbox.add({
        ...base,
        localId,
        body: JSON.stringify(body),
        label: number === null ? "new box" : `box ${number}`,
      });
      return { id: localId, store: "", note: "", ...body, number, pending: true };
    }
    const numberKind = req.operation === "findsCreate" ? "find" : "context";
    if (body.number === undefined || body.number === null || body.number === "") {
      const n = await outbox.takeNumber(siteId, numberKind);
      if (n === null)
        throw new ApiError(
          `This device holds no ${numberKind} numbers for this site: connect once so it can reserve a block, then record offline.`,
          0,
        );
      body.number = n;
      deps.numberTaken?.(siteId, numberKind);
    }
    const label = numberKind === "find" ? `find #${body.number}` : `context ${body.number}`;
    await outbox.add({ ...base, localId, body: JSON.stringify(body), label });
    const now = new Date().toISOString();
    return numberKind === "find"
      ? {
          id: localId,
          trenchId: "",
          z: null,
          count: null,
          weightG: null,
          description: "",
          method: "plan",
          ...body,
          recordedAt: now,
          recordedBy: null,
          pending: true,
        }
      : { id: localId, state: "open", signedOffAt: null, extent: null, ...body, pending: true };
  }

  if (kind === "bulk") {
    const label = bulkLabel(req.operation, body);
    await outbox.add({ ...base, body: req.body, label });
    return { ...(typeof body.action === "string" && { action: body.action }), label, pending: true };
  }

  // An edit or delete of a record made on this device and not yet sent changes its queued create.
  const create = await outbox.createOf(recordId);
  if (create) return kind === "edit" ? mergeIntoCreate(outbox, create, body) : dropCreate(outbox, create);

  const tag = /^\s*"?(\d+)"?\s*$/.exec(req.headers["if-match"] ?? "");
  const baseVersion = typeof body.version === "number" ? body.version : tag ? Number(tag[1]) : null;
  await outbox.add({
    ...base,
    body: req.body,
    baseVersion,
    label: `${kind === "edit" ? "change" : "delete"} ${recordWord(req.operation)}`,
  });
  return kind === "edit" ? { id: recordId, ...body, pending: true } : { deleted: recordId, pending: true };
}

/** "move 3 finds", "status of 2 samples": what a queued change to many records does. */
function bulkLabel(operation: string, body: Record<string, unknown>): string {
  const many = (key: string, one: string) => {
    const n = Array.isArray(body[key]) ? (body[key] as unknown[]).length : 0;
    return `${n} ${n === 1 ? one : `${one}s`}`;
  };
  if (operation === "findsBulk") {
    const verb = { move: "move", reclass: "re-class", delete: "delete", process: "process" }[String(body.action)];
    return `${verb ?? "change"} ${many("findIds", "find")}`;
  }
  if (operation === "samplesStore") return `store ${many("sampleIds", "sample")}`;
  if (operation === "boxEmpty") return "empty a box into another";
  return `status of ${many("sampleIds", "sample")}`;
}

function recordWord(operation: string): string {
  if (operation.startsWith("find")) return "find";
  if (operation.startsWith("context")) return "context";
  if (operation.startsWith("square")) return "square record";
  if (operation.startsWith("spit")) return "spit";
  if (operation.startsWith("box")) return "box";
  return "relation";
}

async function mergeIntoCreate(outbox: Outbox, create: OutboxEntry, patch: Record<string, unknown>) {
  const merged = { ...(JSON.parse(create.body ?? "{}") as Record<string, unknown>), ...patch };
  delete merged.version;
  await outbox.put({ ...create, body: JSON.stringify(merged) });
  return { id: create.localId, ...merged, pending: true };
}

async function dropCreate(outbox: Outbox, create: OutboxEntry) {
  await outbox.remove(create.seq!);
  const number = (JSON.parse(create.body ?? "{}") as { number?: number }).number;
  return { deleted: create.localId, number, pending: true };
}

// Uploads ------------------------------------------------------------------------------------------

export type UploadPathDeps = {
  outbox: Outbox;
  online: () => boolean;
  send?: (req: UploadRequest, signal?: AbortSignal) => Promise<UploadAnswer>;
  queued?: () => void;
};

/**
 * Where an upload goes on a device that may have no connection: a photo taken offline (or while writes
 * wait, or when the connection drops on the way) is kept in the outbox with its file as a Blob and the same
 * idempotency key, and uploaded in order when the connection returns. Its number comes from the server then.
 */
export function createUploadPath(deps: UploadPathDeps) {
  const send = deps.send ?? sendUpload;
  return async function upload(req: UploadRequest, signal?: AbortSignal): Promise<UploadAnswer> {
    const key = req.headers[IDEMPOTENCY_HEADER] ?? crypto.randomUUID();
    const withKey: UploadRequest = { ...req, headers: { ...req.headers, [IDEMPOTENCY_HEADER]: key } };
    if (deps.online() && (await deps.outbox.count()).waiting === 0) {
      try {
        return await send(withKey, signal);
      } catch (err) {
        if (!isNetworkFailure(err)) throw err;
      }
    }
    const input = req.input as { siteId?: string; subject?: string };
    await deps.outbox.add({
      key,
      siteId: input.siteId ?? "",
      operation: `upload:${req.slug}`,
      method: "POST",
      url: `/api/uploadthing?slug=${req.slug}`,
      headers: withKey.headers,
      body: JSON.stringify(req.input),
      file: req.file,
      fileName: req.file.name,
      label: `photo “${req.file.name}” of a ${input.subject ?? "record"}`,
    });
    deps.queued?.();
    return { photoId: "", number: null, pending: true };
  };
}

/** The upload an outbox entry keeps, ready to send again (ids the device made replaced by the server's). */
export function uploadOf(entry: OutboxEntry, body: string | undefined): UploadRequest {
  const slug = entry.operation.slice("upload:".length) as UploadRequest["slug"];
  const file = new File([entry.file!], entry.fileName ?? "photo", { type: entry.file!.type });
  return { slug, file, input: JSON.parse(body ?? "{}") as UploadRequest["input"], headers: entry.headers };
}
