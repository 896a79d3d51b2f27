import "server-only";
import { and, asc, count, eq, inArray } from "drizzle-orm";
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import type { Db } from "@/db/client";
import {
  analysisRuns,
  boxes,
  contextRelations,
  contexts,
  finds,
  levelRuns,
  photos,
  samples,
  spits,
  spotLevels,
  trenches,
} from "@/db/schema";
import { findsByNumber } from "@/lib/server/finds";
import { listBenchmarks } from "@/lib/server/benchmarks";
import { allSamples } from "@/lib/server/samples";
import { listClasses } from "@/lib/server/artefact-classes";
import { allDrawings } from "@/lib/server/drawings";
import { allRecordPhotos, type RecordPhotoRow } from "@/lib/server/record-photos";
import { facingWords } from "@/lib/schemas/record-photo";
import { userNames } from "@/lib/server/reads/user-names";
import { readStoredRun } from "@/lib/server/analysis/stored-result";
import { contextsForExport } from "./contexts-export";
import {
  contextCsvColumns,
  contextsCsv,
  drawingCsvColumns,
  drawingsCsv,
  findCsvColumns,
  findCsvRow,
  sampleCsvColumns,
  sampleCsvRow,
  toCsv,
  type CsvColumn,
} from "./csv";

/** One register of the package: its file under data/registers/, its columns, its rows as CSV text. */
export type PackageRegister = { file: string; title: string; columns: readonly CsvColumn[]; rows: number; csv: string };

/** What the readme says of a register; a streamed register's `rows` is final once its chunks are read. */
export type RegisterMeta = Omit<PackageRegister, "csv">;

/** A register too large to hold at once (the finds): its CSV in chunks of one page of rows each. */
export type StreamedRegister = { meta: RegisterMeta; chunks: AsyncIterable<Uint8Array> };

/** Whole site, or one trench (a trench's package holds only its own records). */
export type PackageScope = { siteId: string; trenchId?: string };

const yesNo = (b: boolean) => (b ? "yes" : "no");
const iso = (d: Date | null) => d?.toISOString() ?? "";

function register(file: string, title: string, columns: readonly CsvColumn[], rows: unknown[][]): PackageRegister {
  return { file, title, columns, rows: rows.length, csv: toCsv(columns, rows) };
}

/** The finds register of the package: the export's columns, the context's state, and where each find is now. */
export const findPackageColumns: readonly CsvColumn[] = [
  ...findCsvColumns,
  ["context_state", "text"],
  ["processing", "text"],
  ["sent_to", "text"],
  ["box", "number"],
  ["location", "text"],
];

const utf8 = new TextEncoder();

/** The finds, by number, read and written a page at a time: a site of any size costs one page of memory. */
export function findsRegister(db: Db, scope: PackageScope): StreamedRegister {
  const meta: RegisterMeta = { file: "finds.csv", title: "Finds register", columns: findPackageColumns, rows: 0 };
  async function* chunks() {
    yield utf8.encode(toCsv(findPackageColumns, []));
    for await (const page of findsByNumber(db, scope.siteId, { trenchId: scope.trenchId })) {
      meta.rows += page.length;
      const rows = page.map((f) => [...findCsvRow(f), f.contextState, f.processing, f.sentTo, f.boxNumber, f.location]);
      yield utf8.encode(`\r\n${toCsv(findPackageColumns, rows, { header: false })}`);
    }
  }
  return { meta, chunks: chunks() };
}

export async function contextsRegister(db: Db, scope: PackageScope, trenchCode?: string): Promise<PackageRegister> {
  const rows = (await contextsForExport(db, scope.siteId)).filter((c) => !trenchCode || c.trenchCode === trenchCode);
  return {
    file: "contexts.csv",
    title: "Context register",
    columns: contextCsvColumns,
    rows: rows.length,
    csv: contextsCsv(rows),
  };
}

export const relationColumns: readonly CsvColumn[] = [
  ["from_context", "number"],
  ["relation", "text"],
  ["to_context", "number"],
  ["from_state", "text"],
  ["to_state", "text"],
];

