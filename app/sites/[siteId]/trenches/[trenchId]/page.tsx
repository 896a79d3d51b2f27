import { notFound } from "next/navigation";
import { DeepTrenchCaution, DEEP_TRENCH_M, HumanRemainsBanner } from "@/components/cautions";
import { OutlineSketch } from "@/components/outline-sketch";
import { SiteNav } from "@/components/site-nav";
import { checkOutline } from "@/lib/geometry/outline";
import { listContexts } from "@/lib/server/contexts";
import { isPublicError } from "@/lib/server/errors";
import { countHumanRemains } from "@/lib/server/human-remains";
import { pageSiteActor } from "@/lib/server/page-access";
import { getTrench } from "@/lib/server/trenches";

export default async function TrenchPage({ params }: { params: Promise<{ siteId: string; trenchId: string }> }) {
  const { siteId, trenchId } = await params;
  const { db, actor } = await pageSiteActor(siteId);
  const trench = await getTrench(db, siteId, trenchId).catch((err) => {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  });
  const [contexts, remains] = await Promise.all([listContexts(db, siteId, trenchId), countHumanRemains(db, siteId, trenchId)]);
  const check = checkOutline(trench.outline);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current="" />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Trench {trench.code} <span className="text-xl font-normal text-ink-soft">{trench.name}</span></h1>
        {remains > 0 && <HumanRemainsBanner count={remains} />}
        {(trench.maxDepth ?? 0) > DEEP_TRENCH_M && <DeepTrenchCaution depth={trench.maxDepth!} />}
        <section className="sheet flex flex-wrap gap-6">
          <OutlineSketch outline={trench.outline} size={220} />
          <dl className="grid grid-cols-2 gap-x-4 gap-y-1 self-start">
            <dt className="text-ink-soft">Area</dt><dd className="num">{check.ok ? `${check.window.area.toFixed(2)} m²` : "—"}</dd>
            <dt className="text-ink-soft">Perimeter</dt><dd className="num">{check.ok ? `${check.window.perimeter.toFixed(2)} m` : "—"}</dd>
            <dt className="text-ink-soft">Holes</dt><dd className="num">{trench.outline.coordinates.length - 1}</dd>
            <dt className="text-ink-soft">Contexts</dt><dd className="num">{contexts.length}</dd>
          </dl>
        </section>
      </main>
    </>
  );
}
