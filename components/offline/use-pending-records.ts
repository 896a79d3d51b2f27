"use client";

import { useMemo, useSyncExternalStore } from "react";
import { device } from "@/lib/offline/device";
import type { OutboxEntry } from "@/lib/offline/outbox-db";
import type { ContextRow, FindRow } from "@/components/plan/rows";

type Body = Record<string, unknown>;
const bodyOf = (e: OutboxEntry): Body | null => {
  try {
    return e.body ? (JSON.parse(e.body) as Body) : null;
  } catch {
    return null;
  }
};

/**
 * The plan's records with those made on this device and not yet sent: contexts opened here join the
 * trench's list (finds can go into them at once), finds waiting in the outbox are drawn and listed, marked
 * pending. After a reload offline they come back from the outbox, not from memory.
 */
export function usePendingRecords(trenchId: string, contexts: ContextRow[]) {
  const s = useSyncExternalStore(device.subscribe, device.getSnapshot, device.getServerSnapshot);
  const withPending = useMemo(() => {
    const made = s.entries
      .filter((e) => e.operation === "contextsCreate" && e.localId)
      .map((e) => ({ e, b: bodyOf(e) }))
      .filter(({ b }) => b && b.trenchId === trenchId)
      .map(({ e, b }): ContextRow => ({
        id: e.localId!,
        number: Number(b!.number),
        type: String(b!.type ?? "deposit"),
        state: "open",
        signedOffAt: null,
        extent: null,
      }));
    return made.length ? [...contexts, ...made.filter((m) => !contexts.some((c) => c.id === m.id))] : contexts;
  }, [s.entries, contexts, trenchId]);

  /** Adds the queued finds of this trench's contexts that the list does not hold yet. */
  const addPendingFinds = useMemo(() => {
    const byId = new Map(withPending.map((c) => [c.id, c]));
    const pending = s.entries
      .filter((e) => e.operation === "findsCreate" && e.localId)
      .map((e) => ({ e, b: bodyOf(e) }))
      .filter(({ b }) => b && byId.has(String(b.contextId)))
      .map(({ e, b }): FindRow => {
        const ctx = byId.get(String(b!.contextId))!;
        return {
          id: e.localId!,
          number: Number(b!.number),
          trenchId,
          contextId: ctx.id,
          classId: String(b!.classId),
          x: Number(b!.x),
          y: Number(b!.y),
          z: (b!.z as number | null) ?? null,
          count: (b!.count as number | null) ?? null,
          weightG: (b!.weightG as number | null) ?? null,
          description: String(b!.description ?? ""),
          method: String(b!.method ?? "plan"),
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
