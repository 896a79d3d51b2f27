/** The pure parts of Patterns: canonical JSON for fingerprints, stratigraphic equivalence, departures. */
import { describe, expect, it } from "vitest";
import { canonicalJson } from "@/lib/server/analysis/canonical-json";
import { stratigraphicWarnings, type RelationRow } from "@/lib/stratigraphy/one-surface";
import { departureSentences, mainDepartures } from "@/components/patterns/departures";

describe("canonical JSON", () => {
  it("does not depend on key order and writes dates as ISO strings", () => {
    const t = new Date("2026-05-04T10:00:00.000Z");
    expect(canonicalJson({ b: 1, a: [{ y: 2, x: t }] })).toBe(canonicalJson({ a: [{ x: t, y: 2 }], b: 1 }));
    expect(canonicalJson({ b: 1, a: { d: t } })).toBe('{"a":{"d":"2026-05-04T10:00:00.000Z"},"b":1}');
  });
  it("refuses numbers without a JSON form", () => {
    expect(() => canonicalJson({ x: NaN })).toThrow(/no JSON form/);
  });
});

describe("stratigraphic equivalence of the chosen contexts", () => {
  const ids = ["a", "b", "c", "d", "e"];
  const ctx = (id: string, number: number) => ({ id, number });
  const rel = (fromId: string, kind: RelationRow["kind"], toId: string): RelationRow => ({ fromId, kind, toId });

  it("treats contexts joined by same_as (even through a third) as one surface", () => {
    const rels = [rel("a", "same_as", "b"), rel("b", "same_as", "c")];
    expect(stratigraphicWarnings([ctx("a", 1), ctx("c", 3)], ids, rels)).toEqual([]);
  });
  it("warns when one chosen context is later than another, directly or through the matrix", () => {
    const rels = [rel("a", "above", "d"), rel("d", "cuts", "b")];
    const w = stratigraphicWarnings([ctx("a", 1), ctx("b", 2)], ids, rels);
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ kind: "ordered", a: 1, b: 2 });
  });
  it("orders a context equivalent to a later one as later too", () => {
    const rels = [rel("e", "same_as", "a"), rel("a", "fills", "b")];
    expect(stratigraphicWarnings([ctx("e", 5), ctx("b", 2)], ids, rels)[0]).toMatchObject({
      kind: "ordered",
      a: 5,
      b: 2,
    });
  });
  it("says so when nothing in the record joins two contexts", () => {
    expect(stratigraphicWarnings([ctx("a", 1), ctx("b", 2)], ids, [])[0].kind).toBe("unrelated");
  });
});

describe("where the curve leaves the band", () => {
  it("names the wide departures with a cluster-size reading and counts brief crossings", () => {
    const deps = [
      { side: "above" as const, from: 0.1, to: 1.2, rejoins: true },
      { side: "below" as const, from: 1.5, to: 1.52, rejoins: true },
    ];
    expect(mainDepartures(deps, 2).shown).toHaveLength(1);
    const lines = departureSentences(deps, 2, "l");
    expect(lines[0]).toContain("rejoins it at 1.20 m");
    expect(lines[0]).toContain("tends to overstate");
    expect(lines[1]).toContain("1 brief crossing");
  });
  it("reads no cluster size from crossings when the global test found nothing", () => {
    const lines = departureSentences([{ side: "above", from: 0.8, to: 1.1, rejoins: true }], 2, "l", false);
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain("no cluster size should be read");
    expect(lines[0]).not.toContain("overstate");
  });
});

