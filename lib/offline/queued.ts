import type { ApiName } from "@/lib/api/catalog";
import type { OutboxEntry, OutboxState } from "./outbox-db";

type Body = Record<string, unknown>;

const bodyOf = (e: OutboxEntry): Body | null => {
  try {
    return e.body ? (JSON.parse(e.body) as Body) : null;
  } catch {
    return null;
  }
};

/**
 * Records made on this device and not yet sent: the queued creates of one kind, each with the id the device
 * gave it and the body it will send. Registers and the plan list them beside the server's rows, marked, so a
 * record made offline is seen where it will be once it syncs.
 */
export function queuedCreates(entries: readonly OutboxEntry[], operation: ApiName) {
  return entries
    .filter((e) => e.operation === operation && e.localId)
    .map((e) => ({ entry: e, localId: e.localId!, body: bodyOf(e) }))
    .filter((q): q is { entry: OutboxEntry; localId: string; body: Body } => q.body !== null);
}

/** A box added on this device and not yet sent, as the box register lists it. */
export type QueuedBox = {
  id: string;
  /** Null when left blank: the box takes the next free number when it reaches the server. */
  number: number | null;
  store: string;
  note: string;
  state: OutboxState;
};

/** The boxes of this site waiting in the outbox (or refused and needing attention), in the order they were added. */
export function queuedBoxes(entries: readonly OutboxEntry[], siteId: string): QueuedBox[] {
  return queuedCreates(entries, "boxesCreate")
    .filter(({ entry }) => entry.siteId === siteId)
    .map(({ entry, localId, body }) => ({
      id: localId,
      number: body.number === undefined || body.number === null || body.number === "" ? null : Number(body.number),
      store: String(body.store ?? ""),
      note: String(body.note ?? ""),
      state: entry.state,
    }));
}
