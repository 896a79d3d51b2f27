import Papa from "papaparse";
import type { Context } from "@/db/schema";
import type { RegisterRow } from "@/lib/server/finds";
import type { SampleRegisterRow } from "@/lib/server/samples";
import type { DrawingRegisterRow } from "@/lib/server/drawings";
import { inertText, quoteGuarded } from "@/lib/csv-cells";

type Kind = "number" | "text";
export type CsvColumn = readonly [name: string, kind: Kind];

/** A number column's cell: the number itself, or empty when there is none. Anything else is a bug here. */
function numberCell(name: string, v: unknown): number | string {
  if (v === null || v === undefined || v === "") return "";
  if (typeof v !== "number" || !Number.isFinite(v))
    throw new Error(`CSV column ${name} holds ${typeof v}, not a number`);
  return v;
}

/**
 * CSV text through papaparse, each cell written by its column's kind: numbers as numbers, text made
 * inert against spreadsheet formulas (see lib/csv-cells.ts).
 */
export function toCsv(columns: readonly CsvColumn[], rows: unknown[][], { header = true } = {}): string {
  const data = rows.map((r) =>
    columns.map(([name, kind], i) => (kind === "number" ? numberCell(name, r[i]) : inertText(String(r[i] ?? "")))),
  );
  return Papa.unparse(
    { fields: columns.map(([name]) => name), data },
    { escapeFormulae: false, quotes: quoteGuarded, newline: "\r\n", header },
  );
}

/**
 * The register's columns; the header names are ones the import recognises, so a file round-trips. z_rl_m is the
 * reduced level in metres against the site's datum (empty when no level was taken).
 */
export const findCsvColumns: readonly CsvColumn[] = [
  ["number", "number"],
  ["trench", "text"],
  ["context", "number"],
  ["class", "text"],
  ["x", "number"],
  ["y", "number"],
  ["z_rl_m", "number"],
  ["count", "number"],
  ["weight_g", "number"],
  ["description", "text"],
  ["method", "text"],
  ["recorded_by", "text"],
  ["recorded_at", "text"],
  ["station_point", "text"],
];

export function findsCsv(rows: RegisterRow[]): string {
  return toCsv(findCsvColumns, rows.map(findCsvRow));
}

/** One find's cells, in findCsvColumns' order. */
export function findCsvRow(f: RegisterRow): unknown[] {
  return [
    f.number,
    f.trenchCode,
    f.contextNumber,
    f.classCode,
    f.x,
    f.y,
    f.z,
    f.count,
    f.weightG,
    f.description,
    f.method,
    f.recordedBy ?? "",
    f.recordedAt.toISOString(),
    f.stationPoint ?? "",
  ];
}

export type ContextExportRow = Context & { trenchCode: string; finds: number; relations: string };

export const contextCsvColumns: readonly CsvColumn[] = [
  ["number", "number"],
  ["trench", "text"],
  ["type", "text"],
  ["state", "text"],
  ["colour", "text"],
  ["compaction", "text"],
  ["composition", "text"],
  ["inclusions", "text"],
  ["description", "text"],
  ["interpretation", "text"],
  ["relations", "text"],
  ["finds", "number"],
  ["has_extent", "text"],
  ["signed_off_at", "text"],
];

export function contextsCsv(rows: ContextExportRow[]): string {
  return toCsv(
    contextCsvColumns,
    rows.map((c) => [
      c.number,
      c.trenchCode,
      c.type,
      c.state,
      c.colour,
      c.compaction,
      c.composition,
      c.inclusions,
      c.description,
      c.interpretation,
      c.relations,
      c.finds,
      c.extent ? "yes" : "no",
      c.signedOffAt?.toISOString() ?? "",
    ]),
  );
}

/** The samples register; z_rl_m and volume_l empty when not recorded. */
export const sampleCsvColumns: readonly CsvColumn[] = [
  ["number", "number"],
  ["trench", "text"],
  ["context", "number"],
  ["spit", "number"],
  ["type", "text"],
  ["x", "number"],
  ["y", "number"],
  ["z_rl_m", "number"],
  ["volume_l", "number"],
  ["purpose", "text"],
  ["taken_by", "text"],
  ["taken_on", "text"],
  ["status", "text"],
  ["context_state", "text"],
];

export function samplesCsv(rows: SampleRegisterRow[]): string {
  return toCsv(sampleCsvColumns, rows.map(sampleCsvRow));
}

/** One sample's cells, in sampleCsvColumns' order. */
export function sampleCsvRow(s: SampleRegisterRow): unknown[] {
  return [
    s.number,
    s.trenchCode,
    s.contextNumber,
    s.spitNumber,
    s.type,
    s.x,
    s.y,
    s.z,
    s.volumeL,
    s.purpose,
    s.takenBy ?? "",
    s.takenOn,
    s.status,
    s.contextState,
  ];
}

/**
 * The drawing register; `contexts` lists the numbers of the contexts shown, `state` is open until all are
 * signed off.
 */
export const drawingCsvColumns: readonly CsvColumn[] = [
  ["number", "number"],
  ["kind", "text"],
  ["scale", "text"],
  ["trench", "text"],
  ["contexts", "text"],
  ["title", "text"],
  ["drawn_by", "text"],
  ["drawn_on", "text"],
  ["state", "text"],
];

export function drawingsCsv(rows: DrawingRegisterRow[]): string {
  return toCsv(
    drawingCsvColumns,
    rows.map((d) => [
      d.number,
      d.kind,
      `1:${d.scale}`,
      d.trenchCode,
      d.contextNumbers.join(" "),
      d.title,
      d.drawnBy ?? "",
      d.drawnOn,
      d.state,
    ]),
  );
}
