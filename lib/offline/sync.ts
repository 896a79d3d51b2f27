import {
  ApiError,
  sendRequest,
  sendUpload,
  type ApiRequest,
  type UploadAnswer,
  type UploadRequest,
} from "@/lib/api/client";
import { isNetworkFailure, uploadOf } from "./write-path";
import type { Outbox } from "./outbox";
import type { OutboxEntry, Refusal } from "./outbox-db";

/**
 * Sends the outbox to the server, oldest first, each write with its own idempotency key (a replay of one
 * that reached the server before is answered with its first answer and writes nothing). What stops a sync:
 * no connection (tried again with back-off), a 401 (paused until the user signs in again — never *needs
 * attention*). What moves one entry aside to *needs attention*, with the server's reason, while the rest go
 * on: a refusal (409 stale or locked, 422, 403, 404, 400), or an entry damaged on the device. An entry that
 * names a record made on the device whose create has not been sent waits for it.
 */
export type SyncOutcome = { sent: number; refused: number; stopped: "done" | "offline" | "sign-in" | "server-busy" };

export type SyncDeps = {
  outbox: Outbox;
  send?: (req: ApiRequest) => Promise<unknown>;
  /** Sends a kept upload (a photo taken offline) through the upload route. */
  upload?: (req: UploadRequest) => Promise<UploadAnswer>;
  /** After each entry: how many are still waiting. */
  progress?: (waiting: number) => void;
};

/** Answers that mean "try again later", not "no". */
const TRANSIENT = new Set([408, 425, 429, 500, 502, 503, 504]);

export async function syncOutbox({
  outbox,
  send = sendRequest,
  upload = sendUpload,
  progress,
}: SyncDeps): Promise<SyncOutcome> {
  let sent = 0;
  let refused = 0;
  const blocked = new Set<string>();
  for (const entry of await outbox.waiting()) {
    const checked = damaged(entry);
    if (checked) {
      await outbox.needsAttention(entry.seq!, { code: "damaged", message: checked, status: 0 });
      refused++;
      continue;
    }
    const { url, body, unknown } = await outbox.resolveIds(entry);
    if (unknown.length) {
      // Its create is waiting or needs attention: this one waits with it, in order.
      if (entry.localId) blocked.add(entry.localId);
      continue;
    }
    try {
      const answer = entry.operation.startsWith("upload:")
        ? await upload(uploadOf(entry, body))
        : await send({
            operation: entry.operation as ApiRequest["operation"],
            method: entry.method,
            url,
            headers: entry.headers,
            body,
          });
      await outbox.sent(entry, answer);
      sent++;
    } catch (err) {
      if (isNetworkFailure(err)) return { sent, refused, stopped: "offline" };
      if (!(err instanceof ApiError)) throw err;
      if (err.status === 401) return { sent, refused, stopped: "sign-in" };
      if (TRANSIENT.has(err.status)) {
        await outbox.put({ ...entry, attempts: entry.attempts + 1 });
        return { sent, refused, stopped: "server-busy" };
      }
      await outbox.needsAttention(entry.seq!, refusalOf(err));
      refused++;
    }
    progress?.((await outbox.count()).waiting);
  }
  return { sent, refused, stopped: "done" };
}

/** The server's reason code (lib/api/offline.ts `reasonCodes`) and its words. */
export function refusalOf(err: ApiError): Refusal {
  const reason = err.code ?? err.detail("reason");
  return {
    code: typeof reason === "string" ? reason : null,
    message: err.message,
    status: err.status,
    details: err.details,
  };
}

/** Why an entry cannot be sent as it stands (damaged on the device), or null. */
export function damaged(e: Partial<OutboxEntry>): string | null {
  if (typeof e.key !== "string" || e.key.length < 8) return "It has no idempotency key.";
  if (typeof e.url !== "string" || !e.url.startsWith("/api/")) return "Its address is missing or not Loamwork's.";
  if (typeof e.operation === "string" && e.operation.startsWith("upload:") && !(e.file instanceof Blob))
    return "The photo's file is missing from this device.";
  if (!["POST", "PATCH", "DELETE"].includes(String(e.method))) return "It is not a write.";
  if (e.body !== undefined) {
    try {
      JSON.parse(e.body);
    } catch {
      return "Its content cannot be read.";
    }
  }
  return null;
}

/** Seconds to wait before the next try after `failures` failed ones: 2, 4, 8, … up to 5 minutes. */
export function backoffSeconds(failures: number): number {
  return Math.min(300, 2 ** Math.max(1, failures));
}
