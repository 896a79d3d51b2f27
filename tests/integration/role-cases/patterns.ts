import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import { nextCount, type RoleCases } from "./types";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runCancelRoute from "@/app/api/sites/[siteId]/runs/[runId]/cancel/route";

/** Twelve finds of the fixture's class spread over trench A (10 × 6 m, baulk at 4–6 × 2–3 left clear). */
async function placeFinds(fx: SiteFixture) {
  const db = await getDb();
  const spots = [
    [1, 1],
    [2, 4],
    [3, 5],
    [7, 1],
    [8, 4],
    [9, 5],
    [1, 5],
    [5, 5],
    [5, 0.5],
    [8, 2],
    [2, 2],
    [9, 0.5],
  ];
  await db.insert(schema.finds).values(
    spots.map(([x, y]) => ({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: fx.context.id,
      classId: fx.cls.id,
      number: 80000 + nextCount(),
      x,
      y,
      method: "typed" as const,
    })),
  );
}

export const patternsCases: RoleCases = {
  runsCreate: async (fx) => {
    await placeFinds(fx);
    return {
      mod: runsRoute,
      params: { siteId: fx.site.id },
      body: {
        scope: { trenchId: fx.trench.id, contextIds: [fx.context.id], classIds: [fx.cls.id] },
        tests: [{ kind: "clark-evans", correction: "monte-carlo" }],
        params: { nsim: 19, seed: 1 },
      },
    };
  },
  runCancel: async (fx) => {
    const db = await getDb();
    // A queued run that no queue holds: cancelling it only changes its row (and the audit trail).
    const [run] = await db
      .insert(schema.analysisRuns)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        scope: { trenchId: fx.trench.id, contextIds: [fx.context.id], classIds: [fx.cls.id] },
        method: "clark-evans",
        params: {},
        seed: 1,
        engineVersion: "test",
        fingerprint: "none",
      })
      .returning();
    return { mod: runCancelRoute, params: { siteId: fx.site.id, runId: run.id } };
  },
};