describe("putting a saved run back in the form", () => {
  it("gives back the same request: scope, tests, parameters and seed", async () => {
    const { formFromRun, toRequest } = await import("@/components/patterns/form-state");
    const { testSchema } = await import("@/lib/schemas/run");
    const id = (k: number) => `00000000-0000-4000-8000-00000000000${k}`;
    const tests = [
      { type: "l-envelope", class: id(3), statistic: "dclf", count: "poisson", correction: "translation" },
      { type: "l-envelope", class: id(4), statistic: "dclf", count: "poisson", correction: "translation" },
      { type: "cross-l", a: id(3), b: id(4), null: "a-fixed", correction: "translation", statistic: "dclf" },
      { type: "quadrat", class: id(3), cellSize: 1.5 },
      { type: "quadrat", class: id(4), cellSize: 1.5 },
    ].map((t) => testSchema.parse(t));
    const run = {
      scope: { trenchId: id(1), contextIds: [id(2)], classIds: [id(3), id(4)] },
      seed: 77,
      params: { rmax: 1.75, nsim: 499, level: 0.01, tests },
    };
    const req = toRequest(formFromRun(run));
    expect(req.scope).toEqual(run.scope);
    expect(req.params).toEqual({ rmax: 1.75, nsim: 499, level: 0.01, seed: 77 });
    const key = (t: { type: string }) => JSON.stringify(t);
    expect(req.tests.map((t) => testSchema.parse(t)).sort((a, b) => key(a).localeCompare(key(b)))).toEqual(
      [...tests].sort((a, b) => key(a).localeCompare(key(b))),
    );
    expect(req.squareTests).toBeUndefined();
  });

  it("keeps the depth limits: the level range and the chosen spits", async () => {
    const { formFromRun, toRequest } = await import("@/components/patterns/form-state");
    const id = (k: number) => `00000000-0000-4000-8000-00000000000${k}`;
    const run = {
      scope: {
        trenchId: id(1),
        contextIds: [id(2)],
        classIds: [id(3)],
        levelFrom: 41.2,
        levelTo: 41.35,
        spitIds: [id(5)],
      },
      seed: 9,
      params: {
        rmax: 1,
        nsim: 99,
        level: 0.05,
        tests: [{ type: "pcf-envelope" as const, class: id(3), count: "fixed" as const, statistic: "dclf" as const }],
      },
    };
    const form = formFromRun(run);
    expect([form.levelFrom, form.levelTo, form.spitIds]).toEqual(["41.2", "41.35", [id(5)]]);
    expect(toRequest(form).scope).toEqual(run.scope);
    // A run with no depth limits reopens with none.
    const whole = toRequest(
      formFromRun({ ...run, scope: { trenchId: id(1), contextIds: [id(2)], classIds: [id(3)] } }),
    );
    expect(whole.scope).toEqual({ trenchId: id(1), contextIds: [id(2)], classIds: [id(3)] });
  });

  it("keeps the square-count tests and their options", async () => {
    const { formFromRun, toRequest } = await import("@/components/patterns/form-state");
    const id = (k: number) => `00000000-0000-4000-8000-00000000000${k}`;
    const { squareTestSchema } = await import("@/lib/schemas/run");
    const asked = { neighbours: { type: "rook", from: "shapes" }, style: "binary", variable: "count", minArea: 0.1 };
    const squareTests = [
      squareTestSchema.parse({ type: "moran", ...asked }),
      squareTestSchema.parse({ type: "getis-ord", ...asked }),
    ];
    const run = {
      scope: { trenchId: id(1), contextIds: [id(2)], classIds: [id(3)] },
      seed: 5,
      params: {
        rmax: 1,
        nsim: 999,
        level: 0.05,
        tests: [],
        squareTests: [...squareTests],
      },
    };
    const req = toRequest(formFromRun(run));
    expect(req.tests).toEqual([]);
    expect(req.squareTests?.map((t) => squareTestSchema.parse(t))).toEqual(squareTests);
  });

  it("keeps a cross-K test cross-K, and a cross-L test cross-L", async () => {
    const { formFromRun, toRequest } = await import("@/components/patterns/form-state");
    const { testSchema } = await import("@/lib/schemas/run");
    const id = (k: number) => `00000000-0000-4000-8000-00000000000${k}`;
    const run = (fun: "K" | "L") => ({
      scope: { trenchId: id(1), contextIds: [id(2)], classIds: [id(3), id(4)] },
      seed: 5,
      params: {
        rmax: 1,
        nsim: 99,
        level: 0.05,
        tests: [testSchema.parse({ type: "cross-l", a: id(3), b: id(4), count: "fixed", statistic: "dclf", fun })],
      },
    });
    expect(formFromRun(run("K")).cross.fun).toBe("K");
    expect(toRequest(formFromRun(run("K"))).tests.map((t) => testSchema.parse(t))).toEqual(run("K").params.tests);
    expect(formFromRun(run("L")).cross.fun).toBe("L");
    expect(toRequest(formFromRun(run("L"))).tests.map((t) => testSchema.parse(t))).toEqual(run("L").params.tests);
  });
});
