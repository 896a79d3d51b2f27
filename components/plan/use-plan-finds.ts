"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useCallback, useMemo } from "react";
import { nearestEdge, type Pt, type Rings } from "@/lib/geometry/outline-edit";
import { ApiError, apiClient, keptOnDevice } from "@/lib/api/client";
import type { ContextRow, FindRow } from "./rows";
import type { Refused } from "./draw-marks";
import type { QuickFind } from "./find-form";
import type { UndoEntry } from "./use-undo";
import { moveFind } from "./move-find";

type Deps = {
  siteId: string;
  trenchId: string;
  initialFinds: FindRow[];
  contexts: ContextRow[];
  savedRings: Rings;
  pushUndo: (e: UndoEntry) => void;
  say: (kind: "ok" | "warn", text: string) => void;
};

const pageSize = 500;

/** Every find of a trench, 500 a page, pages after the first fetched together. */
async function fetchAllFinds(siteId: string, trenchId: string): Promise<FindRow[]> {
  const page = (n: number) => apiClient.call("findsList", { siteId }, { trenchId, pageSize, page: n });
  const first = await page(1);
  const pages = Math.ceil(first.total / pageSize);
  const rest = await Promise.all(Array.from({ length: Math.max(0, pages - 1) }, (_, i) => page(i + 2)));
  return [first, ...rest].flatMap((p) => p.rows);
}

/** The trench's finds (all pages) and the plan's writes to them, each with its undo. */
export function usePlanFinds({ siteId, trenchId, initialFinds, contexts, savedRings, pushUndo, say }: Deps) {
  const qc = useQueryClient();
  const key = useMemo(() => ["plan-finds", siteId, trenchId], [siteId, trenchId]);
  const query = useQuery({
    queryKey: key,
    queryFn: () => fetchAllFinds(siteId, trenchId),
    initialData: initialFinds,
    staleTime: 60_000,
  });
  const finds = query.data ?? [];
  const patch = useCallback(
    (fn: (rows: FindRow[]) => FindRow[]) => qc.setQueryData<FindRow[]>(key, (rows) => fn(rows ?? [])),
    [qc, key],
  );

  const withContext = useCallback(
    (
      row: Omit<FindRow, "contextNumber" | "contextState" | "classCode" | "classLabel" | "recordedBy"> &
        Partial<FindRow>,
      classCode: string,
      classLabel: string,
    ): FindRow => {
      const ctx = contexts.find((c) => c.id === row.contextId);
      return {
        recordedBy: null,
        ...row,
        contextNumber: ctx?.number ?? 0,
        contextState: ctx?.state ?? "open",
        classCode,
        classLabel,
      } as FindRow;
    },
    [contexts],
  );

  /** Records a find; an outside-trench refusal comes back as the refused mark to draw. */
  const record = useCallback(
    async (
      at: Pt,
      v: QuickFind,
      cls: { code: string; label: string },
    ): Promise<{ ok: true; row: FindRow } | { ok: false; message: string; refused: Refused | null }> => {
      try {
        const created = await apiClient.call(
          "findsCreate",
          { siteId },
          {
            contextId: v.contextId,
            classId: v.classId,
            x: at[0],
            y: at[1],
            z: v.z ?? null,
            count: v.count ?? null,
            weightG: v.weightG ?? null,
            description: v.description,
            method: "plan",
          },
        );
        const row = withContext(created, cls.code, cls.label);
        patch((rows) => [...rows, row]);
        pushUndo({
          label: `record find #${row.number}`,
          run: async () => {
            await apiClient.call("findDelete", { siteId, findId: row.id });
            patch((rows) => rows.filter((r) => r.id !== row.id));
          },
        });
        const kept = keptOnDevice(created);
        say(
          created.levelWarning ? "warn" : "ok",
          `${kept ? `Find #${row.number} kept on this device (number from its block); it is sent when the server can be reached.` : `Find #${row.number} recorded (number allocated by the server).`}${created.levelWarning ? ` ${created.levelWarning}` : ""}`,
        );
        return { ok: true, row };
      } catch (err) {
        if (!(err instanceof ApiError)) throw err;
        const given = err.detail("distance");
        const distance = typeof given === "number" ? given : null;
        const near = distance !== null ? nearestEdge(savedRings, at[0], at[1]) : null;
        return {
          ok: false,
          message: err.message,
          refused: distance !== null ? { at, nearest: near?.point ?? at, distance } : null,
        };
      }
    },
    [siteId, savedRings, patch, pushUndo, say, withContext],
  );

  const move = useCallback(
    async (f: FindRow, to: Pt) => {
      const from: Pt = [f.x, f.y];
      const place = (p: Pt, version: number | null) =>
        patch((rows) =>
          rows.map((r) => (r.id === f.id ? { ...r, x: p[0], y: p[1], ...(version !== null && { version }) } : r)),
        );
      const moved = await moveFind(siteId, f, to);
      if (!moved.ok) {
        const now = moved.current;
        // Stale: the plan shows the find as the server has it now, and reads the trench again.
        if (now) {
          patch((rows) =>
            rows.map((r) =>
              r.id === f.id
                ? withContext({ ...r, ...now, contextId: now.contextId || r.contextId }, r.classCode, r.classLabel)
                : r,
            ),
          );
          void qc.invalidateQueries({ queryKey: key });
        }
        say("warn", moved.message);
        return;
      }
      place(to, moved.version);
      pushUndo({
        label: `move find #${f.number}`,
        run: async () => {
          const back = await moveFind(siteId, { ...f, version: moved.version }, from);
          if (!back.ok) throw new Error(back.message);
          place(from, back.version);
        },
      });
      say("ok", `Find #${f.number} moved to ${to[0].toFixed(3)}, ${to[1].toFixed(3)}.`);
    },
    [siteId, patch, pushUndo, say, withContext, qc, key],
  );

  /** Why a find cannot be dragged (its context is signed off), or null when it can. */
  const dragRefusal = (f: FindRow) => {
    if (f.contextState !== "signed_off") return null;
    const ctx = contexts.find((c) => c.id === f.contextId);
    return `Find #${f.number} cannot be moved: context ${f.contextNumber} is signed off${ctx?.signedOffAt ? ` (since ${new Date(ctx.signedOffAt).toLocaleDateString()})` : ""}. A director must reopen it first.`;
  };

  return { finds, loading: query.isLoading, error: query.error as Error | null, record, move, dragRefusal };
}
