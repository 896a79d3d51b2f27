import Link from "next/link";
import { notFound } from "next/navigation";
import { AuditTrail } from "@/components/audit/audit-trail";
import { LockNotice } from "@/components/contexts/lock-notice";
import { SampleBoxControl, SampleDelete, SampleStatusControl } from "@/components/samples/sample-actions";
import { SampleForm } from "@/components/samples/sample-form";
import { SiteNav } from "@/components/site-nav";
import { isPublicError } from "@/lib/server/errors";
import { formatStamp, isContextWritable } from "@/lib/server/locks";
import { pageSiteActor } from "@/lib/server/page-access";
import { sampleStatusLabels, sampleTypeLabels } from "@/lib/schemas/sample";

export default async function SamplePage({ params }: { params: Promise<{ siteId: string; sampleId: string }> }) {
  const { siteId, sampleId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const s = await read.sample(sampleId).catch((err) => {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  });
  const [ctx, contexts, trenches, members, trail, boxes] = await Promise.all([
    read.context(s.contextId),
    read.contexts(),
    read.trenches(),
    read.members(),
    read.audit({ recordType: "sample", recordId: s.id }),
    read.boxChoices(),
  ]);
  const signed = ctx.state === "signed_off";
  const lockerId = signed ? ctx.signedOffBy : ctx.submittedBy;
  const names = await read.userNames([lockerId, s.takenBy]);
  const codes = new Map(trenches.map((t) => [t.id, t.code]));
  const writable = isContextWritable(ctx) && actor.role !== "specialist";
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
        <div className="flex flex-wrap items-baseline gap-3">
          <h1 className="text-3xl font-bold">
            Sample <span className="num">{s.number}</span>
          </h1>
          <span className="text-xl text-ink-soft">{sampleTypeLabels[s.type]}</span>
          <Link className="btn ml-auto" href={`/sites/${siteId}/contexts/${ctx.id}`}>
            Context {ctx.number}
          </Link>
        </div>
        <LockNotice
          state={ctx.state}
          number={ctx.number}
          who={(lockerId ? names.get(lockerId) : undefined) ?? null}
          at={formatStamp(signed ? ctx.signedOffAt : ctx.submittedAt)}
        />
        {writable ? (
          <SampleForm
            siteId={siteId}
            sampleId={s.id}
            contexts={contexts
              .filter((c) => isContextWritable(c) || c.id === s.contextId)
              .map((c) => ({ id: c.id, number: c.number, trenchCode: codes.get(c.trenchId) ?? "?" }))}
            members={members.map((m) => ({ id: m.userId, name: m.name }))}
            initial={{
              contextId: s.contextId,
              spit: s.spit,
              type: s.type,
              x: s.x,
              y: s.y,
              z: s.z,
              volumeL: s.volumeL,
              purpose: s.purpose,
              takenBy: s.takenBy,
              takenOn: s.takenOn,
            }}
          />
        ) : (
          <dl className="sheet grid grid-cols-[10rem_1fr] gap-y-1">
            <dt className="text-ink-soft">Spit</dt>
            <dd className="num">{s.spit ?? "—"}</dd>
            <dt className="text-ink-soft">Position (m)</dt>
            <dd className="num">
              {s.x !== null && s.y !== null ? `${s.x.toFixed(3)}, ${s.y.toFixed(3)}` : "—"}
              {s.z !== null ? ` · RL ${s.z.toFixed(3)}` : ""}
            </dd>
            <dt className="text-ink-soft">Volume</dt>
            <dd className="num">{s.volumeL ?? "—"} l</dd>
            <dt className="text-ink-soft">Purpose</dt>
            <dd>{s.purpose || "—"}</dd>
            <dt className="text-ink-soft">Taken</dt>
            <dd>
              {(s.takenBy ? names.get(s.takenBy) : null) ?? "—"} · <span className="num">{s.takenOn}</span>
            </dd>
          </dl>
        )}
        <section className="sheet space-y-2" aria-label="Processing">
          <p>
            Now: <strong>{sampleStatusLabels[s.status]}</strong>
          </p>
          <SampleStatusControl siteId={siteId} sampleIds={[s.id]} current={s.status} />
          <SampleBoxControl siteId={siteId} sampleIds={[s.id]} boxes={boxes} current={s.boxId} />
        </section>
        {writable && <SampleDelete siteId={siteId} sampleId={s.id} number={s.number} />}
        <AuditTrail entries={trail} siteId={siteId} recordType="sample" recordId={s.id} />
      </main>
    </>
  );
}
