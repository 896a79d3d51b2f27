import Link from "next/link";
import { SamplesTable } from "@/components/samples/samples-table";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";
import {
  sampleListQuery,
  sampleStatusLabels,
  sampleStatuses,
  sampleTypeLabels,
  sampleTypes,
} from "@/lib/schemas/sample";

type Search = Record<string, string | undefined>;

/** The samples register: filters in the URL (a plain form), the page read on the server. */
export default async function SamplesPage({
  params,
  searchParams,
}: {
  params: Promise<{ siteId: string }>;
  searchParams: Promise<Search>;
}) {
  const { siteId } = await params;
  const search = await searchParams;
  const { actor, read } = await pageSiteActor(siteId);
  const parsed = sampleListQuery.safeParse(Object.fromEntries(Object.entries(search).filter(([, v]) => v)));
  const q = parsed.success ? parsed.data : sampleListQuery.parse({});
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
          <div>
            <label className="label" htmlFor="sf-context">
              Context
            </label>
            <select id="sf-context" name="contextId" className="field num" defaultValue={q.contextId ?? ""}>
              <option value="">Any</option>
              {contexts.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.number}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor="sf-type">
              Kind
            </label>
            <select id="sf-type" name="type" className="field" defaultValue={q.type ?? ""}>
              <option value="">Any</option>
              {sampleTypes.map((t) => (
                <option key={t} value={t}>
                  {sampleTypeLabels[t]}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor="sf-status">
              Status
            </label>
            <select id="sf-status" name="status" className="field" defaultValue={q.status ?? ""}>
              <option value="">Any</option>
              {sampleStatuses.map((s) => (
                <option key={s} value={s}>
                  {sampleStatusLabels[s]}
                </option>
              ))}
            </select>
          </div>
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
