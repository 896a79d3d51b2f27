"use client";

import { useRef } from "react";
import { minimumPoints, modelForCount, type FitModel } from "@/lib/geometry/photo-fit";
import type { PhotoView } from "@/lib/geometry/photo-fit-input";
import { formatMetres } from "@/lib/geometry/plan-view";

export type DraftPoint = { px: number; py: number; x: string; y: string };

/** The control points being placed and the fit asked for: what the plan screen hands the panel. */
export type PhotoFitControls = {
  points: DraftPoint[];
  active: number | null;
  model: FitModel | "auto";
  onPoints: (p: DraftPoint[]) => void;
  onActive: (i: number | null) => void;
  onModel: (m: FitModel | "auto") => void;
  onFit: () => void;
  fitting: boolean;
  error: string | null;
};

/** Control points: tap the photo here, then type (or tap on the plan) the peg's grid position. */
export function PhotoFitPanel({
  photo,
  points,
  active,
  model,
  onPoints,
  onActive,
  onModel,
  onFit,
  fitting,
  error,
  canEdit,
}: PhotoFitControls & { photo: PhotoView; canEdit: boolean }) {
  const img = useRef<HTMLImageElement>(null);
  const w = photo.width ?? 1;
  const h = photo.height ?? 1;
  const fit = photo.fit;
  const chosen = model === "auto" ? modelForCount(points.length) : model;
  const ready = points.length >= minimumPoints[chosen] && points.every((p) => p.x.trim() !== "" && p.y.trim() !== "");
  const set = (i: number, patch: Partial<DraftPoint>) =>
    onPoints(points.map((p, k) => (k === i ? { ...p, ...patch } : p)));
  const residualOf = (i: number) => (fit && fit.points.length === points.length ? fit.residuals[i] : undefined);

  return (
    <div className="space-y-3">
      <div className="relative w-full overflow-hidden rounded border border-ink/40">
        <img
          ref={img}
          src={photo.displayUrl}
          alt={`Photo ${photo.fileName}: tap a peg to add a control point`}
          className="block w-full cursor-crosshair"
          draggable={false}
          data-testid="fit-photo"
          onClick={(e) => {
            if (!canEdit) return;
            const r = e.currentTarget.getBoundingClientRect();
            const px = ((e.clientX - r.left) / r.width) * w;
            const py = ((e.clientY - r.top) / r.height) * h;
            onPoints([...points, { px, py, x: "", y: "" }]);
            onActive(points.length);
          }}
        />
        {points.map((p, i) => (
          <span
            key={i}
            className={`pointer-events-none absolute flex h-7 w-7 -translate-x-1/2 -translate-y-1/2 items-center justify-center rounded-full border-2 font-mono text-sm font-bold ${active === i ? "border-white bg-accent text-white" : "border-ink bg-white text-ink"}`}
            style={{ left: `${(p.px / w) * 100}%`, top: `${(p.py / h) * 100}%` }}
          >
            {i + 1}
          </span>
        ))}
      </div>
      <p className="text-sm text-ink-soft">
        Tap a peg on the photo, then type its grid position or tap the peg's place on the plan (snaps to grid
        crossings). 2 points: similarity, 3: affine, 4 or more: projective.
      </p>
      {points.length > 0 && (
        <table className="ledger">
          <thead>
            <tr>
              <th>#</th>
              <th>x (m)</th>
              <th>y (m)</th>
              <th className="num">Residual</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {points.map((p, i) => (
              <tr key={i} className={active === i ? "bg-accent-light" : ""} onClick={() => onActive(i)}>
                <td className="num font-bold">{i + 1}</td>
                <td>
                  <input
                    aria-label={`Point ${i + 1} x`}
                    className="field num w-24"
                    inputMode="decimal"
                    value={p.x}
                    onFocus={() => onActive(i)}
                    onChange={(e) => set(i, { x: e.target.value })}
                  />
                </td>
                <td>
                  <input
                    aria-label={`Point ${i + 1} y`}
                    className="field num w-24"
                    inputMode="decimal"
                    value={p.y}
                    onFocus={() => onActive(i)}
                    onChange={(e) => set(i, { y: e.target.value })}
                  />
                </td>
                <td className="num" data-testid={`residual-${i + 1}`}>
                  {residualOf(i) === undefined ? "—" : formatMetres(residualOf(i)!)}
                </td>
                <td>
                  <button
                    type="button"
                    className="btn min-w-11 px-2"
                    aria-label={`Remove point ${i + 1}`}
                    onClick={() => {
                      onPoints(points.filter((_, k) => k !== i));
                      onActive(null);
                    }}
                  >
                    ✕
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <div className="flex flex-wrap items-end gap-2">
        <label>
          <span className="label">Model</span>
          <select className="field" value={model} onChange={(e) => onModel(e.target.value as FitModel | "auto")}>
            <option value="auto">By number of points ({modelForCount(points.length)})</option>
            <option value="similarity">Similarity (2+)</option>
            <option value="affine">Affine (3+)</option>
            <option value="projective">Projective (4+)</option>
          </select>
        </label>
        <button type="button" className="btn-primary" onClick={onFit} disabled={!ready || fitting || !canEdit}>
          {fitting ? "Fitting…" : "Fit photo to grid"}
        </button>
      </div>
      {error && (
        <p role="alert" className="rounded border-2 border-warn bg-warn-light p-2 font-semibold text-warn">
          {error}
        </p>
      )}
      {fit && (
        <p role="status" className="rounded border-2 border-ok bg-ok-light p-2 text-ok" data-testid="fit-summary">
          Fitted ({fit.model}, {fit.points.length} points): overall error (RMS){" "}
          <span className="num font-bold">{formatMetres(fit.rms)}</span>
          {fit.redundancy === 0 ? " — exactly determined; add a point to check the fit." : ""}
          {fit.model === "projective" ? " Drawn as a raster warped on the server." : ""}
        </p>
      )}
    </div>
  );
}
