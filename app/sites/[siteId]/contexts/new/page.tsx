import Link from "next/link";
import { ContextSheetForm } from "@/components/contexts/context-sheet-form";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function NewContextPage({
  params,
  searchParams,
}: {
  params: Promise<{ siteId: string }>;
  searchParams: Promise<{ trench?: string }>;
}) {
  const { siteId } = await params;
  const { trench } = await searchParams;
  const { actor, read } = await pageSiteActor(siteId);
  const trenches = (await read.trenches()).map((t) => ({ id: t.id, code: t.code }));
  const base = `/sites/${siteId}/contexts`;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-4xl space-y-4 px-4 py-6">
        <p>
          <Link className="underline" href={base}>
            ← Context sheets
          </Link>
        </p>
        <h1 className="text-3xl font-bold">New context sheet</h1>
        {actor.role === "specialist" ? (
          <p className="sheet">A finds specialist reads context sheets; diggers and directors open them.</p>
        ) : trenches.length === 0 ? (
          <p className="sheet">Lay out a trench first: every context belongs to one trench.</p>
        ) : (
          <ContextSheetForm siteId={siteId} trenches={trenches} initial={trench ? { trenchId: trench } : undefined} />
        )}
      </main>
    </>
  );
}
