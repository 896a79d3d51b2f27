"use client";

import { useMemo, useState } from "react";
import { ApiError, apiClient } from "@/lib/api/client";
import { buildSectionFigure, sectionSvg, type ContextLevels, type SectionFind } from "@/lib/levels/section-figure";
import { sectionCreateSchema } from "@/lib/schemas/section";
import { sectionDraft, useSectionDraft } from "./section-draft";

type Saved = {
  id: string;
  name: string;
  startX: number;
  startY: number;
  endX: number;
  endY: number;
  halfWidth: number;
  exaggeration: number;
};

const text = (v: number | null | undefined) => (v === null || v === undefined ? "" : String(v));
const toNumber = (t: string) => (t.trim() === "" ? null : Number(t.replace(",", ".")));

/**
 * Sections of finds for one trench: the line drawn on the plan (Section line tool) or typed here, the band
 * and exaggeration, a live figure of the finds it catches, and the saved sections with their exports.
 */
export function SectionWorkbench({
  siteId,
  trench,
  datumName,
  finds,
  contextLevels,
  sections,
}: {
  siteId: string;
  trench: { id: string; code: string };
  datumName: string;
  finds: SectionFind[];
  contextLevels: ContextLevels[];
  sections: Saved[];
}) {
  const draft = useSectionDraft();
  const [name, setName] = useState(`S${sections.length + 1}`);
  const [exaggeration, setExaggeration] = useState("2");
  const [halfWidthText, setHalfWidthText] = useState(String(draft.halfWidth));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [note, setNote] = useState("");

  const ve = toNumber(exaggeration);
  const line = draft.start && draft.end ? { start: draft.start, end: draft.end, halfWidth: draft.halfWidth } : null;
  const figure = useMemo(() => {
    if (!line || !(ve !== null && ve > 0) || !(line.halfWidth > 0)) return null;
    try {
      return buildSectionFigure(name || "new", line, ve, finds, contextLevels);
    } catch {
      return null;
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [line?.start, line?.end, line?.halfWidth, ve, name, finds, contextLevels]);
  const svg = figure
    ? sectionSvg(figure, { title: `Trench ${trench.code}, section ${name || "(unnamed)"}`, datumName })
    : null;

  const setEnd = (which: "start" | "end", axis: 0 | 1, t: string) => {
    const v = toNumber(t);
    const old = draft[which] ?? [0, 0];
    const next: [number, number] = [old[0], old[1]];
    next[axis] = v === null || !Number.isFinite(v) ? 0 : v;
    sectionDraft.set({ [which]: next });
  };
  const setHalfWidth = (t: string) => {
    setHalfWidthText(t);
    const v = toNumber(t);
    if (v !== null && Number.isFinite(v)) sectionDraft.set({ halfWidth: v });
  };
  const show = (s: Saved) => {
    sectionDraft.set({ start: [s.startX, s.startY], end: [s.endX, s.endY], halfWidth: s.halfWidth });
    setHalfWidthText(String(s.halfWidth));
    setExaggeration(String(s.exaggeration));
    setName(s.name);
  };

  async function save() {
    setErrors({});
    setNote("");
    const body = {
      name,
      startX: draft.start?.[0],
      startY: draft.start?.[1],
      endX: draft.end?.[0],
      endY: draft.end?.[1],
      halfWidth: halfWidthText,
      exaggeration,
    };
    const parsed = sectionCreateSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? "_"), i.message])));
      return;
    }
    try {
      const saved = await apiClient.call("sectionsCreate", { siteId, trenchId: trench.id }, parsed.data);
      setNote(`Section ${saved.name} saved.`);
      setName(`S${sections.length + 2}`);
    } catch (err) {
      if (err instanceof ApiError)
        setErrors({
          ...Object.fromEntries(Object.entries(err.fieldErrors).map(([k, v]) => [k, v.join(" ")])),
          _: err.message,
        });
      else setErrors({ _: String(err) });
    }
  }

  async function remove(s: Saved) {
    setNote("");
    try {
      await apiClient.call("sectionDelete", { siteId, trenchId: trench.id, sectionId: s.id });
      setNote(`Section ${s.name} deleted.`);
    } catch (err) {
      setNote(err instanceof Error ? err.message : String(err));
    }
  }

  const coord = (id: string, label: string, value: number | undefined, onChange: (t: string) => void) => (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      <input
        id={id}
        className="field num w-28"
        inputMode="decimal"
        value={text(value)}
        onChange={(e) => onChange(e.target.value)}
      />
    </div>
  );
  const exportHref = (s: Saved, format: string) =>
    `/api/sites/${siteId}/trenches/${trench.id}/sections/${s.id}/export?format=${format}`;

  return (
    <section aria-labelledby="section-h" className="sheet space-y-3">
      <h2 id="section-h" className="text-xl font-bold">
        Section of finds
      </h2>
      <p className="text-sm text-ink-soft">
        Choose <strong>Section line</strong> among the plan&apos;s tools and tap the line&apos;s start (A) and end (B),
        or type them. The finds within the band either side of the line, and between its ends, are projected onto it:
        distance along the line across, reduced level up.
      </p>
      <div className="flex flex-wrap items-end gap-3">
        {coord("section-ax", "Start A x (m)", draft.start?.[0], (t) => setEnd("start", 0, t))}
        {coord("section-ay", "Start A y (m)", draft.start?.[1], (t) => setEnd("start", 1, t))}
        {coord("section-bx", "End B x (m)", draft.end?.[0], (t) => setEnd("end", 0, t))}
        {coord("section-by", "End B y (m)", draft.end?.[1], (t) => setEnd("end", 1, t))}
        <div>
          <label className="label" htmlFor="section-half">
            Band either side (m)
          </label>
          <input
            id="section-half"
            className="field num w-24"
            inputMode="decimal"
            value={halfWidthText}
            onChange={(e) => setHalfWidth(e.target.value)}
          />
        </div>
        <div>
          <label className="label" htmlFor="section-ve">
            Vertical exaggeration (×)
          </label>
          <input
            id="section-ve"
            className="field num w-24"
            inputMode="decimal"
            value={exaggeration}
            onChange={(e) => setExaggeration(e.target.value)}
          />
        </div>
        <div>
          <label className="label" htmlFor="section-name">
            Name
          </label>
          <input id="section-name" className="field w-40" value={name} onChange={(e) => setName(e.target.value)} />
        </div>
        <button type="button" className="btn-primary" onClick={() => void save()}>
          Save the section
        </button>
      </div>
      <ul className="field-error" aria-live="polite">
        {Object.entries(errors).map(([k, v]) => (
          <li key={k}>{v}</li>
        ))}
      </ul>
      <p role="status" aria-live="polite">
        {note}
      </p>
      {figure && svg ? (
        <figure>
          <div className="overflow-x-auto" data-testid="section-figure" dangerouslySetInnerHTML={{ __html: svg }} />
          <figcaption className="text-sm">
            <span data-testid="section-drawn">
              {figure.finds.length} finds drawn
              {figure.finds.length ? `: ${figure.finds.map((f) => f.number).join(", ")}` : ""}
            </span>
            {figure.withoutLevel.length > 0 && (
              <span className="text-warn"> · {figure.withoutLevel.length} in the band without a level, not drawn</span>
            )}
          </figcaption>
        </figure>
      ) : (
        <p className="text-ink-soft">
          {draft.start && !draft.end ? "Now tap the end of the line (B)." : "No section line yet."}
        </p>
      )}
      <h3 className="font-bold">Saved sections</h3>
      {sections.length === 0 ? (
        <p className="text-ink-soft">None saved for trench {trench.code}.</p>
      ) : (
        <table className="ledger text-sm" aria-label="Saved sections">
          <thead>
            <tr>
              <th>Name</th>
              <th className="num">Band ± (m)</th>
              <th className="num">V.E.</th>
              <th>Export</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {sections.map((s) => (
              <tr key={s.id} data-section={s.name}>
                <td>{s.name}</td>
                <td className="num">{s.halfWidth}</td>
                <td className="num">×{s.exaggeration}</td>
                <td className="space-x-2">
                  <a className="underline" href={exportHref(s, "svg")}>
                    SVG
                  </a>
                  <a className="underline" href={exportHref(s, "png")}>
                    PNG
                  </a>
                  <a className="underline" href={exportHref(s, "csv")}>
                    CSV
                  </a>
                </td>
                <td className="space-x-2">
                  <button type="button" className="btn" onClick={() => show(s)}>
                    Show {s.name}
                  </button>
                  <button type="button" className="btn-danger" onClick={() => void remove(s)}>
                    Delete {s.name}
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
