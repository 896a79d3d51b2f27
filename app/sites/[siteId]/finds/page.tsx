import { Suspense } from "react";
import { FindsRegister } from "@/components/register/finds-register";
import { SiteNav } from "@/components/site-nav";
import { listClasses } from "@/lib/server/artefact-classes";
import { listContexts } from "@/lib/server/contexts";
import { pageSiteActor } from "@/lib/server/page-access";
import { listMembers } from "@/lib/server/sites";
import { listTrenches } from "@/lib/server/trenches";

export default async function FindsRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { db, actor } = await pageSiteActor(siteId);
  const [trenches, contexts, classes, members] = await Promise.all([listTrenches(db, siteId), listContexts(db, siteId), listClasses(db, siteId), listMembers(db, siteId)]);
  const options = {
    trenches: trenches.map((t) => ({ id: t.id, code: t.code })),
    contexts: contexts.map((c) => ({ id: c.id, number: c.number })),
    classes: classes.map((c) => ({ id: c.id, code: c.code, label: c.label })),
    recorders: members.map((m) => ({ id: m.userId, name: m.name })),
  };
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/finds`} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Finds register</h1>
        <Suspense fallback={<p>Reading the register…</p>}>
          <FindsRegister siteId={siteId} options={options} canImport={actor.role !== "specialist"} hasCrs={!!actor.site.crs?.trim()} />
        </Suspense>
      </main>
    </>
  );
}
