import "server-only";
import type { Db, Tx } from "@/db/client";
import { auditEntries } from "@/db/schema";

export type AuditInput = {
  siteId: string;
  actorId: string | null;
  action: string;
  recordType:
    | "site"
    | "member"
    | "trench"
    | "context"
    | "relation"
    | "find"
    | "class"
    | "photo"
    | "run"
    | "import"
    | "datum"
    | "benchmark"
    | "level_run"
    | "spit"
    | "square"
    | "section"
    | "sample"
    | "drawing"
    | "box"
    | "number_block"
    | "operation"
    | "package";
  recordId: string;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
};

const plain = (v: unknown) => (v === undefined ? null : JSON.parse(JSON.stringify(v)));

/** Appends one entry to the audit trail inside the caller's transaction. */
export async function recordAudit(tx: Db | Tx, entry: AuditInput): Promise<void> {
  await tx.insert(auditEntries).values({
    ...entry,
    before: plain(entry.before),
    after: plain(entry.after),
    reason: entry.reason ?? null,
  });
}
