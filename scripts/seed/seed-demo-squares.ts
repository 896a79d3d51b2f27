import { and, asc, eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import * as s from "@/db/schema";
import { checkOutline } from "@/lib/geometry/outline";
import { clipSquares } from "@/lib/geometry/square-grid";
import { createRandom } from "@/lib/spatial";

type Ids = {
  siteId: string;
  trenchId: string;
  contextId: string;
  classId: (code: "CHP" | "BBN" | "FCR") => string;
  diggerId: string;
};

/** Poisson draw by inversion (Knuth); fine for the small means here. */
function poisson(mean: number, next: () => number): number {
  const limit = Math.exp(-mean);
  let k = 0;
  for (let p = next(); p > limit; p *= next()) k++;
  return k;
}

/**
 * Invented counts by square for the demo: trench A (the knapping floor) gets a 1 m grid through the site
 * origin, and context 1005's sieved chips, burnt bone and fire-cracked stone are counted per square in its
 * two spits. Chips crowd round the two knapping spots, as the piece-plotted flakes do; spit 2 is dug only in
 * the northern squares so far, and square 3/2 was half dug in spit 1 (a sondage took the rest).
 */
export async function seedDemoSquares(tx: Tx, ids: Ids): Promise<void> {
  const [trench] = await tx
    .update(s.trenches)
    .set({ squareSize: 1, squareOriginX: 0, squareOriginY: 0 })
    .where(eq(s.trenches.id, ids.trenchId))
    .returning();
  const check = checkOutline(trench!.outline);
  if (!check.ok) throw new Error(check.reason);
  const squares = clipSquares(check.window, { size: 1, originX: 0, originY: 0 });
  const spits = await tx
    .select()
    .from(s.spits)
    .where(and(eq(s.spits.contextId, ids.contextId)))
    .orderBy(asc(s.spits.number));
  const rng = createRandom(20261216);
  const next = () => Math.max(rng.next(), 1e-12);
  const spots: [number, number][] = [
    [2.2, 2.0],
    [2.6, 6.2],
  ];
  for (const [k, spit] of spits.entries()) {
    for (const sq of squares) {
      if (k === 1 && sq.row < 4) continue;
      const cx = (sq.x0 + sq.x1) / 2,
        cy = (sq.y0 + sq.y1) / 2;
      const near = Math.max(...spots.map(([x, y]) => Math.exp(-((cx - x) ** 2 + (cy - y) ** 2) / (2 * 1.1 ** 2))));
      const half = k === 0 && sq.col === 3 && sq.row === 2;
      const area = half ? sq.area / 2 : sq.area;
      const chips = poisson((4 + 60 * near) * area * (k === 0 ? 1 : 0.5), next);
      const bone = poisson(1.2 * area, next);
      const stone = poisson(2 * area, next);
      const [sample] = await tx
        .insert(s.squareSamples)
        .values({
          siteId: ids.siteId,
          trenchId: ids.trenchId,
          contextId: ids.contextId,
          spitId: spit.id,
          col: sq.col,
          row: sq.row,
          excavatedArea: half ? area : null,
          recordedBy: ids.diggerId,
        })
        .returning();
      await tx.insert(s.squareCounts).values([
        { sampleId: sample!.id, classId: ids.classId("CHP"), count: chips, weightG: Math.round(chips * 0.4 * 10) / 10 },
        { sampleId: sample!.id, classId: ids.classId("BBN"), count: bone, weightG: null },
        { sampleId: sample!.id, classId: ids.classId("FCR"), count: stone, weightG: Math.round(stone * 85) },
      ]);
    }
  }
}
