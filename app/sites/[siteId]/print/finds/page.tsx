import type { Metadata } from "next";
import { NumberAccountingTable } from "@/components/print/number-accounting-table";
import { PrintedPage, SignOffMark } from "@/components/print/printed-page";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatDay, formatWhen } from "@/lib/words/when";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Finds register to print" };

const m = (v: number | null) => (v === null ? "" : v.toFixed(3));

/** The finds register on paper: every find in number order, then the find numbers' accounting. */
export default async function PrintedFindsRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [r, locale] = await Promise.all([read.printed.finds(), requestLocale()]);
  const unsigned = r.rows.filter((f) => !f.signedOff).length;
  return (
    <PrintedPage
      site={actor.site}
      title="Finds register"
      printedAt={formatWhen(new Date(), locale)}
      back={{ href: `/sites/${siteId}/finds`, label: "Back to the finds register" }}
      testId="printed-finds"
    >
      <p>
        <span className="num">{r.rows.length}</span> finds;{" "}
        <strong data-unsigned={unsigned}>
          <span className="num">{unsigned}</span> not signed off
        </strong>{" "}
        (a find is signed off with its context). x, y in site-grid metres; RL in metres above the site datum.
      </p>
      {r.rows.length === 0 ? (
        <p>No finds yet.</p>
      ) : (
        <table className="ledger printed-table" aria-label="Finds register">
          <thead>
            <tr>
              <th scope="col" className="num">
                Find
              </th>
              <th scope="col" className="num">
                Context (trench)
              </th>
              <th scope="col">Class</th>
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
                Count
              </th>
              <th scope="col" className="num">
                Weight (g)
              </th>
              <th scope="col">Description</th>
              <th scope="col">Recorded</th>
              <th scope="col">Sign-off</th>
            </tr>
          </thead>
          <tbody>
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
          </tbody>
        </table>
      )}
      <NumberAccountingTable accounting={r.accounting} />
    </PrintedPage>
  );
}
