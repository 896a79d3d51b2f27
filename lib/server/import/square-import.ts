import "server-only";
import { randomUUID } from "node:crypto";
import { and, eq, inArray, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contexts, spits, squareCounts, squareSamples } from "@/db/schema";
import type { SquareImportInput } from "@/lib/schemas/squares";
import { recordAudit } from "@/lib/server/audit";
import { badInput, conflict } from "@/lib/server/errors";
import { assertContextsWritable } from "@/lib/server/locks";
import type { SiteActor } from "@/lib/server/membership";
import { gridOf, trenchSquares } from "@/lib/server/squares";
import { getTrench } from "@/lib/server/trenches";
import { loadImportLookups } from "./lookups";
import { parseCsv } from "./parse";
import { checkSquareRows, findSquareColumns, type SquareLookups } from "./square-rows";

async function loadSquareLookups(db: Db | Tx, actor: SiteActor, trenchId: string): Promise<SquareLookups> {
  const trench = await getTrench(db, actor.site.id, trenchId);
  const grid = gridOf(trench);
  if (!grid)
    throw conflict(`Trench ${trench.code} has no square grid yet; a director sets its square size and origin first.`);
  const squares = trenchSquares(trench, grid);
  const base = await loadImportLookups(db, actor.site.id);
  const rows = await db
    .select({ id: spits.id, contextId: spits.contextId, number: spits.number })
    .from(spits)
    .innerJoin(contexts, eq(contexts.id, spits.contextId))
    .where(eq(contexts.trenchId, trench.id));
  return {
    ...base,
    trench: { id: trench.id, code: trench.code },
    grid,
    squares,
    spits: new Map(rows.map((s) => [`${s.contextId}:${s.number}`, s.id])),
  };
}

function readFile(input: SquareImportInput) {
  const csv = parseCsv(input.csv);
  const { columns, missing } = findSquareColumns(csv.headers);
  if (missing.length) {
    throw badInput(
      `The file has no ${missing.join(", ")} column${missing.length > 1 ? "s" : ""}; the header needs square, context, class and count.`,
      { csv: [`Missing: ${missing.join(", ")}.`] },
    );
  }
  if (!csv.rows.length) throw badInput("The file has a header but no rows.");
  return { csv, columns };
}

/** Checks every row of a square-count file and reports; writes nothing. */
async function checkSquareImport(db: Db, actor: SiteActor, input: SquareImportInput) {
  const { csv, columns } = readFile(input);
  const check = checkSquareRows(csv, columns, await loadSquareLookups(db, actor, input.trenchId));
  return {
    dryRun: true,
    rowCount: check.rows,
    validCount: check.rows - check.errors.length,
    squares: check.units.length,
    errors: check.errors,
    importId: null,
  };
}

/**
 * Imports a square-count file in one transaction, every row or none. A square already recorded in the same
 * context and spit keeps the classes the file does not name; the file's classes replace their earlier counts.
 */
export async function importSquareCounts(db: Db, actor: SiteActor, input: SquareImportInput) {
  if (input.dryRun) return checkSquareImport(db, actor, input);
  const { csv, columns } = readFile(input);
  return db.transaction(async (tx) => {
    const check = checkSquareRows(csv, columns, await loadSquareLookups(tx, actor, input.trenchId));
    if (check.errors.length) {
      const n = check.errors.length;
      throw badInput(
        `${n} of ${check.rows} rows cannot be imported, so nothing was imported. Fix ${n === 1 ? "it" : "them"} and upload the file again.`,
        undefined,
        { errors: check.errors },
      );
    }
    await assertContextsWritable(tx, [...check.contextIds], "given counts by square");
    const importId = randomUUID();
    for (const unit of check.units) {
      const key = and(
        eq(squareSamples.contextId, unit.contextId),
        unit.spitId ? eq(squareSamples.spitId, unit.spitId) : sql`${squareSamples.spitId} is null`,
        eq(squareSamples.col, unit.col),
        eq(squareSamples.row, unit.row),
      );
      const [old] = await tx.select().from(squareSamples).where(key);
      const before = old
        ? { ...old, counts: await tx.select().from(squareCounts).where(eq(squareCounts.sampleId, old.id)) }
        : null;
      const [sample] = old
        ? await tx
            .update(squareSamples)
            .set({
              ...(unit.excavatedArea !== null && { excavatedArea: unit.excavatedArea }),
              recordedBy: actor.userId,
              updatedAt: new Date(),
            })
            .where(eq(squareSamples.id, old.id))
            .returning()
        : await tx
            .insert(squareSamples)
            .values({
              siteId: actor.site.id,
              trenchId: input.trenchId,
              contextId: unit.contextId,
              spitId: unit.spitId,
              col: unit.col,
              row: unit.row,
              excavatedArea: unit.excavatedArea,
              recordedBy: actor.userId,
            })
            .returning();
      if (old)
        await tx.delete(squareCounts).where(
          and(
            eq(squareCounts.sampleId, old.id),
            inArray(
              squareCounts.classId,
              unit.counts.map((c) => c.classId),
            ),
          ),
        );
      await tx.insert(squareCounts).values(unit.counts.map((c) => ({ sampleId: sample!.id, ...c })));
      const counts = await tx.select().from(squareCounts).where(eq(squareCounts.sampleId, sample!.id));
      await recordAudit(tx, {
        siteId: actor.site.id,
        actorId: actor.userId,
        action: "import",
        recordType: "square",
        recordId: sample!.id,
        before,
        after: { ...sample!, label: unit.label, counts, importId },
      });
    }
    const summary = {
      fileName: input.fileName,
      trenchId: input.trenchId,
      rows: check.rows,
      squares: check.units.length,
      kind: "square counts",
    };
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "import",
      recordType: "import",
      recordId: importId,
      after: summary,
    });
    return {
      dryRun: false,
      rowCount: check.rows,
      validCount: check.rows,
      squares: check.units.length,
      errors: [],
      importId,
    };
  });
}
