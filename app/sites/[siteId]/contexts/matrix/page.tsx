import Link from "next/link";
import { MatrixView } from "@/components/matrix/matrix-view";
import { SiteNav } from "@/components/site-nav";
import { readingLabels } from "@/lib/schemas/relation";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function MatrixPage({
  params,
  searchParams,
}: {
  params: Promise<{ siteId: string }>;
  searchParams: Promise<{ trench?: string }>;
}) {
  const { siteId } = await params;
  const { trench } = await searchParams;
  const { actor, read } = await pageSiteActor(siteId);
  const trenches = await read.trenches();
  const chosen = trenches.find((t) => t.id === trench);
  const { matrix, drawing } = await read.matrix(chosen?.id);
  const numberOf = new Map(matrix.contexts.map((c) => [c.id, c.number]));
  const redundant = matrix.edges.filter((e) => e.redundant);
  const base = `/sites/${siteId}/contexts`;
  const q = chosen ? `&trenchId=${chosen.id}` : "";
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <p>
          <Link className="underline" href={base}>
            ← Context sheets
          </Link>
        </p>
        <div className="flex flex-wrap items-end gap-3">
          <h1 className="mr-auto text-3xl font-bold">
            Harris matrix{chosen ? ` · trench ${chosen.code}` : " · whole site"}
          </h1>
          <a className="btn" href={`/api/sites/${siteId}/matrix/image?format=svg${q}`} download>
            Download SVG
          </a>
          <a className="btn" href={`/api/sites/${siteId}/matrix/image?format=png${q}`} download>
            Download PNG
          </a>
        </div>
        <nav aria-label="Trenches" className="flex flex-wrap gap-2">
          <Link className={`btn ${!chosen ? "bg-ink text-paper hover:bg-ink" : ""}`} href={`${base}/matrix`}>
            Whole site
          </Link>
          {trenches.map((t) => (
            <Link
              key={t.id}
              className={`btn ${chosen?.id === t.id ? "bg-ink text-paper hover:bg-ink" : ""}`}
              href={`${base}/matrix?trench=${t.id}`}
            >
              Trench {t.code}
            </Link>
          ))}
        </nav>
        {matrix.loop && (
          <p role="alert" className="rounded border-2 border-warn bg-warn-light p-3 font-semibold text-warn">
            These records loop back on themselves: {matrix.loop}. Remove one of these relations on its sheet.
          </p>
        )}
        {matrix.nodes.length === 0 ? (
          <p className="sheet">No contexts recorded yet.</p>
        ) : (
          <MatrixView drawing={drawing} />
        )}
        <section className="sheet" aria-labelledby="redundant-h">
          <h2 id="redundant-h" className="text-lg font-bold">
            Redundant relations ({redundant.length})
          </h2>
          <p className="text-sm text-ink-soft">
            Each is true, but already follows from other relations; the matrix does not need it. Keep it if the sheet
            recorded it.
          </p>
          <ul className="mt-2 space-y-1">
            {redundant.map((e) => (
              <li key={e.relation.id} className="num">
                <Link className="underline" href={`${base}/${e.relation.fromId}`}>
                  {numberOf.get(e.relation.fromId)}
                </Link>{" "}
                {readingLabels[e.relation.kind]}{" "}
                <Link className="underline" href={`${base}/${e.relation.toId}`}>
                  {numberOf.get(e.relation.toId)}
                </Link>
              </li>
            ))}
          </ul>
        </section>
      </main>
    </>
  );
}
