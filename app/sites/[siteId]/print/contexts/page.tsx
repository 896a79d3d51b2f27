import type { Metadata } from "next";
import { NumberAccountingTable } from "@/components/print/number-accounting-table";
import { PrintedPage, SignOffMark } from "@/components/print/printed-page";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatDay, formatWhen } from "@/lib/words/when";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Context register to print" };

/** The context register on paper: every context sheet in number order, then the context numbers' accounting. */
export default async function PrintedContextRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [r, locale] = await Promise.all([read.printed.contexts(), requestLocale()]);
  const unsigned = r.rows.filter((c) => !c.signedOff).length;
  return (
    <PrintedPage
      site={actor.site}
      title="Context register"
      printedAt={formatWhen(new Date(), locale)}
      back={{ href: `/sites/${siteId}/contexts`, label: "Back to the context sheets" }}
      testId="printed-contexts"
    >
      <p>
        <span className="num">{r.rows.length}</span> context sheets;{" "}
        <strong data-unsigned={unsigned}>
          <span className="num">{unsigned}</span> not signed off
        </strong>
        .
      </p>
      {r.rows.length === 0 ? (
        <p>No context sheets yet.</p>
      ) : (
        <table className="ledger printed-table" aria-label="Context register">
          <thead>
            <tr>
              <th scope="col" className="num">
                Context
              </th>
              <th scope="col">Trench</th>
              <th scope="col">Type</th>
              <th scope="col">Description and interpretation</th>
              <th scope="col">Relations</th>
              <th scope="col">Opened – closed</th>
              <th scope="col" className="num">
                Finds
              </th>
              <th scope="col">Recorded by</th>
              <th scope="col">Sign-off</th>
            </tr>
          </thead>
          <tbody>
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
                  {c.openedOn ? formatDay(c.openedOn, locale) : "—"} –{" "}
                  {c.closedOn ? formatDay(c.closedOn, locale) : "—"}
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
          </tbody>
        </table>
      )}
      <NumberAccountingTable accounting={r.accounting} />
    </PrintedPage>
  );
}
