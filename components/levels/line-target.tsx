"use client";

import type { BookLine } from "./level-book-form";

export type Choices = {
  benchmarks: { id: string; code: string; level: number }[];
  contexts: { id: string; number: number; trenchCode: string }[];
  spits: { id: string; number: number; contextNumber: number }[];
};

const targetLabels: Record<BookLine["target"], string> = {
  benchmark: "benchmark",
  change_point: "change point",
  find: "find",
  context_top: "top of context",
  context_base: "base of context",
  spit_top: "top of spit",
  spit_base: "base of spit",
  ground: "ground surface",
  other: "other",
};

/** The station's name as the book would write it, from what the staff stood on. */
export function stationFor(line: Pick<BookLine, "target" | "ref">, choices: Choices): string {
  const { target, ref } = line;
  if (target === "benchmark") return choices.benchmarks.find((b) => b.id === ref)?.code ?? "";
  if (target === "find") return ref.trim() ? `find ${ref.trim()}` : "";
  if (target === "context_top" || target === "context_base") {
    const c = choices.contexts.find((x) => x.id === ref);
    return c ? `${target === "context_top" ? "top" : "base"} of ${c.number}` : "";
  }
  if (target === "spit_top" || target === "spit_base") {
    const s = choices.spits.find((x) => x.id === ref);
    return s ? `${target === "spit_top" ? "top" : "base"} of ${s.contextNumber} spit ${s.number}` : "";
  }
  if (target === "change_point") return "CP";
  if (target === "ground") return "ground";
  return "";
}

/** What one line's staff stood on: the kind, and the record where the kind is a record of the site. */
export function LineTarget({
  line,
  index,
  choices,
  onChange,
}: {
  line: BookLine;
  index: number;
  choices: Choices;
  onChange: (patch: Partial<BookLine>) => void;
}) {
  const n = index + 1;
  const kind = line.target;
  return (
    <div className="flex gap-1">
      <select
        aria-label={`Line ${n} staff on`}
        className="field"
        value={kind}
        onChange={(e) => onChange({ target: e.target.value as BookLine["target"], ref: "" })}
      >
        {Object.entries(targetLabels).map(([k, label]) => (
          <option key={k} value={k}>
            {label}
          </option>
        ))}
      </select>
      {kind === "benchmark" && (
        <select
          aria-label={`Line ${n} benchmark`}
          className="field"
          value={line.ref}
          onChange={(e) => onChange({ ref: e.target.value })}
        >
          <option value="">choose…</option>
          {choices.benchmarks.map((b) => (
            <option key={b.id} value={b.id}>
              {b.code}
            </option>
          ))}
        </select>
      )}
      {kind === "find" && (
        <input
          aria-label={`Line ${n} find number`}
          className="field num w-24"
          inputMode="numeric"
          value={line.ref}
          onChange={(e) => onChange({ ref: e.target.value })}
        />
      )}
      {(kind === "context_top" || kind === "context_base") && (
        <select
          aria-label={`Line ${n} context`}
          className="field"
          value={line.ref}
          onChange={(e) => onChange({ ref: e.target.value })}
        >
          <option value="">choose…</option>
          {choices.contexts.map((c) => (
            <option key={c.id} value={c.id}>
              {c.number} ({c.trenchCode})
            </option>
          ))}
        </select>
      )}
      {(kind === "spit_top" || kind === "spit_base") && (
        <select
          aria-label={`Line ${n} spit`}
          className="field"
          value={line.ref}
          onChange={(e) => onChange({ ref: e.target.value })}
        >
          <option value="">choose…</option>
          {choices.spits.map((s) => (
            <option key={s.id} value={s.id}>
              {s.contextNumber} spit {s.number}
            </option>
          ))}
        </select>
      )}
    </div>
  );
}
