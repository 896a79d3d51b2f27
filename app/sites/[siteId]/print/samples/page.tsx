import type { Metadata } from "next";
import { NumberAccountingTable } from "@/components/print/number-accounting-table";
import { PrintedPage, PrintedTally, SignOffMark } from "@/components/print/printed-page";
import { metres as m, PrintedTable } from "@/components/print/printed-table";
import { sampleStatusLabels, sampleTypeLabels } from "@/lib/schemas/sample";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatDay } from "@/lib/words/when";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Samples register to print" };

/** The samples register on paper: every sample in number order, then the sample numbers' accounting. */
export default async function PrintedSamplesRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [r, locale] = await Promise.all([read.printed.samples(), requestLocale()]);
  return (
    <PrintedPage
      site={actor.site}
      title="Samples register"
      locale={locale}
      back={{ href: `/sites/${siteId}/samples`, label: "Back to the samples register" }}
      testId="printed-samples"
    >
      <PrintedTally
        rows={r.rows}
        noun="samples"
        note={`(a sample is signed off with its context). Numbered ${
          r.accounting.sequence === "find" ? "in the finds' sequence" : "in their own sequence"
        }.`}
      />
      {r.rows.length === 0 ? (
        <p>No samples yet.</p>
      ) : (
        <PrintedTable
          label="Samples register"
          columns={[
            { num: "Sample" },
            "Kind",
            { num: "Context (trench), spit" },
            { num: "x" },
            { num: "y" },
            { num: "RL" },
            { num: "Litres" },
            "Purpose",
            "Taken",
            "Processing",
            "Sign-off",
          ]}
        >
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
        </PrintedTable>
      )}
      <NumberAccountingTable accounting={r.accounting} />
    </PrintedPage>
  );
}
