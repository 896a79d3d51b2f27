"use client";

import { useCallback, useMemo, useState } from "react";
import type { OutlinePolygon } from "@/lib/geometry/outline";
import type { Pt } from "@/lib/geometry/outline-edit";
import type { PhotoView } from "@/lib/geometry/photo-fit-input";
import type { ClassRow, ContextRow, FindRow } from "./rows";
import PlanCanvas, { drawsRing, type Tap, type Tool } from "./plan-canvas";
import { PlanMessage } from "./plan-message";
import { PlanPanels, toolPanels, type Panel } from "./plan-panels";
import { PlanOverlay, usePointerReadout } from "./plan-overlay";
import { PlanToolbar, toolHint } from "./plan-toolbar";
import { useExtents } from "./use-extents";
import { useFindLayers } from "./use-find-layers";
import { useOutlineEdit } from "./use-outline-edit";
import { usePhotoFit } from "./use-photo-fit";
import { usePlanFinds } from "./use-plan-finds";
import { usePlanKeys } from "./use-plan-keys";
import { usePlanView } from "./use-plan-view";
import { useRecording } from "./use-recording";
import { useUndo } from "./use-undo";
import { sectionDraft } from "@/components/sections/section-draft";
import { SectionOverlay } from "@/components/sections/section-overlay";
import { usePendingRecords } from "@/components/offline/use-pending-records";

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