/** Each relation once, as stored ("1005 cuts 1004"); the reverse reading is implied. */
export async function relationsRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const sheets = await db
    .select({ id: contexts.id, number: contexts.number, state: contexts.state, trenchId: contexts.trenchId })
    .from(contexts)
    .where(eq(contexts.siteId, scope.siteId));
  const byId = new Map(sheets.map((c) => [c.id, c]));
  const rels = await db
    .select()
    .from(contextRelations)
    .where(eq(contextRelations.siteId, scope.siteId))
    .orderBy(asc(contextRelations.createdAt));
  const rows: unknown[][] = [];
  for (const r of rels) {
    const from = byId.get(r.fromId);
    const to = byId.get(r.toId);
    if (!from || !to) continue;
    if (scope.trenchId && from.trenchId !== scope.trenchId && to.trenchId !== scope.trenchId) continue;
    rows.push([from.number, r.kind, to.number, from.state, to.state]);
  }
  return register("relations.csv", "Stratigraphic relations", relationColumns, rows);
}

/** The samples register of the package: the export's columns and where each sample is kept. */
export const samplePackageColumns: readonly CsvColumn[] = [
  ...sampleCsvColumns,
  ["box", "number"],
  ["location", "text"],
];

export async function samplesRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const rows = await allSamples(db, scope.siteId, { trenchId: scope.trenchId });
  return register(
    "samples.csv",
    "Samples register",
    samplePackageColumns,
    rows.map((s) => [...sampleCsvRow(s), s.boxNumber, s.location]),
  );
}

/** Rows of the package's site, and only of its trench when the package is a trench's. */
function inScope(table: { siteId: AnyPgColumn; trenchId: AnyPgColumn }, scope: PackageScope) {
  return scope.trenchId
    ? and(eq(table.siteId, scope.siteId), eq(table.trenchId, scope.trenchId))
    : eq(table.siteId, scope.siteId);
}

export const boxColumns: readonly CsvColumn[] = [
  ["number", "number"],
  ["store", "text"],
  ["note", "text"],
  ["finds", "number"],
  ["samples", "number"],
];

/**
 * The box register: every box with the finds and samples of the package it holds (a trench's package lists
 * only the boxes that hold something of that trench).
 */
export async function boxesRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const findsIn = inScope(finds, scope);
  const samplesIn = inScope(samples, scope);
  const [rows, findCounts, sampleCounts] = await Promise.all([
    db.select().from(boxes).where(eq(boxes.siteId, scope.siteId)).orderBy(asc(boxes.number)),
    db.select({ boxId: finds.boxId, n: count() }).from(finds).where(findsIn).groupBy(finds.boxId),
    db.select({ boxId: samples.boxId, n: count() }).from(samples).where(samplesIn).groupBy(samples.boxId),
  ]);
  const held = (list: { boxId: string | null; n: number }[]) => new Map(list.map((r) => [r.boxId, Number(r.n)]));
  const [f, s] = [held(findCounts), held(sampleCounts)];
  return register(
    "boxes.csv",
    "Box register",
    boxColumns,
    rows
      .map((b) => [b.number, b.store, b.note, f.get(b.id) ?? 0, s.get(b.id) ?? 0])
      .filter((r) => !scope.trenchId || Number(r[3]) + Number(r[4]) > 0),
  );
}

export const trenchColumns: readonly CsvColumn[] = [
  ["code", "text"],
  ["name", "text"],
  ["state", "text"],
  ["signed_off_at", "text"],
  ["surface_rl_m", "number"],
];

export async function trenchesRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const rows = await db.select().from(trenches).where(eq(trenches.siteId, scope.siteId)).orderBy(asc(trenches.code));
  return register(
    "trenches.csv",
    "Trenches",
    trenchColumns,
    rows
      .filter((t) => !scope.trenchId || t.id === scope.trenchId)
      .map((t) => [t.code, t.name, t.signedOffAt ? "signed_off" : "open", iso(t.signedOffAt), t.surfaceLevel]),
  );
}

export const classColumns: readonly CsvColumn[] = [
  ["code", "text"],
  ["label", "text"],
  ["material", "text"],
  ["human_remains", "text"],
  ["finds", "number"],
];

