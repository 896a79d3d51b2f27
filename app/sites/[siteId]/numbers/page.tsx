import Link from "next/link";
import { SiteNav } from "@/components/site-nav";
import { PrintButton } from "@/components/sign-off/print-button";
import { numberAccountingQuery } from "@/lib/schemas/number-blocks";
import { numberStatusOrder as order, numberStatusWords as statusWords } from "@/components/print/accounting-words";
import { NumberOverlaps, NumberRangesTable } from "@/components/print/number-accounting-table";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatWhen } from "@/lib/words/when";

export const dynamic = "force-dynamic";

/**
 * The site's number accounting on paper (field.md, "Numbers"): every number from 1 to the highest is a find,
 * a sample (where samples share the finds' sequence), a context sheet, reserved in a named device's block,
 * void with the reason, or never handed out. Runs of one kind print as one line. The same accounting as
 * GET /api/sites/{siteId}/number-accounting.
 */
export default async function NumberAccountingPage({
  params,
  searchParams,
}: {
  params: Promise<{ siteId: string }>;
  searchParams: Promise<Record<string, string | undefined>>;
}) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const query = numberAccountingQuery.safeParse(await searchParams);
  const kind = query.success ? query.data.kind : "find";
  const [a, locale] = await Promise.all([read.numberAccounting(kind), requestLocale()]);
  const other = kind === "find" ? "context" : "find";
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current="" />
      <main className="mx-auto max-w-5xl space-y-4 px-4 py-6" data-testid="number-accounting" data-kind={kind}>
        <div className="no-print flex flex-wrap items-center gap-3">
          <PrintButton label="Print the number accounting" />
          <Link className="btn" href={`/sites/${siteId}/numbers?kind=${other}`}>
            {other === "find" ? "Find numbers" : "Context numbers"}
          </Link>
        </div>
        <header>
          <p className="font-mono text-xs uppercase tracking-widest text-ink-faint">
            Number accounting · {actor.site.code} {actor.site.name}
          </p>
          <h1 className="text-3xl font-bold">{kind === "find" ? "Find numbers" : "Context numbers"}</h1>
          <p className="text-ink-soft">
            Every number from 1 to <span className="num">{a.highest}</span>, and what became of it. Printed{" "}
            {formatWhen(new Date(), locale)}.
          </p>
        </header>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 text-sm" aria-label="Totals">
          {order
            .filter((s) => a.totals[s] || s === kind)
            .map((s) => (
              <div key={s} className="contents" data-total={s}>
                <dt className="text-ink-soft">{statusWords[s]}</dt>
                <dd className="num">{a.totals[s] ?? 0}</dd>
              </div>
            ))}
        </dl>
        <NumberOverlaps overlaps={a.overlaps} />
        {a.ranges.length === 0 ? (
          <p className="text-ink-soft">No number has been handed out yet.</p>
        ) : (
          <NumberRangesTable
            ranges={a.ranges}
            className="w-full text-sm"
            rowClassName="border-t border-paper-edge align-top"
          />
        )}
      </main>
    </>
  );
}
