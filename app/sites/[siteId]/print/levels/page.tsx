import type { Metadata } from "next";
import { PrintedPage, SignOffMark } from "@/components/print/printed-page";
import { metres as m, PrintedTable } from "@/components/print/printed-table";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatDay } from "@/lib/words/when";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Level book to print" };

const mm = (v: number) => `${v >= 0 ? "+" : "−"}${Math.abs(v * 1000).toFixed(0)} mm`;

/**
 * The level book on paper, booked by the height-of-collimation method: each run's lines with backsight,
 * intermediate sight and foresight, the height of the plane of collimation (HPC) at each set-up and the
 * reduced level (RL) kept, the arithmetic check and the closure on a benchmark.
 */
export default async function PrintedLevelBookPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [book, locale] = await Promise.all([read.printed.levelBook(), requestLocale()]);
  const s = actor.site;
  return (
    <PrintedPage
      site={s}
      title="Level book"
      locale={locale}
      back={{ href: `/sites/${siteId}/levels`, label: "Back to the level book" }}
      testId="printed-levels"
    >
      <p>
        Every RL is in metres above <strong>{s.datumName}</strong> (
        {s.datumKind === "national" ? "a national datum" : "a local site datum"}). Closing tolerance{" "}
        <span className="num">±{(s.levelTolerance * 1000).toFixed(0)} mm</span>; a run is signed off with its trench.
      </p>
      <section aria-labelledby="bm-h" className="space-y-1">
        <h2 id="bm-h" className="text-xl font-bold">
          Temporary benchmarks
        </h2>
        <PrintedTable
          label="Benchmarks"
          columns={["Code", "Description", { num: "x (m)" }, { num: "y (m)" }, { num: "RL (m)" }]}
        >
          {book.benchmarks.map((b) => (
            <tr key={b.id}>
              <td>{b.code}</td>
              <td>{b.description}</td>
              <td className="num">{m(b.x)}</td>
              <td className="num">{m(b.y)}</td>
              <td className="num font-bold">{m(b.level)}</td>
            </tr>
          ))}
        </PrintedTable>
      </section>
      {book.runs.length === 0 && <p>No levelling runs booked yet.</p>}
      {book.runs.map((run) => (
        <section
          key={run.id}
          className="printed-run space-y-1"
          aria-label={`Run of ${run.takenOn} from ${run.startCode}`}
          data-run={run.id}
          data-signed-off={run.signedOff}
        >
          <h2 className="text-lg font-bold">
            <span className="num">{formatDay(run.takenOn, locale)}</span> · {run.startCode} →{" "}
            {run.closingCode ?? "not closed"}
            {run.trenchCode ? ` · trench ${run.trenchCode}` : " · site-wide"} ·{" "}
            <SignOffMark signedOff={run.signedOff} />
          </h2>
          <p className="text-sm">Booked by {run.recordedBy ?? "—"}</p>
          <PrintedTable
            label={`Level book, run of ${run.takenOn}`}
            columns={[
              { num: "Line" },
              "Station",
              { num: "BS" },
              { num: "IS" },
              { num: "FS" },
              { num: "HPC" },
              { num: "RL (m)" },
              "Remarks",
            ]}
          >
            {run.lines.map((l, i) => (
              <tr key={i} data-line={i + 1}>
                <td className="num">{i + 1}</td>
                <td>{l.station}</td>
                <td className="num">{m(l.backsight)}</td>
                <td className="num">{m(l.intermediate)}</td>
                <td className="num">{m(l.foresight)}</td>
                <td className="num">{m(l.collimation)}</td>
                <td className="num font-bold">{m(l.level)}</td>
                <td>
                  {l.backsight !== null && l.foresight !== null ? "change point" : ""}
                  {l.flagged ? " ⚑ run outside tolerance" : ""}
                </td>
              </tr>
            ))}
          </PrintedTable>
          <p className="text-sm" data-check>
            Check: ΣBS <span className="num">{m(run.sumBacksights)}</span> − ΣFS{" "}
            <span className="num">{m(run.sumForesights)}</span> = <span className="num">{m(run.rise)}</span>; last RL −
            first RL ={" "}
            <span className="num">
              {run.firstLevel !== null && run.lastLevel !== null ? m(run.lastLevel - run.firstLevel) : ""}
            </span>
            .{" "}
            {run.misclosure === null ? (
              "Not closed on a benchmark."
            ) : run.withinTolerance ? (
              <>
                Closing error <span className="num">{mm(run.misclosure)}</span>, within tolerance.
              </>
            ) : (
              <strong>
                Closing error <span className="num">{mm(run.misclosure)}</span>, OUTSIDE tolerance: levels flagged.
              </strong>
            )}
          </p>
        </section>
      ))}
      <section className="printed-accounting space-y-1" aria-labelledby="sum-h">
        <h2 id="sum-h" className="text-xl font-bold">
          Runs in this book
        </h2>
        <dl className="grid grid-cols-[auto_auto] justify-start gap-x-6 text-sm">
          <dt>Runs booked</dt>
          <dd className="num text-right" data-total="runs">
            {book.summary.runs}
          </dd>
          <dt>Closed within tolerance</dt>
          <dd className="num text-right">{book.summary.closedWithin}</dd>
          <dt>Closed outside tolerance</dt>
          <dd className="num text-right">{book.summary.closedOutside}</dd>
          <dt>Not closed on a benchmark</dt>
          <dd className="num text-right">{book.summary.open}</dd>
          <dt>Reduced levels</dt>
          <dd className="num text-right">{book.summary.levels}</dd>
          <dt>Runs not signed off</dt>
          <dd className="num text-right" data-total="unsigned">
            {book.summary.notSignedOff}
          </dd>
        </dl>
      </section>
    </PrintedPage>
  );
}
