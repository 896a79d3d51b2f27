import Link from "next/link";
import { Suspense } from "react";
import { FindsRegister } from "@/components/register/finds-register";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function FindsRegisterPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [trenches, contexts, classes, members, boxes, moveTargets] = await Promise.all([
    read.trenches(),
    read.contexts(),
    read.classes(),
    read.members(),
    read.boxChoices(),
    read.findMoveTargets(),
  ]);
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
        <div className="flex flex-wrap items-end gap-3">
          <h1 className="mr-auto text-3xl font-bold">Finds register</h1>
          <Link className="btn" href={`/sites/${siteId}/print/finds`}>
            Print the register
          </Link>
        </div>
        <Suspense fallback={<p>Reading the register…</p>}>
          <FindsRegister
            siteId={siteId}
            options={options}
            canImport={actor.role !== "specialist"}
            hasCrs={!!actor.site.crs?.trim()}
            role={actor.role}
            boxes={boxes}
            moveTargets={moveTargets}
          />
        </Suspense>
      </main>
    </>
  );
}
