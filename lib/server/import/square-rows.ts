import {
  parseSquareLabel,
  squareIndex,
  squareLabel,
  type GridSquare,
  type SquareGridSpec,
} from "@/lib/geometry/square-grid";
import type { ImportRowError } from "@/lib/schemas/import";
import { squareCountSchema } from "@/lib/schemas/squares";
import type { ImportLookups } from "./lookups";
import type { ParsedCsv } from "./parse";

/**
 * The square-count CSV: a header row, then one row per square × context × spit × class. Columns are found
 * by name (any case; the alternatives after the first are accepted too): square, context and class and
 * count are needed; spit, weight and excavated area are optional.
 */
export const squareColumns = {
  square: ["square", "sq"],
  context: ["context", "context_number"],
  spit: ["spit", "spit_number"],
  class: ["class", "class_code"],
  count: ["count", "n"],
  weightG: ["weight_g", "weight", "weight (g)"],
  excavatedArea: ["excavated_m2", "excavated_area", "area_m2"],
} as const;
type Column = keyof typeof squareColumns;
const needed: Column[] = ["square", "context", "class", "count"];

export type SquareUnit = {
  col: number;
  row: number;
  label: string;
  contextId: string;
  spitId: string | null;
  excavatedArea: number | null;
  counts: { classId: string; count: number; weightG: number | null }[];
};
export type SquareRowsCheck = { units: SquareUnit[]; errors: ImportRowError[]; contextIds: Set<string>; rows: number };

export type SquareLookups = ImportLookups & {
  trench: { id: string; code: string };
  grid: SquareGridSpec;
  squares: GridSquare[];
  /** "contextId:spitNumber" → spit id */
  spits: Map<string, string>;
};

/** The header of each column, or the list of columns the file lacks. */
export function findSquareColumns(headers: string[]): { columns: Partial<Record<Column, number>>; missing: string[] } {
  const lower = headers.map((h) => h.trim().toLowerCase());
  const columns: Partial<Record<Column, number>> = {};
  for (const [col, names] of Object.entries(squareColumns) as [Column, readonly string[]][]) {
    const i = lower.findIndex((h) => names.includes(h));
    if (i >= 0) columns[col] = i;
  }
  return { columns, missing: needed.filter((c) => columns[c] === undefined).map((c) => squareColumns[c][0]) };
}

function readNumber(raw: string): number | null {
  const s = raw.trim().replace(/^(-?\d+),(\d+)$/, "$1.$2");
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(s)) return null;
  return Number(s);
}

const when = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : "earlier");

/**
 * Checks every row against the trench's squares, its contexts and spits, and the site's classes; lists every reason a
 * row fails.
 */
