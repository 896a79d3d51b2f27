/**
 * Distribution tests on the demo site (db/seed-demo.ts): trench A, context 1005, where the seed lays out FLK
 * clustered, CHP going with FLK, FCR evenly spread and SHD at random. The expected verdicts are the layouts
 * the seed draws them from (its own simulation design), not numbers from an outside source.
 * Fewer simulations than the workspace's default (199 instead of 999) keep the suite short; the verdicts
 * here have p at the floor 1/(s+1) or far above 0.05, so 199 decides them as clearly.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { DEMO_USERS, seedDemo } from "@/db/seed-demo";
import { runsIdle } from "@/lib/server/jobs/runner";
import type { RunView } from "@/lib/server/analysis/run-view";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";

let demo: Awaited<ReturnType<typeof demoScope>>;

async function demoScope() {
  const db = await getDb();
  const { siteId } = await seedDemo(db);
  const [trench] = await db.select().from(s.trenches).where(and(eq(s.trenches.siteId, siteId), eq(s.trenches.code, "A")));
  const contexts = await db.select().from(s.contexts).where(eq(s.contexts.trenchId, trench.id));
  const classes = await db.select().from(s.artefactClasses).where(eq(s.artefactClasses.siteId, siteId));
  const [specialist] = await db.select().from(s.users).where(eq(s.users.email, DEMO_USERS[1].email));
  return {
    siteId, trenchId: trench.id, specialist: specialist.id,
    ctx: Object.fromEntries(contexts.map((c) => [c.number, c.id])) as Record<number, string>,
    cls: Object.fromEntries(classes.map((c) => [c.code, c.id])) as Record<string, string>,
  };
}

async function runToEnd(body: unknown): Promise<RunView> {
  session.userId = demo.specialist;
  const started = await call(runsRoute, "POST", { siteId: demo.siteId }, body);
  expect(started.status, JSON.stringify(started.json)).toBe(201);
  await runsIdle();
  const read = await call(runRoute, "GET", { siteId: demo.siteId, runId: started.json.id });
  expect(read.status).toBe(200);
  expect(read.json.status, read.json.error).toBe("done");
  return read.json;
}

beforeAll(async () => {
  demo = await demoScope();
});

describe("verdicts on the demo site, trench A context 1005", () => {
  it("FLK clustered, SHD no evidence, FCR evenly spread (Besag's L, DCLF test under CSR)", async () => {
    const run = await runToEnd({
      scope: { trenchId: demo.trenchId, contextIds: [demo.ctx[1005]], classIds: [demo.cls.FLK, demo.cls.SHD, demo.cls.FCR] },
      tests: [{ kind: "l-csr" }],
      params: { nsim: 199, seed: 7 },
    });
    const verdict = (code: string) => run.result!.tests.find((t) => t.kind === "l-csr" && "classId" in t && t.classId === demo.cls[code])!;
    expect(verdict("FLK").verdict).toBe("clustered");
    expect(verdict("FLK").p).toBeLessThanOrEqual(0.05);
    expect(verdict("SHD").verdict).toBe("no-evidence");
    expect(verdict("FCR").verdict).toBe("regular");
    const flk = verdict("FLK");
    if (flk.kind !== "l-csr") throw new Error("wrong kind");
    expect(flk.clusterScale).not.toBeNull();
    expect(run.progress).toBe(1);
  });
});