export async function classesRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const [rows, found] = await Promise.all([
    listClasses(db, scope.siteId),
    db.select({ classId: finds.classId, n: count() }).from(finds).where(inScope(finds, scope)).groupBy(finds.classId),
  ]);
  const counts = new Map(found.map((f) => [f.classId, Number(f.n)]));
  return register(
    "classes.csv",
    "Artefact classes",
    classColumns,
    rows.map((c) => [c.code, c.label, c.material, yesNo(c.humanRemains), counts.get(c.id) ?? 0]),
  );
}

export const levelColumns: readonly CsvColumn[] = [
  ["run", "text"],
  ["taken_on", "text"],
  ["trench", "text"],
  ["line", "number"],
  ["station", "text"],
  ["target", "text"],
  ["target_record", "text"],
  ["level_rl_m", "number"],
  ["flagged", "text"],
  ["run_misclosure_m", "number"],
  ["run_within_tolerance", "text"],
];

/** Every reduced level the level book gave, with what it was taken on (a context or spit by number). */
export async function levelsRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const [runs, levels, sheets, slices, trenchRows, marks] = await Promise.all([
    db.select().from(levelRuns).where(eq(levelRuns.siteId, scope.siteId)).orderBy(asc(levelRuns.takenOn)),
    db.select().from(spotLevels).where(eq(spotLevels.siteId, scope.siteId)).orderBy(asc(spotLevels.line)),
    db.select({ id: contexts.id, number: contexts.number }).from(contexts).where(eq(contexts.siteId, scope.siteId)),
    db
      .select({ id: spits.id, number: spits.number, contextNumber: contexts.number })
      .from(spits)
      .innerJoin(contexts, eq(contexts.id, spits.contextId))
      .where(eq(spits.siteId, scope.siteId)),
    db.select({ id: trenches.id, code: trenches.code }).from(trenches).where(eq(trenches.siteId, scope.siteId)),
    listBenchmarks(db, scope.siteId),
  ]);
  // Only the finds a level was taken on: the site's finds may be many.
  const targets = [...new Set(levels.flatMap((l) => (l.targetId ? [l.targetId] : [])))];
  const found = targets.length
    ? await db
        .select({ id: finds.id, number: finds.number })
        .from(finds)
        .where(and(eq(finds.siteId, scope.siteId), inArray(finds.id, targets)))
    : [];
  const names = new Map<string, string>([
    ...sheets.map((c): [string, string] => [c.id, `context ${c.number}`]),
    ...slices.map((s): [string, string] => [s.id, `context ${s.contextNumber} spit ${s.number}`]),
    ...found.map((f): [string, string] => [f.id, `find ${f.number}`]),
    ...marks.map((b): [string, string] => [b.id, `benchmark ${b.code}`]),
  ]);
  const trenchCode = new Map(trenchRows.map((t) => [t.id, t.code]));
  const runOrder = new Map(runs.map((r, i) => [r.id, i]));
  const kept = runs.filter((r) => !scope.trenchId || r.trenchId === scope.trenchId);
  const runById = new Map(kept.map((r) => [r.id, r]));
  const rows = levels
    .filter((l) => runById.has(l.runId))
    .sort((a, b) => (runOrder.get(a.runId) ?? 0) - (runOrder.get(b.runId) ?? 0) || a.line - b.line)
    .map((l) => {
      const run = runById.get(l.runId)!;
      return [
        run.id,
        run.takenOn,
        run.trenchId ? (trenchCode.get(run.trenchId) ?? "") : "",
        l.line + 1,
        l.station,
        l.target,
        l.targetId ? (names.get(l.targetId) ?? "") : "",
        l.level,
        yesNo(l.flagged),
        run.misclosure,
        run.withinTolerance === null ? "" : yesNo(run.withinTolerance),
      ];
    });
  return register("levels.csv", "Level book: reduced levels", levelColumns, rows);
}

export const benchmarkColumns: readonly CsvColumn[] = [
  ["code", "text"],
  ["description", "text"],
  ["x", "number"],
  ["y", "number"],
  ["level_rl_m", "number"],
];

