"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiClient } from "@/lib/api/client";
import { DEFAULT_LEVEL_SPREAD_CAUTION } from "@/lib/levels/vertical-spread";

/**
 * The vertical spread above which the Patterns scope cautions that a class's finds may mix several
 * surfaces. The director sets it; the default is common practice, and says so.
 */
export function SpreadForm({ siteId, initial, canEdit }: { siteId: string; initial: number; canEdit: boolean }) {
  const router = useRouter();
  const [value, setValue] = useState(String(initial));
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const [error, setError] = useState("");
  const save = async (ev: React.FormEvent) => {
    ev.preventDefault();
    setNote(null);
    setError("");
    try {
      await apiClient.call("siteUpdate", { siteId }, { levelSpreadCaution: value.trim() });
      setNote({ ok: true, text: "Saved." });
      router.refresh();
    } catch (err) {
      const fe = (err as { fieldErrors?: Record<string, string[]> }).fieldErrors ?? {};
      setError(fe.levelSpreadCaution?.join(" ") ?? "");
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    }
  };
  return (
    <form className="sheet space-y-3" onSubmit={save} noValidate aria-label="Levels in analyses">
      <div>
        <label className="label" htmlFor="site-level-spread">
          Vertical spread that may mix surfaces (m)
        </label>
        <input
          id="site-level-spread"
          className="field num max-w-40"
          inputMode="decimal"
          disabled={!canEdit}
          value={value}
          onChange={(e) => setValue(e.target.value)}
          aria-describedby="site-level-spread-help site-level-spread-error"
          aria-invalid={error ? true : undefined}
        />
        <p id="site-level-spread-help" className="text-sm text-ink-soft">
          When the finds of one class in a Patterns scope lie further apart than this, from the lowest reduced level to
          the highest, the scope is cautioned: they may come from several surfaces. Default{" "}
          <span className="num">{DEFAULT_LEVEL_SPREAD_CAUTION.toFixed(2)} m</span>, common practice (about two 10 cm
          spits), not a published value.
        </p>
        <p id="site-level-spread-error" className="field-error" aria-live="polite">
          {error}
        </p>
      </div>
      {canEdit && (
        <div className="flex items-center gap-3">
          <button className="btn-primary" type="submit">
            Save the spread
          </button>
          <span role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
            {note?.text ?? ""}
          </span>
        </div>
      )}
    </form>
  );
}
