import Link from "next/link";
import { SiteNav } from "@/components/site-nav";
import { StateBadge } from "@/components/contexts/state-badge";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function ContextsPage({
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
  const rows = await read.contextSummaries(chosen?.id);
  const canRecord = actor.role !== "specialist";
  const base = `/sites/${siteId}/contexts`;
  // GeoJSON is WGS 84 only (RFC 7946), so it needs the site placed; the GeoPackage carries the site grid itself.
  const placed = !!actor.site.crs?.trim();
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <div className="flex flex-wrap items-end gap-3">
          <h1 className="mr-auto text-3xl font-bold">Context sheets</h1>
          <Link className="btn" href={`/sites/${siteId}/print/contexts`}>
            Print the register
          </Link>
          <Link className="btn" href={`${base}/matrix${chosen ? `?trench=${chosen.id}` : ""}`}>
            Harris matrix
          </Link>
          <a className="btn" href={`/api/sites/${siteId}/export/contexts?format=csv`} download>
            Contexts CSV
          </a>
          {placed && (
            <a className="btn" href={`/api/sites/${siteId}/export/contexts?format=geojson`} download>
              Extents GeoJSON (WGS 84)
            </a>
          )}
          {placed && (
            <a className="btn" href={`/api/sites/${siteId}/export/trenches`} download>
              Trench outlines GeoJSON (WGS 84)
            </a>
          )}
          <a className="btn" href={`/api/sites/${siteId}/export/gis${chosen ? `?trenchId=${chosen.id}` : ""}`} download>
            GeoPackage (GIS)
          </a>
          {canRecord && (
            <Link className="btn-primary" href={`${base}/new`}>
              Open a new sheet
            </Link>
          )}
        </div>
        <nav aria-label="Trenches" className="flex flex-wrap gap-2">
          <Link className={`btn ${!chosen ? "bg-ink text-paper hover:bg-ink" : ""}`} href={base}>
            All trenches
          </Link>
          {trenches.map((t) => (
            <Link
              key={t.id}
              className={`btn ${chosen?.id === t.id ? "bg-ink text-paper hover:bg-ink" : ""}`}
              href={`${base}?trench=${t.id}`}
            >
              Trench {t.code}
            </Link>
          ))}
        </nav>
        <div className="overflow-x-auto">
          <table className="ledger sheet">
            <thead>
              <tr>
                <th className="num">Context</th>
                <th>Trench</th>
                <th>Type</th>
                <th>State</th>
                <th className="num">Finds</th>
                <th>Description</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((c) => (
                <tr key={c.id}>
                  <td className="num">
                    <Link className="inline-flex min-h-11 items-center font-bold underline" href={`${base}/${c.id}`}>
                      {c.number}
                    </Link>
                  </td>
                  <td>{c.trenchCode}</td>
                  <td>{c.type}</td>
                  <td>
                    <StateBadge state={c.state} />
                  </td>
                  <td className="num">
                    <Link className="underline" href={`/sites/${siteId}/finds?contextId=${c.id}`}>
                      {c.finds}
                    </Link>
                  </td>
                  <td className="max-w-md truncate text-ink-soft">{c.description}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {rows.length === 0 && (
          <p className="text-ink-soft">No context sheets yet{chosen ? ` in trench ${chosen.code}` : ""}.</p>
        )}
      </main>
    </>
  );
}
