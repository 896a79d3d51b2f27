import Link from "next/link";
import { BenchmarkForm } from "@/components/levels/benchmark-form";
import { DatumForm } from "@/components/levels/datum-form";
import { LevelBookForm } from "@/components/levels/level-book-form";
import { LevelRunsList } from "@/components/levels/level-runs-list";
import { PrintButton } from "@/components/sign-off/print-button";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";

export const dynamic = "force-dynamic";

/** The site's level book: its datum, temporary benchmarks and levelling runs; recorders book new runs here. */
export default async function LevelBookPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [book, trenches] = await Promise.all([read.levelBook(), read.trenches()]);
  const s = actor.site;
  const records = actor.role !== "specialist";
  const base = `/sites/${siteId}/levels`;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-6xl space-y-6 px-4 py-6">
        <div className="flex flex-wrap items-baseline gap-3">
          <h1 className="text-3xl font-bold">Level book</h1>
          <span className="text-ink-soft">
            {s.code} {s.name}
          </span>
          <span className="ml-auto no-print flex flex-wrap gap-2">
            <Link className="btn" href={`/sites/${siteId}/print/levels`}>
              Level book to print
            </Link>
            <PrintButton label="Print this page" />
          </span>
        </div>
        <section aria-labelledby="datum-h" className="sheet space-y-2">
          <h2 id="datum-h" className="text-lg font-bold">
            Datum
          </h2>
          <p data-datum>
            Every level in Loamwork is a reduced level (RL): metres above <strong>{s.datumName}</strong> (
            {s.datumKind === "national" ? "a national datum" : "a local site datum"}). A closed run may miss its
            benchmark by at most <span className="num">±{(s.levelTolerance * 1000).toFixed(0)} mm</span>; outside that
            its levels are flagged.
          </p>
          {actor.role === "director" && (
            <DatumForm
              siteId={siteId}
              initial={{ datumKind: s.datumKind, datumName: s.datumName, levelTolerance: s.levelTolerance }}
            />
          )}
        </section>
        <section aria-labelledby="bm-h" className="sheet space-y-2">
          <h2 id="bm-h" className="text-lg font-bold">
            Temporary benchmarks
          </h2>
          <table className="ledger" aria-label="Benchmarks">
            <thead>
              <tr>
                <th>Code</th>
                <th>Description</th>
                <th className="num">x (m)</th>
                <th className="num">y (m)</th>
                <th className="num">RL (m)</th>
              </tr>
            </thead>
            <tbody>
              {book.benchmarks.length === 0 && (
                <tr>
                  <td colSpan={5} className="text-ink-soft">
                    None yet: a run starts from a benchmark.
                  </td>
                </tr>
              )}
              {book.benchmarks.map((b) => (
                <tr key={b.id}>
                  <td>{b.code}</td>
                  <td>{b.description}</td>
                  <td className="num">{b.x.toFixed(3)}</td>
                  <td className="num">{b.y.toFixed(3)}</td>
                  <td className="num font-bold">{b.level.toFixed(3)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {records && <BenchmarkForm siteId={siteId} />}
        </section>
        {records && book.benchmarks.length > 0 && (
          <LevelBookForm
            siteId={siteId}
            tolerance={s.levelTolerance}
            datumName={s.datumName}
            trenches={trenches.map((t) => ({ id: t.id, code: t.code }))}
            choices={{
              benchmarks: book.benchmarks.map((b) => ({ id: b.id, code: b.code, level: b.level })),
              contexts: book.contexts,
              spits: book.spits,
            }}
          />
        )}
        <section aria-labelledby="runs-h" className="space-y-2">
          <h2 id="runs-h" className="text-2xl font-bold">
            Runs
          </h2>
          <LevelRunsList runs={book.runs} />
        </section>
      </main>
    </>
  );
}
