import type { Metadata } from "next";
import { NumberAccountingTable } from "@/components/print/number-accounting-table";
import { PrintedPage, PrintedTally, SignOffMark } from "@/components/print/printed-page";
import { metres as m, PrintedTable } from "@/components/print/printed-table";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatDay } from "@/lib/words/when";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Finds register to print" };

/** The finds register on paper: every find in number order, then the find numbers' accounting. */
export default async function PrintedFindsRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [r, locale] = await Promise.all([read.printed.finds(), requestLocale()]);
  return (
    <PrintedPage
      site={actor.site}
      title="Finds register"
      locale={locale}
      back={{ href: `/sites/${siteId}/finds`, label: "Back to the finds register" }}
      testId="printed-finds"
    >
      <PrintedTally
        rows={r.rows}
        noun="finds"
        note="(a find is signed off with its context). x, y in site-grid metres; RL in metres above the site datum."
      />
      {r.rows.length === 0 ? (
        <p>No finds yet.</p>
      ) : (
        <PrintedTable
          label="Finds register"
          columns={[
            { num: "Find" },
            { num: "Context (trench)" },
            "Class",
            { num: "x" },
            { num: "y" },
            { num: "RL" },
            { num: "Count" },
            { num: "Weight (g)" },
            "Description",
            "Recorded",
            "Sign-off",
          ]}
        >
          {r.rows.map((f) => (
            <tr key={f.id} className="align-top" data-number={f.number} data-signed-off={f.signedOff}>
              <td className="num font-bold">{f.number}</td>
              <td className="num whitespace-nowrap">
                {f.contextNumber} <span className="text-xs">({f.trenchCode})</span>
              </td>
              <td>
                {f.classCode} <span className="text-xs">{f.classLabel}</span>
              </td>
              <td className="num">{m(f.x)}</td>
              <td className="num">{m(f.y)}</td>
              <td className="num">{m(f.z)}</td>
              <td className="num">{f.count ?? ""}</td>
              <td className="num">{f.weightG ?? ""}</td>
              <td>{f.description}</td>
              <td>
                {f.recordedBy ?? "—"}
                <span className="block whitespace-nowrap text-xs">{formatDay(f.recordedAt, locale)}</span>
              </td>
              <td>
                <SignOffMark signedOff={f.signedOff} />
              </td>
            </tr>
          ))}
        </PrintedTable>
      )}
      <NumberAccountingTable accounting={r.accounting} />
    </PrintedPage>
  );
}
