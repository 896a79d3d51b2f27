import Link from "next/link";
import { ImportWizard } from "@/components/register/import-wizard";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function ImportPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor } = await pageSiteActor(siteId);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/finds`} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <p>
          <Link className="underline" href={`/sites/${siteId}/finds`}>
            ← Finds register
          </Link>
        </p>
        <h1 className="text-3xl font-bold">Import a total-station file</h1>
        {actor.role === "specialist" ? (
          <p className="sheet">Diggers and directors import finds; a specialist reads and re-classes them.</p>
        ) : (
          <ImportWizard siteId={siteId} />
        )}
      </main>
    </>
  );
}
