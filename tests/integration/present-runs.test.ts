/**
 * Runs stored in the result shape Loamwork used up to December 2026 keep opening and reproducing.
 *
 * tests/fixtures/present-runs.json holds one run exactly as that code stored it (requested through the API,
 * run and read back from the database; class, trench and context ids replaced by {{placeholders}}, each
 * heat layer's pixel values by the SHA-256 of their JSON, the run's time by a round number). It asks for
 * every kind of distribution test with each choice that changes what is stored: the corrections, the
 * global statistics, one class fixed and random labelling, cross-K.
 *
 * Checked: the run opens with the result read into today's shape (the engine's own), which the workspace
 * shows word for word and curve for curve as it showed the stored one; and started again with the tests it
 * opened with, it gives that result, test for test, with the same plan layers.
 */
import { createHash } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { readRunFixture, startAgainAsOpened, storeRunFixture, type StoredRunFixture } from "../support/run-fixtures";
import { getDb } from "@/db/client";
import { runsRegister } from "@/lib/server/export/package-registers";
import { testViews } from "@/lib/patterns-view/test-view";
import type { RunResult } from "@/lib/api/run-result";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";

type StoredRun = StoredRunFixture<Record<string, unknown>>;

let d: DemoSite;
let stored: StoredRun[];
beforeAll(async () => {
  d = await seedDemoSite();
  stored = readRunFixture("present-runs.json", d);
});

/** What the workspace shows of a result, as the fixture keeps it: heat layers' pixels by their digest. */
function shown(result: RunResult): Record<string, unknown> {
  return {
    tests: testViews(result),
    classes: result.classes,
    correction: result.correction,
    outline: result.outline,
    points: result.finds,
    cautions: result.cautions,
    density: result.density.map((l) => ({
      ...l,
      // A run opened from the fixture has its digest already.
      values: Array.isArray(l.values)
        ? { sha256: createHash("sha256").update(JSON.stringify(l.values)).digest("hex") }
        : l.values,
    })),
    run: [result.engineVersion, result.seed, result.nsim, result.level, result.rmax, result.window.area],
  };
}
const keptShown = (r: Record<string, unknown>) => ({
  tests: r.tests,
  classes: r.classes,
  correction: r.correction,
  outline: r.outline,
  points: r.points,
  cautions: r.cautions,
  density: r.density,
  run: [r.engineVersion, r.seed, r.nsim, r.level, r.rmax, r.area],
});

describe("saved runs in the result shape of December 2026", { timeout: 180_000 }, () => {
  it("open with their result and reproduce it when started again", async () => {
    session.userId = d.people.specialist;
    for (const run of stored) {
      const runId = await storeRunFixture(d, run);
      const view = (await call(runRoute, "GET", { siteId: d.siteId, runId })).json;
      expect(view.status).toBe("done");
      expect(view.result.results).toHaveLength((run.result.tests as unknown[]).length);
      expect(view.result.elapsedMs).toBe(run.result.elapsedMs);
      expect(shown(view.result)).toEqual(keptShown(run.result));
      const rerun = await startAgainAsOpened(d.siteId, view);
      expect(shown(rerun.result)).toEqual(keptShown(run.result));
    }
  });

  it("go into a deposition package in today's shape, as the API gives them", async () => {
    session.userId = d.people.specialist;
    const [run] = stored;
    if (!run) throw new Error("the fixture holds no run");
    const runId = await storeRunFixture(d, run);
    const view = (await call(runRoute, "GET", { siteId: d.siteId, runId })).json;
    const { results } = await runsRegister(await getDb(), { siteId: d.siteId });
    const file = results.find((r) => r.path === `analysis/${runId}.json`);
    if (!file) throw new Error("the package has no file for the stored run");
    const packed = JSON.parse(file.json);
    expect(packed.run).toBe(runId);
    expect(packed.result.tests).toBeUndefined(); // the stored shape's name for them
    expect(packed.result).toEqual(view.result);
    expect(packed.params).toEqual(view.params);
  });
});
