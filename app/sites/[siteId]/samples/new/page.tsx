import Link from "next/link";
import { SampleForm } from "@/components/samples/sample-form";
import { SiteNav } from "@/components/site-nav";
import { isContextWritable } from "@/lib/server/locks";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function NewSamplePage({
  params,
  searchParams,
}: {
  params: Promise<{ siteId: string }>;
  searchParams: Promise<{ contextId?: string }>;
}) {
  const { siteId } = await params;
  const { contextId } = await searchParams;
  const { actor, read } = await pageSiteActor(siteId);
  const [contexts, trenches, members] = await Promise.all([read.contexts(), read.trenches(), read.members()]);
  const codes = new Map(trenches.map((t) => [t.id, t.code]));
  const open = contexts
    .filter(isContextWritable)
    .map((c) => ({ id: c.id, number: c.number, trenchCode: codes.get(c.trenchId) ?? "?" }));
  const base = `/sites/${siteId}/samples`;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-4xl space-y-4 px-4 py-6">
        <p>
          <Link className="underline" href={base}>
            ← Samples register
          </Link>
        </p>
        <h1 className="text-3xl font-bold">New sample</h1>
        {actor.role === "specialist" ? (
          <p className="sheet">
            Diggers and the director take samples; a specialist records their processing in the register.
          </p>
        ) : open.length === 0 ? (
          <p className="sheet">No context is open: samples are taken from an open context.</p>
        ) : (
          <SampleForm
            siteId={siteId}
            contexts={open}
            members={members.map((m) => ({ id: m.userId, name: m.name }))}
            initial={{ contextId: contextId ?? open[0]!.id }}
          />
        )}
      </main>
    </>
  );
}
