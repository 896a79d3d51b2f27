import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { createFind, deleteFind } from "@/lib/server/finds";
import { loadSiteActor } from "@/lib/server/membership";

describe("find numbers under concurrent recording", () => {
  it("hands out 1..N once each, without gaps, when many diggers record at the same moment", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const diggers = [fx.people.digger, fx.people.director];
    const actors = await Promise.all(diggers.map((p) => loadSiteActor(db, p.id, fx.site.id)));
    const N = 60;
    // All N transactions are started together. PGlite is one single-connection PostgreSQL in this
    // process, so drizzle queues the transactions and they run one after another: here the test proves
    // the allocation is correct when interleaved at transaction level. The same suite run against a real
    // PostgreSQL (DATABASE_URL, a pool of 10 connections) runs them truly in parallel, where the row lock
    // taken by allocateFindNumbers' UPDATE of the site row is what keeps the numbers unique and gapless.
    // A few of the calls are meant to fail (outside the trench) and must give their number back.
    const results = await Promise.allSettled(
      Array.from({ length: N }, (_, i) =>
        createFind(db, actors[i % 2], {
          contextId: fx.context.id,
          classId: fx.cls.id,
          x: i % 10 === 9 ? 50 : 0.5 + (i % 9),
          y: 1,
          description: `find ${i}`,
          method: "typed",
        }),
      ),
    );
    const made = results
      .filter((r) => r.status === "fulfilled")
      .map((r) => (r as PromiseFulfilledResult<schema.Find>).value);
    const refused = results.filter((r) => r.status === "rejected");
    expect(refused).toHaveLength(6);
    const numbers = made.map((f) => f.number).sort((a, b) => a - b);
    expect(numbers).toEqual(Array.from({ length: N - 6 }, (_, i) => i + 1));
    const [site] = await db.select().from(schema.sites).where(eq(schema.sites.id, fx.site.id));
    expect(site.nextFindNumber).toBe(N - 6 + 1);
  });

  it("never hands out a deleted find's number again", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const actor = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    const input = {
      contextId: fx.context.id,
      classId: fx.cls.id,
      x: 1,
      y: 1,
      description: "",
      method: "typed" as const,
    };
    const a = await createFind(db, actor, input);
    const b = await createFind(db, actor, input);
    await deleteFind(db, actor, b.id);
    const c = await createFind(db, actor, input);
    expect([a.number, b.number, c.number]).toEqual([1, 2, 3]);
  });
});
