"use client";

import KDBush from "kdbush";
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import { Layer, Shape, Stage } from "react-konva";
import type { Context } from "konva/lib/Context";
import type { Layer as KonvaLayer } from "konva/lib/Layer";
import { nearestEdge, type EdgeHit, type Problem, type Pt, type Rings } from "@/lib/geometry/outline-edit";
import { toScreen, toWorld, zoomAt, type View } from "@/lib/geometry/plan-view";
import type { ClassRow, FindRow } from "./rows";
import { drawDrawing, drawExtents, drawFinds, drawGrid, drawOutline, drawVertices } from "./draw";
import {
  drawFitMarks,
  drawPhoto,
  drawPlacing,
  drawRefused,
  drawSelection,
  type FitMark,
  type Photo,
  type Refused,
} from "./draw-marks";
import { ViewCache } from "./view-cache";
import type { ViewStore } from "./view-store";

export type Tool = "look" | "place" | "outline" | "draw" | "hole" | "extent" | "fit" | "section";

/** Tools that draw a ring corner by corner (the trench edge, a hole, a context's extent). */
export const drawsRing = (t: Tool): boolean => t === "draw" || t === "hole" || t === "extent";
export type VertexRef = { ring: number; v: number };
export type Tap = {
  world: Pt;
  find: FindRow | null;
  vertex: VertexRef | null;
  edge: EdgeHit | null;
  additive: boolean;
};

type Props = {
  width: number;
  height: number;
  /** The live view: gestures write it, the canvas redraws from it (never through React state). */
  viewStore: ViewStore;
  tool: Tool;
  finds: FindRow[];
  classes: Map<string, ClassRow>;
  selected: ReadonlySet<string>;
  rings: Rings;
  /** Context extents shown on the plan (their contexts' layers switched on). */
  extents: { number: number; extent?: { coordinates: [number, number][][] } | null }[];
  problem: Problem | null;
  selectedVertex: VertexRef | null;
  drawing: Pt[];
  photo: Photo | null;
  placing: Pt | null;
  refused: Refused | null;
  fitMarks: FitMark[];
  /** Why a find may not be moved (its context is signed off), or null. */
  dragRefusal: (f: FindRow) => string | null;
  onTap: (t: Tap) => void;
  onFindMoved: (f: FindRow, to: Pt) => void;
  onVertexMove: (ref: VertexRef, to: Pt, done: boolean) => void;
  onRefusedDrag: (reason: string) => void;
  onPointer: (p: Pt | null) => void;
};

/** Touch targets: 22 px radius = 44 px across (product.md, field use). */
const HIT_PX = 22;
const DRAG_START_PX = 6;

const native = (ctx: Context) => (ctx as unknown as { _context: CanvasRenderingContext2D })._context;

type Gesture =
  | { kind: "none" }
  | {
      kind: "pending";
      id: number;
      start: Pt;
      view: View;
      find: FindRow | null;
      vertex: VertexRef | null;
      additive: boolean;
    }
  | { kind: "pan"; id: number; start: Pt; view: View }
  | { kind: "find"; id: number; find: FindRow }
  | { kind: "vertex"; id: number; vertex: VertexRef }
  | { kind: "pinch"; dist: number; mid: Pt; view: View };

