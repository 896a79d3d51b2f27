import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { canonicalJson, trenchFingerprint } from "@/lib/server/sign-off";
import { loadTrenchReport } from "@/lib/server/reads/trench-report";
import * as submitRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/submit/route";
import * as lockRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/lock/route";
import * as reopenRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/reopen/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import { completeSheet } from "./role-cases/sign-off";

describe("the trench record report", () => {
  it("canonical JSON sorts keys at every depth, so equal content hashes alike", () => {
    expect(canonicalJson({ b: 1, a: { d: [2, { f: 1, e: 0 }], c: null } })).toBe(
      '{"a":{"c":null,"d":[2,{"e":0,"f":1}]},"b":1}',
    );
    // SHA-256 of "abc" from FIPS 180-2, appendix B.1.
    expect(createHash("sha256").update("abc").digest("hex")).toBe(
      "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad",
    );
  });

  it("stamps the sign-off and a fingerprint that survives sign-off but not a change", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await completeSheet(fx.context.id);
    const [find] = await db
      .insert(schema.finds)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: fx.context.id,
        classId: fx.cls.id,
        number: 1,
        x: 2,
        y: 1,
        method: "plan",
      })
      .returning();
    const p = { siteId: fx.site.id, contextId: fx.context.id };
    const before = await trenchFingerprint(db, fx.trench);

    session.userId = fx.people.digger.id;
    expect((await call(submitRoute, "POST", p)).status).toBe(200);
    session.userId = fx.people.director.id;
    expect((await call(lockRoute, "POST", p)).status).toBe(200);

    const [trench] = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    const report = await loadTrenchReport(db, trench);
    expect(report.signedOffByName).toBe("Director");
    expect(report.fingerprint).toMatch(/^[0-9a-f]{64}$/);
    // Submitting and signing off change only the lifecycle fields, which the fingerprint leaves out.
    expect(report.fingerprint).toBe(before);
    expect(report.stampedFingerprint).toBe(report.fingerprint);
    expect(report.sheets.map((s) => [s.number, s.state, s.signedOffByName, s.finds])).toEqual([
      [fx.context.number, "signed_off", "Director", 1],
    ]);
    expect(report.finds.map((f) => [f.number, f.cls?.code])).toEqual([[1, "FL"]]);
    expect(report.matrixSvg).toContain(`>${fx.context.number}</text>`);

    expect((await call(reopenRoute, "POST", p, { reason: "Find 1 was planned 20 cm too far west." })).status).toBe(200);
    expect((await call(findRoute, "PATCH", { siteId: fx.site.id, findId: find.id }, { x: 2.2 })).status).toBe(200);
    const [t2] = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    const after = await loadTrenchReport(db, t2);
    expect(t2.signedOffAt).toBeNull();
    expect(after.fingerprint).not.toBe(before);
    expect(after.stampedFingerprint).toBe(before);
  });
});
