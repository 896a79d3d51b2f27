import { ApiError, apiClient } from "@/lib/api/client";
import type { Pt } from "@/lib/geometry/outline-edit";

/** What a drag needs of the find: its id, number and the version the plan read (none for one not yet sent). */
export type MovedFind = { id: string; number: number; version?: number | null };

/** The find as the server has it now, when the drag was made on an older version. */
export type CurrentFind = { x: number; y: number; z: number | null; version: number; contextId: string };

export type MoveOutcome =
  { ok: true; version: number | null } | { ok: false; message: string; current: CurrentFind | null };

/**
 * Moves a find to `to` on the version the plan read of it (If-Match), so a find changed by someone else since
 * is never moved over silently: the server refuses (409 `stale`) and the outcome carries the find as it is
 * now, to show. The version after the move comes back for the next move or its undo; a move kept on the
 * device (offline) gets the version it will have once it lands, as every change raises it by one.
 */
export async function moveFind(siteId: string, f: MovedFind, to: Pt): Promise<MoveOutcome> {
  const base = typeof f.version === "number" ? f.version : null;
  try {
    const saved = (await apiClient.call(
      "findUpdate",
      { siteId, findId: f.id },
      { x: to[0], y: to[1] },
      base === null ? {} : { headers: { "if-match": `"${base}"` } },
    )) as { version?: number; pending?: boolean };
    if (typeof saved.version === "number") return { ok: true, version: saved.version };
    return { ok: true, version: saved.pending && base !== null ? base + 1 : null };
  } catch (err) {
    if (!(err instanceof ApiError)) throw err;
    const current = err.code === "stale" ? currentOf(err.detail("current")) : null;
    if (current)
      return {
        ok: false,
        current,
        message: `Find #${f.number} was not moved: someone changed it since this plan read it (it is now version ${current.version}, at ${current.x.toFixed(3)}, ${current.y.toFixed(3)}). The plan now shows it as it is; move it again if it should still go.`,
      };
    return { ok: false, current: null, message: `Find #${f.number} was not moved: ${err.message}` };
  }
}

function currentOf(raw: unknown): CurrentFind | null {
  if (!raw || typeof raw !== "object") return null;
  const r = raw as Record<string, unknown>;
  if (typeof r.x !== "number" || typeof r.y !== "number" || typeof r.version !== "number") return null;
  return {
    x: r.x,
    y: r.y,
    z: typeof r.z === "number" ? r.z : null,
    version: r.version,
    contextId: typeof r.contextId === "string" ? r.contextId : "",
  };
}