export default function PlanCanvas(p: Props) {
  const box = useRef<HTMLDivElement>(null);
  const pointers = useRef(new Map<number, Pt>());
  const gesture = useRef<Gesture>({ kind: "none" });
  const [moved, setMoved] = useState<{ id: string; at: Pt } | null>(null);
  const [pointer, setPointer] = useState<Pt | null>(null);
  const latest = useRef(p);
  latest.current = p;
  const viewNow = () => latest.current.viewStore.get()!;
  const layer = useRef<KonvaLayer>(null);
  const redraw = useCallback(() => layer.current?.batchDraw(), []);
  const [caches] = useState(() => ({ photo: new ViewCache(redraw), finds: new ViewCache(redraw) }));
  useEffect(() => () => (caches.photo.dispose(), caches.finds.dispose()), [caches]);

  // A view change redraws the canvas (once per animation frame, Konva batches) and republishes the view
  // on the element for scripts and tests; React is not involved.
  useLayoutEffect(() => {
    const publish = () => {
      const v = latest.current.viewStore.get();
      if (v && box.current) box.current.dataset.view = JSON.stringify(v);
      redraw();
    };
    publish();
    return p.viewStore.subscribe(publish);
  }, [p.viewStore, redraw]);

  const index = useMemo(() => {
    const idx = new KDBush(Math.max(1, p.finds.length));
    for (const f of p.finds) idx.add(f.x, f.y);
    if (!p.finds.length) idx.add(NaN, NaN);
    idx.finish();
    return idx;
  }, [p.finds]);

  const local = (e: { clientX: number; clientY: number }): Pt => {
    const r = box.current!.getBoundingClientRect();
    return [e.clientX - r.left, e.clientY - r.top];
  };

  const findAt = useCallback(
    (s: Pt): FindRow | null => {
      const v = viewNow();
      const [x, y] = toWorld(v, ...s);
      let best: FindRow | null = null;
      let bestD = Infinity;
      for (const i of index.within(x, y, HIT_PX / v.scale)) {
        const f = latest.current.finds[i];
        if (!f) continue;
        const d = Math.hypot(f.x - x, f.y - y);
        if (d < bestD) [best, bestD] = [f, d];
      }
      return best;
    },
    [index],
  );

  const vertexAt = (s: Pt): VertexRef | null => {
    const { rings } = latest.current;
    const view = viewNow();
    let best: VertexRef | null = null;
    let bestD = HIT_PX;
    rings.forEach((r, k) =>
      r.forEach((q, i) => {
        const [sx, sy] = toScreen(view, q[0], q[1]);
        const d = Math.hypot(sx - s[0], sy - s[1]);
        if (d < bestD) [best, bestD] = [{ ring: k, v: i }, d];
      }),
    );
    return best;
  };

  // Wheel zoom needs a non-passive listener to keep the page from scrolling.
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const s = local(e);
      const factor = Math.exp(-e.deltaY * (e.deltaMode === 1 ? 0.05 : 0.0015));
      latest.current.viewStore.set(zoomAt(viewNow(), factor, s[0], s[1]));
    };
    el.addEventListener("wheel", onWheel, { passive: false });
    return () => el.removeEventListener("wheel", onWheel);
  }, []);

  const startPinch = () => {
    const [a, b] = [...pointers.current.values()];
    if (!a || !b) return;
    gesture.current = {
      kind: "pinch",
      dist: Math.hypot(a[0] - b[0], a[1] - b[1]) || 1,
      mid: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2],
      view: viewNow(),
    };
    setMoved(null);
  };

  const onDown = (e: React.PointerEvent) => {
    if (e.button !== 0 && e.pointerType === "mouse" && e.button !== 1) return;
    try {
      box.current!.setPointerCapture(e.pointerId);
    } catch {
      // Synthetic pointers (scripts, some styluses) cannot be captured; the gesture still works.
    }
    const s = local(e);
    pointers.current.set(e.pointerId, s);
    if (pointers.current.size === 2) return startPinch();
    if (pointers.current.size > 2) return;
    const { tool } = latest.current;
    const panOnly = e.button === 1;
    gesture.current = {
      kind: "pending",
      id: e.pointerId,
      start: s,
      view: viewNow(),
      find: !panOnly && (tool === "look" || tool === "place") ? findAt(s) : null,
      vertex: !panOnly && tool === "outline" ? vertexAt(s) : null,
      additive: e.shiftKey || e.ctrlKey || e.metaKey,
    };
  };

  const onMove = (e: React.PointerEvent) => {
    const s = local(e);
    const world = toWorld(viewNow(), ...s);
    if (e.pointerType === "mouse" || pointers.current.has(e.pointerId)) {
      // Only the rubber band of a ring being drawn needs a re-render per move.
      if (drawsRing(latest.current.tool)) setPointer(world);
      latest.current.onPointer(world);
    }
    if (!pointers.current.has(e.pointerId)) return;
    pointers.current.set(e.pointerId, s);
    const g = gesture.current;
    if (g.kind === "pinch") {
      const [a, b] = [...pointers.current.values()];
      if (!a || !b) return;
      const dist = Math.hypot(a[0] - b[0], a[1] - b[1]);
      const mid: Pt = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
      const shifted = { ...g.view, ox: g.view.ox + mid[0] - g.mid[0], oy: g.view.oy + mid[1] - g.mid[1] };
      latest.current.viewStore.set(zoomAt(shifted, dist / g.dist, mid[0], mid[1]));
      return;
    }
    if (g.kind === "pending" && g.id === e.pointerId) {
      if (Math.hypot(s[0] - g.start[0], s[1] - g.start[1]) < DRAG_START_PX) return;
      if (g.find && latest.current.tool === "look") {
        const reason = latest.current.dragRefusal(g.find);
        if (!reason) {
          gesture.current = { kind: "find", id: g.id, find: g.find };
        } else {
          latest.current.onRefusedDrag(reason);
          gesture.current = { kind: "pan", id: g.id, start: g.start, view: g.view };
        }
      } else if (g.vertex) {
        gesture.current = { kind: "vertex", id: g.id, vertex: g.vertex };
      } else {
        gesture.current = { kind: "pan", id: g.id, start: g.start, view: g.view };
      }
    }
    const h = gesture.current;
    if (h.kind === "pan" && h.id === e.pointerId)
      latest.current.viewStore.set({ ...h.view, ox: h.view.ox + s[0] - h.start[0], oy: h.view.oy + s[1] - h.start[1] });
    if (h.kind === "find" && h.id === e.pointerId) setMoved({ id: h.find.id, at: world });
    if (h.kind === "vertex" && h.id === e.pointerId) latest.current.onVertexMove(h.vertex, world, false);
  };

  const onUp = (e: React.PointerEvent) => {
    const s = local(e);
    const g = gesture.current;
    pointers.current.delete(e.pointerId);
    const world = toWorld(viewNow(), ...s);
    if (g.kind === "pinch" || g.kind === "pan") redraw(); // exact again now the gesture is over
    if (g.kind === "pinch") {
      gesture.current = { kind: "none" };
      return;
    }
    if (g.kind === "pending" && g.id === e.pointerId && e.type === "pointerup") {
      const { tool, rings } = latest.current;
      const view = viewNow();
      const edge = tool === "outline" && !g.vertex ? nearestEdge(rings, ...world) : null;
      latest.current.onTap({
        world,
        find: g.find,
        vertex: g.vertex,
        edge: edge && edge.distance * view.scale <= HIT_PX ? edge : null,
        additive: g.additive,
      });
    }
    if (g.kind === "find" && g.id === e.pointerId) {
      latest.current.onFindMoved(g.find, world);
      setMoved(null);
    }
    if (g.kind === "vertex" && g.id === e.pointerId) latest.current.onVertexMove(g.vertex, world, true);
    gesture.current = { kind: "none" };
  };

  const { width, height } = p;
  const selectedPts = useMemo(
    () => p.finds.filter((f) => p.selected.has(f.id)).map((f) => (moved?.id === f.id ? moved.at : ([f.x, f.y] as Pt))),
    [p.finds, p.selected, moved],
  );
  const movedFind = useMemo(() => {
    const f = moved && p.finds.find((g) => g.id === moved.id);
    return f ? [{ ...f, x: moved.at[0], y: moved.at[1] }] : [];
  }, [p.finds, moved]);

  // Everything on one canvas: a pan then repaints and hands the compositor one bitmap, not four.
  const scene = (ctx: Context) => {
    const c = native(ctx);
    const view = viewNow();
    const live = gesture.current.kind === "pan" || gesture.current.kind === "pinch";
    const screen = { x0: 0, y0: 0, x1: width, y1: height };
    const { photo, finds, classes } = p;
    const hasPhoto = Boolean(photo?.img);
    if (photo?.img)
      caches.photo.draw(c, view, width, height, [photo.img, photo.opacity, ...photo.matrix], live, (cc, v) =>
        drawPhoto(cc, v, photo),
      );
    drawOutline(c, view, p.rings, hasPhoto, p.problem);
    drawExtents(c, view, p.extents);
    drawGrid(c, view, width, height, hasPhoto);
    if (finds.length)
      caches.finds.draw(c, view, width, height, [finds, classes, moved?.id ?? null], live, (cc, v, area) =>
        drawFinds(cc, v, finds, classes, area, moved?.id),
      );
    if (movedFind.length) drawFinds(c, view, movedFind, classes, screen);
    // For the benchmark (scripts/bench-plan.ts): the first frame with finds on the plan.
    if (finds.length && !performance.getEntriesByName("loamwork-plan-finds").length)
      performance.mark("loamwork-plan-finds", { detail: finds.length });
    drawSelection(c, view, selectedPts);
    if (p.tool === "outline") drawVertices(c, view, p.rings, p.selectedVertex);
    if (drawsRing(p.tool)) drawDrawing(c, view, p.drawing, pointer);
    if (p.placing) drawPlacing(c, view, p.placing);
    if (p.refused) drawRefused(c, view, p.refused, width);
    drawFitMarks(c, view, p.fitMarks);
  };

  return (
    <div
      ref={box}
      className="relative h-full w-full touch-none select-none bg-paper-deep"
      style={{ cursor: p.tool === "look" ? "grab" : "crosshair" }}
      onPointerDown={onDown}
      onPointerMove={onMove}
      onPointerUp={onUp}
      onPointerCancel={onUp}
      onPointerLeave={() => {
        setPointer(null);
        latest.current.onPointer(null);
      }}
      data-testid="plan-canvas"
    >
      <Stage width={width} height={height} listening={false}>
        <Layer ref={layer} listening={false}>
          <Shape listening={false} perfectDrawEnabled={false} sceneFunc={scene} />
        </Layer>
      </Stage>
    </div>
  );
}
