import { Suspense } from "react";
import { asc, eq } from "drizzle-orm";
import { SiteNav } from "@/components/site-nav";
import { PatternsWorkspace } from "@/components/patterns/workspace";
import { artefactClasses, contexts, trenches } from "@/db/schema";
import { ensureRunner } from "@/lib/server/jobs/runner";
import { pageSiteActor } from "@/lib/server/page-access";

export const metadata = { title: "Patterns — Loamwork" };

export default async function PatternsPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { db, actor } = await pageSiteActor(siteId);
  // Starting the runner here also hands back runs a stopped server left behind.
  await ensureRunner();
  const [t, c, k] = await Promise.all([
    db.select({ id: trenches.id, code: trenches.code, name: trenches.name }).from(trenches).where(eq(trenches.siteId, siteId)).orderBy(asc(trenches.code)),
    db.select({ id: contexts.id, trenchId: contexts.trenchId, number: contexts.number, type: contexts.type, state: contexts.state, interpretation: contexts.interpretation }).from(contexts).where(eq(contexts.siteId, siteId)).orderBy(asc(contexts.number)),
    db.select({ id: artefactClasses.id, code: artefactClasses.code, label: artefactClasses.label, colour: artefactClasses.colour, symbol: artefactClasses.symbol }).from(artefactClasses).where(eq(artefactClasses.siteId, siteId)).orderBy(asc(artefactClasses.code)),
  ]);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/patterns`} />
      <main className="mx-auto max-w-[1600px] space-y-4 px-4 py-6">
        <div>
          <h1 className="text-3xl font-bold">Patterns</h1>
          <p className="max-w-3xl text-ink-soft">Is a class of finds clustered, evenly spread or scattered at random inside its trench, and do two classes go together? Tests run in the trench&apos;s own outline, holes included.</p>
        </div>
        <Suspense fallback={<p>Loading the workspace…</p>}>
          <PatternsWorkspace siteId={siteId} canRun={actor.role === "specialist" || actor.role === "director"} trenches={t} contexts={c} classes={k} />
        </Suspense>
      </main>
    </>
  );
}
