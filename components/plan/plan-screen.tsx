"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { checkOutline, type OutlinePolygon } from "@/lib/geometry/outline";
import { deleteVertex, insertVertex, locateProblem, moveVertex, polygonToRings, ringsToPolygon, type Pt, type Rings } from "@/lib/geometry/outline-edit";
import type { FitModel } from "@/lib/geometry/photo-fit";
import type { PhotoView } from "@/lib/geometry/photo-fit-input";
import { fitBounds, gridLines, toScreen, zoomAt } from "@/lib/geometry/plan-view";
import { ApiError, apiClient } from "@/lib/api/client";
import type { ClassRow, ContextRow, FindRow } from "./rows";
import type { Refused } from "./draw-marks";
import { FindForm, type QuickFind } from "./find-form";
import { ExtentPanel, extentLockedMessage } from "./extent-panel";
import { FindsList } from "./finds-list";
import { HelpPanel } from "./help-panel";
import { LayersPanel } from "./layers-panel";
import { OutlinePanel } from "./outline-panel";
import PlanCanvas, { drawsRing, type Tap, type Tool, type VertexRef } from "./plan-canvas";
import { PlanOverlay } from "./plan-overlay";
import { PhotoPanel } from "./photo-panel";
import { PlanToolbar, toolHint } from "./plan-toolbar";
import { usePhotoLayer } from "./use-photo-layer";
import { usePlanFinds } from "./use-plan-finds";
import { useUndo } from "./use-undo";
import { createViewStore } from "./view-store";
import type { DraftPoint } from "./photo-fit-panel";

export type PlanScreenProps = {
  siteId: string;
  trench: { id: string; code: string; outline: OutlinePolygon; signedOff: boolean };
  classes: ClassRow[];
  contexts: ContextRow[];
  photos: PhotoView[];
  /** Every find of the trench, read by the page on the server for the first paint. */
  finds: FindRow[];
  canEdit: boolean;
};

type Panel = "finds" | "record" | "layers" | "outline" | "extent" | "photo" | "help";
const panels: { id: Panel; label: string }[] = [
  { id: "finds", label: "Finds" }, { id: "record", label: "Record" }, { id: "layers", label: "Layers" },
  { id: "outline", label: "Outline" }, { id: "extent", label: "Extent" }, { id: "photo", label: "Photo" }, { id: "help", label: "Shortcuts" },
];

