"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import type { Pt } from "@/lib/geometry/outline-edit";
import type { FitModel } from "@/lib/geometry/photo-fit";
import type { PhotoView } from "@/lib/geometry/photo-fit-input";
import { apiClient } from "@/lib/api/client";
import type { DraftPoint } from "./photo-fit-panel";
import { usePhotoLayer } from "./use-photo-layer";

type Deps = {
  siteId: string;
  trenchId: string;
  initialPhotos: PhotoView[];
  say: (kind: "ok" | "warn", text: string) => void;
};

/** The trench's plan photos, the one shown under the plan, and the control points of its fit to the grid. */
export function usePhotoFit({ siteId, trenchId, initialPhotos, say }: Deps) {
  const qc = useQueryClient();
  const key = ["plan-photos", siteId, trenchId];
  const photosQuery = useQuery({
    queryKey: key,
    queryFn: () => apiClient.call("photosList", { siteId }, { trenchId }),
    initialData: initialPhotos,
  });
  const photos = photosQuery.data;
  const [photoId, setPhotoId] = useState<string | null>(initialPhotos[0]?.id ?? null);
  const photo = photos.find((p) => p.id === photoId) ?? null;
  const [opacity, setOpacity] = useState(0.9);
  const layer = usePhotoLayer(photo, opacity);
  const [points, setPoints] = useState<DraftPoint[]>([]);
  const [active, setActive] = useState<number | null>(null);
  const [model, setModel] = useState<FitModel | "auto">("auto");
  const [error, setError] = useState<string | null>(null);
  const [fitting, setFitting] = useState(false);

  // The draft points start again from the saved fit whenever another photo or a new fit is shown (state
  // adjusted while rendering, as React's docs advise, rather than in an effect one render late).
  const savedFitKey = `${photo?.id ?? ""} ${photo?.fit?.fittedAt ?? ""}`;
  const [draftFromFit, setDraftFromFit] = useState<string | null>(null);
  if (draftFromFit !== savedFitKey) {
    setDraftFromFit(savedFitKey);
    setPoints(photo?.fit ? photo.fit.points.map((p) => ({ px: p.px, py: p.py, x: String(p.x), y: String(p.y) })) : []);
    setError(null);
  }

  /** A tap with the fit tool gives the active control point its grid position (snapped by the caller). */
  const placePoint = ([x, y]: Pt) => {
    if (active === null || !points[active]) return;
    const next = points.map((p, i) => (i === active ? { ...p, x: x.toFixed(3), y: y.toFixed(3) } : p));
    setPoints(next);
    const empty = next.findIndex((p) => p.x === "" || p.y === "");
    setActive(empty >= 0 ? empty : null);
  };

  const runFit = async () => {
    if (!photo) return;
    setFitting(true);
    setError(null);
    try {
      const body = {
        points: points.map((p) => ({ px: p.px, py: p.py, x: Number(p.x), y: Number(p.y) })),
        ...(model === "auto" ? {} : { model }),
      };
      const out = await apiClient.call("photoFit", { siteId, photoId: photo.id }, body);
      qc.setQueryData<PhotoView[]>(key, (list) => (list ?? []).map((p) => (p.id === out.id ? out : p)));
      say("ok", `Photo fitted: RMS ${(out.fit!.rms * 1000).toFixed(1)} mm over ${out.fit!.points.length} points.`);
    } catch (err) {
      setError(`Refused: ${(err as Error).message}`);
    } finally {
      setFitting(false);
    }
  };

  /** After an upload the new photo is shown. */
  const uploaded = async (id: string) => {
    await photosQuery.refetch();
    setPhotoId(id);
  };

  const remove = async (id: string) => {
    try {
      await apiClient.call("photoDelete", { siteId, photoId: id });
      const left = (await photosQuery.refetch()).data ?? [];
      // Skip the deleted photo even if the refetch failed and returned the old list.
      setPhotoId(left.filter((p) => p.id !== id)[0]?.id ?? null);
      say("ok", "Photo deleted.");
    } catch (err) {
      say("warn", `Photo not deleted: ${(err as Error).message}`);
    }
  };

  /** The control points with a usable grid position, numbered as in the fit panel. */
  const marks = points
    .map((p, i) => ({ p, i }))
    .filter(({ p }) => p.x !== "" && p.y !== "" && Number.isFinite(Number(p.x)) && Number.isFinite(Number(p.y)))
    .map(({ p, i }) => ({ x: Number(p.x), y: Number(p.y), label: String(i + 1) }));

  const panel = {
    points,
    active,
    model,
    onPoints: setPoints,
    onActive: setActive,
    onModel: setModel,
    onFit: () => void runFit(),
    fitting,
    error,
  };
  return { photos, photo, setPhotoId, opacity, setOpacity, layer, placePoint, uploaded, remove, marks, panel };
}