export async function benchmarksRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const marks = await listBenchmarks(db, scope.siteId);
  return register(
    "benchmarks.csv",
    "Temporary benchmarks",
    benchmarkColumns,
    marks.map((b) => [b.code, b.description, b.x, b.y, b.level]),
  );
}

export const photoColumns: readonly CsvColumn[] = [
  ["file", "text"],
  ["copy", "text"],
  ["file_name", "text"],
  ["photo_kind", "text"],
  ["photo_number", "number"],
  ["photo_of", "text"],
  ["context", "number"],
  ["find_number", "number"],
  ["trench", "text"],
  ["trench_state", "text"],
  ["record_state", "text"],
  ["facing", "text"],
  ["facing_degrees", "number"],
  ["scale_shown", "text"],
  ["caption", "text"],
  ["photographer", "text"],
  ["taken_at", "text"],
  ["taken_at_from", "text"],
  ["width_px", "number"],
  ["height_px", "number"],
  ["fitted_to_grid", "text"],
  ["uploaded_by", "text"],
  ["uploaded_at", "text"],
];

export type PackagePhoto = {
  id: string;
  siteId: string;
  fileKey: string;
  fileName: string;
  mimeType: string;
  displayPath: string | null;
  width: number | null;
  height: number | null;
  fitted: boolean;
  trenchCode: string;
  trenchSignedOff: boolean;
  uploadedBy: string;
  uploadedAt: Date;
  /** A plan underlay, or a record photo of the photo register with its sheet. */
  kind: "plan" | "record";
  record: RecordPhotoRow | null;
};

/**
 * The photos of the site (or trench): plan underlays in upload order, then the photo register in number
 * order (a record photo of a context or find belongs to that record's trench). Their files follow the registers.
 */
export async function packagePhotos(db: Db, scope: PackageScope): Promise<PackagePhoto[]> {
  const rows = await db
    .select({ p: photos, trenchCode: trenches.code, signedOffAt: trenches.signedOffAt })
    .from(photos)
    .leftJoin(trenches, eq(trenches.id, photos.trenchId))
    .where(and(eq(photos.siteId, scope.siteId), eq(photos.kind, "plan")))
    .orderBy(asc(photos.createdAt), asc(photos.id));
  const kept = rows.filter((r) => !scope.trenchId || r.p.trenchId === scope.trenchId);
  const records = await allRecordPhotos(db, scope.siteId, { trenchId: scope.trenchId });
  const files = new Map(
    records.length
      ? (
          await db
            .select()
            .from(photos)
            .where(
              inArray(
                photos.id,
                records.map((r) => r.id),
              ),
            )
        ).map((p) => [p.id, p])
      : [],
  );
  const signedOff = new Map(
    (
      await db
        .select({ id: trenches.id, at: trenches.signedOffAt })
        .from(trenches)
        .where(eq(trenches.siteId, scope.siteId))
    ).map((t) => [t.id, t.at !== null]),
  );
  const names = await userNames(db, [
    ...kept.map((r) => r.p.uploadedBy),
    ...[...files.values()].map((p) => p.uploadedBy),
  ]);
  const plan: PackagePhoto[] = kept.map(({ p, trenchCode, signedOffAt }) => ({
    id: p.id,
    siteId: p.siteId,
    fileKey: p.fileKey,
    fileName: p.fileName,
    mimeType: p.mimeType,
    displayPath: p.displayPath,
    width: p.width,
    height: p.height,
    fitted: p.fit !== null,
    trenchCode: trenchCode ?? "",
    trenchSignedOff: signedOffAt !== null,
    uploadedBy: p.uploadedBy ? (names.get(p.uploadedBy) ?? "") : "",
    uploadedAt: p.createdAt,
    kind: "plan",
    record: null,
  }));
  const recorded: PackagePhoto[] = records.flatMap((r) => {
    const p = files.get(r.id);
    if (!p) return [];
    return [
      {
        id: p.id,
        siteId: p.siteId,
        fileKey: p.fileKey,
        fileName: p.fileName,
        mimeType: p.mimeType,
        displayPath: p.displayPath,
        width: p.width,
        height: p.height,
        fitted: false,
        trenchCode: r.trenchCode,
        trenchSignedOff: signedOff.get(r.trenchId) ?? false,
        uploadedBy: p.uploadedBy ? (names.get(p.uploadedBy) ?? "") : "",
        uploadedAt: p.createdAt,
        kind: "record",
        record: r,
      },
    ];
  });
  return [...plan, ...recorded];
}

