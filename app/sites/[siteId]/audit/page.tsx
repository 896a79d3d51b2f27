import Link from "next/link";
import type { Metadata } from "next";
import { AuditChanges, recordLabel } from "@/components/audit/audit-changes";
import { FilterSelect } from "@/components/register/filter-select";
import { SiteNav } from "@/components/site-nav";
import { auditQuerySchema } from "@/lib/schemas/sign-off";
import { readUrlQuery } from "@/lib/schemas/url-query";
import { pageSiteActor, type SiteSearchPageProps } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatWhen } from "@/lib/words/when";

export const metadata: Metadata = { title: "Record trail" };

const recordTypes = [
  "context",
  "find",
  "relation",
  "trench",
  "member",
  "class",
  "photo",
  "run",
  "import",
  "site",
] as const;

/** Where each kind of record is read; others have no page of their own. */
function recordHref(siteId: string, type: string, id: string): string | null {
  if (type === "context") return `/sites/${siteId}/contexts/${id}`;
  if (type === "find") return `/sites/${siteId}/finds/${id}`;
  if (type === "trench") return `/sites/${siteId}/trenches/${id}`;
  return null;
}

export default async function AuditPage({ params, searchParams }: SiteSearchPageProps) {
  const locale = await requestLocale();
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const { q: filter, valid } = readUrlQuery(auditQuerySchema, await searchParams);
  const [entries, members] = await Promise.all([read.audit(filter), read.members()]);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/audit`} />
      <main className="mx-auto max-w-7xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Record trail</h1>
        <p className="max-w-3xl text-ink-soft">
          Every change to the site&apos;s records, newest first, with the values before and after. Entries are never
          changed or removed.
        </p>
        <form className="sheet flex flex-wrap items-end gap-3" method="get">
          <FilterSelect
            id="recordType"
            name="recordType"
            label="Kind of record"
            value={filter.recordType}
            items={recordTypes.map((t) => ({ id: t, text: t }))}
          />
          <div>
            <label className="label" htmlFor="recordId">
              Record id
            </label>
            <input id="recordId" name="recordId" className="field font-mono" defaultValue={filter.recordId ?? ""} />
          </div>
          <FilterSelect
            id="actorId"
            name="actorId"
            label="Person"
            value={filter.actorId}
            items={members.map((m) => ({ id: m.userId, text: m.name }))}
            any="Anyone"
          />
          <button className="btn-primary" type="submit">
            Show
          </button>
          <Link className="btn" href={`/sites/${siteId}/audit`}>
            Clear
          </Link>
        </form>
        {!valid && (
          <p className="field-error" role="alert">
            Those filters are not valid; showing everything.
          </p>
        )}
        <table className="ledger">
          <thead>
            <tr>
              <th>When (UTC)</th>
              <th>Who</th>
              <th>What</th>
              <th>Record</th>
              <th>Change</th>
            </tr>
          </thead>
          <tbody>
            {entries.map((e) => {
              const href = recordHref(siteId, e.recordType, e.recordId);
              const label = recordLabel(e.recordType, e.before, e.after);
              return (
                <tr key={e.id}>
                  <td className="num whitespace-nowrap">{formatWhen(e.at, locale)}</td>
                  <td>{e.actor ?? "system"}</td>
                  <td>
                    {e.action}
                    {e.reason && <p className="italic">Reason: {e.reason}</p>}
                  </td>
                  <td>
                    {href ? (
                      <Link className="underline" href={href}>
                        {label}
                      </Link>
                    ) : (
                      label
                    )}{" "}
                    <Link
                      className="text-xs text-ink-faint underline"
                      href={`/sites/${siteId}/audit?recordType=${e.recordType}&recordId=${e.recordId}`}
                      title="Only this record"
                    >
                      only this
                    </Link>
                  </td>
                  <td>
                    <AuditChanges action={e.action} before={e.before} after={e.after} />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        {entries.length === 0 && <p className="text-ink-soft">No entries match.</p>}
        {entries.length === filter.limit && (
          <p className="text-sm text-ink-soft">
            Showing the newest {filter.limit}; narrow the filters to see older ones.
          </p>
        )}
      </main>
    </>
  );
}
