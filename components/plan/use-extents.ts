"use client";

import { useRef, useState } from "react";
import { checkOutline } from "@/lib/geometry/outline";
import { ringsToPolygon, type Pt } from "@/lib/geometry/outline-edit";
import { apiClient } from "@/lib/api/client";
import { extentLockedMessage } from "./extent-panel";
import type { ContextRow } from "./rows";
import type { UndoEntry } from "./use-undo";

type Deps = {
  siteId: string;
  contexts: ContextRow[];
  pushUndo: (e: UndoEntry) => void;
  say: (kind: "ok" | "warn", text: string) => void;
  /** Called when an extent is saved, so the screen clears the ring being drawn. */
  onSaved: () => void;
};

/**
 * Context extents as saved (a context's optional extent polygon), drawn on the plan and edited with the extent tool.
 */
export function useExtents({ siteId, contexts, pushUndo, say, onSaved }: Deps) {
  const [extents, setExtents] = useState(() => new Map(contexts.map((c) => [c.id, c.extent ?? null])));
  const [chosen, setChosen] = useState(contexts[0]?.id ?? "");
  const [error, setError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const savingNow = useRef(false); // also catches two taps that land before React re-renders
  // The chosen context, or the first one when the chosen one is gone from the list.
  const contextId = contexts.some((c) => c.id === chosen) ? chosen : (contexts[0]?.id ?? "");

  const choose = (id: string) => {
    setChosen(id);
    setError(null);
  };

  /** Save the ring as the chosen context's extent (null clears it); refused rings and locked contexts say why. */
  const save = async (ring: Pt[] | null) => {
    // The first-corner tap and Enter call this directly, so a second tap while saving must not send a second PATCH.
    if (saving || savingNow.current) return;
    const ctx = contexts.find((c) => c.id === contextId);
    if (!ctx) return setError("Pick the context whose extent this is.");
    const locked = extentLockedMessage(ctx);
    if (locked) return setError(locked);
    const extent = ring ? ringsToPolygon([ring]) : null;
    if (extent) {
      const c = checkOutline(extent);
      if (!c.ok) return setError(`Not saved: ${c.reason}`);
    }
    const prev = extents.get(ctx.id) ?? null;
    savingNow.current = true;
    setSaving(true);
    try {
      await apiClient.call("contextUpdate", { siteId, contextId: ctx.id }, { extent });
      setExtents((m) => new Map(m).set(ctx.id, extent));
      onSaved();
      setError(null);
      say("ok", extent ? `Extent of context ${ctx.number} saved.` : `Extent of context ${ctx.number} cleared.`);
      pushUndo({
        label: `${extent ? "save" : "clear"} the extent of context ${ctx.number}`,
        run: async () => {
          await apiClient.call("contextUpdate", { siteId, contextId: ctx.id }, { extent: prev });
          setExtents((m) => new Map(m).set(ctx.id, prev));
        },
      });
    } catch (err) {
      setError(`Not saved: ${(err as Error).message}`);
    } finally {
      savingNow.current = false;
      setSaving(false);
    }
  };

  return { extents, contextId, choose, error, saving, save };
}
