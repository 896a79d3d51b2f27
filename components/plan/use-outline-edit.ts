"use client";

import { useMemo, useRef, useState } from "react";
import { checkOutline, type OutlinePolygon } from "@/lib/geometry/outline";
import {
  deleteVertex,
  insertVertex,
  locateProblem,
  moveVertex,
  polygonToRings,
  ringsToPolygon,
  type Pt,
  type Rings,
} from "@/lib/geometry/outline-edit";
import { ApiError, apiClient } from "@/lib/api/client";
import type { Tap, VertexRef } from "./plan-canvas";
import type { UndoEntry } from "./use-undo";

type Deps = {
  siteId: string;
  trenchId: string;
  outline: OutlinePolygon;
  pushUndo: (e: UndoEntry) => void;
  say: (kind: "ok" | "warn", text: string) => void;
  /** A refused outline names the finds it would leave outside: the screen selects them. */
  onFindsOutside: (numbers: number[]) => void;
};

/** The trench outline being edited: the rings as saved and as drawn, their check, and each edit with its undo. */
export function useOutlineEdit({ siteId, trenchId, outline, pushUndo, say, onFindsOutside }: Deps) {
  const [savedRings, setSavedRings] = useState<Rings>(() => polygonToRings(outline));
  const [rings, setRings] = useState<Rings>(savedRings);
  const [selectedVertex, setSelectedVertex] = useState<VertexRef | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const dirty = JSON.stringify(rings) !== JSON.stringify(savedRings);
  const check = useMemo(() => (rings.length ? checkOutline(ringsToPolygon(rings)) : null), [rings]);
  const problem = useMemo(() => (check && !check.ok ? locateProblem(rings) : null), [check, rings]);

  const editRings = (next: Rings, label: string) => {
    const prev = rings;
    setRings(next);
    setError(null);
    pushUndo({ label, run: () => setRings(prev) });
  };

  // A vertex drag moves the ring live; its undo returns to the rings from before the drag began.
  const dragStart = useRef<Rings | null>(null);
  const onVertexMove = (ref: VertexRef, to: Pt, done: boolean) => {
    dragStart.current ??= rings;
    const before = dragStart.current;
    setRings((r) => moveVertex(r, ref.ring, ref.v, to));
    if (!done) return;
    dragStart.current = null;
    setError(null);
    pushUndo({ label: "move a vertex", run: () => setRings(before) });
  };

  /** A drawn ring becomes the trench edge (draw) or a hole in it (hole). */
  const closeRing = (drawing: Pt[], kind: "draw" | "hole") =>
    editRings(
      kind === "draw" ? [drawing, ...rings.slice(1)] : [...rings, drawing],
      kind === "draw" ? "draw the trench edge" : "add a hole",
    );

  const save = async () => {
    setSaving(true);
    const prev = savedRings;
    try {
      await apiClient.call("trenchUpdate", { siteId, trenchId }, { outline: ringsToPolygon(rings) });
      const now = rings;
      setSavedRings(now);
      setError(null);
      say("ok", "Outline saved.");
      pushUndo({
        label: "save the outline",
        run: async () => {
          await apiClient.call("trenchUpdate", { siteId, trenchId }, { outline: ringsToPolygon(prev) });
          setSavedRings(prev);
          setRings(prev);
        },
      });
    } catch (err) {
      const field = err instanceof ApiError ? err.fieldErrors.outline?.[0] : undefined;
      setError(`Refused: ${field ?? (err as Error).message}`);
      const outside = err instanceof ApiError ? err.detail("outside") : undefined;
      if (Array.isArray(outside) && outside.length) onFindsOutside(outside);
    } finally {
      setSaving(false);
    }
  };

  const discard = () => {
    setRings(savedRings);
    setError(null);
  };

  const deleteSelectedVertex = () => {
    if (!selectedVertex) return;
    try {
      editRings(deleteVertex(rings, selectedVertex.ring, selectedVertex.v), "delete a vertex");
      setSelectedVertex(null);
    } catch (err) {
      setError((err as Error).message);
    }
  };

  /** A tap with the outline tool: picks a vertex, adds one on an edge, or lets go. */
  const tap = (t: Tap) => {
    if (t.vertex) setSelectedVertex(t.vertex);
    else if (t.edge) {
      editRings(insertVertex(rings, t.edge.ring, t.edge.edge, t.edge.point), "add a vertex");
      setSelectedVertex({ ring: t.edge.ring, v: t.edge.edge + 1 });
    } else setSelectedVertex(null);
  };

  return {
    rings,
    savedRings,
    selectedVertex,
    setSelectedVertex,
    error,
    saving,
    dirty,
    check,
    problem,
    editRings,
    onVertexMove,
    closeRing,
    save,
    discard,
    deleteSelectedVertex,
    tap,
  };
}
