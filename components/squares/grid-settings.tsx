"use client";

import { useState } from "react";
import { ApiError, apiClient } from "@/lib/api/client";

/** The director's setting of the trench's square grid: square size and the origin its lines pass through. */
export function GridSettings({
  siteId,
  trenchId,
  grid,
  locked,
}: {
  siteId: string;
  trenchId: string;
  grid: { size: number; originX: number; originY: number } | null;
  locked: boolean;
}) {
  const [size, setSize] = useState(grid ? String(grid.size) : "1");
  const [ox, setOx] = useState(grid ? String(grid.originX) : "0");
  const [oy, setOy] = useState(grid ? String(grid.originY) : "0");
  const [message, setMessage] = useState<string | null>(null);
  const save = async () => {
    setMessage(null);
    try {
      await apiClient.call("trenchUpdate", { siteId, trenchId }, {
        squareSize: size,
        squareOriginX: ox,
        squareOriginY: oy,
      } as never);
      setMessage("Grid saved.");
    } catch (err) {
      setMessage(
        err instanceof ApiError && err.hasFieldErrors
          ? Object.values(err.fieldErrors).flat().join(" ")
          : err instanceof Error
            ? err.message
            : String(err),
      );
    }
  };
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      aria-label="Square grid"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      <label className="flex flex-col">
        <span className="label">Square size (m)</span>
        <input
          className="field num w-24"
          inputMode="decimal"
          value={size}
          onChange={(e) => setSize(e.target.value)}
          disabled={locked}
        />
      </label>
      <label className="flex flex-col">
        <span className="label">Grid line easting (m)</span>
        <input
          className="field num w-28"
          inputMode="decimal"
          value={ox}
          onChange={(e) => setOx(e.target.value)}
          disabled={locked}
        />
      </label>
      <label className="flex flex-col">
        <span className="label">Grid line northing (m)</span>
        <input
          className="field num w-28"
          inputMode="decimal"
          value={oy}
          onChange={(e) => setOy(e.target.value)}
          disabled={locked}
        />
      </label>
      <button type="submit" className="btn" disabled={locked}>
        {grid ? "Change the grid" : "Set the grid"}
      </button>
      <p className="w-full text-sm" role="status" aria-live="polite">
        {locked ? "The grid is fixed: counts are recorded in its squares." : (message ?? "")}
      </p>
    </form>
  );
}
