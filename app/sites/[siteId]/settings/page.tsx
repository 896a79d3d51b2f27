import { SiteNav } from "@/components/site-nav";
import { ClassesPanel } from "@/components/settings/classes-panel";
import { GridForm } from "@/components/settings/grid-form";
import { RecordsForm } from "@/components/settings/records-form";
import { SpreadForm } from "@/components/settings/spread-form";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function SettingsPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const s = actor.site;
  const samples = await read.samples({ page: 1, pageSize: 1 });
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/settings`} />
      <main className="mx-auto max-w-5xl space-y-8 px-4 py-6">
        <section aria-labelledby="classes-h">
          <h1 id="classes-h" className="text-3xl font-bold">
            Artefact classes
          </h1>
          <p className="mt-1 text-ink-soft">
            The site&apos;s vocabulary for classing finds. Every class pairs a colour with its own symbol, so the plan
            reads without colour too.
            {actor.role === "digger" && " Finds specialists and the director maintain this list."}
          </p>
          <div className="mt-4">
            <ClassesPanel siteId={siteId} canEdit={actor.role !== "digger"} />
          </div>
        </section>
        <section aria-labelledby="grid-h">
          <h2 id="grid-h" className="text-2xl font-bold">
            Site and grid
          </h2>
          {actor.role !== "director" && <p className="text-ink-soft">Only the site director changes these.</p>}
          <div className="mt-4">
            <GridForm
              siteId={siteId}
              canEdit={actor.role === "director"}
              initial={{
                name: s.name,
                gridDescription: s.gridDescription,
                gridOriginX: s.gridOriginX,
                gridOriginY: s.gridOriginY,
                crs: s.crs ?? "",
              }}
            />
          </div>
        </section>
        <section aria-labelledby="records-h">
          <h2 id="records-h" className="text-2xl font-bold">
            Numbers and labels
          </h2>
          <div className="mt-4">
            <RecordsForm
              siteId={siteId}
              canEdit={actor.role === "director"}
              sampleCount={samples.total}
              initial={{ samplesShareFindNumbers: s.samplesShareFindNumbers, labelAddress: s.labelAddress ?? "" }}
            />
          </div>
        </section>
        <section aria-labelledby="levels-h">
          <h2 id="levels-h" className="text-2xl font-bold">
            Levels in analyses
          </h2>
          <p className="text-ink-soft">
            Every level in Loamwork is a reduced level (RL): metres above the site datum.
            {actor.role !== "director" && " Only the site director changes this."}
          </p>
          <div className="mt-4">
            <SpreadForm siteId={siteId} canEdit={actor.role === "director"} initial={s.levelSpreadCaution} />
          </div>
        </section>
      </main>
    </>
  );
}