/** The photos register; `files` says which copy of each photo went into the package, and where. */
export function photosRegister(list: PackagePhoto[], files: Map<string, { path: string; copy: string }>) {
  return register(
    "photos.csv",
    "Photos",
    photoColumns,
    list.map((p) => {
      const r = p.record;
      return [
        files.get(p.id)?.path ?? "",
        files.get(p.id)?.copy ?? "missing",
        p.fileName,
        p.kind === "plan" ? "plan underlay" : "record",
        r?.number ?? null,
        r?.subject ?? "trench plan",
        r?.contextNumber ?? null,
        r?.findNumber ?? null,
        p.trenchCode,
        p.trenchSignedOff ? "signed_off" : "open",
        // A record photo is final once what it is of is: not yet signed off is marked here as in every register.
        r?.state ?? "",
        r ? facingWords(r.facing) : "",
        r?.facing ?? null,
        r?.scale ?? "",
        r?.caption ?? "",
        r?.takenBy ?? "",
        r?.takenAt ? iso(r.takenAt) : "",
        r ? (r.takenAtSource === "camera" ? "camera (EXIF)" : "upload time") : "",
        p.width,
        p.height,
        yesNo(p.fitted),
        p.uploadedBy,
        iso(p.uploadedAt),
      ];
    }),
  );
}

export const runColumns: readonly CsvColumn[] = [
  ["run", "text"],
  ["trench", "text"],
  ["method", "text"],
  ["status", "text"],
  ["seed", "number"],
  ["engine_version", "text"],
  ["fingerprint", "text"],
  ["created_at", "text"],
  ["finished_at", "text"],
  ["result_file", "text"],
];

/** The saved analysis runs with their fingerprints; each finished run's parameters and result as JSON. */
export async function runsRegister(db: Db, scope: PackageScope) {
  const rows = await db
    .select({ r: analysisRuns, trenchCode: trenches.code })
    .from(analysisRuns)
    .innerJoin(trenches, eq(trenches.id, analysisRuns.trenchId))
    .where(eq(analysisRuns.siteId, scope.siteId))
    .orderBy(asc(analysisRuns.createdAt), asc(analysisRuns.id));
  const kept = rows.filter(({ r }) => !scope.trenchId || r.trenchId === scope.trenchId);
  const results = kept
    .filter(({ r }) => r.status === "done")
    .map(({ r }) => ({
      path: `analysis/${r.id}.json`,
      json: JSON.stringify(
        // Runs stored in an older shape are written in today's, so that a package holds one shape of run.
        { run: r.id, method: r.method, scope: r.scope, seed: r.seed, ...readStoredRun(r) },
        null,
        1,
      ),
    }));
  const done = new Set(results.map((r) => r.path));
  const table = register(
    "analysis-runs.csv",
    "Saved analysis runs",
    runColumns,
    kept.map(({ r, trenchCode }) => [
      r.id,
      trenchCode,
      r.method,
      r.status,
      r.seed,
      r.engineVersion,
      r.fingerprint,
      iso(r.createdAt),
      iso(r.finishedAt),
      done.has(`analysis/${r.id}.json`) ? `analysis/${r.id}.json` : "",
    ]),
  );
  return { table, results };
}

export async function drawingsRegister(db: Db, scope: PackageScope): Promise<PackageRegister> {
  const rows = await allDrawings(db, scope.siteId, { trenchId: scope.trenchId });
  return {
    file: "drawings.csv",
    title: "Drawing register",
    columns: drawingCsvColumns,
    rows: rows.length,
    csv: drawingsCsv(rows),
  };
}
