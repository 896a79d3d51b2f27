import { describe, expect, it } from "vitest";
import { findCreateSchema, findFormSchema } from "@/lib/schemas/find";
import type { ImportMapping } from "@/lib/schemas/import";
import type { ImportLookups } from "@/lib/server/import/lookups";
import { parseCsv } from "@/lib/server/import/parse";
import { validateRows } from "@/lib/server/import/validate";
import { createWindow } from "@/lib/spatial";

const contextId = "8f2b0c1e-3d4a-4b5c-9d6e-7f8091a2b3c4";
const classId = "1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d";
const trenchId = "9e8d7c6b-5a49-4382-9170-6f5e4d3c2b1a";

/** One open context in a 10 m × 6 m trench, one class, no finds yet. */
const lookups: ImportLookups = {
  classes: new Map([["FL", classId]]),
  contexts: new Map([
    [
      1001,
      {
        id: contextId,
        number: 1001,
        trenchId,
        state: "open",
        signedOffBy: null,
        signedOffAt: null,
        submittedBy: null,
        submittedAt: null,
      },
    ],
  ]),
  trenches: new Map([
    [
      trenchId,
      {
        code: "A",
        window: createWindow({
          outer: [
            [0, 0],
            [10, 0],
            [10, 6],
            [0, 6],
          ],
          holes: [],
        }),
      },
    ],
  ]),
  usedNumbers: new Set(),
  nextNumber: 1,
};
const mapping: ImportMapping = {
  x: "E",
  y: "N",
  z: "Z",
  classCode: "Class",
  contextNumber: "Ctx",
  count: "Count",
  weightG: "Weight",
  description: "Notes",
};

function check(row: string) {
  return validateRows(parseCsv(`E;N;Z;Class;Ctx;Count;Weight;Notes\n${row}`), mapping, lookups);
}

/** The API's own message for one field of a find, so the import and the form are held to the same words. */
function apiMessage(field: string, value: unknown): string {
  const base = { contextId, classId, x: 1, y: 1 };
  const issue = findCreateSchema.safeParse({ ...base, [field]: value }).error?.issues.find((i) => i.path[0] === field);
  if (!issue) throw new Error(`the API accepts ${field} = ${String(value)}`);
  return issue.message;
}

describe("a find's rules are written once: the import checks rows with the API's rules", () => {
  it("reads the file's notation (decimal comma) and keeps a row within the rules", () => {
    const out = check("2,5;3;41,25;FL;1001;2;12,5;flake");
    expect(out.errors).toEqual([]);
    expect(out.valid[0]).toMatchObject({ x: 2.5, y: 3, z: 41.25, count: 2, weightG: 12.5, description: "flake" });
  });

  it("refuses a count or a weight beyond what the API accepts, in the API's words", () => {
    expect(check("2;3;;FL;1001;2000000;;").errors).toEqual([
      { row: 2, reasons: [`count "2000000": ${apiMessage("count", 2_000_000)}`] },
    ]);
    expect(check("2;3;;FL;1001;;20000000;").errors).toEqual([
      { row: 2, reasons: [`weight "20000000": ${apiMessage("weightG", 20_000_000)}`] },
    ]);
    expect(check("2;3;;FL;1001;1.5;;").errors[0]?.reasons).toEqual([`count "1.5": A count is a whole number.`]);
  });

  it("refuses a description longer than the API keeps instead of cutting it", () => {
    const out = check(`2;3;;FL;1001;;;${"x".repeat(4001)}`);
    expect(out.valid).toEqual([]);
    expect(out.errors[0]?.reasons).toEqual([`description: ${apiMessage("description", "x".repeat(4001))}`]);
  });

  it("refuses a coordinate implausibly far from the grid origin with the API's reason, not a distance", () => {
    expect(check("100000000;3;;FL;1001;;;").errors[0]?.reasons).toEqual([`x "100000000": ${apiMessage("x", 1e8)}`]);
  });
});

describe("the plan's quick form checks with the same rules", () => {
  const form = { classId, contextId, z: "", count: "", weightG: "", description: "" };

  it("reads blank numbers as none and typed ones as numbers", () => {
    expect(findFormSchema.parse({ ...form, z: "41.250", count: "3", weightG: "0" })).toEqual({
      classId,
      contextId,
      z: 41.25,
      count: 3,
      weightG: 0,
      description: "",
    });
    expect(findFormSchema.parse(form)).toEqual({
      classId,
      contextId,
      z: null,
      count: null,
      weightG: null,
      description: "",
    });
  });

  it("names an empty choice and refuses what the API refuses, in the API's words", () => {
    const messages = (v: Record<string, string>) =>
      Object.fromEntries(
        (findFormSchema.safeParse({ ...form, ...v }).error?.issues ?? []).map((i) => [i.path[0], i.message]),
      );
    expect(messages({ classId: "", contextId: "" })).toEqual({
      classId: "Pick the find's class.",
      contextId: "Pick the context it came from.",
    });
    expect(messages({ count: "2000000", weightG: "-1" })).toEqual({
      count: apiMessage("count", 2_000_000),
      weightG: apiMessage("weightG", -1),
    });
  });
});
