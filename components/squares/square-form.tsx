"use client";

import { useEffect, useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { ApiError, apiClient, type ApiAnswer, keptOnDevice } from "@/lib/api/client";
import { formatValue } from "@/lib/squares/colour-classes";

type Sample = ApiAnswer<"trenchSquares">["samples"][number];
type Square = ApiAnswer<"trenchSquares">["squares"][number];
export type SquareFormClass = { id: string; code: string; label: string };
export type SquareFormContext = { id: string; number: number; state: string };

/**
 * The compact form a tapped square opens: the context (and spit) dug, the area dug when not the whole
 * square, and a count (and weight) per class. A class left blank was not counted; 0 is a count.
 */
export function SquareForm({
  siteId,
  trenchId,
  square,
  samples,
  classes,
  contexts,
  onDone,
}: {
  siteId: string;
  trenchId: string;
  square: Square;
  samples: Sample[];
  classes: SquareFormClass[];
  contexts: SquareFormContext[];
  onDone: (message: string) => void;
}) {
  const open = contexts.filter((c) => c.state === "open");
  const [contextId, setContextId] = useState(open[0]?.id ?? "");
  const [spitId, setSpitId] = useState("");
  const spits = useQuery({
    queryKey: ["spits", siteId, contextId],
    queryFn: () => apiClient.call("spitsList", { siteId, contextId }) as Promise<{ id: string; number: number }[]>,
    enabled: Boolean(contextId),
  });
  const existing = samples.find(
    (s) => s.col === square.col && s.row === square.row && s.contextId === contextId && (s.spitId ?? "") === spitId,
  );
  const [area, setArea] = useState("");
  const [counts, setCounts] = useState<Record<string, { count: string; weight: string }>>({});
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [failure, setFailure] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  // Show what this square already holds in the chosen context and spit.
  useEffect(() => {
    setArea(existing?.excavatedArea != null ? String(existing.excavatedArea) : "");
    setCounts(
      Object.fromEntries(
        (existing?.counts ?? []).map((c) => [
          c.classId,
          { count: String(c.count), weight: c.weightG == null ? "" : String(c.weightG) },
        ]),
      ),
    );
    setErrors({});
    setFailure(null);
  }, [existing?.id, existing?.updatedAt]); // eslint-disable-line react-hooks/exhaustive-deps

  const save = async () => {
    setBusy(true);
    setFailure(null);
    setErrors({});
    const entered = classes.filter((c) => (counts[c.id]?.count ?? "").trim() !== "");
    try {
      const made = await apiClient.call("squareRecord", { siteId, trenchId }, {
        col: square.col,
        row: square.row,
        contextId,
        spitId: spitId || null,
        excavatedArea: area.trim() === "" ? null : area.trim(),
        counts: entered.map((c) => ({
          classId: c.id,
          count: counts[c.id]!.count.trim(),
          weightG: counts[c.id]!.weight.trim() === "" ? null : counts[c.id]!.weight.trim(),
        })),
      } as never);
      onDone(
        keptOnDevice(made)
          ? `Square ${square.label} kept on this device; it is sent when the server can be reached.`
          : `Square ${square.label} saved.`,
      );
    } catch (err) {
      if (err instanceof ApiError) {
        const byClass: Record<string, string[]> = {};
        for (const [path, msgs] of Object.entries(err.fieldErrors)) {
          const m = /^counts\.(\d+)\.(\w+)$/.exec(path);
          byClass[m ? `${entered[Number(m[1])]?.id}.${m[2]}` : path] = msgs;
        }
        setErrors(byClass);
      }
      setFailure(err instanceof Error ? err.message : String(err));
    } finally {
      setBusy(false);
    }
  };

  const remove = async () => {
    if (!existing) return;
    setBusy(true);
    try {
      const gone = await apiClient.call("squareDelete", { siteId, sampleId: existing.id });
      onDone(
        keptOnDevice(gone)
          ? `Square ${square.label}: the deletion is kept on this device; it is sent when the server can be reached.`
          : `Square ${square.label} is no longer recorded as dug in that context.`,
      );
    } catch (err) {
      setFailure(err instanceof Error ? err.message : String(err));
    } finally {
      setBusy(false);
    }
  };

  const fieldError = (key: string) => errors[key]?.join(" ") ?? "";
  return (
    <form
      aria-label={`Counts in square ${square.label}`}
      className="space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
      noValidate
    >
      <h3 className="font-bold">
        Square {square.label}{" "}
        <span className="font-normal text-ink-soft">({formatValue(square.area)} m² inside the trench)</span>
      </h3>
      {open.length === 0 && (
        <p className="text-warn">Every context of this trench is submitted or signed off; counts cannot be entered.</p>
      )}
      <div className="grid gap-2 sm:grid-cols-3">
        <label className="flex flex-col">
          <span className="label">Context</span>
          <select
            className="field"
            value={contextId}
            onChange={(e) => {
              setContextId(e.target.value);
              setSpitId("");
            }}
          >
            {open.map((c) => (
              <option key={c.id} value={c.id}>
                {c.number}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col">
          <span className="label">Spit</span>
          <select className="field" value={spitId} onChange={(e) => setSpitId(e.target.value)}>
            <option value="">not dug in spits</option>
            {(spits.data ?? []).map((s) => (
              <option key={s.id} value={s.id}>
                {s.number}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col">
          <span className="label">Area dug (m²)</span>
          <input
            className="field num"
            inputMode="decimal"
            value={area}
            placeholder="whole square"
            onChange={(e) => setArea(e.target.value)}
            aria-describedby="sq-area-error"
          />
          <span id="sq-area-error" className="field-error" aria-live="polite">
            {fieldError("excavatedArea")}
          </span>
        </label>
      </div>
      <table className="text-sm" aria-label="Counts by class">
        <thead>
          <tr>
            <th className="pr-3 text-left">Class</th>
            <th className="pr-3 text-left">Count</th>
            <th className="text-left">Weight (g)</th>
          </tr>
        </thead>
        <tbody>
          {classes.map((c) => (
            <tr key={c.id}>
              <td className="pr-3">
                {c.code} <span className="text-ink-soft">{c.label}</span>
              </td>
              <td className="pr-3">
                <input
                  className="field num w-24"
                  inputMode="numeric"
                  aria-label={`Count of ${c.code}`}
                  placeholder="not counted"
                  value={counts[c.id]?.count ?? ""}
                  onChange={(e) =>
                    setCounts({ ...counts, [c.id]: { count: e.target.value, weight: counts[c.id]?.weight ?? "" } })
                  }
                />
                <span className="field-error block" aria-live="polite">
                  {fieldError(`${c.id}.count`)}
                </span>
              </td>
              <td>
                <input
                  className="field num w-24"
                  inputMode="decimal"
                  aria-label={`Weight of ${c.code} in grams`}
                  value={counts[c.id]?.weight ?? ""}
                  onChange={(e) =>
                    setCounts({ ...counts, [c.id]: { count: counts[c.id]?.count ?? "", weight: e.target.value } })
                  }
                />
                <span className="field-error block" aria-live="polite">
                  {fieldError(`${c.id}.weightG`)}
                </span>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-xs text-ink-soft">Leave a class blank if it was not counted; enter 0 when none were found.</p>
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={busy || !contextId}>
          Save the square
        </button>
        {existing && (
          <button type="button" className="btn-danger" disabled={busy} onClick={() => void remove()}>
            Not dug here
          </button>
        )}
        <button type="button" className="btn" onClick={() => onDone("")}>
          Close
        </button>
      </div>
      <p className="field-error" role="alert" aria-live="assertive">
        {failure ?? ""}
      </p>
    </form>
  );
}
