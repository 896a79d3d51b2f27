import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { createFind, deleteFind } from "@/lib/server/finds";
import { recordLevelRun } from "@/lib/server/level-runs";
import { loadSiteActor } from "@/lib/server/membership";
import { reserveNumberBlock } from "@/lib/server/number-blocks";
import {
  printedContextRegister,
  printedFindsRegister,
  printedLevelBook,
  printedSamplesRegister,
} from "@/lib/server/reads/printed-registers";
import { createSample, deleteSample } from "@/lib/server/samples";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { makeBenchmark } from "./role-cases/levels";

/**
 * The printed registers (the paper fallback): every record in number order, marked when not signed off, and
 * closed by the accounting of its numbers — issued, used, reserved on a device, void with the reason.
 */

async function secondContext(fx: SiteFixture, number: number) {
  const db = await getDb();
  const [c] = await db
    .insert(schema.contexts)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, number, type: "fill" })
    .returning();
  return c!;
}

async function signOff(contextId: string) {
  const db = await getDb();
  await db
    .update(schema.contexts)
    .set({ state: "signed_off", signedOffAt: new Date() })
    .where(eq(schema.contexts.id, contextId));
}

const find = (contextId: string, classId: string) => ({
  contextId,
  classId,
  x: 1.5,
  y: 1.5,
  description: "",
  method: "typed" as const,
});

