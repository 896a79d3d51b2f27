import Link from "next/link";
import { notFound } from "next/navigation";
import { AuditTrail } from "@/components/audit/audit-trail";
import { ContextSheetForm } from "@/components/contexts/context-sheet-form";
import { LevelsPanel } from "@/components/contexts/levels-panel";
import { LockNotice } from "@/components/contexts/lock-notice";
import { RelationsPanel } from "@/components/contexts/relations-panel";
import { RecordPhotosPanel } from "@/components/photos/record-photos-panel";
import { StateBadge } from "@/components/contexts/state-badge";
import { SignOffActions } from "@/components/sign-off/sign-off-actions";
import { SiteNav } from "@/components/site-nav";
import { isPublicError } from "@/lib/server/errors";
import { formatStamp, isContextWritable } from "@/lib/server/locks";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";

const sheetFields = [
  "colour",
  "compaction",
  "composition",
  "inclusions",
  "description",
  "interpretation",
  "excavatedBy",
  "openedOn",
  "closedOn",
  "digMethod",
] as const;
const sheetLabels: Record<string, string> = {
  excavatedBy: "excavated by",
  openedOn: "opened",
  closedOn: "closed",
  digMethod: "dug by",
};

export default async function ContextSheetPage({ params }: { params: Promise<{ siteId: string; contextId: string }> }) {
  const locale = await requestLocale();
  const { siteId, contextId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const c = await read.context(contextId).catch((err) => {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  });
  const [trenches, all, problems, names, trail, classNotes, spits, spots, members] = await Promise.all([
    read.trenches(),
    read.contextSummaries(),
    read.sheetProblems(c),
    read.userNames([c.recordedBy, c.signedOffBy, c.submittedBy]),
    read.audit({ sheetOf: c.id }),
    read.contextClassNotes(c),
    read.spits(c.id),
    read.contextSpotLevels(c.id),
    read.members(),
  ]);
  const trench = trenches.find((t) => t.id === c.trenchId);
  const mine = all.find((x) => x.id === c.id);
  const writable = isContextWritable(c) && actor.role !== "specialist";
  const signed = c.state === "signed_off";
  const base = `/sites/${siteId}/contexts`;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={base} />
      <main className="mx-auto max-w-5xl space-y-4 px-4 py-6">
        <p>
          <Link className="underline" href={base}>
            ← Context sheets
          </Link>{" "}
          ·{" "}
          <Link className="underline" href={`${base}/matrix?trench=${c.trenchId}`}>
            Matrix of trench {trench?.code}
          </Link>
        </p>
        <div className="flex flex-wrap items-baseline gap-3">
          <h1 className="text-3xl font-bold">
            Context <span className="num">{c.number}</span>
          </h1>
          <span className="text-xl text-ink-soft">
            {c.type} · trench {trench?.code}
          </span>
          <StateBadge state={c.state} />
        </div>
        <p className="text-sm text-ink-soft">
          Recorded by {c.recordedBy ? (names.get(c.recordedBy) ?? "—") : "—"} on{" "}
          <span className="num">{formatStamp(c.createdAt, locale)}</span> ·{" "}
          <Link className="underline" href={`/sites/${siteId}/finds?contextId=${c.id}`}>
            <span className="num">{mine?.finds ?? 0}</span> finds
          </Link>{" "}
          ·{" "}
          <Link className="underline" href={`/sites/${siteId}/trenches/${c.trenchId}`}>
            plan of trench {trench?.code}
          </Link>
        </p>
        <section aria-labelledby="sign-off-h" className="sheet">
          <h2 id="sign-off-h" className="text-lg font-bold">
            Sign-off
          </h2>
          {c.state !== "signed_off" && problems.length > 0 && (
            <ul className="mt-1 list-disc pl-5 text-sm text-warn" aria-label="What keeps this sheet from sign-off">
              {problems.map((p) => (
                <li key={p.field + p.message}>{p.message}</li>
              ))}
            </ul>
          )}
          {classNotes.length > 0 && (
            <ul className="mt-1 list-disc pl-5 text-sm text-warn" aria-label="Class changes after sign-off">
              {classNotes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          )}
          <div className="mt-2">
            <SignOffActions
              siteId={siteId}
              contextId={c.id}
              number={c.number}
              state={c.state}
              role={actor.role}
              ready={problems.length === 0}
            />
          </div>
        </section>
        <LockNotice
          state={c.state}
          number={c.number}
          who={names.get((signed ? c.signedOffBy : c.submittedBy) ?? "") ?? null}
          at={formatStamp(signed ? c.signedOffAt : c.submittedAt, locale)}
        />
        {writable ? (
          <ContextSheetForm
            siteId={siteId}
            contextId={c.id}
            trenches={trenches.map((t) => ({ id: t.id, code: t.code }))}
            initial={{
              trenchId: c.trenchId,
              number: c.number,
              type: c.type,
              colour: c.colour,
              compaction: c.compaction,
              composition: c.composition,
              inclusions: c.inclusions,
              description: c.description,
              interpretation: c.interpretation,
              lengthM: c.lengthM ?? "",
              widthM: c.widthM ?? "",
              thicknessM: c.thicknessM ?? "",
              excavatedBy: c.excavatedBy,
              openedOn: c.openedOn ?? "",
              closedOn: c.closedOn ?? "",
              digMethod: c.digMethod ?? "",
              sieveMeshMm: c.sieveMeshMm ?? "",
            }}
          />
        ) : (
          <dl className="sheet grid gap-x-6 gap-y-2 sm:grid-cols-[10rem_1fr]">
            {sheetFields.map((f) => (
              <div key={f} className="contents">
                <dt className="font-semibold capitalize text-ink-soft">{sheetLabels[f] ?? f}</dt>
                <dd className="whitespace-pre-wrap">{c[f] || "—"}</dd>
              </div>
            ))}
          </dl>
        )}
        <LevelsPanel
          siteId={siteId}
          contextId={c.id}
          datumName={actor.site.datumName}
          spits={spits}
          spots={spots}
          canEdit={writable}
        />
        <RelationsPanel
          siteId={siteId}
          contextId={c.id}
          number={c.number}
          canEdit={writable}
          others={all.filter((o) => o.id !== c.id).map((o) => ({ id: o.id, number: o.number }))}
        />
        <RecordPhotosPanel
          siteId={siteId}
          subject="context"
          subjectId={c.id}
          what={`context ${c.number}`}
          canEdit={writable}
          members={members.map((m) => ({ id: m.userId, name: m.name }))}
        />
        <AuditTrail entries={trail} siteId={siteId} recordType="context" recordId={c.id} locale={locale} />
      </main>
    </>
  );
}