/** The trench plan: the canvas with its tools, and the panels beside it. Each concern lives in its own hook. */
export default function PlanScreen({
  siteId,
  trench,
  classes,
  contexts: readContexts,
  photos: initialPhotos,
  finds: initialFinds,
  canEdit,
}: PlanScreenProps) {
  // Contexts and finds made on this device and not yet sent join the server's (components/offline).
  const { contexts, addPendingFinds } = usePendingRecords(trench.id, readContexts);
  const [tool, setTool] = useState<Tool>("look");
  const [panel, setPanel] = useState<Panel>("finds");
  const [drawing, setDrawing] = useState<Pt[]>([]);
  const { pointerRef, setPointer } = usePointerReadout();
  const [message, setMessage] = useState<{ kind: "ok" | "warn"; text: string } | null>(null);
  const say = useCallback((kind: "ok" | "warn", text: string) => setMessage({ kind, text }), []);
  const { push, undo, top } = useUndo(say);

  const outline = useOutlineEdit({
    siteId,
    trenchId: trench.id,
    outline: trench.outline,
    pushUndo: push,
    say,
    onFindsOutside: (numbers) => layers.selectNumbers(numbers),
  });
  const extents = useExtents({ siteId, contexts, pushUndo: push, say, onSaved: () => setDrawing([]) });
  const { box, size, viewStore, hasView, zoomToTrench, zoomBy, pan, snapToGrid, screenDistance, bringIntoView } =
    usePlanView(outline.rings, outline.savedRings);
  const classMap = useMemo(() => new Map(classes.map((c) => [c.id, c])), [classes]);
  const {
    finds: readFinds,
    loading,
    error,
    record,
    move,
    dragRefusal,
  } = usePlanFinds({
    siteId,
    trenchId: trench.id,
    initialFinds,
    contexts,
    savedRings: outline.savedRings,
    pushUndo: push,
    say,
  });
  const finds = useMemo(() => addPendingFinds(readFinds), [addPendingFinds, readFinds]);
  const layers = useFindLayers(finds, bringIntoView);
  const recording = useRecording({
    classMap,
    record,
    onRecorded: (row) => {
      layers.setSelected(new Set([row.id]));
      setPanel("finds");
    },
    trenchCode: trench.code,
    savedRings: outline.savedRings,
    say,
  });
  const photoFit = usePhotoFit({ siteId, trenchId: trench.id, initialPhotos, say });

  const chooseTool = (t: Tool) => {
    setTool(t);
    setDrawing([]);
    if (t !== "place") recording.setPlacing(null);
    const shows = toolPanels[t];
    if (shows) setPanel(shows);
  };

  const closeRing = () => {
    if (drawing.length < 3) return;
    outline.closeRing(drawing, tool === "draw" ? "draw" : "hole");
    setDrawing([]);
    setTool("outline");
    setPanel("outline");
  };

  const onTap = (t: Tap) => {
    if (tool === "look") {
      layers.tapFind(t.find, t.additive);
      if (t.find) setPanel("finds");
      recording.setRefused(null);
    } else if (tool === "place" && canEdit) {
      recording.place(t.world);
      setPanel("record");
    } else if (tool === "outline") outline.tap(t);
    else if (drawsRing(tool)) {
      const first = drawing[0];
      const apart = first && drawing.length >= 3 ? screenDistance(first, t.world) : null;
      if (apart !== null && apart <= 22) return tool === "extent" ? void extents.save(drawing) : closeRing();
      setDrawing([...drawing, t.world]);
    } else if (tool === "fit") photoFit.placePoint(snapToGrid(t.world));
    else if (tool === "section") sectionDraft.tap(t.world);
  };

  usePlanKeys({
    canEdit,
    tool,
    hasView: () => viewStore.get() !== null,
    undo,
    chooseTool,
    zoomToTrench,
    zoomBy,
    pan,
    toggleHelp: () => setPanel((p) => (p === "help" ? "finds" : "help")),
    finishRing: () => {
      if (tool === "draw" || tool === "hole") closeRing();
      else if (tool === "extent" && drawing.length >= 3) void extents.save(drawing);
    },
    deleteVertex: outline.deleteSelectedVertex,
    escape: () => {
      setDrawing([]);
      recording.setPlacing(null);
      outline.setSelectedVertex(null);
      recording.setRefused(null);
    },
  });

  const shownRings =
    tool === "outline" || tool === "draw" || tool === "hole" || outline.dirty ? outline.rings : outline.savedRings;
  const shownExtents = contexts
    .filter((c) => extents.extents.get(c.id) && !layers.hiddenContexts.has(c.id))
    .map((c) => ({ number: c.number, extent: extents.extents.get(c.id) }));

  return (
    <div className="flex flex-col lg:h-[max(30rem,calc(100vh-16.5rem))] lg:flex-row">
      <section className="flex min-h-[58vh] flex-1 flex-col lg:min-h-0" aria-label={`Plan of trench ${trench.code}`}>
        <PlanToolbar
          tool={tool}
          onTool={chooseTool}
          canEdit={canEdit}
          onZoomTrench={zoomToTrench}
          onZoom={zoomBy}
          onUndo={() => void undo()}
          undoLabel={top}
          onHelp={() => setPanel("help")}
        />
        <p
          className="border-b border-paper-edge bg-paper-deep px-3 py-1 text-sm"
          aria-live="polite"
          data-testid="tool-hint"
        >
          {toolHint(tool)}
        </p>
        <div ref={box} className="relative flex-1 overflow-hidden">
          {hasView && size.width > 0 && (
            <PlanCanvas
              width={size.width}
              height={size.height}
              viewStore={viewStore}
              tool={tool}
              finds={layers.visible}
              classes={classMap}
              selected={layers.selected}
              rings={shownRings}
              extents={shownExtents}
              problem={shownRings === outline.rings ? outline.problem : null}
              selectedVertex={outline.selectedVertex}
              drawing={drawing}
              photo={photoFit.layer}
              placing={recording.placing}
              refused={recording.refused}
              fitMarks={tool === "fit" ? photoFit.marks : []}
              dragRefusal={dragRefusal}
              onTap={onTap}
              onFindMoved={(f, to) => void move(f, to)}
              onVertexMove={outline.onVertexMove}
              onRefusedDrag={(reason) => say("warn", reason)}
              onPointer={setPointer}
            />
          )}
          {hasView && <SectionOverlay viewStore={viewStore} />}
          {hasView && <PlanOverlay viewStore={viewStore} pointerRef={pointerRef} />}
          {message && <PlanMessage message={message} onDismiss={() => setMessage(null)} />}
          {loading && (
            <p className="absolute left-3 top-3 rounded bg-paper px-2 py-1" role="status">
              Loading finds…
            </p>
          )}
          {error && (
            <p className="absolute left-3 top-3 rounded bg-warn-light px-2 py-1 text-warn" role="alert">
              Finds could not be loaded: {error.message}
            </p>
          )}
        </div>
      </section>
      <PlanPanels
        panel={panel}
        onPanel={setPanel}
        plan={{ siteId, trench, classes, contexts, classMap, finds, canEdit, tool, drawing }}
        layers={layers}
        recording={recording}
        outline={outline}
        extents={extents}
        photoFit={photoFit}
        act={{ closeRing, cancelRing: () => setDrawing([]), chooseTool, keepOutlineTool: () => setTool("outline") }}
      />
    </div>
  );
}
