import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import type { Db } from "@/db/client";
import { boxes, finds, samples } from "@/db/schema";
import type { BoxEmpty } from "@/lib/schemas/processing";
import { recordAudit } from "./audit";
import { getBox } from "./boxes";
import { badInput, conflict, notFound } from "./errors";
import { processingOf } from "./find-processing";
import type { SiteActor } from "./membership";

/**
 * Empties a box into another of the site's boxes: every find and sample in it moves, all or nothing, in one
 * transaction. Audited as boxing a find is (one `process` entry per find, and one `store` entry per sample
 * as storing samples does, each with the new box's number), so each record's own trail says where it went.
 * Both boxes' rows are locked, in id order so that two moves between the same boxes cannot deadlock: a box
 * deleted or emptied meanwhile is either gone before this reads it (refused, named) or waits for it.
 */
export async function emptyBox(db: Db, actor: SiteActor, boxId: string, input: BoxEmpty) {
  return db.transaction(async (tx) => {
    const from = await getBox(tx, actor.site.id, boxId);
    if (input.intoBoxId === from.id)
      throw badInput(`Box ${from.number} cannot be emptied into itself; pick another box.`, {
        intoBoxId: ["Pick another box."],
      });
    const locked = await tx
      .select()
      .from(boxes)
      .where(and(eq(boxes.siteId, actor.site.id), inArray(boxes.id, [from.id, input.intoBoxId])))
      .orderBy(asc(boxes.id))
      .for("update");
    if (!locked.some((b) => b.id === from.id)) throw notFound("That box");
    const into = locked.find((b) => b.id === input.intoBoxId);
    if (!into)
      throw badInput("The box to empty it into is not one of this site's boxes: it may have been deleted.", {
        intoBoxId: ["Unknown box."],
      });
    const [inFinds, inSamples] = await Promise.all([
      tx.select().from(finds).where(eq(finds.boxId, from.id)).orderBy(asc(finds.number)).for("update"),
      tx.select().from(samples).where(eq(samples.boxId, from.id)).orderBy(asc(samples.number)).for("update"),
    ]);
    if (!inFinds.length && !inSamples.length)
      throw conflict(`Box ${from.number} is empty: nothing was moved.`, undefined, "conflict");
    const now = new Date();
    const movedFinds = inFinds.length
      ? await tx
          .update(finds)
          .set({ boxId: into.id, version: sql`${finds.version} + 1`, updatedAt: now })
          .where(eq(finds.boxId, from.id))
          .returning()
      : [];
    if (inSamples.length)
      await tx.update(samples).set({ boxId: into.id, updatedAt: now }).where(eq(samples.boxId, from.id));
    const findAfter = new Map(movedFinds.map((f) => [f.id, f]));
    const audit = { siteId: actor.site.id, actorId: actor.userId };
    for (const f of inFinds)
      await recordAudit(tx, {
        ...audit,
        action: "process",
        recordType: "find",
        recordId: f.id,
        before: processingOf(f),
        after: { ...processingOf(findAfter.get(f.id)), boxNumber: into.number },
        reason: `Box ${from.number} emptied into box ${into.number}`,
      });
    for (const s of inSamples)
      await recordAudit(tx, {
        ...audit,
        action: "store",
        recordType: "sample",
        recordId: s.id,
        before: { boxId: s.boxId, location: s.location },
        after: { boxId: into.id, location: s.location, boxNumber: into.number },
        reason: `Box ${from.number} emptied into box ${into.number}`,
      });
    return {
      from: from.number,
      into: into.number,
      findNumbers: inFinds.map((f) => f.number),
      sampleNumbers: inSamples.map((s) => s.number),
    };
  });
}
