import type { Metadata } from "next";
import { NumberAccountingTable } from "@/components/print/number-accounting-table";
import { PrintedPage, SignOffMark } from "@/components/print/printed-page";
import { sampleStatusLabels, sampleTypeLabels } from "@/lib/schemas/sample";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatDay, formatWhen } from "@/lib/words/when";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Samples register to print" };

const m = (v: number | null) => (v === null ? "" : v.toFixed(3));

/** The samples register on paper: every sample in number order, then the sample numbers' accounting. */
export default async function PrintedSamplesRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [r, locale] = await Promise.all([read.printed.samples(), requestLocale()]);
  const unsigned = r.rows.filter((s) => !s.signedOff).length;
  return (
    <PrintedPage
      site={actor.site}
      title="Samples register"
      printedAt={formatWhen(new Date(), locale)}
      back={{ href: `/sites/${siteId}/samples`, label: "Back to the samples register" }}
      testId="printed-samples"
    >
      <p>
        <span className="num">{r.rows.length}</span> samples;{" "}
        <strong data-unsigned={unsigned}>
          <span className="num">{unsigned}</span> not signed off
        </strong>{" "}
        (a sample is signed off with its context). Numbered{" "}
        {r.accounting.sequence === "find" ? "in the finds' sequence" : "in their own sequence"}.
      </p>
      {r.rows.length === 0 ? (
        <p>No samples yet.</p>
      ) : (
        <table className="ledger printed-table" aria-label="Samples register">
          <thead>
            <tr>
              <th scope="col" className="num">
                Sample
              </th>
              <th scope="col">Kind</th>
              <th scope="col" className="num">
                Context (trench), spit
              </th>
              <th scope="col" className="num">
                x
              </th>
              <th scope="col" className="num">
                y
              </th>
              <th scope="col" className="num">
                RL
              </th>
              <th scope="col" className="num">
                Litres
              </th>
              <th scope="col">Purpose</th>
              <th scope="col">Taken</th>
              <th scope="col">Processing</th>
              <th scope="col">Sign-off</th>
            </tr>
          </thead>
          <tbody>
            {r.rows.map((s) => (
              <tr key={s.id} className="align-top" data-number={s.number} data-signed-off={s.signedOff}>
                <td className="num font-bold">{s.number}</td>
                <td>{sampleTypeLabels[s.type]}</td>
                <td className="num">
                  <span className="whitespace-nowrap">
                    {s.contextNumber} <span className="text-xs">({s.trenchCode})</span>
                  </span>
                  {s.spitNumber !== null && <span className="block text-xs">spit {s.spitNumber}</span>}
                </td>
                <td className="num">{m(s.x)}</td>
                <td className="num">{m(s.y)}</td>
                <td className="num">{m(s.z)}</td>
                <td className="num">{s.volumeL ?? ""}</td>
                <td>{s.purpose}</td>
                <td>
                  {s.takenBy ?? "—"}
                  <span className="block whitespace-nowrap text-xs">{formatDay(s.takenOn, locale)}</span>
                </td>
                <td>{sampleStatusLabels[s.status]}</td>
                <td>
                  <SignOffMark signedOff={s.signedOff} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <NumberAccountingTable accounting={r.accounting} />
    </PrintedPage>
  );
}
