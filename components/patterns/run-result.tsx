"use client";

import { ClassSymbol } from "@/components/class-symbol";
import type { RunView } from "@/lib/api/patterns-responses";
import { TestFigure } from "./class-plots";
import { classSentence, LOW_POWER_N, pairSentence } from "./plain-words";
import { PlanOverlay } from "./plan-overlay";
import { SquareResults } from "./square-results";
import { VerdictCard } from "./verdict-card";
import { fmtM } from "./words";
import { depthWords, leftOutWords } from "@/lib/levels/depth-words";
import { squareTestViews } from "@/lib/patterns-view/square-view";
import { testViews } from "@/lib/patterns-view/test-view";

/** A finished run: header with everything needed to reproduce it, warnings, verdicts and figures, cautions. */
export function RunResultView({ run, compact = false }: { run: RunView; compact?: boolean }) {
  const result = run.result;
  if (!result) return null;
  const byId = new Map(result.classes.map((c) => [c.id, c]));
  const name = (id: string) => byId.get(id)?.code ?? "?";
  const named = (id: string) => {
    const c = byId.get(id);
    return c ? `${c.label} (${c.code})` : "?";
  };
  const views = testViews(result);
  const squareTests = squareTestViews(result);
  const perClass = result.classes.map((c) => ({
    c,
    tests: views.filter((t) => "classId" in t && t.classId === c.id),
  }));
  const between = views.filter((t) => t.kind === "cross-l" || t.kind === "k-difference");
  const p = run.params;
  return (
    <div className="space-y-4" data-testid="run-result">
      <section className="sheet" aria-label="In plain words">
        <h3 className="font-bold">In plain words</h3>
        <ul className="mt-1 list-disc space-y-1 pl-5" data-testid="plain-sentences">
          {perClass.map(({ c, tests }) =>
            tests.length ? <li key={c.id}>{classSentence(c, tests, result.rmax)}</li> : null,
          )}
          {between.map((t, i) =>
            t.kind === "cross-l" || t.kind === "k-difference" ? (
              <li key={`pair-${i}`}>{pairSentence(t, named, result.rmax)}</li>
            ) : null,
          )}
        </ul>
      </section>
      <section className="sheet text-sm" aria-label="How this run was made">
        <p>
          Trench <b>{p.names.trench}</b>, context{p.names.contexts.length > 1 ? "s" : ""}{" "}
          <b className="num">{p.names.contexts.join(", ")}</b>
          {p.depth && (
            <>
              , limited to <b className="num">{depthWords(p.depth)}</b> (RL: metres above the site datum)
            </>
          )}
          ; level {result.level}, {result.nsim} simulations, seed <span className="num">{result.seed}</span>,{" "}
          {result.correction} edge correction, r up to {fmtM(result.rmax)}; engine {result.engineVersion}; records
          fingerprint{" "}
          <span className="num" title={run.fingerprint}>
            {run.fingerprint.slice(0, 12)}…
          </span>
          ; computed in {(result.elapsedMs / 1000).toFixed(1)} s.
        </p>
        {run.outOfDate && (
          <p role="status" className="mt-2 rounded border-2 border-warn bg-warn-light p-2 font-semibold text-warn">
            Out of date: finds, context states (e.g. a sign-off) or the outline this run read have changed since. Run it
            again with seed {result.seed} to compare.
          </p>
        )}
        {p.depth && p.depth.noLevel.count > 0 && (
          <p className="mt-2 text-warn">{leftOutWords("with no level recorded", p.depth.noLevel.numbers)}.</p>
        )}
        {p.depth && p.depth.noSpit.count > 0 && (
          <p className="mt-2 text-warn">{leftOutWords("recorded in no spit", p.depth.noSpit.numbers)}.</p>
        )}
      </section>
      {p.warnings.length > 0 && (
        <section role="alert" className="rounded border-2 border-warn bg-warn-light p-3 text-warn">
          <p className="font-bold">Contexts mixed in this scope</p>
          <ul className="list-disc pl-5 text-sm">
            {p.warnings.map((w, i) => (
              <li key={i}>{w.message}</li>
            ))}
          </ul>
        </section>
      )}
      {perClass.map(({ c, tests }) =>
        tests.length ? (
          <section key={c.id} aria-labelledby={`cls-${run.id}-${c.id}`} className="space-y-3">
            <h3 id={`cls-${run.id}-${c.id}`} className="text-lg font-bold">
              <ClassSymbol symbol={c.symbol} colour={c.colour} /> {c.code}{" "}
              <span className="font-normal text-ink-soft">
                {c.label}, n = <span className="num">{c.n}</span>
              </span>
              {c.n < LOW_POWER_N && (
                <span className="ml-2 text-sm font-semibold text-warn">few points: little power</span>
              )}
            </h3>
            <div className={`grid gap-3 ${compact ? "" : "lg:grid-cols-2"}`}>
              {tests.map((t, i) => (
                <div key={i} className="space-y-3">
                  <VerdictCard t={t} rmax={result.rmax} subject={c.code} />
                  <TestFigure t={t} result={result} cls={c} name={name} />
                </div>
              ))}
            </div>
          </section>
        ) : null,
      )}
      {between.length > 0 && (
        <section aria-label="Between classes" className="space-y-3">
          <h3 className="text-lg font-bold">Between classes</h3>
          <div className={`grid gap-3 ${compact ? "" : "lg:grid-cols-2"}`}>
            {between.map((t, i) =>
              t.kind === "cross-l" || t.kind === "k-difference" ? (
                <div key={i} className="space-y-3">
                  <VerdictCard t={t} rmax={result.rmax} subject={`${name(t.a)} and ${name(t.b)}`} />
                  <TestFigure t={t} result={result} cls={byId.get(t.b)} name={name} />
                </div>
              ) : null,
            )}
          </div>
        </section>
      )}
      {squareTests.length > 0 && (
        <SquareResults tests={squareTests} classes={result.classes} outline={result.outline} />
      )}
      <PlanOverlay result={result} runName={run.id.slice(0, 8)} />
      <section className="sheet" aria-labelledby={`cautions-${run.id}`}>
        <h3 id={`cautions-${run.id}`} className="font-bold">
          Before you quote this
        </h3>
        <ul className="mt-1 list-disc pl-5 text-sm">
          {result.cautions.map((c, i) => (
            <li key={i}>{c}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}
