/**
 * Saved runs from older versions of Loamwork keep opening and reproducing.
 *
 * tests/fixtures/former-runs.json holds two runs exactly as the former code stored them (requested, run and
 * read back from the database before the app took the engine's test descriptions; class, trench and
 * context ids replaced by {{placeholders}}, and each curve, histogram and cell grid by the SHA-256 of its
 * JSON to keep the file small). Such a run has tests named by `kind`, run on every class in scope, and
 * the edge correction beside them; former-run.ts reads it into the engine's tests.
 *
 * Checked: migration 0009 still renames the app's first test names in such a row; the row opens with the
 * engine's tests; and started again with the tests it opened with, it gives the stored result test for
 * test (same verdicts, p-values, sentences and curves), so the reading keeps each class's place in the
 * seed's streams.
 */
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { session, call } from "../support/harness";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { readRunFixture, startAgainAsOpened, storeRunFixture, type StoredRunFixture } from "../support/run-fixtures";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { testViews, type TestView } from "@/lib/patterns-view/test-view";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";

type StoredRun = StoredRunFixture<{ tests: Record<string, unknown>[] } & Record<string, unknown>>;

let d: DemoSite;
let former: StoredRun[];
beforeAll(async () => {
  d = await seedDemoSite();
  former = readRunFixture("former-runs.json", d);
});

/** A result test as the fixture keeps it: curves, histograms and cells by their digest. */
const digest = (t: TestView | Record<string, unknown>) => {
  const o: Record<string, unknown> = { ...t };
  for (const k of ["curve", "histogram", "cells"])
    if (k in o) o[k] = { sha256: createHash("sha256").update(asJsonb(o[k])).digest("hex") };
  return o;
};

/** JSON with its keys in the order the database's jsonb keeps them (shorter first, then by bytes), as digested. */
function asJsonb(v: unknown): string {
  const order = (a: string, b: string) => a.length - b.length || (a < b ? -1 : a > b ? 1 : 0);
  return JSON.stringify(v, (_key, value: unknown) =>
    value && typeof value === "object" && !Array.isArray(value)
      ? Object.fromEntries(Object.entries(value).sort(([a], [b]) => order(a, b)))
      : value,
  );
}

/**
 * The pictures' numbers, which the fixture keeps by digest only, left empty in a row stored from it, with
 * the plan's layers (heat layers, find positions), which it does not keep.
 */
const PICTURES: Record<string, unknown> = {
  curve: { r: [], obs: [] },
  histogram: { edges: [], counts: [] },
  cells: [],
};
const withoutPictures = (t: Record<string, unknown>) =>
  Object.fromEntries(Object.entries(t).filter(([k]) => !(k in PICTURES)));

async function storeFormer(run: StoredRun, opts: { pictures?: "empty" } = {}): Promise<string> {
  const result =
    opts.pictures === "empty"
      ? {
          density: [],
          points: [],
          ...run.result,
          tests: run.result.tests.map((t) => ({
            ...t,
            ...Object.fromEntries(
              Object.keys(PICTURES)
                .filter((k) => k in t)
                .map((k) => [k, PICTURES[k]]),
            ),
          })),
        }
      : run.result;
  return storeRunFixture(d, run, { result, fingerprint: "former" });
}

