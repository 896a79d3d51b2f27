import type { Metadata } from "next";
import Link from "next/link";
import { BoxForm } from "@/components/boxes/box-form";
import { BoxTable } from "@/components/boxes/box-table";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor, type SiteSearchPageProps } from "@/lib/server/page-access";
import { boxListQuery } from "@/lib/schemas/processing";
import { readUrlQuery } from "@/lib/schemas/url-query";

export const metadata: Metadata = { title: "Boxes" };

/** The box register: the finds store's boxes, numbered per site, with where each is kept and how much it holds. */
export default async function BoxesPage({ params, searchParams }: SiteSearchPageProps) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const { q } = readUrlQuery(boxListQuery, await searchParams);
  const page = await read.boxes(q);
  const base = `/sites/${siteId}/boxes`;
  const pages = Math.max(1, Math.ceil(page.total / q.pageSize));
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-5xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Box register</h1>
        <p className="text-ink-soft">
          The boxes of the finds store. A box holds the finds and samples put in it, from the finds register, a
          find&apos;s page or the samples register; its label lists them.
        </p>
        <BoxForm siteId={siteId} />
        <p>
          <Link className="btn" href={`/sites/${siteId}/labels?kind=boxes&preset=8`}>
            Box labels for every box
          </Link>
        </p>
        <BoxTable siteId={siteId} rows={page.rows} />
        {pages > 1 && (
          <nav aria-label="Pages" className="flex gap-2">
            {q.page > 1 && (
              <Link className="btn" href={`${base}?page=${q.page - 1}`}>
                ← Previous
              </Link>
            )}
            {q.page < pages && (
              <Link className="btn" href={`${base}?page=${q.page + 1}`}>
                Next →
              </Link>
            )}
          </nav>
        )}
      </main>
    </>
  );
}
