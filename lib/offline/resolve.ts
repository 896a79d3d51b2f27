import type { Outbox } from "./outbox";
import type { OutboxEntry } from "./outbox-db";

/**
 * What a person can do with a write the server refused (it waits in *needs attention* until then). Each
 * choice changes the queued write and sends it again, or replaces it with a discard that the server puts on
 * its audit trail when it arrives (lib/api/offline.ts, point 5). Nothing is dropped silently.
 */
export type Resolution = "move" | "keep-mine" | "take-theirs" | "discard" | "retry";

/** The choices a refusal allows: a locked or missing context → move; a stale edit → keep mine or take theirs. */
export function choicesFor(e: OutboxEntry, canKeepMine: boolean): Resolution[] {
  const code = e.refusal?.code;
  const out: Resolution[] = [];
  const placesAFind = e.operation === "findsCreate";
  if (placesAFind && (code === "locked" || code === "not-found" || code === "conflict")) out.push("move");
  if (code === "stale") {
    if (canKeepMine) out.push("keep-mine");
    out.push("take-theirs");
  }
  if (code === "damaged" || code === "server" || code === "busy" || code === null || code === undefined)
    out.push("retry");
  out.push("discard");
  return out;
}

const back = (e: OutboxEntry, patch: Partial<OutboxEntry>): OutboxEntry => ({
  ...e,
  ...patch,
  state: "waiting",
  attempts: 0,
  refusal: undefined,
});

/** A find refused for its context goes to another (open) context; a new key, as it is a new request. */
export async function moveToContext(
  outbox: Outbox,
  e: OutboxEntry,
  contextId: string,
  contextNumber: number,
): Promise<void> {
  const body = { ...(JSON.parse(e.body ?? "{}") as Record<string, unknown>), contextId };
  const key = crypto.randomUUID();
  await outbox.put(
    back(e, {
      body: JSON.stringify(body),
      key,
      headers: { ...e.headers, "idempotency-key": key },
      label: `${e.label.split(" in ")[0]} in context ${contextNumber}`,
    }),
  );
}

/** Keep mine: the edit is sent again on the version the server has now, overwriting it knowingly. */
export async function keepMine(outbox: Outbox, e: OutboxEntry): Promise<void> {
  const current = (e.refusal?.details as { currentVersion?: number } | undefined)?.currentVersion;
  if (typeof current !== "number")
    throw new Error("The server did not say which version it has now; try again when online.");
  const key = crypto.randomUUID();
  await outbox.put(
    back(e, {
      key,
      baseVersion: current,
      headers: { ...e.headers, "idempotency-key": key, "if-match": `"${current}"` },
    }),
  );
}

/** Take theirs, or discard: the write goes, and a discard naming it is queued for the audit trail. */
export async function discard(
  outbox: Outbox,
  e: OutboxEntry,
  why: "take-theirs" | "discard",
  note = "",
): Promise<void> {
  const path = new URL(e.url, "http://device").pathname;
  const key = crypto.randomUUID();
  const body = {
    idempotencyKey: e.key,
    operation: e.operation,
    method: e.method,
    path,
    reasonCode: e.refusal?.code ?? "discarded",
    reason:
      why === "take-theirs"
        ? `Took the server's version instead: ${e.refusal?.message ?? ""}`
        : `Discarded on the device: ${e.refusal?.message ?? "not sent"}`,
    ...(note ? { note } : {}),
  };
  await outbox.remove(e.seq!);
  await outbox.add({
    key,
    siteId: e.siteId,
    operation: "discardsCreate" as OutboxEntry["operation"],
    method: "POST",
    url: `/api/sites/${e.siteId}/discards`,
    headers: { "content-type": "application/json", "idempotency-key": key },
    body: JSON.stringify(body),
    label: `discard of ${e.label}`,
  });
}

export async function retry(outbox: Outbox, e: OutboxEntry): Promise<void> {
  await outbox.put(back(e, {}));
}
