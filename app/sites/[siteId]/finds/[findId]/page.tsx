import Link from "next/link";
import { notFound } from "next/navigation";
import { AuditTrail } from "@/components/audit/audit-trail";
import { HumanRemainsBanner } from "@/components/cautions";
import { LockNotice } from "@/components/contexts/lock-notice";
import { FindEditForm } from "@/components/register/find-edit-form";
import { FindProcessingPanel } from "@/components/register/find-processing";
import { RecordPhotosPanel } from "@/components/photos/record-photos-panel";
import { recorders } from "@/lib/api/operation";
import { isRole } from "@/lib/server/membership";
import { SiteNav } from "@/components/site-nav";
import { isPublicError } from "@/lib/server/errors";
import { changeableFields } from "@/lib/server/field-rights";
import { formatStamp, isContextWritable } from "@/lib/server/locks";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";

export default async function FindPage({ params }: { params: Promise<{ siteId: string; findId: string }> }) {
  const locale = await requestLocale();
  const { siteId, findId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const f = await read.find(findId).catch((err) => {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  });
  const [ctx, contexts, classes, boxes] = await Promise.all([
    read.context(f.contextId),
    read.contexts(),
    read.classes(),
    read.boxChoices(),
  ]);
  const cls = classes.find((c) => c.id === f.classId);
  const signed = ctx.state === "signed_off";
  const lockerId = signed ? ctx.signedOffBy : ctx.submittedBy;
  const [names, trail, members] = await Promise.all([
    read.userNames([lockerId]),
    read.audit({ recordType: "find", recordId: f.id }),
    read.members(),
  ]);
  const writable = isContextWritable(ctx);
  // A signed-off find reads its class as it stood at sign-off; a later rename or flag is said, not silently shown.
  const asSigned = signed && ctx.signedOffAt && cls ? await read.classesAsSignedOff(ctx.signedOffAt, [cls]) : null;
  const face = (cls && asSigned?.faces.get(cls.id)?.face) ?? cls;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/finds`} />
      <main className="mx-auto max-w-4xl space-y-4 px-4 py-6">
        <p>
          <Link className="underline" href={`/sites/${siteId}/finds`}>
            ← Finds register
          </Link>
        </p>
        <div className="flex flex-wrap items-baseline gap-3">
          <h1 className="text-3xl font-bold">
            Find <span className="num">{f.number}</span>
          </h1>
          <span className="text-xl text-ink-soft">
            {face?.code} · {face?.label}
          </span>
          {f.stationPoint && (
            <span className="text-ink-soft">
              station point <span className="num">{f.stationPoint}</span>
            </span>
          )}
          <Link className="btn ml-auto" href={`/sites/${siteId}/trenches/${f.trenchId}?find=${f.id}`}>
            See it on the plan
          </Link>
          <Link className="btn" href={`/sites/${siteId}/contexts/${ctx.id}`}>
            Context {ctx.number}
          </Link>
        </div>
        {cls?.humanRemains && <HumanRemainsBanner count={1} />}
        {asSigned && asSigned.notes.length > 0 && (
          <ul className="sheet list-disc pl-8 text-sm text-warn" aria-label="Class changes after sign-off">
            {asSigned.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        )}
        <LockNotice
          state={ctx.state}
          number={ctx.number}
          who={(lockerId ? names.get(lockerId) : undefined) ?? null}
          at={formatStamp(signed ? ctx.signedOffAt : ctx.submittedAt, locale)}
        />
        {writable ? (
          <FindEditForm
            siteId={siteId}
            findId={f.id}
            initial={{
              contextId: f.contextId,
              classId: f.classId,
              x: f.x,
              y: f.y,
              z: f.z,
              count: f.count,
              weightG: f.weightG,
              description: f.description,
            }}
            contexts={contexts
              .filter((c) => isContextWritable(c) || c.id === f.contextId)
              .map((c) => ({ id: c.id, number: c.number }))}
            classes={classes.map((c) => ({ id: c.id, code: c.code, label: c.label }))}
            changeable={changeableFields("find", actor.role)}
          />
        ) : (
          <dl className="sheet grid grid-cols-[10rem_1fr] gap-y-1">
            <dt className="text-ink-soft">Position (m)</dt>
            <dd className="num">
              {f.x.toFixed(3)}, {f.y.toFixed(3)}
            </dd>
            <dt className="text-ink-soft">Reduced level</dt>
            <dd className="num">{f.z !== null ? `RL ${f.z.toFixed(3)} m above the site datum` : "none recorded"}</dd>
            <dt className="text-ink-soft">Count · weight</dt>
            <dd className="num">
              {f.count ?? "—"} · {f.weightG ?? "—"} g
            </dd>
            <dt className="text-ink-soft">Description</dt>
            <dd>{f.description || "—"}</dd>
          </dl>
        )}
        <FindProcessingPanel
          siteId={siteId}
          findId={f.id}
          now={{ processing: f.processing, sentTo: f.sentTo, boxId: f.boxId, location: f.location }}
          boxes={boxes}
        />
        <RecordPhotosPanel
          siteId={siteId}
          subject="find"
          subjectId={f.id}
          what={`find ${f.number}`}
          canEdit={writable && isRole(actor, recorders)}
          members={members.map((m) => ({ id: m.userId, name: m.name }))}
        />
        <AuditTrail entries={trail} siteId={siteId} recordType="find" recordId={f.id} locale={locale} />
      </main>
    </>
  );
}
