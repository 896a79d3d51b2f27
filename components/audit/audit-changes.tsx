/** Fields that change on every write and say nothing to a reader. */
const noise = new Set(["updatedAt", "createdAt", "id", "siteId"]);

export function changedFields(before: unknown, after: unknown): string[] {
  const b = (before ?? {}) as Record<string, unknown>;
  const a = (after ?? {}) as Record<string, unknown>;
  const keys = new Set([...Object.keys(b), ...Object.keys(a)]);
  return [...keys].filter((k) => !noise.has(k) && JSON.stringify(b[k]) !== JSON.stringify(a[k]));
}

const show = (v: unknown) => {
  if (v === null || v === undefined || v === "") return "—";
  const s = typeof v === "object" ? JSON.stringify(v) : String(v);
  return s.length > 80 ? `${s.slice(0, 77)}…` : s;
};

/** A record's short name from its snapshot: "context 1005", "find 231", "trench A". */
export function recordLabel(recordType: string, before: unknown, after: unknown): string {
  const snap = { ...((before ?? {}) as Record<string, unknown>), ...((after ?? {}) as Record<string, unknown>) };
  if (typeof snap.reads === "string") return `relation ${snap.reads}`;
  const name = snap.number ?? snap.code ?? snap.email ?? snap.fileName ?? null;
  return name === null ? recordType : `${recordType} ${String(name)}`;
}

/**
 * Before → after of one audit entry: each changed field for an update, the main fields of a created or
 * deleted record. Nothing is hidden: "show all" opens the whole snapshot.
 */
export function AuditChanges({ action, before, after }: { action: string; before: unknown; after: unknown }) {
  const fields = changedFields(before, after);
  const b = (before ?? {}) as Record<string, unknown>;
  const a = (after ?? {}) as Record<string, unknown>;
  const created = before == null && after != null;
  const deleted = after == null && before != null;
  if (!fields.length) return null;
  return (
    <details className="text-ink-soft">
      <summary className="cursor-pointer">
        {created
          ? "Recorded with"
          : deleted
            ? "Removed, it held"
            : `Changed ${fields.length} field${fields.length > 1 ? "s" : ""}`}
        : {fields.slice(0, 4).join(", ")}
        {fields.length > 4 ? ", …" : ""}
      </summary>
      <ul className="mt-1 space-y-0.5" data-action={action}>
        {fields.map((f) => (
          <li key={f} className="font-mono text-xs">
            <span className="font-semibold">{f}</span>:{" "}
            {created ? (
              show(a[f])
            ) : deleted ? (
              show(b[f])
            ) : (
              <>
                {show(b[f])} → {show(a[f])}
              </>
            )}
          </li>
        ))}
      </ul>
    </details>
  );
}
