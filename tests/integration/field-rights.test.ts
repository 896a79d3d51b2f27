import { describe, expect, it } from "vitest";
import fc from "fast-check";
import type { Role } from "@/db/schema";
import { api, type ApiOperation } from "@/lib/server/api-catalog";
import { fieldRights, type RightsRecord } from "@/lib/server/field-rights";
import { session, call } from "../support/harness";
import { makeUpdateSite, updatables } from "../support/updatable";

/** The record each catalogued update changes. */
const recordOf: Record<string, RightsRecord> = {
  siteUpdate: "site",
  memberUpdate: "member",
  classUpdate: "class",
  trenchUpdate: "trench",
  contextUpdate: "context",
  findUpdate: "find",
  datumUpdate: "datum",
  benchmarkUpdate: "benchmark",
  spitUpdate: "spit",
  sampleUpdate: "sample",
  drawingUpdate: "drawing",
  boxUpdate: "box",
  recordPhotoUpdate: "photo",
};

const roles = ["digger", "specialist", "director"] as const;
const updates = (Object.entries(api) as [string, ApiOperation][]).filter(([, op]) => op.method === "PATCH");
const routeAllows = (op: ApiOperation, role: Role) =>
  op.roles === "member" || (Array.isArray(op.roles) && op.roles.includes(role));

/**
 * What must hold, written out here rather than read from the table under test: whoever the route lets in
 * may change every field, except that a specialist (who classes finds) may change only a find's class, and
 * only a director sets a trench's square grid (the squares bulk finds are counted in).
 */
function mayChange(name: string, role: Role, field: string): boolean {
  if (!routeAllows(api[name as keyof typeof api] as ApiOperation, role)) return false;
  if (name === "findUpdate" && role === "specialist") return field === "classId";
  if (name === "trenchUpdate" && field.startsWith("square")) return role === "director";
  return true;
}

/** A valid value for the field that differs from what the record holds, so a change is visible. */
function newValue(arb: fc.Arbitrary<unknown>, current: unknown, seed: number): unknown {
  const values = fc.sample(arb, { seed, numRuns: 30 });
  const fresh = values.find((v) => JSON.stringify(v) !== JSON.stringify(current));
  if (fresh === undefined) throw new Error("no value differing from the stored one");
  return fresh;
}

describe("field-level rights: every update × role × field", () => {
  it("the rights table has a row for exactly the fields of each update schema", () => {
    expect(Object.keys(recordOf).sort()).toEqual(updates.map(([n]) => n).sort());
    for (const [name, op] of updates) {
      const shape = (op.input as unknown as { shape: Record<string, unknown> }).shape;
      expect(Object.keys(fieldRights[recordOf[name]]).sort(), name).toEqual(Object.keys(shape).sort());
    }
  });

  for (const [name, op] of updates) {
    const fields = Object.keys((op.input as unknown as { shape: Record<string, unknown> }).shape);
    for (const role of roles) {
      for (const [i, field] of fields.entries()) {
        const allowed = mayChange(name, role, field);
        it(`${op.method} ${op.path} {${field}} as ${role} → ${allowed ? 200 : 403}`, async () => {
          const fx = await makeUpdateSite();
          const u = updatables[name];
          const target = await u.target(fx);
          const before = await target.read();
          const value = newValue(u.fields(fx)[field], before[field], 1000 + i);
          session.userId = fx.people[role].id;
          const res = await call(u.mod, "PATCH", target.params, { [field]: value });
          const after = await target.read();
          if (allowed) {
            expect(res.status, JSON.stringify(res.json)).toBe(200);
            expect(after[field]).toEqual(value);
          } else {
            expect(res.status, JSON.stringify(res.json)).toBe(403);
            expect(after).toEqual(before);
            if (routeAllows(op, role)) {
              // Refused by the field rule (not the route): the message and the field errors name the field.
              expect(res.json.error).toContain(field);
              expect(Object.keys(res.json.fieldErrors)).toEqual([field]);
            }
          }
        });
      }
    }
  }

  it("a specialist re-classing a find while also moving it is refused whole: x and description named, nothing changed", async () => {
    const fx = await makeUpdateSite();
    const u = updatables.findUpdate;
    const target = await u.target(fx);
    const before = await target.read();
    session.userId = fx.people.specialist.id;
    const res = await call(u.mod, "PATCH", target.params, { classId: fx.alt.classId, x: 2, description: "moved" });
    expect(res.status).toBe(403);
    expect(Object.keys(res.json.fieldErrors).sort()).toEqual(["description", "x"]);
    expect(res.json.error).toMatch(/specialist may not change x, description of a find .*may change classId/);
    expect(await target.read()).toEqual(before);
    const reclass = await call(u.mod, "PATCH", target.params, { classId: fx.alt.classId });
    expect(reclass.status).toBe(200);
    expect((await target.read()).classId).toBe(fx.alt.classId);
  });
});