export function checkSquareRows(
  csv: ParsedCsv,
  columns: Partial<Record<Column, number>>,
  lk: SquareLookups,
): SquareRowsCheck {
  const cell = (r: string[], c: Column) => (columns[c] === undefined ? "" : (r[columns[c]!] ?? "").trim());
  const squares = squareIndex(lk.squares);
  const units = new Map<string, SquareUnit & { firstRow: number }>();
  const seen = new Map<string, number>();
  const errors: ImportRowError[] = [];
  const contextIds = new Set<string>();
  csv.rows.forEach((r, i) => {
    const row = i + 2;
    const reasons: string[] = [];
    const problem = csv.rowProblems.get(i);
    if (problem) reasons.push(`the row ${problem}`);
    const sqRaw = cell(r, "square");
    const at = sqRaw ? parseSquareLabel(lk.grid, sqRaw) : null;
    const square = at ? squares.get(`${at.col},${at.row}`) : undefined;
    if (!sqRaw) reasons.push("square is empty");
    else if (!at)
      reasons.push(
        `square "${sqRaw}" is not the south-west corner of a ${lk.grid.size} m square of this grid (easting/northing, e.g. ${squareLabel(lk.grid, 0, 0)})`,
      );
    else if (!square) reasons.push(`square ${sqRaw} lies outside trench ${lk.trench.code}`);
    const ctxRaw = cell(r, "context");
    const ctxNumber = readNumber(ctxRaw);
    const ctx = ctxNumber === null ? undefined : lk.contexts.get(ctxNumber);
    if (!ctxRaw) reasons.push("context is empty");
    else if (!ctx) reasons.push(`context "${ctxRaw}" does not exist on this site`);
    else if (ctx.trenchId !== lk.trench.id) reasons.push(`context ${ctx.number} is not in trench ${lk.trench.code}`);
    else if (ctx.state === "signed_off")
      reasons.push(
        `context ${ctx.number} was signed off by ${ctx.signedOffBy ?? "a director"} on ${when(ctx.signedOffAt)}; a director must reopen it first`,
      );
    else if (ctx.state === "awaiting")
      reasons.push(
        `context ${ctx.number} awaits sign-off (submitted by ${ctx.submittedBy ?? "a recorder"} on ${when(ctx.submittedAt)}); a director must return it to open first`,
      );
    const spitRaw = cell(r, "spit");
    let spitId: string | null = null;
    if (spitRaw && ctx) {
      const n = readNumber(spitRaw);
      spitId = n === null ? null : (lk.spits.get(`${ctx.id}:${n}`) ?? null);
      if (!spitId) reasons.push(`spit "${spitRaw}" is not a spit of context ${ctx.number}`);
    }
    const classRaw = cell(r, "class");
    const classId = lk.classes.get(classRaw.toUpperCase());
    if (!classRaw) reasons.push("class is empty");
    else if (!classId) reasons.push(`class "${classRaw}" is not one of this site's classes`);
    const countRaw = cell(r, "count");
    const weightRaw = cell(r, "weightG");
    const areaRaw = cell(r, "excavatedArea");
    const values = {
      classId: classId ?? "00000000-0000-4000-8000-000000000000",
      count: countRaw ? (readNumber(countRaw) ?? countRaw) : undefined,
      weightG: weightRaw ? (readNumber(weightRaw) ?? weightRaw) : null,
    };
    const checked = squareCountSchema.safeParse(values);
    for (const issue of checked.error?.issues ?? []) {
      const field = String(issue.path[0]);
      if (field === "count")
        reasons.push(
          countRaw ? `count "${countRaw}": ${issue.message}` : "count is empty (enter 0 when none were found)",
        );
      if (field === "weightG") reasons.push(`weight "${weightRaw}": ${issue.message}`);
    }
    let area: number | null = null;
    if (areaRaw) {
      area = readNumber(areaRaw);
      if (area === null || !(area > 0)) reasons.push(`excavated area "${areaRaw}" is not a number of m² above 0`);
      else if (square && area > square.area + 1e-6)
        reasons.push(
          `excavated area ${areaRaw} m² is more than the ${+square.area.toFixed(4)} m² of square ${square.label} inside the trench`,
        );
    }
    const unitKey = at && ctx ? `${at.col},${at.row}|${ctx.id}|${spitId ?? ""}` : null;
    const unit = unitKey ? units.get(unitKey) : undefined;
    if (unitKey && classId) {
      const dup = seen.get(`${unitKey}|${classId}`);
      if (dup)
        reasons.push(
          `class ${classRaw} in square ${sqRaw}, context ${ctxRaw}${spitRaw ? `, spit ${spitRaw}` : ""} is also on row ${dup}`,
        );
    }
    if (unit && area !== null && unit.excavatedArea !== null && Math.abs(unit.excavatedArea - area) > 1e-9) {
      reasons.push(
        `excavated area ${areaRaw} m² differs from the ${unit.excavatedArea} m² given for the same square on row ${unit.firstRow}`,
      );
    }
    if (reasons.length || !checked.success || !square || !ctx || !classId) {
      errors.push({ row, reasons });
      return;
    }
    seen.set(`${unitKey}|${classId}`, row);
    contextIds.add(ctx.id);
    const target =
      unit ??
      units
        .set(unitKey!, {
          col: square.col,
          row: square.row,
          label: square.label,
          contextId: ctx.id,
          spitId,
          excavatedArea: null,
          counts: [],
          firstRow: row,
        })
        .get(unitKey!)!;
    if (area !== null) target.excavatedArea = area;
    target.counts.push({ classId, count: checked.data.count, weightG: checked.data.weightG });
  });
  return { units: [...units.values()].map(({ firstRow: _f, ...u }) => u), errors, contextIds, rows: csv.rows.length };
}
