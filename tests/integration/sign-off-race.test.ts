import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { loadSiteActor } from "@/lib/server/membership";
import { createFind } from "@/lib/server/finds";
import { submitContext } from "@/lib/server/sign-off";
import { completeSheet } from "./role-cases/sign-off";

/**
 * A find recorded at the very moment its context is submitted must either land before the submission (and be
 * part of what the director reviews) or be refused — never slip in after the sheet froze. On PostgreSQL the
 * write's share lock and the submission's update lock on the context row decide the order (without the share
 * lock in assertContextWritable this test fails there: the find commits after the submission).
 */
describe("a find recorded while its sheet is being submitted", () => {
  it("is either in the sheet before it froze, or refused", async () => {
    const db = await getDb();
    let landed = 0;
    let refused = 0;
    for (let round = 0; round < 8; round++) {
      const fx = await makeSite();
      await completeSheet(fx.context.id);
      const digger = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
      const director = await loadSiteActor(db, fx.people.director.id, fx.site.id);
      const [find, submit] = await Promise.allSettled([
        createFind(db, director, {
          contextId: fx.context.id,
          classId: fx.cls.id,
          x: 1 + round / 10,
          y: 1,
          method: "plan",
          description: "",
        }),
        submitContext(db, digger, fx.context.id),
      ]);
      expect(submit.status).toBe("fulfilled");
      const trail = await db.select().from(schema.auditEntries).where(eq(schema.auditEntries.siteId, fx.site.id));
      const submitted = trail.find((e) => e.action === "submit")!;
      const finds = await db
        .select()
        .from(schema.finds)
        .where(and(eq(schema.finds.contextId, fx.context.id)));
      if (find.status === "fulfilled") {
        landed++;
        expect(finds).toHaveLength(1);
        const recorded = trail.find((e) => e.recordType === "find" && e.action === "create")!;
        expect(recorded.id).toBeLessThan(submitted.id);
      } else {
        refused++;
        expect(String((find.reason as Error).message)).toContain("submitted for sign-off");
        expect(finds).toHaveLength(0);
      }
    }
    expect(landed + refused).toBe(8);
  });
});
