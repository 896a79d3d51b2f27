import Link from "next/link";
import { SamplesTable } from "@/components/samples/samples-table";
import { FilterSelect } from "@/components/register/filter-select";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor, type SiteSearchPageProps } from "@/lib/server/page-access";
import {
  sampleListQuery,
  sampleStatusLabels,
  sampleStatuses,
  sampleTypeLabels,
  sampleTypes,
} from "@/lib/schemas/sample";
import { readUrlQuery } from "@/lib/schemas/url-query";

/** The samples register: filters in the URL (a plain form), the page read on the server. */
export default async function SamplesPage({ params, searchParams }: SiteSearchPageProps) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const { q } = readUrlQuery(sampleListQuery, await searchParams);
  const [page, contexts, boxes] = await Promise.all([read.samples(q), read.contexts(), read.boxChoices()]);
  const pages = Math.max(1, Math.ceil(page.total / q.pageSize));
  const filters = new URLSearchParams(
    Object.entries({ contextId: q.contextId, type: q.type, status: q.status }).filter(
      (e): e is [string, string] => !!e[1],
    ),
  );
  const base = `/sites/${siteId}/samples`;
  const pageHref = (n: number) => `${base}?${new URLSearchParams({ ...Object.fromEntries(filters), page: String(n) })}`;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Samples register</h1>
        <p className="text-ink-soft">
          Numbered {actor.site.samplesShareFindNumbers ? "in the finds' sequence" : "in their own sequence"}, without
          gaps; locked with their context. Processing status can be set after sign-off.
        </p>
        <div className="flex flex-wrap items-center gap-2">
          {actor.role !== "specialist" && (
            <Link className="btn-primary" href={`${base}/new`}>
              Record a sample
            </Link>
          )}
          <Link className="btn" href={`/sites/${siteId}/print/samples`}>
            Print the register
          </Link>
          <a className="btn" href={`/api/sites/${siteId}/export/samples?${filters}`} download>
            Export CSV
          </a>
        </div>
        <form className="sheet flex flex-wrap items-end gap-3" method="get" aria-label="Filter the samples">
          <FilterSelect
            id="sf-context"
            name="contextId"
            label="Context"
            value={q.contextId}
            items={contexts.map((c) => ({ id: c.id, text: String(c.number) }))}
            numeric
          />
          <FilterSelect
            id="sf-type"
            name="type"
            label="Kind"
            value={q.type}
            items={sampleTypes.map((t) => ({ id: t, text: sampleTypeLabels[t] }))}
          />
          <FilterSelect
            id="sf-status"
            name="status"
            label="Status"
            value={q.status}
            items={sampleStatuses.map((s) => ({ id: s, text: sampleStatusLabels[s] }))}
          />
          <button className="btn" type="submit">
            Filter
          </button>
        </form>
        <p aria-live="polite" className="text-sm text-ink-soft">
          <span className="num">{page.total}</span> samples match · page <span className="num">{q.page}</span> of{" "}
          <span className="num">{pages}</span>
        </p>
        <SamplesTable siteId={siteId} rows={page.rows} boxes={boxes} />
        <nav aria-label="Pages" className="flex gap-2">
          {q.page > 1 && (
            <Link className="btn" href={pageHref(q.page - 1)}>
              ← Previous
            </Link>
          )}
          {q.page < pages && (
            <Link className="btn" href={pageHref(q.page + 1)}>
              Next →
            </Link>
          )}
        </nav>
      </main>
    </>
  );
}
