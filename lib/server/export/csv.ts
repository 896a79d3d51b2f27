import Papa from "papaparse";
import type { Context } from "@/db/schema";
import type { RegisterRow } from "@/lib/server/finds";

/**
 * CSV text through papaparse. Cells starting with = + @ or a tab are prefixed with ' so a spreadsheet
 * does not run them as formulas (OWASP "CSV injection"); "-" is left alone because negative coordinates
 * start with it.
 */
export function toCsv(columns: string[], rows: unknown[][]): string {
  return Papa.unparse({ fields: columns, data: rows }, { escapeFormulae: /^[=+@\t\r]/, newline: "\r\n" });
}

/** The register's columns; the header names are ones the import recognises, so a file round-trips. */
export const findCsvColumns = ["number", "trench", "context", "class", "x", "y", "z", "count", "weight_g", "description", "method", "recorded_by", "recorded_at"];

export function findsCsv(rows: RegisterRow[]): string {
  return toCsv(
    findCsvColumns,
    rows.map((f) => [f.number, f.trenchCode, f.contextNumber, f.classCode, f.x, f.y, f.z ?? "", f.count ?? "", f.weightG ?? "", f.description, f.method, f.recordedBy ?? "", f.recordedAt.toISOString()]),
  );
}

export type ContextExportRow = Context & { trenchCode: string; finds: number; relations: string };

export function contextsCsv(rows: ContextExportRow[]): string {
  const columns = ["number", "trench", "type", "state", "colour", "compaction", "composition", "inclusions", "description", "interpretation", "relations", "finds", "has_extent", "signed_off_at"];
  return toCsv(
    columns,
    rows.map((c) => [c.number, c.trenchCode, c.type, c.state, c.colour, c.compaction, c.composition, c.inclusions, c.description, c.interpretation, c.relations, c.finds, c.extent ? "yes" : "no", c.signedOffAt?.toISOString() ?? ""]),
  );
}
