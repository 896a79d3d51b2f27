import "server-only";
import { inArray, sql } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { finds, type Box, type Find } from "@/db/schema";
import type { FindsBulk } from "@/lib/schemas/finds-bulk";
import { findProcessingLabels } from "@/lib/schemas/processing";
import { recordAudit } from "./audit";
import { boxInSite } from "./boxes";
import { PublicError } from "./errors";

type Process = Extract<FindsBulk, { action: "process" }>;
type Refusal = { findId: string; number: number; reason: string };

/**
 * Why one find cannot take this change, or null. Processing comes after the trench, so a closed or signed-off
 * context does not stop it (as for samples); what stops it is the find's own state: only a find that was sent
 * out can come back, a find with a specialist is not in a box, and a boxed find has a box. A find sent out
 * leaves its box (so the box's label no longer lists it); it goes back into one when it returns.
 */
function refusalOf(f: Find, input: Process): string | null {
  const state = input.processing ?? f.processing;
  const boxId = input.boxId === undefined ? f.boxId : input.boxId;
  if (input.processing === "returned" && f.processing !== "sent")
    return `it was not sent out (it is ${findProcessingLabels[f.processing].toLowerCase()})`;
  if (state === "sent" && input.boxId)
    return `it is with a specialist${f.sentTo ? ` (${f.sentTo})` : ""}; mark it back first`;
  if (state === "boxed" && !boxId) return "it is in no box; pick the box it is in";
  return null;
}

/** What a find's audit entry records of its processing and place: boxing a find, or emptying its box. */
export const processingOf = (f: Find | undefined) =>
  f && { processing: f.processing, sentTo: f.sentTo, boxId: f.boxId, location: f.location, version: f.version };

/** The after-the-trench change of many finds, all or nothing; one audit entry per find. */
export async function processFinds(
  tx: Tx,
  actor: { site: { id: string }; userId: string },
  input: Process,
  rows: Find[],
) {
  let box: Box | null = null;
  if (input.boxId) box = await boxInSite(tx, actor.site.id, input.boxId);
  const refused: Refusal[] = [];
  for (const f of rows) {
    const reason = refusalOf(f, input);
    if (reason) refused.push({ findId: f.id, number: f.number, reason });
  }
  if (refused.length) {
    const shown = refused.slice(0, 12).map((r) => `find ${r.number}: ${r.reason}`);
    const more = refused.length > shown.length ? ` … and ${refused.length - shown.length} more` : "";
    throw new PublicError(
      409,
      `No find was changed: ${refused.length === 1 ? "1 find stops" : `${refused.length} finds stop`} it. ${shown.join(" · ")}${more}`,
      undefined,
      { refused },
      "conflict",
    );
  }
  const after = await tx
    .update(finds)
    .set({
      ...(input.processing !== undefined && { processing: input.processing }),
      ...(input.sentTo !== undefined && { sentTo: input.sentTo }),
      ...(input.boxId !== undefined && { boxId: input.boxId }),
      ...(input.processing === "sent" && input.boxId === undefined && { boxId: null }),
      ...(input.location !== undefined && { location: input.location }),
      version: sql`${finds.version} + 1`,
      updatedAt: new Date(),
    })
    .where(
      inArray(
        finds.id,
        rows.map((r) => r.id),
      ),
    )
    .returning();
  const byId = new Map(after.map((a) => [a.id, a]));
  for (const f of rows)
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "process",
      recordType: "find",
      recordId: f.id,
      before: processingOf(f),
      after: { ...processingOf(byId.get(f.id)), ...(box && { boxNumber: box.number }) },
    });
  return { action: input.action, changed: rows.length, numbers: rows.map((r) => r.number) };
}
