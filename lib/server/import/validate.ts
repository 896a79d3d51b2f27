import { MAX_FIND_NUMBER, findRules } from "@/lib/schemas/find";
import { depthToLevel, levelOutsideContext } from "@/lib/levels/context-range";
import type { ImportField, ImportMapping, ImportRowError } from "@/lib/schemas/import";
import { rangeHolding, type ImportLookups } from "./lookups";
import type { ParsedCsv } from "./parse";

/** A row that passed every check, ready to insert. `number` null = the server allocates one. */
export type ValidRow = {
  row: number;
  number: number | null;
  stationPoint: string | null;
  contextId: string;
  trenchId: string;
  classId: string;
  x: number;
  y: number;
  z: number | null;
  count: number | null;
  weightG: number | null;
  description: string;
};

/**
 * `warnings`: rows that pass but whose level lies outside their context's recorded top and base (counted, not refused).
 */
export type Validation = {
  valid: ValidRow[];
  errors: ImportRowError[];
  warnings: ImportRowError[];
  contextIds: Set<string>;
};

/** Accepts "12.5" and "12,5" (a decimal comma, common in European instrument exports); nothing else. */
function readNumber(raw: string): number | null {
  const s = raw.trim().replace(/^(-?\d+),(\d+)$/, "$1.$2");
  if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(s)) return null;
  const v = Number(s);
  return Number.isFinite(v) ? v : null;
}

const when = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : "earlier");

/** The find's own rules (the API's and the plan form's) for what a row says of the find itself. */
const rowRules = findRules.pick({ x: true, y: true, z: true, count: true, weightG: true, description: true });
const ruleColumns = {
  x: "x",
  y: "y",
  z: "z",
  count: "count",
  weightG: "weightG",
  description: "description",
} as const satisfies Record<keyof typeof rowRules.shape, ImportField>;
const ruleLabels: Record<keyof typeof ruleColumns, string> = {
  x: "x",
  y: "y",
  z: "z",
  count: "count",
  weightG: "weight",
  description: "description",
};

/**
 * Checks every row against the site's classes, contexts, trench windows and used find numbers, in
 * memory, and lists every reason a row fails. Row numbers are as a spreadsheet shows them.
 */
