import { Suspense } from "react";
import { SiteNav } from "@/components/site-nav";
import { PatternsWorkspace } from "@/components/patterns/workspace";
import { pageSiteActor } from "@/lib/server/page-access";

export const metadata = { title: "Patterns — Loamwork" };

export default async function PatternsPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const choices = await read.patternsChoices();
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/patterns`} />
      <main className="mx-auto max-w-[1600px] space-y-4 px-4 py-6">
        <div>
          <h1 className="text-3xl font-bold">Patterns</h1>
          <p className="max-w-3xl text-ink-soft">
            Is a class of finds clustered, evenly spread or scattered at random inside its trench, and do two classes go
            together? Tests run in the trench&apos;s own outline, holes included.
          </p>
        </div>
        <Suspense fallback={<p>Loading the workspace…</p>}>
          <PatternsWorkspace
            siteId={siteId}
            canRun={actor.role === "specialist" || actor.role === "director"}
            trenches={choices.trenches}
            contexts={choices.contexts}
            classes={choices.classes}
            spits={choices.spits}
          />
        </Suspense>
      </main>
    </>
  );
}
