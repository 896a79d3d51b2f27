import Link from "next/link";
import { notFound } from "next/navigation";
import { ClassSymbol } from "@/components/class-symbol";
import { DeepTrenchCaution, DEEP_TRENCH_M, HumanRemainsBanner } from "@/components/cautions";
import { SiteNav } from "@/components/site-nav";
import { PlanFigure } from "@/components/sign-off/plan-figure";
import { PrintButton } from "@/components/sign-off/print-button";
import { SquareMapsPrint } from "@/components/squares/square-maps-print";
import { StateBadge } from "@/components/contexts/state-badge";
import { testViews } from "@/lib/patterns-view/test-view";
import { isPublicError } from "@/lib/server/errors";
import { pageSiteActor } from "@/lib/server/page-access";
import "./print.css";

export const dynamic = "force-dynamic";
const stamp = (d: Date | null) => (d ? `${d.toISOString().slice(0, 16).replace("T", " ")} UTC` : "—");
const num = (v: number | null, dp = 3) => (v === null || v === undefined ? "" : v.toFixed(dp));

export default async function TrenchReportPage({ params }: { params: Promise<{ siteId: string; trenchId: string }> }) {
  const { siteId, trenchId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const trench = await read.trench(trenchId).catch((err) => {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  });
  const [r, remains, depth, sections] = await Promise.all([
    read.trenchReport(trench),
    read.humanRemains(trenchId),
    read.trenchDepth(trenchId),
    read.trenchSections(trench),
  ]);
  const [squares, classes] = await Promise.all([read.trenchSquares(trenchId), read.classes()]);
  const signedCount = r.sheets.filter((s) => s.state === "signed_off").length;
  const matches = r.stampedFingerprint === r.fingerprint;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current="" />
      <main className="trench-report mx-auto max-w-5xl space-y-6 px-4 py-6">
        <div className="no-print flex flex-wrap items-center gap-3">
          <PrintButton />
          <Link className="btn" href={`/sites/${siteId}/sign-off`}>
            Back to sign-off
          </Link>
        </div>
        <header className="report-stamp sheet" aria-label="Sign-off stamp">
          <p className="font-mono text-xs uppercase tracking-widest text-ink-faint">
            Trench record · {actor.site.code} {actor.site.name}
          </p>
          <h1 className="text-3xl font-bold">
            Trench {trench.code} {trench.name && <span className="font-normal">— {trench.name}</span>}
          </h1>
          {trench.signedOffAt ? (
            <p className="mt-2 text-lg font-bold text-ok" data-stamp="signed-off">
              Signed off by {r.signedOffByName} on {stamp(trench.signedOffAt)}
            </p>
          ) : (
            <p className="mt-2 text-lg font-bold text-warn" data-stamp="draft">
              Draft — not signed off: {signedCount} of {r.sheets.length} contexts signed off
            </p>
          )}
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 text-sm">
            <dt className="text-ink-soft">SHA-256 of the records shown</dt>
            <dd className="num break-all" data-fingerprint={r.fingerprint}>
              {r.fingerprint}
            </dd>
            {r.stampedFingerprint && (
              <>
                <dt className="text-ink-soft">At sign-off</dt>
                <dd className={matches ? "text-ok" : "font-bold text-warn"}>
                  {matches
                    ? "the same: nothing has changed since"
                    : `different (${r.stampedFingerprint.slice(0, 16)}…): the records changed after sign-off`}
                </dd>
              </>
            )}
            <dt className="text-ink-soft">Printed</dt>
            <dd className="num">{stamp(new Date())}</dd>
            <dt className="text-ink-soft">Contents</dt>
            <dd>
              <span className="num">{r.sheets.length}</span> context sheets ·{" "}
              <span className="num">{r.finds.length}</span> finds · <span className="num">{r.runs.length}</span> saved
              analysis runs
            </dd>
          </dl>
        </header>

        {remains > 0 && <HumanRemainsBanner count={remains} />}
        {(depth.depth ?? 0) > DEEP_TRENCH_M && <DeepTrenchCaution depth={depth.depth!} />}
        <section aria-labelledby="plan-h">
          <h2 id="plan-h" className="text-2xl font-bold">
            Plan
          </h2>
          <PlanFigure
            outline={trench.outline}
            points={r.finds.map((f) => ({
              x: f.x,
              y: f.y,
              symbol: f.cls?.symbol ?? "disc",
              colour: f.cls?.colour ?? "#000",
              label: `Find ${f.number}`,
            }))}
          />
          <ul className="mt-2 flex flex-wrap gap-4 text-sm" aria-label="Legend">
            {r.classes.map((c) => (
              <li key={c.id}>
                <ClassSymbol symbol={c.symbol} colour={c.colour} /> {c.code} {c.label}{" "}
                <span className="num">({r.finds.filter((f) => f.classId === c.id).length})</span>
              </li>
            ))}
          </ul>
        </section>

        <SquareMapsPrint
          trenchCode={trench.code}
          outline={trench.outline.coordinates}
          data={squares}
          classes={classes}
        />

        <section className="report-section" aria-labelledby="sheets-h">
          <h2 id="sheets-h" className="text-2xl font-bold">
            Context sheets
          </h2>
          {r.sheets.map((s) => (
            <article key={s.id} className="report-sheet sheet mt-3" aria-label={`Context ${s.number}`}>
              <h3 className="text-xl font-bold">
                <span className="num">{s.number}</span> <span className="font-normal">{s.type}</span>{" "}
                <StateBadge state={s.state} />
              </h3>
              <dl className="mt-2 grid grid-cols-[10rem_1fr] gap-x-3 gap-y-1 text-sm">
                {(["colour", "compaction", "composition", "inclusions", "description", "interpretation"] as const).map(
                  (k) => (
                    <div key={k} className="contents">
                      <dt className="text-ink-soft">{k}</dt>
                      <dd className="whitespace-pre-wrap">{s[k] || "—"}</dd>
                    </div>
                  ),
                )}
                <dt className="text-ink-soft">relations</dt>
                <dd>{s.relations.join("; ") || "—"}</dd>
                <dt className="text-ink-soft">finds</dt>
                <dd className="num">{s.finds}</dd>
                <dt className="text-ink-soft">recorded by</dt>
                <dd>
                  {s.recordedByName ?? "—"} · <span className="num">{stamp(s.createdAt)}</span>
                </dd>
                <dt className="text-ink-soft">submitted</dt>
                <dd>
                  {s.submittedByName ? (
                    <>
                      {s.submittedByName} · <span className="num">{stamp(s.submittedAt)}</span>
                    </>
                  ) : (
                    "—"
                  )}
                </dd>
                <dt className="text-ink-soft">signed off</dt>
                <dd>
                  {s.signedOffByName ? (
                    <>
                      {s.signedOffByName} · <span className="num">{stamp(s.signedOffAt)}</span>
                    </>
                  ) : (
                    "—"
                  )}
                </dd>
              </dl>
              {s.classNotes.length > 0 && (
                <ul
                  className="mt-2 list-disc pl-5 text-sm text-warn"
                  aria-label={`Class changes after the sign-off of context ${s.number}`}
                >
                  {s.classNotes.map((n) => (
                    <li key={n}>{n}</li>
                  ))}
                </ul>
              )}
            </article>
          ))}
        </section>

        <section className="report-section" aria-labelledby="matrix-h">
          <h2 id="matrix-h" className="text-2xl font-bold">
            Harris matrix
          </h2>
          <p className="text-sm text-ink-soft">
            Contexts of this trench, latest at the top; dashed lines are relations implied by others.
          </p>
          {r.matrixSvg ? (
            <div className="report-matrix mt-2 overflow-x-auto" dangerouslySetInnerHTML={{ __html: r.matrixSvg }} />
          ) : (
            <p>No contexts.</p>
          )}
        </section>

        {sections.length > 0 && (
          <section className="report-section" aria-labelledby="sections-h">
            <h2 id="sections-h" className="text-2xl font-bold">
              Sections of finds
            </h2>
            {sections.map((s) => (
              <figure key={s.id} className="report-sheet report-matrix mt-3" aria-label={`Section ${s.name}`}>
                <div className="overflow-x-auto" dangerouslySetInnerHTML={{ __html: s.svg }} />
                <figcaption className="text-sm">
                  <span className="num">{s.drawn}</span> finds drawn
                  {s.withoutLevel > 0 && (
                    <>
                      ; <span className="num">{s.withoutLevel}</span> in the band without a level
                    </>
                  )}
                  .
                </figcaption>
              </figure>
            ))}
          </section>
        )}

        <section className="report-section" aria-labelledby="finds-h">
          <h2 id="finds-h" className="text-2xl font-bold">
            Finds register
          </h2>
          <table className="ledger mt-2">
            <thead>
              <tr>
                <th className="num">Find</th>
                <th className="num">Context</th>
                <th>Class</th>
                <th className="num">x</th>
                <th className="num">y</th>
                <th className="num" title="Reduced level: metres above the site datum">
                  RL (m)
                </th>
                <th className="num">Count</th>
                <th className="num">g</th>
                <th>Description</th>
                <th>How</th>
                <th>Recorder</th>
              </tr>
            </thead>
            <tbody>
              {r.finds.map((f) => (
                <tr key={f.id}>
                  <td className="num">{f.number}</td>
                  <td className="num">{f.contextNumber}</td>
                  <td>
                    {f.cls && <ClassSymbol symbol={f.cls.symbol} colour={f.cls.colour} size={12} />} {f.classFace?.code}
                  </td>
                  <td className="num">{num(f.x)}</td>
                  <td className="num">{num(f.y)}</td>
                  <td className="num">{num(f.z)}</td>
                  <td className="num">{f.count ?? ""}</td>
                  <td className="num">{num(f.weightG, 1)}</td>
                  <td>{f.description}</td>
                  <td>{f.method}</td>
                  <td>{f.recordedByName}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>

        <section className="report-section" aria-labelledby="runs-h">
          <h2 id="runs-h" className="text-2xl font-bold">
            Saved analysis runs
          </h2>
          {r.runs.length === 0 && <p className="text-ink-soft">No finished runs on this trench.</p>}
          {r.runs.map((run) => {
            const result = run.result;
            return (
              <article key={run.id} className="report-sheet sheet mt-3">
                <h3 className="font-bold">
                  {run.method} · <span className="num">{stamp(run.finishedAt)}</span>
                </h3>
                <p className="text-sm">
                  Seed <span className="num">{run.seed}</span> · engine <span className="num">{run.engineVersion}</span>{" "}
                  · records fingerprint <span className="num break-all">{run.fingerprint}</span>
                </p>
                <ul className="mt-1 list-disc pl-5 text-sm">
                  {(result ? testViews(result) : []).map((t, i) => (
                    <li key={i}>
                      <strong>{t.verdict}</strong>: {t.sentence}
                    </li>
                  ))}
                </ul>
                {(result?.cautions ?? []).length > 0 && (
                  <ul className="mt-1 text-xs text-ink-soft">
                    {result!.cautions.map((c, i) => (
                      <li key={i}>Caution: {c}</li>
                    ))}
                  </ul>
                )}
              </article>
            );
          })}
        </section>
        <p className="print-footer" aria-hidden="true">
          {actor.site.code} trench {trench.code} ·{" "}
          {trench.signedOffAt
            ? `signed off by ${r.signedOffByName} on ${stamp(trench.signedOffAt)}`
            : "DRAFT, not signed off"}{" "}
          · SHA-256 {r.fingerprint.slice(0, 16)}…
        </p>
      </main>
    </>
  );
}
