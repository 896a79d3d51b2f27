"use client";

import type { Pt } from "@/lib/geometry/outline-edit";
import { ExtentPanel } from "./extent-panel";
import { FindForm } from "./find-form";
import { FindsList } from "./finds-list";
import { HelpPanel } from "./help-panel";
import { LayersPanel } from "./layers-panel";
import { OutlinePanel } from "./outline-panel";
import { PhotoPanel } from "./photo-panel";
import type { Tool } from "./plan-canvas";
import type { PlanScreenProps } from "./plan-screen";
import type { ClassRow, FindRow } from "./rows";
import type { useExtents } from "./use-extents";
import type { useFindLayers } from "./use-find-layers";
import type { useOutlineEdit } from "./use-outline-edit";
import type { usePhotoFit } from "./use-photo-fit";
import type { useRecording } from "./use-recording";

export type Panel = "finds" | "record" | "layers" | "outline" | "extent" | "photo" | "help";
const panels: { id: Panel; label: string }[] = [
  { id: "finds", label: "Finds" },
  { id: "record", label: "Record" },
  { id: "layers", label: "Layers" },
  { id: "outline", label: "Outline" },
  { id: "extent", label: "Extent" },
  { id: "photo", label: "Photo" },
  { id: "help", label: "Shortcuts" },
];
/** The panel a tool opens. */
export const toolPanels: Partial<Record<Tool, Panel>> = {
  outline: "outline",
  draw: "outline",
  hole: "outline",
  fit: "photo",
  extent: "extent",
  place: "record",
};

type Props = {
  panel: Panel;
  onPanel: (p: Panel) => void;
  plan: Pick<PlanScreenProps, "siteId" | "trench" | "classes" | "contexts" | "canEdit"> & {
    classMap: Map<string, ClassRow>;
    finds: FindRow[];
    tool: Tool;
    drawing: Pt[];
  };
  layers: ReturnType<typeof useFindLayers>;
  recording: ReturnType<typeof useRecording>;
  outline: ReturnType<typeof useOutlineEdit>;
  extents: ReturnType<typeof useExtents>;
  photoFit: ReturnType<typeof usePhotoFit>;
  act: { closeRing: () => void; cancelRing: () => void; chooseTool: (t: Tool) => void; keepOutlineTool: () => void };
};

/** The panels beside the plan, one shown at a time: finds, recording, layers, outline, extent, photo, shortcuts. */
export function PlanPanels({ panel, onPanel, plan, layers, recording, outline, extents, photoFit, act }: Props) {
  const { siteId, trench, classes, contexts, classMap, finds, canEdit, tool, drawing } = plan;
  return (
    // On a phone the find form opens as a sheet over the plan, so the point just tapped stays in view above it.
    <aside
      className={`flex flex-col border-t border-paper-edge bg-paper lg:w-[420px] lg:border-l lg:border-t-0 ${panel === "record" && recording.placing ? "max-sm:fixed max-sm:inset-x-0 max-sm:bottom-0 max-sm:z-40 max-sm:max-h-[62vh] max-sm:rounded-t-lg max-sm:border-2 max-sm:border-ink/40 max-sm:shadow-xl" : ""}`}
      aria-label="Plan panels"
    >
      <div role="tablist" className="flex flex-wrap gap-1 border-b border-paper-edge p-1">
        {panels.map((t) => (
          <button
            key={t.id}
            role="tab"
            type="button"
            aria-selected={panel === t.id}
            className={`btn px-3 ${panel === t.id ? "border-ink bg-ink text-paper hover:bg-ink" : ""}`}
            onClick={() => onPanel(t.id)}
          >
            {t.label}
          </button>
        ))}
      </div>
      <div className="flex-1 overflow-auto p-3" role="tabpanel">
        {panel === "finds" && (
          <FindsList
            finds={layers.visible}
            classes={classMap}
            selected={layers.selected}
            onSelect={layers.selectFromList}
          />
        )}
        {panel === "record" &&
          (recording.placing ? (
            <FindForm
              at={recording.placing}
              classes={classes}
              contexts={contexts}
              defaults={recording.lastFind}
              busy={recording.busy}
              serverError={recording.formError}
              onSubmit={(v) => void recording.submit(v)}
              onCancel={recording.cancel}
            />
          ) : (
            <p className="text-ink-soft">
              {canEdit
                ? "Choose Place find (F) and tap the plan where the find came out of the ground."
                : "Your role on this site reads the plan but does not record finds."}
            </p>
          ))}
        {panel === "layers" && (
          <LayersPanel
            classes={classes}
            contexts={contexts}
            finds={finds}
            hiddenClasses={layers.hiddenClasses}
            hiddenContexts={layers.hiddenContexts}
            onToggleClass={layers.toggleClass}
            onToggleContext={layers.toggleContext}
            photoOpacity={photoFit.opacity}
            onPhotoOpacity={photoFit.setOpacity}
            hasPhoto={Boolean(photoFit.layer)}
          />
        )}
        {panel === "outline" && (
          <OutlinePanel
            rings={outline.rings}
            check={outline.check}
            dirty={outline.dirty}
            saving={outline.saving}
            locked={
              trench.signedOff
                ? `Trench ${trench.code} is signed off: its outline cannot change until a director reopens it.`
                : null
            }
            serverError={outline.error}
            selectedVertex={Boolean(outline.selectedVertex)}
            drawing={tool === "draw" || tool === "hole" ? { kind: tool, count: drawing.length } : null}
            onSave={() => void outline.save()}
            onDiscard={outline.discard}
            onDeleteVertex={outline.deleteSelectedVertex}
            onImport={(r) => {
              outline.editRings(r, "import coordinates");
              act.keepOutlineTool();
            }}
            onCloseRing={act.closeRing}
            onCancelRing={act.cancelRing}
          />
        )}
        {panel === "extent" && (
          <ExtentPanel
            contexts={contexts.map((c) => ({ ...c, extent: extents.extents.get(c.id) ?? null }))}
            contextId={extents.contextId}
            hasExtent={Boolean(extents.extents.get(extents.contextId))}
            count={tool === "extent" ? drawing.length : 0}
            saving={extents.saving}
            error={extents.error}
            canEdit={canEdit}
            onContext={extents.choose}
            onClose={() => void extents.save(drawing)}
            onCancel={act.cancelRing}
            onClear={() => void extents.save(null)}
          />
        )}
        {panel === "photo" && (
          <PhotoPanel
            siteId={siteId}
            trenchId={trench.id}
            photos={photoFit.photos}
            photo={photoFit.photo}
            canEdit={canEdit}
            onPhoto={photoFit.setPhotoId}
            onUploaded={async (id) => {
              await photoFit.uploaded(id);
              act.chooseTool("fit");
            }}
            onDelete={photoFit.remove}
            fit={photoFit.panel}
          />
        )}
        {panel === "help" && <HelpPanel onClose={() => onPanel("finds")} />}
      </div>
    </aside>
  );
}