export default function PlanScreen({ siteId, trench, classes, contexts, photos: initialPhotos, finds: initialFinds, canEdit }: PlanScreenProps) {
  const qc = useQueryClient();
  const box = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState({ width: 0, height: 0 });
  // The view lives in a store, not in state: a pan or zoom must not re-render the panels and the finds list.
  const [viewStore] = useState(createViewStore);
  const [hasView, setHasView] = useState(false);
  const [tool, setTool] = useState<Tool>("look");
  const [panel, setPanel] = useState<Panel>("finds");
  const pointerText = useRef<HTMLDivElement>(null);
  const setPointer = useCallback((p: Pt | null) => {
    // Written straight into the overlay: a state update per pointer move would re-render the whole screen.
    if (pointerText.current) pointerText.current.textContent = p ? `x ${p[0].toFixed(3)} m · y ${p[1].toFixed(3)} m` : "x — · y —";
  }, []);
  const [message, setMessage] = useState<{ kind: "ok" | "warn"; text: string } | null>(null);
  const say = useCallback((kind: "ok" | "warn", text: string) => setMessage({ kind, text }), []);
  const { push, undo, top } = useUndo(say);

  const [savedRings, setSavedRings] = useState<Rings>(() => polygonToRings(trench.outline));
  const [rings, setRings] = useState<Rings>(savedRings);
  const [selectedVertex, setSelectedVertex] = useState<VertexRef | null>(null);
  const [drawing, setDrawing] = useState<Pt[]>([]);
  const [outlineError, setOutlineError] = useState<string | null>(null);
  const [savingOutline, setSavingOutline] = useState(false);
  const dirty = JSON.stringify(rings) !== JSON.stringify(savedRings);
  const check = useMemo(() => (rings.length ? checkOutline(ringsToPolygon(rings)) : null), [rings]);
  const problem = useMemo(() => (check && !check.ok ? locateProblem(rings) : null), [check, rings]);

  // Context extents as saved (a context's optional extent polygon), drawn on the plan and edited with the extent tool.
  const [extents, setExtents] = useState(() => new Map(contexts.map((c) => [c.id, c.extent ?? null])));
  const [extentContext, setExtentContext] = useState(contexts[0]?.id ?? "");
  const [extentError, setExtentError] = useState<string | null>(null);
  const [savingExtent, setSavingExtent] = useState(false);
  const savingExtentNow = useRef(false); // also catches two taps that land before React re-renders
  // The chosen context, or the first one when the chosen one is gone from the list.
  const extentContextId = contexts.some((c) => c.id === extentContext) ? extentContext : contexts[0]?.id ?? "";

  const [selected, setSelected] = useState<ReadonlySet<string>>(new Set());
  const [hiddenClasses, setHiddenClasses] = useState<ReadonlySet<string>>(new Set());
  const [hiddenContexts, setHiddenContexts] = useState<ReadonlySet<string>>(new Set());
  // Stable callbacks so the memoised layers panel does not redraw on every plan render.
  const toggleClass = useCallback((id: string) => setHiddenClasses((s) => toggle(s, id)), []);
  const toggleContext = useCallback((id: string) => setHiddenContexts((s) => toggle(s, id)), []);
  const [placing, setPlacing] = useState<Pt | null>(null);
  const [refused, setRefused] = useState<Refused | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [lastFind, setLastFind] = useState<Partial<QuickFind>>({});

  const classMap = useMemo(() => new Map(classes.map((c) => [c.id, c])), [classes]);
  const { finds, loading, error, record, move } = usePlanFinds({ siteId, trenchId: trench.id, initialFinds, contexts, savedRings, pushUndo: push, say });
  const visible = useMemo(() => finds.filter((f) => !hiddenClasses.has(f.classId) && !hiddenContexts.has(f.contextId)), [finds, hiddenClasses, hiddenContexts]);

  const photosQuery = useQuery({ queryKey: ["plan-photos", siteId, trench.id], queryFn: () => apiClient.call("photosList", { siteId }, { trenchId: trench.id }), initialData: initialPhotos });
  const photos = photosQuery.data;
  const [photoId, setPhotoId] = useState<string | null>(initialPhotos[0]?.id ?? null);
  const photo = photos.find((p) => p.id === photoId) ?? null;
  const [opacity, setOpacity] = useState(0.9);
  const photoLayer = usePhotoLayer(photo, opacity);
  const [fitPoints, setFitPoints] = useState<DraftPoint[]>([]);
  const [activePoint, setActivePoint] = useState<number | null>(null);
  const [fitModel, setFitModel] = useState<FitModel | "auto">("auto");
  const [fitError, setFitError] = useState<string | null>(null);
  const [fitting, setFitting] = useState(false);

  // The draft points start again from the saved fit whenever another photo or a new fit is shown (state
  // adjusted while rendering, as React's docs advise, rather than in an effect one render late).
  const savedFitKey = `${photo?.id ?? ""} ${photo?.fit?.fittedAt ?? ""}`;
  const [draftFromFit, setDraftFromFit] = useState<string | null>(null);
  if (draftFromFit !== savedFitKey) {
    setDraftFromFit(savedFitKey);
    setFitPoints(photo?.fit ? photo.fit.points.map((p) => ({ px: p.px, py: p.py, x: String(p.x), y: String(p.y) })) : []);
    setFitError(null);
  }

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const ro = new ResizeObserver(([e]) => setSize({ width: Math.floor(e.contentRect.width), height: Math.floor(e.contentRect.height) }));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const trenchBounds = useCallback(() => {
    const pts = (rings[0]?.length ? rings : savedRings).flat();
    if (!pts.length) return { minX: 0, minY: 0, maxX: 10, maxY: 10 };
    return { minX: Math.min(...pts.map((p) => p[0])), minY: Math.min(...pts.map((p) => p[1])), maxX: Math.max(...pts.map((p) => p[0])), maxY: Math.max(...pts.map((p) => p[1])) };
  }, [rings, savedRings]);
  const zoomToTrench = useCallback(() => {
    if (!size.width) return;
    viewStore.set(fitBounds(trenchBounds(), size.width, size.height));
    setHasView(true);
  }, [size, trenchBounds, viewStore]);
  useEffect(() => {
    if (!viewStore.get() && size.width > 0) zoomToTrench();
  }, [size.width, viewStore, zoomToTrench]);

  const editRings = (next: Rings, label: string) => {
    const prev = rings;
    setRings(next);
    setOutlineError(null);
    push({ label, run: () => setRings(prev) });
  };

  // A vertex drag moves the ring live; its undo returns to the rings from before the drag began.
  const dragStart = useRef<Rings | null>(null);
  const onVertexMove = (ref: VertexRef, to: Pt, done: boolean) => {
    dragStart.current ??= rings;
    const before = dragStart.current;
    setRings((r) => moveVertex(r, ref.ring, ref.v, to));
    if (!done) return;
    dragStart.current = null;
    setOutlineError(null);
    push({ label: "move a vertex", run: () => setRings(before) });
  };

  const closeRing = () => {
    if (drawing.length < 3) return;
    editRings(tool === "draw" ? [drawing, ...rings.slice(1)] : [...rings, drawing], tool === "draw" ? "draw the trench edge" : "add a hole");
    setDrawing([]);
    setTool("outline");
    setPanel("outline");
  };

  const saveOutline = async () => {
    setSavingOutline(true);
    const prev = savedRings;
    try {
      await apiClient.call("trenchUpdate", { siteId, trenchId: trench.id }, { outline: ringsToPolygon(rings) });
      const now = rings;
      setSavedRings(now);
      setOutlineError(null);
      say("ok", "Outline saved.");
      push({
        label: "save the outline",
        run: async () => {
          await apiClient.call("trenchUpdate", { siteId, trenchId: trench.id }, { outline: ringsToPolygon(prev) });
          setSavedRings(prev);
          setRings(prev);
        },
      });
    } catch (err) {
      const field = err instanceof ApiError ? err.fieldErrors.outline?.[0] : undefined;
      setOutlineError(`Refused: ${field ?? (err as Error).message}`);
      const outside = err instanceof ApiError ? err.detail("outside") : undefined;
      if (Array.isArray(outside) && outside.length) setSelected(new Set(finds.filter((f) => outside.includes(f.number)).map((f) => f.id)));
    } finally {
      setSavingOutline(false);
    }
  };

  /** Save the ring as the chosen context's extent (null clears it); refused rings and locked contexts say why. */
  const saveExtent = async (ring: Pt[] | null) => {
    // The first-corner tap and Enter call this directly, so a second tap while saving must not send a second PATCH.
    if (savingExtent || savingExtentNow.current) return;
    const ctx = contexts.find((c) => c.id === extentContextId);
    if (!ctx) return setExtentError("Pick the context whose extent this is.");
    const locked = extentLockedMessage(ctx);
    if (locked) return setExtentError(locked);
    const extent = ring ? ringsToPolygon([ring]) : null;
    if (extent) {
      const c = checkOutline(extent);
      if (!c.ok) return setExtentError(`Not saved: ${c.reason}`);
    }
    const prev = extents.get(ctx.id) ?? null;
    savingExtentNow.current = true;
    setSavingExtent(true);
    try {
      await apiClient.call("contextUpdate", { siteId, contextId: ctx.id }, { extent });
      setExtents((m) => new Map(m).set(ctx.id, extent));
      setDrawing([]);
      setExtentError(null);
      say("ok", extent ? `Extent of context ${ctx.number} saved.` : `Extent of context ${ctx.number} cleared.`);
      push({
        label: `${extent ? "save" : "clear"} the extent of context ${ctx.number}`,
        run: async () => {
          await apiClient.call("contextUpdate", { siteId, contextId: ctx.id }, { extent: prev });
          setExtents((m) => new Map(m).set(ctx.id, prev));
        },
      });
    } catch (err) {
      setExtentError(`Not saved: ${(err as Error).message}`);
    } finally {
      savingExtentNow.current = false;
      setSavingExtent(false);
    }
  };

  const submitFind = async (v: QuickFind) => {
    if (!placing) return;
    const cls = classMap.get(v.classId);
    setBusy(true);
    setLastFind({ classId: v.classId, contextId: v.contextId });
    const out = await record(placing, v, { code: cls?.code ?? "", label: cls?.label ?? "" });
    setBusy(false);
    if (out.ok) {
      setPlacing(null);
      setRefused(null);
      setFormError(null);
      setSelected(new Set([out.row.id]));
      setPanel("finds");
    } else {
      setFormError(`Not recorded: ${out.message}`);
      setRefused(out.refused);
    }
  };

  const snapToGrid = (p: Pt): Pt => {
    const view = viewStore.get();
    if (!view) return p;
    const { step } = gridLines(view, size.width, size.height);
    const q: Pt = [Math.round(p[0] / step) * step, Math.round(p[1] / step) * step];
    const [ax, ay] = toScreen(view, ...p);
    const [bx, by] = toScreen(view, ...q);
    return Math.hypot(ax - bx, ay - by) <= 14 ? q : p;
  };

  const onTap = (t: Tap) => {
    if (tool === "look") {
      if (t.find) setSelected((s) => (t.additive ? new Set(s.has(t.find!.id) ? [...s].filter((i) => i !== t.find!.id) : [...s, t.find!.id]) : new Set([t.find!.id])));
      else setSelected(new Set());
      if (t.find) setPanel("finds");
      setRefused(null);
    } else if (tool === "place" && canEdit) {
      setPlacing(t.world);
      setRefused(null);
      setFormError(null);
      setPanel("record");
    } else if (tool === "outline") {
      if (t.vertex) setSelectedVertex(t.vertex);
      else if (t.edge) {
        editRings(insertVertex(rings, t.edge.ring, t.edge.edge, t.edge.point), "add a vertex");
        setSelectedVertex({ ring: t.edge.ring, v: t.edge.edge + 1 });
      } else setSelectedVertex(null);
    } else if (drawsRing(tool)) {
      const first = drawing[0];
      const view = viewStore.get();
      if (first && drawing.length >= 3 && view) {
        const [fx, fy] = toScreen(view, ...first);
        const [tx, ty] = toScreen(view, ...t.world);
        if (Math.hypot(fx - tx, fy - ty) <= 22) return tool === "extent" ? void saveExtent(drawing) : closeRing();
      }
      setDrawing([...drawing, t.world]);
    } else if (tool === "fit" && activePoint !== null && fitPoints[activePoint]) {
      const [x, y] = snapToGrid(t.world);
      const next = fitPoints.map((p, i) => (i === activePoint ? { ...p, x: x.toFixed(3), y: y.toFixed(3) } : p));
      setFitPoints(next);
      const empty = next.findIndex((p) => p.x === "" || p.y === "");
      setActivePoint(empty >= 0 ? empty : null);
    }
  };

  const runFit = async () => {
    if (!photo) return;
    setFitting(true);
    setFitError(null);
    try {
      const body = { points: fitPoints.map((p) => ({ px: p.px, py: p.py, x: Number(p.x), y: Number(p.y) })), ...(fitModel === "auto" ? {} : { model: fitModel }) };
      const out = await apiClient.call("photoFit", { siteId, photoId: photo.id }, body);
      qc.setQueryData<PhotoView[]>(["plan-photos", siteId, trench.id], (list) => (list ?? []).map((p) => (p.id === out.id ? out : p)));
      say("ok", `Photo fitted: RMS ${(out.fit!.rms * 1000).toFixed(1)} mm over ${out.fit!.points.length} points.`);
    } catch (err) {
      setFitError(`Refused: ${(err as Error).message}`);
    } finally {
      setFitting(false);
    }
  };

  const latestSize = useRef(size);
  latestSize.current = size;
  const selectFromList = useCallback((f: FindRow, add: boolean) => {
    setSelected((s) => (add ? new Set([...s, f.id]) : new Set([f.id])));
    const [v, sz] = [viewStore.get(), latestSize.current];
    if (!v || add) return;
    const [sx, sy] = toScreen(v, f.x, f.y);
    if (sx < 0 || sy < 0 || sx > sz.width || sy > sz.height) viewStore.set({ ...v, ox: v.ox + sz.width / 2 - sx, oy: v.oy + sz.height / 2 - sy });
  }, [viewStore]);

  const dragRefusal = (f: FindRow) => {
    if (f.contextState === "signed_off") {
      const ctx = contexts.find((c) => c.id === f.contextId);
      return `Find #${f.number} cannot be moved: context ${f.contextNumber} is signed off${ctx?.signedOffAt ? ` (since ${new Date(ctx.signedOffAt).toLocaleDateString()})` : ""}. A director must reopen it first.`;
    }
    return null;
  };

  const deleteSelectedVertex = () => {
    if (!selectedVertex) return;
    try {
      editRings(deleteVertex(rings, selectedVertex.ring, selectedVertex.v), "delete a vertex");
      setSelectedVertex(null);
    } catch (err) {
      setOutlineError((err as Error).message);
    }
  };

  const chooseTool = (t: Tool) => {
    setTool(t);
    setDrawing([]);
    if (t !== "place") setPlacing(null);
    if (t === "outline" || t === "draw" || t === "hole") setPanel("outline");
    if (t === "fit") setPanel("photo");
    if (t === "extent") setPanel("extent");
    if (t === "place") setPanel("record");
  };

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const el = e.target as HTMLElement;
      if (el.closest("input, textarea, select")) return;
      const k = e.key;
      if ((e.ctrlKey || e.metaKey) && k.toLowerCase() === "z") return (e.preventDefault(), void undo());
      if (e.ctrlKey || e.metaKey || e.altKey) return;
      const toolKeys: Record<string, Tool> = { v: "look", f: "place", o: "outline", d: "draw", h: "hole", e: "extent", p: "fit" };
      if (toolKeys[k.toLowerCase()] && (canEdit || k.toLowerCase() === "v")) return chooseTool(toolKeys[k.toLowerCase()]);
      const view = viewStore.get();
      if (!view) return;
      const c: Pt = [size.width / 2, size.height / 2];
      if (k === "z" || k === "Z") zoomToTrench();
      else if (k === "+" || k === "=") viewStore.set(zoomAt(view, 1.5, ...c));
      else if (k === "-" || k === "_") viewStore.set(zoomAt(view, 1 / 1.5, ...c));
      else if (k.startsWith("Arrow")) {
        e.preventDefault();
        const d = 60;
        viewStore.set({ ...view, ox: view.ox + (k === "ArrowLeft" ? d : k === "ArrowRight" ? -d : 0), oy: view.oy + (k === "ArrowUp" ? d : k === "ArrowDown" ? -d : 0) });
      } else if (k === "u" || k === "U") void undo();
      else if (k === "?") setPanel((p) => (p === "help" ? "finds" : "help"));
      else if (k === "Enter" && (tool === "draw" || tool === "hole")) closeRing();
      else if (k === "Enter" && tool === "extent" && drawing.length >= 3) void saveExtent(drawing);
      else if ((k === "Delete" || k === "Backspace") && tool === "outline") deleteSelectedVertex();
      else if (k === "Escape") {
        setDrawing([]);
        setPlacing(null);
        setSelectedVertex(null);
        setRefused(null);
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  });

  const fitMarks = fitPoints
    .map((p, i) => ({ p, i }))
    .filter(({ p }) => tool === "fit" && p.x !== "" && p.y !== "" && Number.isFinite(Number(p.x)) && Number.isFinite(Number(p.y)))
    .map(({ p, i }) => ({ x: Number(p.x), y: Number(p.y), label: String(i + 1) }));
  const shownRings = tool === "outline" || tool === "draw" || tool === "hole" || dirty ? rings : savedRings;

  return (
    <div className="flex flex-col lg:h-[max(30rem,calc(100vh-16.5rem))] lg:flex-row">
      <section className="flex min-h-[58vh] flex-1 flex-col lg:min-h-0" aria-label={`Plan of trench ${trench.code}`}>
        <PlanToolbar tool={tool} onTool={chooseTool} canEdit={canEdit} onZoomTrench={zoomToTrench} onZoom={(f) => {
          const view = viewStore.get();
          if (view) viewStore.set(zoomAt(view, f, size.width / 2, size.height / 2));
        }} onUndo={() => void undo()} undoLabel={top} onHelp={() => setPanel("help")} />
        <p className="border-b border-paper-edge bg-paper-deep px-3 py-1 text-sm" aria-live="polite" data-testid="tool-hint">{toolHint(tool)}</p>
        <div ref={box} className="relative flex-1 overflow-hidden">
          {hasView && size.width > 0 && (
            <PlanCanvas
              width={size.width} height={size.height} viewStore={viewStore} tool={tool} finds={visible} classes={classMap} selected={selected}
              rings={shownRings} extents={contexts.filter((c) => extents.get(c.id) && !hiddenContexts.has(c.id)).map((c) => ({ number: c.number, extent: extents.get(c.id) }))} problem={shownRings === rings ? problem : null} selectedVertex={selectedVertex} drawing={drawing} photo={photoLayer} placing={placing}
              refused={refused} fitMarks={fitMarks} dragRefusal={dragRefusal} onTap={onTap} onFindMoved={(f, to) => void move(f, to)}
              onVertexMove={onVertexMove}
              onRefusedDrag={(reason) => say("warn", reason)} onPointer={setPointer}
            />
          )}
          {hasView && <PlanOverlay viewStore={viewStore} pointerRef={pointerText} />}
          {message && (
            <div role={message.kind === "warn" ? "alert" : "status"} className={`absolute left-1/2 top-3 z-10 flex max-w-[90%] -translate-x-1/2 items-center gap-3 rounded border-2 px-3 py-1 font-semibold shadow ${message.kind === "warn" ? "border-warn bg-warn-light text-warn" : "border-ok bg-ok-light text-ok"}`} data-testid="plan-message">
              <span>{message.text}</span>
              <button type="button" className="btn min-h-11 px-2" onClick={() => setMessage(null)} aria-label="Dismiss message">✕</button>
            </div>
          )}
          {loading && <p className="absolute left-3 top-3 rounded bg-paper px-2 py-1" role="status">Loading finds…</p>}
          {error && <p className="absolute left-3 top-3 rounded bg-warn-light px-2 py-1 text-warn" role="alert">Finds could not be loaded: {error.message}</p>}
        </div>
      </section>
      <aside className="flex flex-col border-t border-paper-edge bg-paper lg:w-[420px] lg:border-l lg:border-t-0" aria-label="Plan panels">
        <div role="tablist" className="flex flex-wrap gap-1 border-b border-paper-edge p-1">
          {panels.map((t) => (
            <button key={t.id} role="tab" type="button" aria-selected={panel === t.id} className={`btn px-3 ${panel === t.id ? "border-ink bg-ink text-paper hover:bg-ink" : ""}`} onClick={() => setPanel(t.id)}>{t.label}</button>
          ))}
        </div>
        <div className="flex-1 overflow-auto p-3" role="tabpanel">
          {panel === "finds" && <FindsList finds={visible} classes={classMap} selected={selected} onSelect={selectFromList} />}
          {panel === "record" && (placing ? (
            <FindForm at={placing} classes={classes} contexts={contexts} defaults={lastFind} busy={busy} serverError={formError} onSubmit={(v) => void submitFind(v)} onCancel={() => { setPlacing(null); setRefused(null); setFormError(null); }} />
          ) : (
            <p className="text-ink-soft">{canEdit ? "Choose Place find (F) and tap the plan where the find came out of the ground." : "Your role on this site reads the plan but does not record finds."}</p>
          ))}
          {panel === "layers" && <LayersPanel classes={classes} contexts={contexts} finds={finds} hiddenClasses={hiddenClasses} hiddenContexts={hiddenContexts} onToggleClass={toggleClass} onToggleContext={toggleContext} photoOpacity={opacity} onPhotoOpacity={setOpacity} hasPhoto={Boolean(photoLayer)} />}
          {panel === "outline" && (
            <OutlinePanel rings={rings} check={check} dirty={dirty} saving={savingOutline} locked={trench.signedOff ? `Trench ${trench.code} is signed off: its outline cannot change until a director reopens it.` : null} serverError={outlineError} selectedVertex={Boolean(selectedVertex)}
              drawing={tool === "draw" || tool === "hole" ? { kind: tool, count: drawing.length } : null}
              onSave={() => void saveOutline()} onDiscard={() => { setRings(savedRings); setOutlineError(null); }} onDeleteVertex={deleteSelectedVertex}
              onImport={(r) => { editRings(r, "import coordinates"); setTool("outline"); }} onCloseRing={closeRing} onCancelRing={() => setDrawing([])} />
          )}
          {panel === "extent" && (
            <ExtentPanel contexts={contexts.map((c) => ({ ...c, extent: extents.get(c.id) ?? null }))} contextId={extentContextId} hasExtent={Boolean(extents.get(extentContextId))}
              count={tool === "extent" ? drawing.length : 0} saving={savingExtent} error={extentError} canEdit={canEdit}
              onContext={(id) => { setExtentContext(id); setExtentError(null); }} onClose={() => void saveExtent(drawing)}
              onCancel={() => setDrawing([])} onClear={() => void saveExtent(null)} />
          )}
          {panel === "photo" && (
            <PhotoPanel siteId={siteId} trenchId={trench.id} photos={photos} photo={photo} canEdit={canEdit} onPhoto={setPhotoId}
              onUploaded={async (id) => { await photosQuery.refetch(); setPhotoId(id); chooseTool("fit"); }}
              onDelete={async (id) => {
                try {
                  await apiClient.call("photoDelete", { siteId, photoId: id });
                  const left = (await photosQuery.refetch()).data ?? [];
                  // Skip the deleted photo even if the refetch failed and returned the old list.
                  setPhotoId(left.filter((p) => p.id !== id)[0]?.id ?? null);
                  say("ok", "Photo deleted.");
                } catch (err) {
                  say("warn", `Photo not deleted: ${(err as Error).message}`);
                }
              }}
              fit={{ points: fitPoints, active: activePoint, model: fitModel, onPoints: setFitPoints, onActive: setActivePoint, onModel: setFitModel, onFit: () => void runFit(), fitting, error: fitError }} />
          )}
          {panel === "help" && <HelpPanel onClose={() => setPanel("finds")} />}
        </div>
      </aside>
    </div>
  );
}

function toggle(set: ReadonlySet<string>, id: string): ReadonlySet<string> {
  const next = new Set(set);
  if (next.has(id)) next.delete(id);
  else next.add(id);
  return next;
}
