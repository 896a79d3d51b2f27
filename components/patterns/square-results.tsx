"use client";

import type { ClassInScope, SquareTestOut } from "@/lib/api/run-result";
import { fmtP } from "./words";

const NAME: Record<SquareTestOut["kind"], string> = {
  moran: "Moran's I",
  geary: "Geary's C",
  "local-moran": "Local Moran's I",
  "getis-ord": "Getis–Ord Gi*",
};
const VERDICT: Record<SquareTestOut["verdict"], string> = {
  clustered: "Like values together",
  dispersed: "High and low alternate",
  "hot-spots": "Hot or cold spots",
  "no-evidence": "No evidence against the null",
  "not-run": "Not run",
};
/** Viridis in five steps (van der Walt & Smith 2015): sequential, readable with the common colour-vision deficiencies. */
const RAMP = ["#fde725", "#5ec962", "#21918c", "#3b528b", "#440154"];
const OUTLINE: Record<string, { stroke: string; dash?: string }> = {
  "hot spot": { stroke: "#b2182b" },
  "cold spot": { stroke: "#2166ac", dash: "4 2" },
  "high among low": { stroke: "#b2182b", dash: "1 2" },
  "low among high": { stroke: "#2166ac", dash: "1 2" },
};

/** The squares of one result on the plan, shaded by quintile of the variable; local results outline their spots. */
function SquareMap({ t, code }: { t: SquareTestOut; code: string }) {
  if (!t.cells.length) return null;
  const xs = t.cells.flatMap((c) => [c.x0, c.x1]);
  const ys = t.cells.flatMap((c) => [c.y0, c.y1]);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const scale = 360 / Math.max(maxX - minX, maxY - minY);
  const sorted = t.cells.map((c) => c.value).sort((a, b) => a - b);
  const breaks = [1, 2, 3, 4].map((k) => sorted[Math.floor((k * sorted.length) / 5)]!);
  const klass = (v: number) => breaks.filter((b) => v >= b).length;
  const unit = t.variable === "density" ? `${code} per m²` : `${code} count`;
  return (
    <figure className="space-y-1">
      <svg
        role="img"
        aria-label={`${NAME[t.kind]} map of ${code} by square`}
        viewBox={`-4 -4 ${(maxX - minX) * scale + 8} ${(maxY - minY) * scale + 8}`}
        className="w-full max-w-md"
      >
        {t.cells.map((c) => {
          const o = OUTLINE[c.class];
          return (
            <rect
              key={c.label}
              x={(c.x0 - minX) * scale}
              y={(maxY - c.y1) * scale}
              width={(c.x1 - c.x0) * scale}
              height={(c.y1 - c.y0) * scale}
              fill={RAMP[klass(c.value)]}
              stroke={o?.stroke ?? "#ffffff"}
              strokeWidth={o ? 3 : 0.5}
              strokeDasharray={o?.dash}
            >
              <title>{`${c.label}: ${+c.value.toPrecision(4)} ${unit}${c.p !== null ? `, p = ${fmtP(c.p)}, adjusted ${fmtP(c.pAdjusted)}` : ""}${c.class !== "none" ? ` — ${c.class}` : ""}`}</title>
            </rect>
          );
        })}
      </svg>
      <figcaption className="text-sm text-ink-soft">
        Squares shaded by quintile of {unit} (light: lowest fifth, dark: highest); squares not dug are not drawn.
        {t.kind === "local-moran" || t.kind === "getis-ord"
          ? " Red outline: hot spot; blue dashed: cold spot; dotted: a high square among low ones or the reverse — after the false-discovery-rate adjustment."
          : ""}
      </figcaption>
    </figure>
  );
}

/** The square-count tests of a run, one card per test and class. */
export function SquareResults({ tests, classes }: { tests: SquareTestOut[]; classes: ClassInScope[] }) {
  const code = (id: string) => classes.find((c) => c.id === id)?.code ?? "?";
  return (
    <section aria-label="Counts by grid square" className="space-y-3">
      <h3 className="text-lg font-bold">Counts by grid square</h3>
      <div className="grid gap-3 lg:grid-cols-2">
        {tests.map((t, i) => (
          <article key={i} className="sheet space-y-2" aria-label={`${NAME[t.kind]} for ${code(t.classId)}`}>
            <header className="flex flex-wrap items-baseline gap-3">
              <h4 className="font-bold">
                {NAME[t.kind]}, {code(t.classId)}
              </h4>
              <span data-verdict={t.verdict} className="rounded border-2 border-ink/30 px-2 py-0.5 text-sm font-bold">
                {VERDICT[t.verdict]}
              </span>
              {t.p !== null && <span className="num text-sm">p = {fmtP(t.p)}</span>}
            </header>
            <p>{t.sentence}</p>
            <p className="text-sm text-ink-soft">
              <span className="font-semibold">Question answered: </span>
              {t.question}
            </p>
            <SquareMap t={t} code={code(t.classId)} />
            {t.notes.length > 0 && (
              <details className="text-sm">
                <summary className="min-h-11 cursor-pointer py-2 font-semibold text-ink-soft">
                  Cautions on this test ({t.notes.length})
                </summary>
                <ul className="list-disc pl-5">
                  {t.notes.map((n, k) => (
                    <li key={k}>{n}</li>
                  ))}
                </ul>
              </details>
            )}
          </article>
        ))}
      </div>
    </section>
  );
}
