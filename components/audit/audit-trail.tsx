import Link from "next/link";
import type { listAudit } from "@/lib/server/audit-read";
import { DEFAULT_LOCALE, formatWhen } from "@/lib/words/when";
import { AuditChanges, recordLabel } from "./audit-changes";

/** Actions that change a record's standing rather than its content, drawn so they stand out in the trail. */
const milestone: Record<string, string> = {
  submit: "submitted for sign-off",
  "sign-off": "signed off",
  reopen: "reopened",
  return: "returned to open",
};

type AuditEntryView = Awaited<ReturnType<typeof listAudit>>[number];

/** The trace of one record: who changed what, when, and why (reasons of reopenings); the page reads the entries. */
export function AuditTrail({
  entries,
  siteId,
  recordType,
  recordId,
  locale = DEFAULT_LOCALE,
}: {
  entries: AuditEntryView[];
  siteId: string;
  recordType: string;
  recordId: string;
  locale?: string;
}) {
  return (
    <section aria-labelledby={`trail-${recordId}`} className="sheet">
      <h2 id={`trail-${recordId}`} className="text-lg font-bold">
        Record trail
      </h2>
      {entries.length === 0 && <p className="text-ink-soft">No changes recorded yet.</p>}
      <ol className="mt-2 space-y-2">
        {entries.map((e) => (
          <li
            key={e.id}
            className={`border-l-4 pl-3 text-sm ${milestone[e.action] ? "border-accent" : "border-ink/30"}`}
          >
            <p>
              <span className="num">{formatWhen(e.at, locale)}</span> · <strong>{e.actor ?? "system"}</strong> ·{" "}
              {milestone[e.action] ?? e.action}
              {e.recordType !== recordType && <> · {recordLabel(e.recordType, e.before, e.after)}</>}
            </p>
            {e.reason && <p className="italic">Reason: {e.reason}</p>}
            <AuditChanges action={e.action} before={e.before} after={e.after} />
          </li>
        ))}
      </ol>
      <p className="mt-2 text-sm">
        <Link className="underline" href={`/sites/${siteId}/audit?recordType=${recordType}&recordId=${recordId}`}>
          Open in the site&apos;s record trail
        </Link>
      </p>
    </section>
  );
}
