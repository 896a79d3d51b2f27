import type { Metadata } from "next";
import { NumberAccountingTable } from "@/components/print/number-accounting-table";
import { PrintedPage, PrintedTally, SignOffMark } from "@/components/print/printed-page";
import { PrintedTable } from "@/components/print/printed-table";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatDay } from "@/lib/words/when";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Context register to print" };

/** The context register on paper: every context sheet in number order, then the context numbers' accounting. */
export default async function PrintedContextRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [r, locale] = await Promise.all([read.printed.contexts(), requestLocale()]);
  return (
    <PrintedPage
      site={actor.site}
      title="Context register"
      locale={locale}
      back={{ href: `/sites/${siteId}/contexts`, label: "Back to the context sheets" }}
      testId="printed-contexts"
    >
      <PrintedTally rows={r.rows} noun="context sheets" />
      {r.rows.length === 0 ? (
        <p>No context sheets yet.</p>
      ) : (
        <PrintedTable
          label="Context register"
          columns={[
            { num: "Context" },
            "Trench",
            "Type",
            "Description and interpretation",
            "Relations",
            "Opened – closed",
            { num: "Finds" },
            "Recorded by",
            "Sign-off",
          ]}
        >
          {r.rows.map((c) => (
            <tr key={c.id} className="align-top" data-number={c.number} data-signed-off={c.signedOff}>
              <td className="num font-bold">{c.number}</td>
              <td>{c.trenchCode}</td>
              <td>{c.type}</td>
              <td>
                {c.description}
                {c.interpretation && <em className="block">{c.interpretation}</em>}
              </td>
              <td>{c.relations}</td>
              <td className="num">
                {c.openedOn ? formatDay(c.openedOn, locale) : "—"} – {c.closedOn ? formatDay(c.closedOn, locale) : "—"}
              </td>
              <td className="num">{c.finds}</td>
              <td>{c.recordedBy ?? "—"}</td>
              <td>
                <SignOffMark signedOff={c.signedOff} />
                {c.signedOff && c.signedOffAt && (
                  <span className="block text-xs">
                    {c.signedOffBy ?? "—"}, {formatDay(c.signedOffAt, locale)}
                  </span>
                )}
                {!c.signedOff && c.state === "awaiting" && <span className="block text-xs">awaiting sign-off</span>}
              </td>
            </tr>
          ))}
        </PrintedTable>
      )}
      <NumberAccountingTable accounting={r.accounting} />
    </PrintedPage>
  );
}