describe("printed registers", () => {
  it("finds: every find in order, unsigned ones marked, and the accounting's issued, used, void and reserved", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const digger = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    const closed = await secondContext(fx, fx.context.number + 1);
    const a = await createFind(db, digger, find(closed.id, fx.cls.id)); // 1, in the context signed off below
    const b = await createFind(db, digger, find(fx.context.id, fx.cls.id)); // 2
    const c = await createFind(db, digger, find(fx.context.id, fx.cls.id)); // 3, deleted
    await createFind(db, digger, find(fx.context.id, fx.cls.id)); // 4
    await deleteFind(db, digger, c.id);
    await db.update(schema.sites).set({ numberBlockSize: 5 }).where(eq(schema.sites.id, fx.site.id));
    const block = await reserveNumberBlock(
      db,
      await loadSiteActor(db, fx.people.digger.id, fx.site.id),
      { kind: "find", deviceLabel: "Tablet 2" },
      randomUUID(),
    );
    await signOff(closed.id);

    const r = await printedFindsRegister(db, fx.site.id);
    expect(r.rows.map((f) => [f.number, f.signedOff])).toEqual([
      [a.number, true],
      [b.number, false],
      [4, false],
    ]);
    expect(r.accounting.sequence).toBe("find");
    expect(r.accounting.highest).toBe(9); // 4 handed out one by one, then the block 5–9
    expect(r.accounting.totals).toMatchObject({ find: 3, void: 1, reserved: 5, unassigned: 0 });
    expect(r.accounting.ranges).toEqual([
      { first: 1, last: 2, status: "find" },
      expect.objectContaining({ first: 3, last: 3, status: "void", reason: "find deleted" }),
      { first: 4, last: 4, status: "find" },
      expect.objectContaining({ first: 5, last: 9, status: "reserved", deviceLabel: "Tablet 2", blockId: block.id }),
    ]);
  });

  it("samples in their own sequence: a deleted sample's number is void with its reason, never 'not handed out'", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const digger = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    const closed = await secondContext(fx, fx.context.number + 1);
    const bulk = (contextId: string) => ({ contextId, type: "bulk" as const, purpose: "flotation", volumeL: 40 });
    const s1 = await createSample(db, digger, bulk(closed.id));
    const s2 = await createSample(db, digger, bulk(fx.context.id));
    await createSample(db, digger, bulk(fx.context.id));
    await deleteSample(db, digger, s2.id, "bag split in the rain");
    await createFind(db, digger, find(fx.context.id, fx.cls.id)); // finds keep their own numbers
    await signOff(closed.id);

    const r = await printedSamplesRegister(db, fx.site.id);
    expect(r.rows.map((s) => [s.number, s.signedOff])).toEqual([
      [s1.number, true],
      [3, false],
    ]);
    expect(r.accounting.sequence).toBe("sample");
    expect(r.accounting.highest).toBe(3);
    expect(r.accounting.totals).toMatchObject({ sample: 2, void: 1, unassigned: 0, find: 0 });
    expect(r.accounting.ranges).toEqual([
      { first: 1, last: 1, status: "sample" },
      expect.objectContaining({ first: 2, last: 2, status: "void", reason: "sample deleted: bag split in the rain" }),
      { first: 3, last: 3, status: "sample" },
    ]);
  });

  it("samples sharing the finds' numbers are accounted in the finds' sequence", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db.update(schema.sites).set({ samplesShareFindNumbers: true }).where(eq(schema.sites.id, fx.site.id));
    const digger = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    await createFind(db, digger, find(fx.context.id, fx.cls.id)); // 1
    await createSample(db, digger, { contextId: fx.context.id, type: "charcoal", purpose: "dating" }); // 2
    const r = await printedSamplesRegister(db, fx.site.id);
    expect(r.rows.map((s) => s.number)).toEqual([2]);
    expect(r.accounting.sequence).toBe("find");
    expect(r.accounting.ranges).toEqual([
      { first: 1, last: 1, status: "find" },
      { first: 2, last: 2, status: "sample" },
    ]);
  });

  it("contexts: sheets in number order, unsigned ones marked, numbers never typed counted as not handed out", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const later = await secondContext(fx, fx.context.number + 3);
    await signOff(later.id);
    const r = await printedContextRegister(db, fx.site.id);
    expect(r.rows.map((c) => [c.number, c.signedOff])).toEqual([
      [fx.context.number, false],
      [later.number, true],
    ]);
    expect(r.accounting.sequence).toBe("context");
    expect(r.accounting.highest).toBe(later.number);
    expect(r.accounting.totals).toMatchObject({ context: 2, unassigned: later.number - 2 });
    expect(r.accounting.ranges.slice(-3)).toEqual([
      { first: fx.context.number, last: fx.context.number, status: "context" },
      { first: fx.context.number + 1, last: fx.context.number + 2, status: "unassigned" },
      { first: later.number, last: later.number, status: "context" },
    ]);
  });

  it("level book: heights of collimation at each set-up, the arithmetic check, signed off with its trench", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const digger = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    const start = await makeBenchmark(fx, 50);
    const close = await makeBenchmark(fx, 48.13);
    // The hand-worked book of lib/levels/levelling.test.ts (height-of-collimation booking, from memory).
    await recordLevelRun(db, digger, {
      takenOn: "2026-06-12",
      trenchId: fx.trench.id,
      startBenchmarkId: start.id,
      closingBenchmarkId: close.id,
      lines: [
        {
          station: start.code,
          target: "benchmark",
          targetId: null,
          backsight: 1.525,
          intermediate: null,
          foresight: null,
        },
        { station: "peg", target: "other", targetId: null, backsight: null, intermediate: 1.87, foresight: null },
        {
          station: "CP1",
          target: "change_point",
          targetId: null,
          backsight: 0.985,
          intermediate: null,
          foresight: 2.615,
        },
        {
          station: close.code,
          target: "benchmark",
          targetId: null,
          backsight: null,
          intermediate: null,
          foresight: 1.76,
        },
      ],
    });
    let book = await printedLevelBook(db, fx.site.id);
    expect(book.runs).toHaveLength(1);
    const run = book.runs[0]!;
    expect(run.lines.map((l) => l.collimation)).toEqual([51.525, null, 49.895, null]);
    expect(run.lines.map((l) => l.level)).toEqual([50, 49.655, 48.91, 48.135]);
    expect([run.sumBacksights, run.sumForesights, run.rise]).toEqual([2.51, 4.375, -1.865]);
    expect(run.misclosure).toBeCloseTo(0.005, 9);
    expect(run.signedOff).toBe(false);
    expect(book.summary).toMatchObject({ runs: 1, closedWithin: 1, closedOutside: 0, open: 0, notSignedOff: 1 });

    await db.update(schema.trenches).set({ signedOffAt: new Date() }).where(eq(schema.trenches.id, fx.trench.id));
    book = await printedLevelBook(db, fx.site.id);
    expect(book.runs[0]!.signedOff).toBe(true);
    expect(book.summary.notSignedOff).toBe(0);
  });
});
