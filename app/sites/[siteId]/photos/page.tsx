import type { Metadata } from "next";
import Link from "next/link";
import { StateBadge } from "@/components/contexts/state-badge";
import { FilterSelect } from "@/components/register/filter-select";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { facingWords, recordPhotoListQuery } from "@/lib/schemas/record-photo";
import { formatWhen } from "@/lib/words/when";

export const metadata: Metadata = { title: "Photo register" };

type Search = Record<string, string | undefined>;

/** The photo register: every record photo of the site in number order, filtered by trench or context. */
export default async function PhotoRegisterPage({
  params,
  searchParams,
}: {
  params: Promise<{ siteId: string }>;
  searchParams: Promise<Search>;
}) {
  const locale = await requestLocale();
  const { siteId } = await params;
  const search = await searchParams;
  const { actor, read } = await pageSiteActor(siteId);
  const parsed = recordPhotoListQuery.safeParse(Object.fromEntries(Object.entries(search).filter(([, v]) => v)));
  const q = parsed.success ? parsed.data : recordPhotoListQuery.parse({});
  const [page, contexts, trenches] = await Promise.all([read.recordPhotos(q), read.contexts(), read.trenches()]);
  const base = `/sites/${siteId}/photos`;
  const pages = Math.max(1, Math.ceil(page.total / q.pageSize));
  const pageHref = (n: number) =>
    `${base}?${new URLSearchParams({ ...(q.trenchId && { trenchId: q.trenchId }), ...(q.contextId && { contextId: q.contextId }), page: String(n) })}`;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Photo register</h1>
        <p className="text-ink-soft">
          Record photos of contexts, finds and trenches, numbered in their own sequence without gaps; locked with what
          they show. Add photos from a context sheet, a find or a trench.
        </p>
        <form method="get" className="sheet flex flex-wrap items-end gap-3" aria-label="Filter the photo register">
          <FilterSelect
            id="photos-trench"
            name="trenchId"
            label="Trench"
            value={q.trenchId}
            items={trenches.map((t) => ({ id: t.id, text: t.code }))}
            any="All trenches"
          />
          <FilterSelect
            id="photos-context"
            name="contextId"
            label="Context"
            value={q.contextId}
            items={contexts.map((c) => ({ id: c.id, text: String(c.number) }))}
            any="All contexts"
            numeric
          />
          <button type="submit" className="btn">
            Show
          </button>
          <span className="text-sm text-ink-soft">
            <span className="num">{page.total}</span> photo{page.total === 1 ? "" : "s"}
          </span>
        </form>
        {page.rows.length === 0 ? (
          <p className="text-ink-soft">No record photos match.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="ledger">
              <thead>
                <tr>
                  <th className="num">Number</th>
                  <th>Photo</th>
                  <th>Of</th>
                  <th>Trench</th>
                  <th>Facing</th>
                  <th>Scale</th>
                  <th>Caption</th>
                  <th>Taken by</th>
                  <th>Taken</th>
                  <th>State</th>
                </tr>
              </thead>
              <tbody>
                {page.rows.map((p) => (
                  <tr key={p.id} data-photo={p.number}>
                    <td className="num font-semibold">{p.number}</td>
                    <td>
                      <img src={p.thumbUrl} alt={`Photo ${p.number}`} className="h-16 w-auto" loading="lazy" />
                    </td>
                    <td>
                      {p.subject === "context" ? (
                        <Link className="underline" href={`/sites/${siteId}/contexts/${p.contextId}`}>
                          context <span className="num">{p.contextNumber}</span>
                        </Link>
                      ) : p.subject === "find" ? (
                        <Link className="underline" href={`/sites/${siteId}/finds/${p.findId}`}>
                          find <span className="num">{p.findNumber}</span>
                        </Link>
                      ) : (
                        <Link className="underline" href={`/sites/${siteId}/trenches/${p.trenchId}`}>
                          trench {p.trenchCode}
                        </Link>
                      )}
                    </td>
                    <td>{p.trenchCode}</td>
                    <td>{facingWords(p.facing)}</td>
                    <td>{p.scale}</td>
                    <td className="whitespace-pre-wrap">{p.caption}</td>
                    <td>{p.takenBy ?? "—"}</td>
                    <td className="num">
                      {p.takenAt ? formatWhen(p.takenAt, locale) : "—"}
                      <span className="block text-xs text-ink-faint">
                        {p.takenAtSource === "camera" ? "camera date" : "upload date"}
                      </span>
                    </td>
                    <td>
                      <StateBadge state={p.state} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {pages > 1 && (
          <p className="flex gap-3 text-sm">
            {q.page > 1 && (
              <Link className="underline" href={pageHref(q.page - 1)}>
                Previous page
              </Link>
            )}
            <span>
              Page <span className="num">{q.page}</span> of <span className="num">{pages}</span>
            </span>
            {q.page < pages && (
              <Link className="underline" href={pageHref(q.page + 1)}>
                Next page
              </Link>
            )}
          </p>
        )}
      </main>
    </>
  );
}
