import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { session, call } from "../support/harness";
import { makeUpdateSite, updatables } from "../support/updatable";
import { api, type ApiOperation } from "@/lib/server/api-catalog";

const updates = (Object.entries(api) as [string, ApiOperation][]).filter(([, op]) => op.method === "PATCH");

describe("a partial update changes only what it names", () => {
  it("has generated values for every catalogued update", () => {
    expect(Object.keys(updatables).sort()).toEqual(updates.map(([name]) => name).sort());
  });

  for (const [name, op] of updates) {
    it(`${name}: its update schema carries no defaults (parsing {} gives {} or is refused)`, () => {
      expect(op.input, `${name} has no input schema`).toBeDefined();
      const parsed = op.input!.safeParse({});
      if (parsed.success) expect(parsed.data).toEqual({});
      // A field left out is either required (refused) or left out of the result, never filled in.
      const shape = (
        op.input as unknown as {
          shape: Record<string, { safeParse: (v: unknown) => { success: boolean; data?: unknown } }>;
        }
      ).shape;
      for (const [field, fieldSchema] of Object.entries(shape)) {
        const alone = fieldSchema.safeParse(undefined);
        expect(alone.success ? alone.data : undefined, `${name}.${field} fills in a default`).toBeUndefined();
      }
    });

    it(`${name}: the generated values cover every field of its schema`, async () => {
      const fx = await makeUpdateSite();
      const shape = (op.input as unknown as { shape: Record<string, unknown> }).shape;
      expect(Object.keys(updatables[name].fields(fx)).sort()).toEqual(Object.keys(shape).sort());
    });

    it(`${name}: an update naming no field changes nothing`, async () => {
      const u = updatables[name];
      const fx = await makeUpdateSite();
      const target = await u.target(fx);
      const before = await target.read();
      session.userId = fx.people.director.id;
      const res = await call(u.mod, "PATCH", target.params, {});
      expect(res.status, JSON.stringify(res.json)).toBe(op.input!.safeParse({}).success ? 200 : 400);
      // Only the time of the last edit may move.
      const { updatedAt: _b, ...was } = before;
      const { updatedAt: _a, ...now } = await target.read();
      expect(now).toEqual(was);
    });

    it(`${name}: patching a random subset of fields leaves every other field as it was`, async () => {
      const u = updatables[name];
      const fx = await makeUpdateSite();
      const target = await u.target(fx);
      const fields = u.fields(fx);
      session.userId = fx.people.director.id;
      await fc.assert(
        fc.asyncProperty(fc.record(fields), fc.record(fields, { requiredKeys: [] }), async (everything, some) => {
          // First every field to a known value, then a random subset to other values.
          const first = await call(u.mod, "PATCH", target.params, everything);
          expect(first.status, JSON.stringify(first.json)).toBe(200);
          const second = await call(u.mod, "PATCH", target.params, some);
          // An update whose one field is required (a member's role) refuses an empty body and changes nothing.
          const emptyRefused = Object.keys(some).length === 0 && !op.input!.safeParse({}).success;
          expect(second.status, JSON.stringify(second.json)).toBe(emptyRefused ? 400 : 200);
          const row = await target.read();
          for (const field of Object.keys(fields)) {
            const want =
              field in some ? (some as Record<string, unknown>)[field] : (everything as Record<string, unknown>)[field];
            expect(row[field], `${name}.${field} after patching ${JSON.stringify(Object.keys(some))}`).toEqual(want);
          }
        }),
        { seed: 20261203, numRuns: 15 },
      );
    });
  }
});
