import { notFound } from "next/navigation";
import { DeepTrenchCaution, DEEP_TRENCH_M, HumanRemainsBanner } from "@/components/cautions";
import { PlanLoader } from "@/components/plan/plan-loader";
import { RecordPhotosPanel } from "@/components/photos/record-photos-panel";
import { SectionWorkbench } from "@/components/sections/section-workbench";
import { SiteNav } from "@/components/site-nav";
import { SquaresPanel } from "@/components/squares/squares-panel";
import { recorders } from "@/lib/api/operation";
import { isPublicError } from "@/lib/server/errors";
import { isRole } from "@/lib/server/membership";
import { pageSiteActor } from "@/lib/server/page-access";

/** The trench plan: a server-read seed (trench, contexts, classes, photos) for the client canvas. */
export default async function TrenchPage({ params }: { params: Promise<{ siteId: string; trenchId: string }> }) {
  const { siteId, trenchId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const trench = await read.trench(trenchId).catch((err) => {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  });
  const [contexts, classes, photos, remains, finds, depth, sections, sectionFinds, contextLevels] = await Promise.all([
    read.contexts(trenchId),
    read.classes(),
    read.photos(trenchId),
    read.humanRemains(trenchId),
    read.planFinds(trenchId),
    read.trenchDepth(trenchId),
    read.sections(trenchId),
    read.sectionFinds(trenchId),
    read.trenchContextLevels(trenchId),
  ]);
  const [squares, members] = await Promise.all([read.trenchSquares(trenchId), read.members()]);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current="" />
      <main className="space-y-2 px-2 py-2 lg:px-4">
        <h1 className="text-2xl font-bold">
          Trench {trench.code} <span className="text-lg font-normal text-ink-soft">{trench.name} · plan</span>
        </h1>
        {remains > 0 && <HumanRemainsBanner count={remains} />}
        {(depth.depth ?? 0) > DEEP_TRENCH_M && <DeepTrenchCaution depth={depth.depth!} />}
        <div className="overflow-hidden rounded border border-paper-edge bg-white/60">
          <PlanLoader
            siteId={siteId}
            trench={{
              id: trench.id,
              code: trench.code,
              outline: trench.outline,
              signedOff: Boolean(trench.signedOffAt),
            }}
            classes={classes.map((c) => ({
              id: c.id,
              code: c.code,
              label: c.label,
              colour: c.colour,
              symbol: c.symbol,
              humanRemains: c.humanRemains,
            }))}
            contexts={contexts.map((c) => ({
              id: c.id,
              number: c.number,
              type: c.type,
              state: c.state,
              signedOffAt: c.signedOffAt ? c.signedOffAt.toISOString() : null,
              extent: c.extent ?? null,
            }))}
            photos={photos}
            finds={finds}
            canEdit={isRole(actor, recorders)}
          />
        </div>
        <SquaresPanel
          siteId={siteId}
          trench={{ id: trench.id, code: trench.code, outline: trench.outline }}
          initial={JSON.parse(JSON.stringify(squares))}
          classes={classes.map((c) => ({ id: c.id, code: c.code, label: c.label }))}
          contexts={contexts.map((c) => ({ id: c.id, number: c.number, state: c.state }))}
          finds={finds.map((f) => ({ x: f.x, y: f.y, classId: f.classId, contextId: f.contextId }))}
          canEdit={isRole(actor, recorders)}
          isDirector={actor.role === "director"}
        />
        <RecordPhotosPanel
          siteId={siteId}
          subject="trench"
          subjectId={trench.id}
          what={`trench ${trench.code}`}
          canEdit={isRole(actor, recorders) && !trench.signedOffAt}
          members={members.map((m) => ({ id: m.userId, name: m.name }))}
        />
        <SectionWorkbench
          siteId={siteId}
          trench={{ id: trench.id, code: trench.code }}
          datumName={actor.site.datumName}
          finds={sectionFinds}
          contextLevels={contextLevels}
          sections={sections.map((s) => ({
            id: s.id,
            name: s.name,
            startX: s.startX,
            startY: s.startY,
            endX: s.endX,
            endY: s.endY,
            halfWidth: s.halfWidth,
            exaggeration: s.exaggeration,
          }))}
        />
      </main>
    </>
  );
}
