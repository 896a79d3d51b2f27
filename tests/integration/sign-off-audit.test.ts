import { describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as auditRoute from "@/app/api/sites/[siteId]/audit/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";

describe("the record trail", () => {
  it("is append-only in the database itself: UPDATE, DELETE and TRUNCATE are refused", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db.insert(schema.auditEntries).values({
      siteId: fx.site.id,
      actorId: fx.people.director.id,
      action: "update",
      recordType: "context",
      recordId: fx.context.id,
      before: { colour: "a" },
      after: { colour: "b" },
    });
    const count = async () => (await db.select().from(schema.auditEntries)).length;
    const n = await count();
    await expect(
      db.update(schema.auditEntries).set({ reason: "tampered" }).where(eq(schema.auditEntries.siteId, fx.site.id)),
    ).rejects.toThrow();
    await expect(db.delete(schema.auditEntries).where(eq(schema.auditEntries.siteId, fx.site.id))).rejects.toThrow();
    await expect(db.execute(sql`truncate audit_entries`)).rejects.toThrow();
    expect(await count()).toBe(n);
    const rows = await db.select().from(schema.auditEntries).where(eq(schema.auditEntries.siteId, fx.site.id));
    expect(rows.every((r) => r.reason !== "tampered")).toBe(true);
  });

  it("keeps before and after of a change, filterable by record and by person, for members only", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    expect(
      (await call(contextRoute, "PATCH", { siteId: fx.site.id, contextId: fx.context.id }, { colour: "pale grey" }))
        .status,
    ).toBe(200);
    session.userId = fx.people.director.id;
    expect(
      (await call(contextRoute, "PATCH", { siteId: fx.site.id, contextId: fx.context.id }, { colour: "mid grey" }))
        .status,
    ).toBe(200);
    expect(
      (
        await call(
          findsRoute,
          "POST",
          { siteId: fx.site.id },
          { contextId: fx.context.id, classId: fx.cls.id, x: 2, y: 2, method: "typed" },
        )
      ).status,
    ).toBe(201);

    session.userId = fx.people.specialist.id;
    const ofContext = await call(auditRoute, "GET", { siteId: fx.site.id }, undefined, {
      recordType: "context",
      recordId: fx.context.id,
    });
    expect(ofContext.status).toBe(200);
    expect(
      ofContext.json.map((e: { actor: string; before: { colour: string }; after: { colour: string } }) => [
        e.actor,
        e.before.colour,
        e.after.colour,
      ]),
    ).toEqual([
      ["Director", "pale grey", "mid grey"],
      ["Digger", "", "pale grey"],
    ]);
    const byDirector = await call(auditRoute, "GET", { siteId: fx.site.id }, undefined, {
      actorId: fx.people.director.id,
    });
    expect(byDirector.json.map((e: { recordType: string; action: string }) => `${e.recordType}:${e.action}`)).toEqual([
      "find:create",
      "context:update",
    ]);

    session.userId = fx.people.stranger.id;
    expect((await call(auditRoute, "GET", { siteId: fx.site.id })).status).toBe(404);
    session.userId = fx.people.director.id;
    expect((await call(auditRoute, "GET", { siteId: fx.site.id }, undefined, { actorId: "nobody" })).status).toBe(400);
  });
});
