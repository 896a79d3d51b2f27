import { describe, expect, it } from "vitest";
import { and, asc, eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { contextClassNotes } from "@/lib/server/class-history";
import { formatStamp } from "@/lib/server/locks";
import { loadTrenchReport } from "@/lib/server/reads/trench-report";
import * as classRoute from "@/app/api/sites/[siteId]/classes/[classId]/route";

describe("a class changed after its finds were signed off", () => {
  it("leaves signed-off records reading the class as signed off, audits the change and shows it on the record", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [open] = await db
      .insert(schema.contexts)
      .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: fx.context.number + 1, type: "fill" })
      .returning();
    const find = (number: number, contextId: string) => ({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId,
      classId: fx.cls.id,
      number,
      x: 1,
      y: 1,
      method: "typed" as const,
    });
    await db.insert(schema.finds).values([find(1, fx.context.id), find(2, fx.context.id), find(3, open.id)]);
    await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date(Date.now() - 60_000), signedOffBy: fx.people.director.id })
      .where(eq(schema.contexts.id, fx.context.id));

    session.userId = fx.people.specialist.id;
    expect(
      (await call(classRoute, "PATCH", { siteId: fx.site.id, classId: fx.cls.id }, { colour: "#d55e00" })).status,
    ).toBe(200);
    expect(
      (
        await call(
          classRoute,
          "PATCH",
          { siteId: fx.site.id, classId: fx.cls.id },
          { code: "BF", label: "Burnt flint" },
        )
      ).status,
    ).toBe(200);
    session.userId = fx.people.director.id;
    expect(
      (await call(classRoute, "PATCH", { siteId: fx.site.id, classId: fx.cls.id }, { humanRemains: true })).status,
    ).toBe(200);

    // Audited: each change that alters how signed-off records read says which records.
    const trail = await db
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.recordType, "class"), eq(schema.auditEntries.recordId, fx.cls.id)))
      .orderBy(asc(schema.auditEntries.id));
    expect(trail.map((e) => e.reason)).toEqual([
      null, // the colour alone changes no record's words
      `Changed after sign-off of 2 finds of this class (context ${fx.context.number}); those records keep the class as signed off and show this change.`,
      `Changed after sign-off of 2 finds of this class (context ${fx.context.number}); those records keep the class as signed off and show this change.`,
    ]);
    const [rename, flag] = [trail[1], trail[2]];

    // Shown on the signed-off context sheet, in words naming the old and new class, the date and the person.
    const [signed] = await db.select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id));
    const notes = [
      `Class FL “Flint flake” renamed to BF “Burnt flint” after sign-off, on ${formatStamp(rename.at)} by Specialist.`,
      `Class BF “Burnt flint” flagged as human remains after sign-off, on ${formatStamp(flag.at)} by Director.`,
    ];
    expect(await contextClassNotes(db, signed)).toEqual(notes);
    expect(await contextClassNotes(db, open)).toEqual([]);

    // The trench record prints signed-off finds with the class as signed off, open ones with today's class.
    const report = await loadTrenchReport(db, fx.trench);
    const faceOf = (n: number) => report.finds.find((f) => f.number === n)!.classFace;
    expect(faceOf(1)).toEqual({ code: "FL", label: "Flint flake", humanRemains: false });
    expect(faceOf(2)).toEqual({ code: "FL", label: "Flint flake", humanRemains: false });
    expect(faceOf(3)).toEqual({ code: "BF", label: "Burnt flint", humanRemains: true });
    expect(report.sheets.find((s) => s.id === fx.context.id)!.classNotes).toEqual(notes);
    expect(report.sheets.find((s) => s.id === open.id)!.classNotes).toEqual([]);
  });

  it("a change made before sign-off is simply what was signed off", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db.insert(schema.finds).values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: fx.context.id,
      classId: fx.cls.id,
      number: 1,
      x: 1,
      y: 1,
      method: "typed",
    });
    session.userId = fx.people.specialist.id;
    await call(classRoute, "PATCH", { siteId: fx.site.id, classId: fx.cls.id }, { label: "Flint flake, retouched" });
    const [signed] = await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date(Date.now() + 1000), signedOffBy: fx.people.director.id })
      .where(eq(schema.contexts.id, fx.context.id))
      .returning();
    expect(await contextClassNotes(db, signed)).toEqual([]);
    const report = await loadTrenchReport(db, fx.trench);
    expect(report.finds[0].classFace).toEqual({ code: "FL", label: "Flint flake, retouched", humanRemains: false });
  });
});
