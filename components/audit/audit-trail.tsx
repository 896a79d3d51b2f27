import type { Db } from "@/db/client";
import { listAudit } from "@/lib/server/audit-read";

/** Fields that change on every write and say nothing to a reader. */
const noise = new Set(["updatedAt", "createdAt"]);

function changedFields(before: unknown, after: unknown): string[] {
  const b = (before ?? {}) as Record<string, unknown>;
  const a = (after ?? {}) as Record<string, unknown>;
  const keys = new Set([...Object.keys(b), ...Object.keys(a)]);
  return [...keys].filter((k) => !noise.has(k) && JSON.stringify(b[k]) !== JSON.stringify(a[k]));
}

const show = (v: unknown) => (v === null || v === undefined || v === "" ? "—" : typeof v === "object" ? JSON.stringify(v) : String(v));

/** The trace of one record: who changed what, when, and why (reasons of reopenings). Server component. */
export async function AuditTrail({ db, siteId, recordType, recordId }: { db: Db; siteId: string; recordType: string; recordId: string }) {
  const entries = await listAudit(db, siteId, { recordType, recordId });
  return (
    <section aria-labelledby={`trail-${recordId}`} className="sheet">
      <h2 id={`trail-${recordId}`} className="text-lg font-bold">Record trail</h2>
      {entries.length === 0 && <p className="text-ink-soft">No changes recorded yet.</p>}
      <ol className="mt-2 space-y-2">
        {entries.map((e) => {
          const fields = changedFields(e.before, e.after);
          const b = (e.before ?? {}) as Record<string, unknown>;
          const a = (e.after ?? {}) as Record<string, unknown>;
          return (
            <li key={e.id} className="border-l-4 border-ink/30 pl-3 text-sm">
              <p>
                <span className="num">{e.at.toISOString().slice(0, 16).replace("T", " ")}</span> · <strong>{e.actor ?? "system"}</strong> · {e.action}
              </p>
              {e.reason && <p className="italic">Reason: {e.reason}</p>}
              {e.action === "update" && fields.length > 0 && (
                <ul className="text-ink-soft">
                  {fields.slice(0, 8).map((f) => (
                    <li key={f}><span className="font-semibold">{f}</span>: {show(b[f])} → {show(a[f])}</li>
                  ))}
                </ul>
              )}
            </li>
          );
        })}
      </ol>
    </section>
  );
}
