import "server-only";
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { trenches } from "@/db/schema";
import { reduceLevelRun } from "@/lib/levels/levelling";
import { contextsForExport } from "../export/contexts-export";
import { allFinds } from "../finds";
import { allSamples } from "../samples";
import { accountSequence } from "../sample-accounting";
import { loadLevelBook } from "./level-book";
import { userNames } from "./user-names";

/**
 * What the printed registers (the paper fallback) show: every record of the register in number order, whether
 * it is signed off (a find or a sample is signed off with its context), and the number accounting of its
 * sequence to close the register, so the paper says which numbers were handed out and what became of them.
 */

export async function printedContextRegister(db: Db, siteId: string) {
  const [rows, accounting] = await Promise.all([contextsForExport(db, siteId), accountSequence(db, siteId, "context")]);
  const names = await userNames(
    db,
    rows.flatMap((c) => [c.recordedBy, c.signedOffBy]),
  );
  return {
    rows: rows.map((c) => ({
      id: c.id,
      number: c.number,
      trenchCode: c.trenchCode,
      type: c.type,
      description: c.description,
      interpretation: c.interpretation,
      openedOn: c.openedOn,
      closedOn: c.closedOn,
      finds: c.finds,
      relations: c.relations,
      state: c.state,
      signedOff: c.state === "signed_off",
      signedOffAt: c.signedOffAt,
      signedOffBy: c.signedOffBy ? (names.get(c.signedOffBy) ?? null) : null,
      recordedBy: c.recordedBy ? (names.get(c.recordedBy) ?? null) : null,
    })),
    accounting,
  };
}

export async function printedFindsRegister(db: Db, siteId: string) {
  const [rows, accounting] = await Promise.all([
    allFinds(db, siteId, { sort: "number", dir: "asc" }),
    accountSequence(db, siteId, "find"),
  ]);
  return {
    rows: rows.map((f) => ({
      id: f.id,
      number: f.number,
      trenchCode: f.trenchCode,
      contextNumber: f.contextNumber,
      classCode: f.classCode,
      classLabel: f.classLabel,
      x: f.x,
      y: f.y,
      z: f.z,
      count: f.count,
      weightG: f.weightG,
      description: f.description,
      recordedBy: f.recordedBy,
      recordedAt: f.recordedAt,
      signedOff: f.contextState === "signed_off",
    })),
    accounting,
  };
}

export async function printedSamplesRegister(db: Db, siteId: string) {
  const [rows, accounting] = await Promise.all([allSamples(db, siteId, {}), accountSequence(db, siteId, "sample")]);
  return {
    rows: rows.map((s) => ({
      id: s.id,
      number: s.number,
      type: s.type,
      status: s.status,
      trenchCode: s.trenchCode,
      contextNumber: s.contextNumber,
      spitNumber: s.spitNumber,
      x: s.x,
      y: s.y,
      z: s.z,
      volumeL: s.volumeL,
      purpose: s.purpose,
      takenBy: s.takenBy,
      takenOn: s.takenOn,
      signedOff: s.contextState === "signed_off",
    })),
    accounting,
  };
}

/**
 * The level book as booked, line by line (BS, IS, FS, the height of the plane of collimation where the
 * instrument was set up, the reduced level kept), with each run's arithmetic check (ΣBS − ΣFS = last RL −
 * first RL) and closure. A run is signed off with its trench; a run of no trench is never signed off.
 */
export async function printedLevelBook(db: Db, siteId: string) {
  const [book, trenchRows] = await Promise.all([
    loadLevelBook(db, siteId),
    db
      .select({ id: trenches.id, code: trenches.code, signedOffAt: trenches.signedOffAt })
      .from(trenches)
      .where(eq(trenches.siteId, siteId)),
  ]);
  const startLevel = new Map(book.benchmarks.map((b) => [b.code, b.level]));
  const signedOff = new Set(trenchRows.filter((t) => t.signedOffAt).map((t) => t.code));
  const runs = book.runs.map((run) => {
    // The book is reduced again for its heights of collimation and sums; the levels printed are those kept.
    let reduced: ReturnType<typeof reduceLevelRun> | null = null;
    const start = startLevel.get(run.startCode);
    if (start !== undefined) {
      try {
        reduced = reduceLevelRun({ startLevel: start, rows: run.lines, tolerance: run.tolerance });
      } catch {
        reduced = null;
      }
    }
    return {
      ...run,
      signedOff: run.trenchCode !== null && signedOff.has(run.trenchCode),
      lines: run.lines.map((l, i) => ({
        ...l,
        collimation: l.backsight !== null ? (reduced?.rows[i]?.heightOfInstrument ?? null) : null,
      })),
      sumBacksights: reduced?.sumBacksights ?? null,
      sumForesights: reduced?.sumForesights ?? null,
      rise: reduced?.rise ?? null,
      firstLevel: run.lines[0]?.level ?? null,
      lastLevel: run.lines[run.lines.length - 1]?.level ?? null,
    };
  });
  const closed = runs.filter((r) => r.misclosure !== null);
  return {
    benchmarks: book.benchmarks,
    runs,
    summary: {
      runs: runs.length,
      closedWithin: closed.filter((r) => r.withinTolerance).length,
      closedOutside: closed.filter((r) => r.withinTolerance === false).length,
      open: runs.length - closed.length,
      levels: runs.reduce((n, r) => n + r.lines.length, 0),
      notSignedOff: runs.filter((r) => !r.signedOff).length,
    },
  };
}

export type PrintedContextRegister = Awaited<ReturnType<typeof printedContextRegister>>;
export type PrintedFindsRegister = Awaited<ReturnType<typeof printedFindsRegister>>;
export type PrintedSamplesRegister = Awaited<ReturnType<typeof printedSamplesRegister>>;
export type PrintedLevelBook = Awaited<ReturnType<typeof printedLevelBook>>;