const OLD: [string, string][] = [
  ['"kind": "l-envelope"', '"kind": "l-csr"'],
  ['"kind": "pcf-envelope"', '"kind": "pcf"'],
  ['"kind": "k-difference"', '"kind": "k-diff"'],
  ['"kind": "inhomogeneous-l"', '"kind": "inhom-l"'],
  ['"null": "random-labelling"', '"null": "labelling"'],
  ['"null": "a-fixed"', '"null": "fixed-a"'],
];
const toOld = (json: unknown) =>
  OLD.reduce((t, [now, old]) => t.split(now).join(old), JSON.stringify(json).replace(/":/g, '": '));

describe("saved runs with the app's former test names", () => {
  it("are renamed by the migration to the names the former shape used", async () => {
    const runId = await storeFormer(former[0]!);
    const db = await getDb();
    const [fresh] = await db.select().from(s.analysisRuns).where(eq(s.analysisRuns.id, runId));
    if (!fresh) throw new Error("run not stored");

    // Written back as an older Loamwork stored it.
    const oldMethod = fresh.method
      .replace("l-envelope", "l-csr")
      .replace("pcf-envelope", "pcf")
      .replace("k-difference", "k-diff")
      .replace("inhomogeneous-l", "inhom-l");
    await db.execute(
      sql`UPDATE analysis_runs SET params = ${toOld(fresh.params)}::jsonb, result = ${toOld(fresh.result)}::jsonb, method = ${oldMethod} WHERE id = ${runId}`,
    );
    const [stale] = await db.select().from(s.analysisRuns).where(eq(s.analysisRuns.id, runId));
    expect(JSON.stringify(stale?.params)).toContain('"kind":"l-csr"');
    expect(JSON.stringify(stale?.result)).toContain('"null":"fixed-a"');
    expect(stale?.method).toContain("inhom-l");

    const migration = readFileSync(path.join(process.cwd(), "drizzle", "0009_stored_run_test_names.sql"), "utf8");
    for (const statement of migration.split("--> statement-breakpoint")) await db.execute(sql.raw(statement));

    const [renamed] = await db.select().from(s.analysisRuns).where(eq(s.analysisRuns.id, runId));
    expect(renamed?.params).toEqual(fresh.params);
    expect(renamed?.result).toEqual(fresh.result);
    expect(renamed?.method).toBe(fresh.method);
  });
});

describe("saved runs in the former shape (tests by kind, one correction for the run)", { timeout: 180_000 }, () => {
  it("open with the engine's tests, one per class, in the order the run read its classes", async () => {
    session.userId = d.people.specialist;
    const runId = await storeFormer(former[0]!, { pictures: "empty" });
    const view = (await call(runRoute, "GET", { siteId: d.siteId, runId })).json;
    // Read into today's shape, the result shows the same words as it was stored with.
    expect(testViews(view.result).map(withoutPictures)).toEqual(former[0]!.result.tests.map(withoutPictures));
    const { CHP, FLK, SHD } = d.cls;
    // The scope chose SHD, FLK, CHP; the run read its classes by code (CHP, FLK, SHD), and so do its tests.
    expect(view.params.tests).toEqual([
      ...[CHP, FLK, SHD].map((c) => ({
        type: "clark-evans",
        class: c,
        correction: "monte-carlo",
        alternative: "two-sided",
      })),
      ...[CHP, FLK, SHD].map((c) => ({
        type: "quadrat",
        class: c,
        nx: 4,
        ny: 4,
        cellSize: 1.5,
        alternative: "two-sided",
      })),
      // The run's border correction on L; the between-class tests fall back to isotropic, as they did.
      ...[CHP, FLK, SHD].map((c) => ({
        type: "l-envelope",
        class: c,
        count: "fixed",
        correction: "border",
        statistic: "dclf",
      })),
      ...[CHP, FLK, SHD].map((c) => ({ type: "pcf-envelope", class: c, count: "fixed", statistic: "dclf" })),
      {
        type: "cross-l",
        a: FLK,
        b: CHP,
        null: "a-fixed",
        count: "fixed",
        correction: "isotropic",
        statistic: "dclf",
        fun: "L",
      },
      {
        type: "cross-l",
        a: CHP,
        b: FLK,
        null: "random-labelling",
        count: "fixed",
        correction: "isotropic",
        statistic: "dclf",
        fun: "K",
      },
      { type: "k-difference", a: FLK, b: SHD, correction: "isotropic", statistic: "dclf" },
      { type: "inhomogeneous-l", class: CHP, reference: FLK, statistic: "dclf" },
    ]);
    expect(testViews(view.result).map((t: TestView) => t.kind)).toEqual(
      view.params.tests.map((t: { type: string }) => t.type),
    );
  });

  it("started again with the tests they open with, reproduce the stored result test for test", async () => {
    session.userId = d.people.specialist;
    for (const run of former) {
      const runId = await storeFormer(run, { pictures: "empty" });
      const view = (await call(runRoute, "GET", { siteId: d.siteId, runId })).json;
      const rerun = await startAgainAsOpened(d.siteId, view);
      expect(testViews(rerun.result).map(digest)).toEqual(run.result.tests);
      expect(rerun.result.correction).toBe(run.result.correction);
      expect(rerun.result.classes).toEqual(run.result.classes);
    }
  });
});
