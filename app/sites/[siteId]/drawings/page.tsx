import type { Metadata } from "next";
import { DrawingActions } from "@/components/drawings/drawing-actions";
import { DrawingForm } from "@/components/drawings/drawing-form";
import { StateBadge } from "@/components/contexts/state-badge";
import { SiteNav } from "@/components/site-nav";
import { isContextWritable } from "@/lib/server/locks";
import { pageSiteActor, type SiteSearchPageProps } from "@/lib/server/page-access";
import { drawingKindLabels, drawingListQuery } from "@/lib/schemas/drawing";
import { readUrlQuery } from "@/lib/schemas/url-query";

export const metadata: Metadata = { title: "Drawings" };

/** The drawing register: plans and sections drawn on film or paper, numbered per site, with the contexts they show. */
export default async function DrawingsPage({ params, searchParams }: SiteSearchPageProps) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const { q } = readUrlQuery(drawingListQuery, await searchParams);
  const [page, contexts, trenches, members] = await Promise.all([
    read.drawings(q),
    read.contexts(),
    read.trenches(),
    read.members(),
  ]);
  const codes = new Map(trenches.map((t) => [t.id, t.code]));
  const open = contexts
    .filter(isContextWritable)
    .map((c) => ({ id: c.id, number: c.number, trenchCode: codes.get(c.trenchId) ?? "?" }));
  const byNumber = new Map(contexts.map((c) => [c.number, c]));
  const people = members.map((m) => ({ id: m.userId, name: m.name }));
  const recorder = actor.role !== "specialist";
  const base = `/sites/${siteId}/drawings`;
  const pages = Math.max(1, Math.ceil(page.total / q.pageSize));
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Drawing register</h1>
        <p className="text-ink-soft">
          Plans and sections drawn on film or paper, numbered in their own sequence without gaps; locked with the
          contexts they show.
        </p>
        <p>
          <a className="btn" href={`/api/sites/${siteId}/export/drawings`} download>
            Export CSV
          </a>
        </p>
        {actor.role === "specialist" ? null : open.length === 0 ? (
          <p className="sheet">No context is open: a new drawing shows open contexts.</p>
        ) : (
          <DrawingForm siteId={siteId} contexts={open} members={people} />
        )}
        {page.rows.length === 0 ? (
          <p className="text-ink-soft">No drawings recorded yet.</p>
        ) : (
          <table className="ledger">
            <thead>
              <tr>
                <th className="num">Number</th>
                <th>Kind</th>
                <th className="num">Scale</th>
                <th>Trench</th>
                <th>Contexts</th>
                <th>Title</th>
                <th>Drawn by</th>
                <th>Drawn on</th>
                <th>State</th>
                {recorder && <th>Change</th>}
              </tr>
            </thead>
            <tbody>
              {page.rows.map((d) => (
                <tr key={d.id} data-drawing={d.number}>
                  <td className="num font-semibold">{d.number}</td>
                  <td>{drawingKindLabels[d.kind]}</td>
                  <td className="num">1:{d.scale}</td>
                  <td>{d.trenchCode}</td>
                  <td className="num">{d.contextNumbers.join(", ")}</td>
                  <td>{d.title}</td>
                  <td>{d.drawnBy ?? "—"}</td>
                  <td className="num">{d.drawnOn}</td>
                  <td>
                    <StateBadge state={d.state} />
                  </td>
                  {recorder && (
                    <td>
                      <DrawingActions
                        siteId={siteId}
                        drawing={{
                          id: d.id,
                          number: d.number,
                          kind: d.kind,
                          scale: d.scale,
                          contextIds: d.contextNumbers.flatMap((n) => byNumber.get(n)?.id ?? []),
                          title: d.title,
                          drawnBy: d.drawnById,
                          drawnOn: d.drawnOn,
                        }}
                        lockedBy={d.contextNumbers.filter((n) => {
                          const c = byNumber.get(n);
                          return c !== undefined && !isContextWritable(c);
                        })}
                        contexts={open}
                        members={people}
                      />
                    </td>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {pages > 1 && (
          <p className="text-sm">
            Page <span className="num">{q.page}</span> of <span className="num">{pages}</span>
          </p>
        )}
      </main>
    </>
  );
}
