/**
 * Runs with tests on counts by grid square, stored in the shape Loamwork used up to December 2026, keep
 * opening and reproducing.
 *
 * tests/fixtures/present-square-runs.json holds two runs exactly as that code stored them (requested through
 * the API, run on the demo's counts by square in context 1005 and read back from the database; class, trench
 * and context ids replaced by {{placeholders}}, each heat layer's pixel values by the SHA-256 of their JSON,
 * the run's times by round numbers). Between them they ask for every square-count test (Moran's I, Geary's
 * C, local Moran's I, Getis–Ord Gi*), density and count, rook, queen and a distance band, binary and
 * row-standardised weights, a minimum area that leaves squares out, a class with no counts by square (not
 * run), and one run with a distribution test beside its square test.
 *
 * Checked: each run opens with the square tests it asked for read as the engine's spec, and its
 * square-count results read into today's shape (the engine's own result,
 * with the squares it was handed), which the workspace shows as it showed the stored ones: the same verdicts,
 * sentences, notes and squares. Started again with the tests it opened with, it gives them again test for
 * test and square for square, and the engine's new result holds everything read from the stored one.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { readRunFixture, startAgainAsOpened, storeRunFixture, type StoredRunFixture } from "../support/run-fixtures";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";
import { squareTestViews } from "@/lib/patterns-view/square-view";
import type { StoredSquareTest } from "@/lib/api/run-result";

type StoredRun = StoredRunFixture<{ squareTests: Record<string, unknown>[]; elapsedMs: number }>;

let d: DemoSite;
let stored: StoredRun[];
beforeAll(async () => {
  d = await seedDemoSite();
  stored = readRunFixture("present-square-runs.json", d);
});

describe("saved runs with square-count tests in the result shape of December 2026", { timeout: 180_000 }, () => {
  it("open with their square results and reproduce them when started again", async () => {
    session.userId = d.people.specialist;
    expect(stored.map((r) => r.result.squareTests.length)).toEqual([12, 1]);
    for (const run of stored) {
      const runId = await storeRunFixture(d, run);
      const view = (await call(runRoute, "GET", { siteId: d.siteId, runId })).json;
      expect(view.status).toBe("done");
      expect(view.result.elapsedMs).toBe(run.result.elapsedMs);
      // The square tests it asked for, stored in the former request's shape, read as the engine's spec.
      const asked = run.params.squareTests as { kind: string }[];
      expect(view.params.squareTests.map((t: { type: string }) => t.type)).toEqual(asked.map((t) => t.kind));
      expect(view.params.squareTests.every((t: object) => !("kind" in t))).toBe(true);
      const opened: StoredSquareTest[] = view.result.squareTests;
      expect(opened.every((t) => ("result" in t && t.result.spec) || ("refused" in t && t.spec))).toBe(true);
      expect(squareTestViews(view.result)).toEqual(run.result.squareTests);
      const rerun = await startAgainAsOpened(d.siteId, view);
      expect(rerun.params.squareTests).toEqual(view.params.squareTests);
      expect(squareTestViews(rerun.result)).toEqual(run.result.squareTests);
      const again: StoredSquareTest[] = rerun.result.squareTests;
      again.forEach((t, i) => {
        const was = opened[i]!;
        if ("refused" in was) expect(t).toEqual(was);
        else expect("result" in t && t.result).toMatchObject(was.result);
      });
    }
  });
});