export function validateRows(
  csv: ParsedCsv,
  mapping: ImportMapping,
  lk: ImportLookups,
  zReference: "rl" | "depth" = "rl",
): Validation {
  const col = new Map<ImportField, number>();
  for (const [field, header] of Object.entries(mapping) as [ImportField, string | undefined][]) {
    if (!header) continue;
    const i = csv.headers.indexOf(header);
    if (i < 0) throw new Error(`mapping names a column "${header}" the file does not have`);
    col.set(field, i);
  }
  const cell = (r: string[], f: ImportField) => (col.has(f) ? (r[col.get(f)!] ?? "").trim() : "");
  const valid: ValidRow[] = [];
  const errors: ImportRowError[] = [];
  const warnings: ImportRowError[] = [];
  const contextIds = new Set<string>();
  const inFile = new Map<number, number>();
  csv.rows.forEach((r, i) => {
    const row = i + 2;
    const reasons: string[] = [];
    const problem = csv.rowProblems.get(i);
    if (problem) reasons.push(`the row ${problem}`);
    // The file's own notation first (decimal commas, exponents), then the find's rules on what was read.
    const read = (f: "x" | "y" | "z" | "count" | "weightG", required: boolean) => {
      const raw = cell(r, f);
      if (!raw) {
        if (required) reasons.push(`${f} is empty`);
        return null;
      }
      const v = readNumber(raw);
      if (v === null) reasons.push(`${ruleLabels[f]} "${raw}" is not a number`);
      return v;
    };
    const values = {
      x: read("x", true),
      y: read("y", true),
      z: read("z", false),
      count: read("count", false),
      weightG: read("weightG", false),
      description: cell(r, "description"),
    };
    const ctxEarly = lk.contexts.get(readNumber(cell(r, "contextNumber")) ?? Number.NaN);
    if (zReference === "depth" && values.z !== null) {
      // A depth becomes a reduced level only against the trench's own surface level; without it, no guess.
      const surface = ctxEarly ? lk.trenches.get(ctxEarly.trenchId)?.surfaceLevel : undefined;
      const code = ctxEarly ? (lk.trenches.get(ctxEarly.trenchId)?.code ?? "?") : null;
      if (values.z < 0) reasons.push(`z "${cell(r, "z")}" is a depth below the surface, so it cannot be negative`);
      else if (code !== null && (surface === null || surface === undefined))
        reasons.push(
          `z is a depth below the surface, but trench ${code} has no surface level to convert it from: record the trench's surface level (RL) first, or import reduced levels`,
        );
      else if (surface !== null && surface !== undefined) values.z = depthToLevel(surface, values.z);
    }
    const checked = rowRules.safeParse(values);
    const broken = new Set<string>();
    for (const issue of checked.error?.issues ?? []) {
      const field = issue.path[0] as keyof typeof ruleColumns;
      broken.add(field);
      const raw = cell(r, ruleColumns[field]);
      if (values[field] === null && field !== "description") continue; // already named: empty or not a number
      reasons.push(
        field === "description" ? `description: ${issue.message}` : `${ruleLabels[field]} "${raw}": ${issue.message}`,
      );
    }
    const { x, y } = values;
    const code = cell(r, "classCode");
    const classId = lk.classes.get(code.toUpperCase());
    if (!code) reasons.push("class code is empty");
    else if (!classId) reasons.push(`class code "${code}" is not one of this site's classes`);
    const ctxRaw = cell(r, "contextNumber");
    const ctxNumber = readNumber(ctxRaw);
    const ctx = ctxNumber === null ? undefined : lk.contexts.get(ctxNumber);
    if (!ctxRaw) reasons.push("context is empty");
    else if (!ctx) reasons.push(`context "${ctxRaw}" does not exist on this site`);
    else if (ctx.state === "signed_off")
      reasons.push(
        `context ${ctx.number} was signed off by ${ctx.signedOffBy ?? "a director"} on ${when(ctx.signedOffAt)}; a director must reopen it first`,
      );
    else if (ctx.state === "awaiting")
      reasons.push(
        `context ${ctx.number} awaits sign-off (submitted by ${ctx.submittedBy ?? "a recorder"} on ${when(ctx.submittedAt)}); a director must return it to open first`,
      );
    if (ctx && x !== null && y !== null && !broken.has("x") && !broken.has("y")) {
      const t = lk.trenches.get(ctx.trenchId);
      if (!t?.window)
        reasons.push(
          `trench ${t?.code ?? "?"} of context ${ctx.number} has no valid outline${t?.problem ? ` (${t.problem})` : ""}`,
        );
      else if (!t.window.contains(x, y)) {
        reasons.push(`(${x}, ${y}) lies ${t.window.boundaryDistance(x, y).toFixed(3)} m outside trench ${t.code}`);
      }
    }
    const stationPoint = cell(r, "stationPoint") || null;
    if (stationPoint && stationPoint.length > 60)
      reasons.push(`station point ID "${stationPoint.slice(0, 20)}…" is longer than 60 characters`);
    let number: number | null = null;
    const numRaw = cell(r, "number");
    if (numRaw) {
      const n = readNumber(numRaw);
      if (n === null || !Number.isInteger(n) || n < 1)
        reasons.push(`find number "${numRaw}" is not a whole number of 1 or more`);
      else if (n > MAX_FIND_NUMBER)
        reasons.push(`find number ${numRaw} is above ${maxNumberWords}, the highest find number Loamwork keeps`);
      else if (lk.usedNumbers.has(n)) reasons.push(`find number ${n} is already in use on this site`);
      else if (lk.sampleNumbers?.has(n))
        reasons.push(`find number ${n} is sample ${n}'s number (samples share the finds' numbers on this site)`);
      else if (rangeHolding(lk.reservedNumbers, n)) {
        const b = rangeHolding(lk.reservedNumbers, n)!;
        reasons.push(
          `find number ${n} is reserved for ${b.words} (block ${b.first}–${b.last}, for recording offline; it may already be on a bag); leave it blank to get a new one`,
        );
      } else if (rangeHolding(lk.voidNumbers, n))
        reasons.push(
          `find number ${n} is void (${rangeHolding(lk.voidNumbers, n)!.words}) and is never used again; leave it blank to get a new one`,
        );
      else if (n < lk.nextNumber)
        reasons.push(
          `find number ${n} was handed out before (deleted finds keep their numbers); leave it blank to get a new one`,
        );
      else if (inFile.has(n)) reasons.push(`find number ${n} is also on row ${inFile.get(n)}`);
      else {
        number = n;
        inFile.set(n, row);
      }
    }
    if (reasons.length || !checked.success) {
      errors.push({ row, reasons });
      return;
    }
    contextIds.add(ctx!.id);
    const f = checked.data;
    const outside = levelOutsideContext(f.z ?? null, lk.levels?.get(ctx!.id), lk.tolerance ?? 0, ctx!.number);
    if (outside) warnings.push({ row, reasons: [outside] });
    valid.push({
      row,
      number,
      stationPoint,
      contextId: ctx!.id,
      trenchId: ctx!.trenchId,
      classId: classId!,
      x: f.x,
      y: f.y,
      z: f.z ?? null,
      count: f.count ?? null,
      weightG: f.weightG ?? null,
      description: f.description,
    });
  });
  return { ...refuseBeyondLastNumber(valid, errors, lk.nextNumber), warnings, contextIds };
}

const maxNumberWords = MAX_FIND_NUMBER.toLocaleString("en-GB");

/**
 * Rows without a number get the numbers after the site's next one and after the file's highest, in file
 * order. A row whose number would pass MAX_FIND_NUMBER is refused here, by row, rather than at allocation.
 */
function refuseBeyondLastNumber(valid: ValidRow[], errors: ImportRowError[], nextNumber: number) {
  let next = nextNumber;
  for (const r of valid) if (r.number !== null && r.number >= next) next = r.number + 1;
  const refused = new Set<ValidRow>();
  for (const r of valid) {
    if (r.number !== null) continue;
    if (next > MAX_FIND_NUMBER) refused.add(r);
    next++;
  }
  if (!refused.size) return { valid, errors };
  const more = [...refused].map((r) => ({
    row: r.row,
    reasons: [`no find number is left for this row: this site's find numbers go up to ${maxNumberWords}`],
  }));
  return { valid: valid.filter((r) => !refused.has(r)), errors: [...errors, ...more].sort((a, b) => a.row - b.row) };
}
