"use client";

import { useState } from "react";
import { ApiError, apiClient } from "@/lib/api/client";

/** The grid's fields, by the name the trench's update reads them with. */
const fields = [
  { key: "squareSize", label: "Square size (m)", width: "w-24" },
  { key: "squareOriginX", label: "Grid line easting (m)", width: "w-28" },
  { key: "squareOriginY", label: "Grid line northing (m)", width: "w-28" },
] as const;
type GridKey = (typeof fields)[number]["key"];

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
  const [values, setValues] = useState<Record<GridKey, string>>({
    squareSize: grid ? String(grid.size) : "1",
    squareOriginX: grid ? String(grid.originX) : "0",
    squareOriginY: grid ? String(grid.originY) : "0",
  });
  const [message, setMessage] = useState<string | null>(null);
  const save = async () => {
    setMessage(null);
    try {
      await apiClient.call("trenchUpdate", { siteId, trenchId }, values as never);
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
      {fields.map((f) => (
        <label key={f.key} className="flex flex-col">
          <span className="label">{f.label}</span>
          <input
            className={`field num ${f.width}`}
            inputMode="decimal"
            value={values[f.key]}
            onChange={(e) => {
              const value = e.target.value;
              setValues((v) => ({ ...v, [f.key]: value }));
            }}
            disabled={locked}
          />
        </label>
      ))}
      <button type="submit" className="btn" disabled={locked}>
        {grid ? "Change the grid" : "Set the grid"}
      </button>
      <p className="w-full text-sm" role="status" aria-live="polite">
        {locked ? "The grid is fixed: counts are recorded in its squares." : (message ?? "")}
      </p>
    </form>
  );
}
