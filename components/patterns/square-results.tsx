"use client";

import type { ClassInScope } from "@/lib/api/run-result";
import type { SquareTestView } from "@/lib/patterns-view/square-view";
import { SquareMap } from "@/components/squares/square-map";
import { testMapCells } from "@/lib/squares/test-map";
import { PlotFrame } from "./plot-frame";
import { SQUARE_BADGE, squareSentence } from "./plain-words";
import { TestNotes, TestTerms } from "./test-terms";
import { fmtP } from "./words";

const NAME: Record<SquareTestView["kind"], string> = {
  moran: "Moran's I",
  geary: "Geary's C",
  "local-moran": "Local Moran's I",
  "getis-ord": "Getis–Ord Gi*",
};
/** One result's squares on the plan, with its export buttons (SVG and PNG keep the legend; CSV the numbers). */
function TestMap({ t, code, outline }: { t: SquareTestView; code: string; outline: [number, number][][] }) {
  if (!t.cells.length) return null;
  const { cells, legend } = testMapCells(t, code);
  const name = `${NAME[t.kind]} ${code}`;
  return (
    <PlotFrame
      title={`${name} on the plan`}
      name={`squares-${t.kind}-${code}`}
      csv={() =>
        t.cells.map((c) => ({
          square: c.label,
          x0: c.x0,
          y0: c.y0,
          x1: c.x1,
          y1: c.y1,
          area_m2: c.area,
          [t.variable === "density" ? "per_m2" : "count"]: c.value,
          statistic: c.statistic,
          p: c.p,
          p_adjusted: c.pAdjusted,
          finding: c.class === "none" ? "" : c.class,
        }))
      }
    >
      <div className="max-w-2xl">
        <SquareMap
          id={`sqtest-${t.kind}-${code}-${t.seed}`}
          outline={outline}
          cells={cells}
          legend={legend}
          ariaLabel={`${name} map of ${code} by square`}
        />
      </div>
    </PlotFrame>
  );
}

/** The square-count tests of a run, one card per test and class. */
export function SquareResults({
  tests,
  classes,
  outline,
}: {
  tests: SquareTestView[];
  classes: ClassInScope[];
  outline: [number, number][][];
}) {
  const code = (id: string) => classes.find((c) => c.id === id)?.code ?? "?";
  const label = (id: string) => {
    const c = classes.find((k) => k.id === id);
    return c ? `${c.label} (${c.code}) finds` : "?";
  };
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
                {SQUARE_BADGE[t.verdict]}
              </span>
              {t.p !== null && <span className="num text-sm" data-testid="p-value">{`p = ${fmtP(t.p)}`}</span>}
            </header>
            <p>{squareSentence(t, label(t.classId))}</p>
            <TestTerms sentence={t.sentence} question={t.question} />
            <TestMap t={t} code={code(t.classId)} outline={outline} />
            <TestNotes title="Cautions on this test" notes={t.notes} />
          </article>
        ))}
      </div>
    </section>
  );
}
