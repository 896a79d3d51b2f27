import Link from "next/link";
import { DeepTrenchCaution, DEEP_TRENCH_M, HumanRemainsBanner } from "@/components/cautions";
import { OutlineSketch } from "@/components/outline-sketch";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";
import { countOf } from "@/lib/words/count";

export default async function SiteOverviewPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [overview, outlines, remains, remainsFinds] = await Promise.all([
    read.overview(),
    read.trenches(),
    read.humanRemains(),
    read.humanRemainsFinds(),
  ]);
  const outlineOf = new Map(outlines.map((t) => [t.id, t.outline]));
  const deep = overview.trenches.filter((t) => (t.depth ?? 0) > DEEP_TRENCH_M);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}`} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <div>
          <p className="font-mono text-sm text-ink-faint">{actor.site.code}</p>
          <h1 className="text-3xl font-bold">{actor.site.name}</h1>
          {actor.site.gridDescription && <p className="mt-1 max-w-3xl text-ink-soft">{actor.site.gridDescription}</p>}
        </div>
        {remains > 0 && (
          <HumanRemainsBanner
            count={remains}
            finds={remainsFinds.map((f) => ({
              label: `Find ${f.number}, trench ${f.trenchCode}`,
              href: `/sites/${siteId}/finds/${f.id}`,
            }))}
          />
        )}
        {deep.map((t) => (
          <DeepTrenchCaution
            key={t.id}
            depth={t.depth!}
            trench={{ label: `Trench ${t.code}`, href: `/sites/${siteId}/trenches/${t.id}` }}
          />
        ))}
        <section className="sheet" aria-labelledby="awaiting">
          <h2 id="awaiting" className="text-lg font-bold">
            What awaits you
          </h2>
          <p className="mt-1">
            {actor.role === "director"
              ? `${countOf(overview.awaitingSignOff, "context sheet")} submitted for your sign-off.`
              : actor.role === "digger"
                ? "Record finds on the trench plans and submit finished contexts for sign-off."
                : "Run distribution tests on the finds in Patterns."}
          </p>
        </section>
        <section aria-labelledby="trenches">
          <h2 id="trenches" className="text-xl font-bold">
            Trenches
          </h2>
          <ul className="mt-3 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            {overview.trenches.map((t) => (
              <li key={t.id} className="sheet flex gap-4">
                {outlineOf.get(t.id) && <OutlineSketch outline={outlineOf.get(t.id)!} />}
                <div>
                  <Link
                    className="text-lg font-bold underline decoration-accent/40 underline-offset-4"
                    href={`/sites/${siteId}/trenches/${t.id}`}
                  >
                    Trench {t.code}
                  </Link>
                  <p className="text-sm text-ink-soft">{t.name}</p>
                  <p className="mt-2 text-sm">
                    <span className="num">{t.contexts}</span> contexts · <span className="num">{t.finds}</span> finds
                  </p>
                  {t.signedOffAt && <p className="mt-1 text-sm font-semibold text-ok">Signed off</p>}
                </div>
              </li>
            ))}
          </ul>
        </section>
      </main>
    </>
  );
}
