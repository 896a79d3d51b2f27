import { useMailSink } from "../support/mail-sink";
import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, makeUser } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { messagesTo } from "@/lib/server/mail/sink-reader";
import * as submitRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/submit/route";
import * as lockRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/lock/route";
import * as reopenRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/reopen/route";
import * as queueRoute from "@/app/api/sites/[siteId]/sign-off/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import { completeSheet } from "./role-cases/sign-off";
import { assertTrenchWritable } from "@/lib/server/locks";

const mail = useMailSink();

const as = (id: string) => (session.userId = id);

describe("submit → sign off → reopen", () => {
  it("refuses an incomplete sheet, naming each missing field", async () => {
    const fx = await makeSite();
    as(fx.people.digger.id);
    const res = await call(submitRoute, "POST", { siteId: fx.site.id, contextId: fx.context.id });
    expect(res.status).toBe(400);
    expect(Object.keys(res.json.fieldErrors).sort()).toEqual([
      "colour",
      "compaction",
      "composition",
      "description",
      "interpretation",
    ]);
    const [c] = await (await getDb()).select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id));
    expect(c.state).toBe("open");
  });

  it("asks a later context for a relation, and every find inside the trench", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [later] = await db
      .insert(schema.contexts)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        number: 9101,
        type: "fill",
        colour: "grey",
        compaction: "soft",
        composition: "silt",
        description: "Fill.",
        interpretation: "Backfill.",
      })
      .returning();
    // Recorded before the outline was redrawn: now 2 m outside the 10 × 6 m trench.
    await db.insert(schema.finds).values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: later.id,
      classId: fx.cls.id,
      number: 77,
      x: 12,
      y: 3,
      method: "typed",
    });
    as(fx.people.digger.id);
    const res = await call(submitRoute, "POST", { siteId: fx.site.id, contextId: later.id });
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors.relations).toHaveLength(1);
    expect(res.json.fieldErrors.finds[0]).toContain("77");
    await db.update(schema.finds).set({ x: 8 }).where(eq(schema.finds.number, 77));
    await db
      .insert(schema.contextRelations)
      .values({ siteId: fx.site.id, fromId: later.id, toId: fx.context.id, kind: "above" });
    const ok = await call(submitRoute, "POST", { siteId: fx.site.id, contextId: later.id });
    expect(ok.status, JSON.stringify(ok.json)).toBe(200);
    expect(ok.json.context.state).toBe("awaiting");
  });

  it("runs the whole cycle with audit entries, trench sign-off and mail to the right people", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const second = await makeUser("Second Director");
    await db.insert(schema.memberships).values({ siteId: fx.site.id, userId: second.id, role: "director" });
    await completeSheet(fx.context.id);
    await db
      .update(schema.contexts)
      .set({ recordedBy: fx.people.digger.id })
      .where(eq(schema.contexts.id, fx.context.id));
    const p = { siteId: fx.site.id, contextId: fx.context.id };

    as(fx.people.digger.id);
    const sub = await call(submitRoute, "POST", p);
    expect(sub.status, JSON.stringify(sub.json)).toBe(200);
    expect(sub.json.mail).toEqual({ sent: 2, failed: 0 });
    for (const d of [fx.people.director, second]) {
      const [m] = messagesTo(mail.dir, d.email);
      expect(m.subject).toBe(`${fx.site.code}: context ${fx.context.number} awaits your sign-off`);
      expect(m.text).toContain(`http://loamwork.example/sites/${fx.site.id}/sign-off`);
      expect(m.html).toContain(`href="http://loamwork.example/sites/${fx.site.id}/sign-off"`);
    }
    expect(messagesTo(mail.dir, fx.people.digger.email)).toHaveLength(0);

    // Awaiting: frozen for the digger and the director alike.
    const frozen = await call(contextRoute, "PATCH", p, { colour: "dark brown" });
    expect(frozen.status).toBe(409);
    expect(frozen.json.error).toContain("submitted for sign-off by Digger");
    as(fx.people.director.id);
    expect((await call(contextRoute, "PATCH", p, { colour: "dark brown" })).status).toBe(409);

    const lock = await call(lockRoute, "POST", p);
    expect(lock.status, JSON.stringify(lock.json)).toBe(200);
    expect(lock.json.trenchSignedOff).toBe(true);
    const [t] = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    expect(t.signedOffBy).toBe(fx.people.director.id);
    await expect(assertTrenchWritable(db, t, "given new contexts")).rejects.toThrow(
      /^Trench A was signed off by Director on \d{1,2} \w{3} \d{4}, \d\d:\d\d UTC; it cannot be given new contexts/,
    );
    const [signed] = messagesTo(mail.dir, fx.people.digger.email);
    expect(signed.subject).toBe(`${fx.site.code}: context ${fx.context.number} signed off`);
    expect(signed.text).toContain(`http://loamwork.example/sites/${fx.site.id}/contexts/${fx.context.id}`);
    expect(signed.text).toContain("Every context of trench A is now signed off, so the trench is signed off too.");

    const noReason = await call(reopenRoute, "POST", p, { reason: "  " });
    expect(noReason.status).toBe(400);
    const reason = "Find numbers 12–15 belong to 1002; re-check the section.";
    const re = await call(reopenRoute, "POST", p, { reason });
    expect(re.status, JSON.stringify(re.json)).toBe(200);
    expect(re.json.context.state).toBe("open");
    const [t2] = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    expect(t2.signedOffAt).toBeNull();
    // Every member but the director who reopened it is told, with the reason quoted.
    for (const who of [fx.people.digger, fx.people.specialist, second]) {
      const [m] = messagesTo(mail.dir, who.email);
      expect(m.subject).toContain(`context ${fx.context.number} reopened`);
      expect(m.text).toContain(`> ${reason}`);
      expect(m.html).toContain("re-check the section");
    }
    expect(messagesTo(mail.dir, fx.people.director.email).some((m) => m.subject.includes("reopened"))).toBe(false);

    const trail = await db.select().from(schema.auditEntries).where(eq(schema.auditEntries.recordId, fx.context.id));
    expect(trail.map((e) => e.action)).toEqual(["submit", "sign-off", "reopen"]);
    expect(trail[2].reason).toBe(reason);
    expect((trail[1].after as { fingerprint: string }).fingerprint).toMatch(/^[0-9a-f]{64}$/);
    const trenchTrail = await db
      .select()
      .from(schema.auditEntries)
      .where(eq(schema.auditEntries.recordId, fx.trench.id));
    expect(trenchTrail.map((e) => e.action)).toEqual(["sign-off", "reopen"]);
  });

  it("asks a cut only for description and interpretation (a cut is an interface, not a deposit)", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [cut] = await db
      .insert(schema.contexts)
      .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 9201, type: "cut" })
      .returning();
    await db
      .insert(schema.contextRelations)
      .values({ siteId: fx.site.id, fromId: cut.id, toId: fx.context.id, kind: "cuts" });
    as(fx.people.digger.id);
    const res = await call(submitRoute, "POST", { siteId: fx.site.id, contextId: cut.id });
    expect(res.status).toBe(400);
    expect(Object.keys(res.json.fieldErrors).sort()).toEqual(["description", "interpretation"]);
  });

  it("refuses out-of-order steps with 409 and lists the queue for every member", async () => {
    const fx = await makeSite();
    await completeSheet(fx.context.id);
    const p = { siteId: fx.site.id, contextId: fx.context.id };
    as(fx.people.director.id);
    expect((await call(lockRoute, "POST", p)).status).toBe(409);
    expect((await call(reopenRoute, "POST", p, { reason: "Nothing to reopen here at all." })).status).toBe(409);
    as(fx.people.digger.id);
    expect((await call(submitRoute, "POST", p)).status).toBe(200);
    expect((await call(submitRoute, "POST", p)).status).toBe(409);
    as(fx.people.specialist.id);
    const q = await call(queueRoute, "GET", { siteId: fx.site.id });
    expect(q.status).toBe(200);
    expect(
      q.json.contexts.map((c: { number: number; state: string; submittedBy: string }) => [
        c.number,
        c.state,
        c.submittedBy,
      ]),
    ).toEqual([[fx.context.number, "awaiting", "Digger"]]);
    as(fx.people.director.id);
    expect((await call(lockRoute, "POST", { ...p, contextId: "not-a-uuid" })).status).toBe(404);
  });
});
