import "server-only";
import { and, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { idempotencyKeys } from "@/db/schema";
import type { Discard } from "@/lib/schemas/number-blocks";
import { recordAudit } from "./audit";
import { conflict } from "./errors";
import type { SiteActor } from "./membership";

/**
 * A device threw away an operation the server had refused (field.md: resolving is itself an operation,
 * audited on the server). The discarded write — its key, path, body and the server's reason — goes on the
 * audit trail, so nothing recorded in the trench disappears unseen. An operation the server did accept
 * under that key cannot be discarded: the device is told so and should take the server's answer instead.
 */
export async function recordDiscard(db: Db, actor: SiteActor, input: Discard, deviceId: string | null) {
  return db.transaction(async (tx) => {
    const [applied] = await tx
      .select({ status: idempotencyKeys.status })
      .from(idempotencyKeys)
      .where(
        and(eq(idempotencyKeys.userId, actor.userId), eq(idempotencyKeys.key, input.idempotencyKey.toLowerCase())),
      );
    if (applied && applied.status >= 200 && applied.status < 300) {
      throw conflict(
        "The server already accepted this operation; it cannot be discarded. Send it again to receive the server's answer.",
        { idempotencyKey: input.idempotencyKey },
      );
    }
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "discard",
      recordType: "operation",
      recordId: input.idempotencyKey,
      after: {
        operation: input.operation,
        method: input.method,
        path: input.path,
        reasonCode: input.reasonCode,
        refusal: input.reason,
        body: input.body ?? null,
        deviceId: input.deviceId ?? deviceId,
      },
      reason: input.note ?? null,
    });
    return { discarded: input.idempotencyKey };
  });
}
