import { and, eq, gt, lte, sql } from "drizzle-orm";
import type { Tx } from "@/db/client";
import * as s from "@/db/schema";
import { reduceLevelRun } from "@/lib/levels/levelling";

type Ids = {
  siteId: string;
  trenchId: Record<"A" | "B" | "C", string>;
  contextId: (n: number) => string;
  diggerId: string;
};

/**
 * The demo's levels (invented): two temporary benchmarks, one closed levelling run in trench B that reaches
 * the base of the burnt spread 1.45 m below the ground (so the deep-trench caution shows from levels), and
 * two 5 cm spits in the knapping floor 1005 holding its finds.
 */
export async function seedDemoLevels(tx: Tx, ids: Ids): Promise<void> {
  const [wh1, wh2] = await tx
    .insert(s.benchmarks)
    .values([
      {
        siteId: ids.siteId,
        code: "TBM WH1",
        description: "Steel pin at grid peg WH1, concreted in.",
        x: 0,
        y: 0,
        level: 50,
        createdBy: ids.diggerId,
      },
      {
        siteId: ids.siteId,
        code: "TBM WH2",
        description: "Nail in the gatepost by the spoil heap.",
        x: 15,
        y: 10,
        level: 49.874,
        createdBy: ids.diggerId,
      },
    ])
    .returning();
  const base2002 = ids.contextId(2002);
  const book: s.LevelBookLine[] = [
    {
      station: "TBM WH1",
      target: "benchmark",
      targetId: wh1!.id,
      backsight: 1.21,
      intermediate: null,
      foresight: null,
    },
    {
      station: "ground, trench B",
      target: "ground",
      targetId: null,
      backsight: null,
      intermediate: 1.86,
      foresight: null,
    },
    {
      station: "base of 2002",
      target: "context_base",
      targetId: base2002,
      backsight: null,
      intermediate: 3.31,
      foresight: null,
    },
    { station: "CP1", target: "change_point", targetId: null, backsight: 1.377, intermediate: null, foresight: 1.502 },
    {
      station: "TBM WH2",
      target: "benchmark",
      targetId: wh2!.id,
      backsight: null,
      intermediate: null,
      foresight: 1.209,
    },
  ];
  const reduced = reduceLevelRun({ startLevel: wh1!.level, rows: book, closingLevel: wh2!.level, tolerance: 0.005 });
  const [run] = await tx
    .insert(s.levelRuns)
    .values({
      siteId: ids.siteId,
      trenchId: ids.trenchId.B,
      takenOn: "2026-06-10",
      startBenchmarkId: wh1!.id,
      closingBenchmarkId: wh2!.id,
      book,
      tolerance: 0.005,
      misclosure: reduced.misclosure,
      withinTolerance: reduced.withinTolerance,
      recordedBy: ids.diggerId,
    })
    .returning();
  await tx.insert(s.spotLevels).values(
    reduced.rows.map((r, i) => ({
      siteId: ids.siteId,
      runId: run!.id,
      line: i,
      target: book[i]!.target,
      targetId: book[i]!.targetId,
      station: r.station,
      level: r.level,
    })),
  );
  const knapping = ids.contextId(1005);
  const spitRows = await tx
    .insert(s.spits)
    .values([
      {
        siteId: ids.siteId,
        contextId: knapping,
        number: 1,
        topLevel: 49.33,
        baseLevel: 49.27,
        createdBy: ids.diggerId,
      },
      {
        siteId: ids.siteId,
        contextId: knapping,
        number: 2,
        topLevel: 49.27,
        baseLevel: 49.21,
        createdBy: ids.diggerId,
      },
    ])
    .returning();
  for (const spit of spitRows) {
    await tx
      .update(s.finds)
      .set({ spitId: spit.id })
      .where(
        and(
          eq(s.finds.contextId, knapping),
          gt(s.finds.z, sql`${spit.baseLevel}`),
          lte(s.finds.z, sql`${spit.topLevel}`),
        ),
      );
  }
}
