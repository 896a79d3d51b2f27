"use client";

import { useMemo, useSyncExternalStore } from "react";
import { device } from "@/lib/offline/device";
import { queuedBoxes, queuedCreates } from "@/lib/offline/queued";
import type { ContextRow, FindRow } from "@/components/plan/rows";

/**
 * The plan's records with those made on this device and not yet sent: contexts opened here join the
 * trench's list (finds can go into them at once), finds waiting in the outbox are drawn and listed, marked
 * pending. After a reload offline they come back from the outbox, not from memory.
 */
export function usePendingRecords(trenchId: string, contexts: ContextRow[]) {
  const s = useSyncExternalStore(device.subscribe, device.getSnapshot, device.getServerSnapshot);
  const withPending = useMemo(() => {
    const made = queuedCreates(s.entries, "contextsCreate")
      .filter(({ body: b }) => b.trenchId === trenchId)
      .map(({ localId, body: b }): ContextRow => ({
        id: localId,
        number: Number(b.number),
        type: String(b.type ?? "deposit"),
        state: "open",
        signedOffAt: null,
        extent: null,
      }));
    return made.length ? [...contexts, ...made.filter((m) => !contexts.some((c) => c.id === m.id))] : contexts;
  }, [s.entries, contexts, trenchId]);

  /** Adds the queued finds of this trench's contexts that the list does not hold yet. */
  const addPendingFinds = useMemo(() => {
    const byId = new Map(withPending.map((c) => [c.id, c]));
    const pending = queuedCreates(s.entries, "findsCreate")
      .filter(({ body: b }) => byId.has(String(b.contextId)))
      .map(({ entry: e, localId, body: b }): FindRow => {
        const ctx = byId.get(String(b.contextId))!;
        return {
          id: localId,
          number: Number(b.number),
          trenchId,
          contextId: ctx.id,
          classId: String(b.classId),
          x: Number(b.x),
          y: Number(b.y),
          z: (b.z as number | null) ?? null,
          count: (b.count as number | null) ?? null,
          weightG: (b.weightG as number | null) ?? null,
          description: String(b.description ?? ""),
          method: String(b.method ?? "plan"),
          recordedAt: e.createdAt,
          recordedBy: null,
          version: 0,
          contextNumber: ctx.number,
          contextState: ctx.state,
          classCode: "",
          classLabel: "",
        } as FindRow;
      });
    return (rows: FindRow[]) => {
      const have = new Set(rows.map((r) => r.id));
      const add = pending.filter((p) => !have.has(p.id));
      return add.length ? [...rows, ...add] : rows;
    };
  }, [s.entries, withPending, trenchId]);

  return { contexts: withPending, addPendingFinds };
}

/** The site's boxes added on this device and not yet sent, for the box register to list beside its own. */
export function usePendingBoxes(siteId: string) {
  const s = useSyncExternalStore(device.subscribe, device.getSnapshot, device.getServerSnapshot);
  return useMemo(() => queuedBoxes(s.entries, siteId), [s.entries, siteId]);
}
