import { describe, expect, it } from "vitest";
import { z } from "zod";
import * as account from "@/lib/schemas/account";
import * as artefactClass from "@/lib/schemas/artefact-class";
import * as common from "@/lib/schemas/common";
import * as context from "@/lib/schemas/context";
import * as drawing from "@/lib/schemas/drawing";
import * as exportSchemas from "@/lib/schemas/export";
import * as find from "@/lib/schemas/find";
import * as importSchemas from "@/lib/schemas/import";
import * as levels from "@/lib/schemas/levels";
import * as relation from "@/lib/schemas/relation";
import * as signOff from "@/lib/schemas/sign-off";
import * as site from "@/lib/schemas/site";
import * as trench from "@/lib/schemas/trench";
import * as runSchemas from "@/lib/schemas/run";
import * as processing from "@/lib/schemas/processing";
import * as findsBulk from "@/lib/schemas/finds-bulk";
import { fieldLabel, fieldLabels } from "@/lib/schemas/messages";

/**
 * Walks every zod schema that forms, the import and the Patterns workspace parse with, feeds each field a
 * spread of bad values, and checks that no message zod's own English locale would write comes back: each
 * refusal is worded by the schema or by Loamwork's one error map (lib/schemas/messages.ts).
 */
const modules = {
  account,
  artefactClass,
  common,
  context,
  drawing,
  exportSchemas,
  find,
  importSchemas,
  levels,
  relation,
  signOff,
  site,
  trench,
  runSchemas,
  processing,
  findsBulk,
};
const probes: unknown[] = [
  undefined,
  null,
  "",
  "   ",
  "x",
  "not-a-uuid",
  -1,
  0,
  0.5,
  1.5,
  -1e12,
  1e12,
  "a".repeat(10_001),
  true,
  [],
  {},
  ["x"],
  "2026-02-30x",
  "#zzzzzz",
];
const english = z.locales.en();
/** The openings of zod's own English messages (zod 4's locales/en.ts). */
const libraryWords =
  /^(Invalid (input|option|string|UUID|email|key|element|value|union|date|number|format)|Too (small|big)|Unrecognized key|Expected |Required$)/;

type Def = {
  type: string;
  shape?: Record<string, z.ZodType>;
  innerType?: z.ZodType;
  in?: z.ZodType;
  out?: z.ZodType;
  element?: z.ZodType;
  options?: z.ZodType[];
  getter?: () => z.ZodType;
};
const def = (s: z.ZodType) => (s as unknown as { _zod: { def: Def } })._zod.def;

/**
 * The object shapes inside a schema (through defaults, optionals, pipes, lists and unions), each with how to wrap an
 * input in it.
 */
function objectsIn(
  s: z.ZodType,
  wrap: (v: unknown) => unknown,
  depth = 0,
): { shape: Record<string, z.ZodType>; wrap: (v: unknown) => unknown; base: Record<string, unknown> }[] {
  if (depth > 6) return [];
  const d = def(s);
  switch (d.type) {
    case "object":
      return [
        { shape: d.shape!, wrap, base: {} },
        ...Object.entries(d.shape!).flatMap(([k, f]) => objectsIn(f, (v) => wrap({ [k]: v }), depth + 1)),
      ];
    case "optional":
    case "nullable":
    case "default":
    case "prefault":
    case "catch":
    case "readonly":
    case "nonoptional":
      return objectsIn(d.innerType!, wrap, depth + 1);
    case "pipe":
      return [...objectsIn(d.in!, wrap, depth + 1), ...objectsIn(d.out!, wrap, depth + 1)];
    case "array":
      return objectsIn(d.element!, (v) => wrap([v]), depth + 1);
    case "union":
      return d.options!.flatMap((o) => {
        const inner = objectsIn(o, wrap, depth + 1);
        // A discriminated option is probed with its own tag, so its other fields are reached.
        const tag =
          def(o).type === "object"
            ? Object.entries(def(o).shape!).find(([, f]) => def(f).type === "literal")
            : undefined;
        const lit = tag
          ? (tag[1] as unknown as { _zod: { def: { values: unknown[] } } })._zod.def.values[0]
          : undefined;
        return inner.map((x, i) => (i === 0 && tag ? { ...x, base: { [tag[0]]: lit } } : x));
      });
    case "lazy":
      return objectsIn(d.getter!(), wrap, depth + 1);
    default:
      return [];
  }
}

const schemas = Object.entries(modules).flatMap(([m, mod]) =>
  Object.entries(mod)
    .filter(([, v]) => v instanceof z.ZodType)
    .map(([name, v]) => [`${m}.${name}`, v as z.ZodType] as const),
);

describe("validation messages", () => {
  it("walks the schemas of every form and import", () => {
    const names = schemas.map(([n]) => n);
    for (const n of [
      "context.contextCreateSchema",
      "find.findFormSchema",
      "find.findUpdateSchema",
      "importSchemas.importMappingSchema",
      "relation.relationCreateSchema",
      "site.siteCreateSchema",
      "artefactClass.artefactClassCreateSchema",
      "levels.spitCreateSchema",
      "runSchemas.runCreateSchema",
      "signOff.reopenSchema",
      "account.invitationAcceptSchema",
    ]) {
      expect(names).toContain(n);
    }
  });

  it("never lets one of zod's own messages through, for any bad value of any field", () => {
    const leaks: string[] = [];
    let seen = 0;
    for (const [name, schema] of schemas) {
      const inputs: unknown[] = [...probes];
      for (const o of objectsIn(schema, (v) => v))
        for (const key of Object.keys(o.shape)) for (const p of probes) inputs.push(o.wrap({ ...o.base, [key]: p }));
      for (const input of inputs) {
        const out = schema.safeParse(input);
        for (const issue of out.error?.issues ?? []) {
          seen++;
          const raw = english.localeError(issue as never);
          const stock = typeof raw === "string" ? raw : raw?.message;
          if (issue.message === stock || libraryWords.test(issue.message))
            leaks.push(`${name} ${JSON.stringify(issue.path)}: ${issue.message}`);
        }
      }
    }
    expect(seen).toBeGreaterThan(1000);
    expect([...new Set(leaks)]).toEqual([]);
  });

  it("has a label for every field of those schemas", () => {
    const unlabelled = new Set<string>();
    for (const [, schema] of schemas)
      for (const o of objectsIn(schema, (v) => v))
        for (const key of Object.keys(o.shape)) if (!(key in fieldLabels)) unlabelled.add(key);
    expect([...unlabelled]).toEqual([]);
  });

  it("names the field in the trade's words (examples from the context sheet and the import)", () => {
    // The sheet without a number: the message a user met was "Too small: expected number to be >=1".
    const sheet = context.contextCreateSchema.safeParse({
      trenchId: "6f1c2a8e-6a59-4a2b-9a57-6c1f3f0f9b21",
      number: 0,
      type: "layer",
    });
    expect(sheet.error?.issues.map((i) => i.message)).toEqual(["A context number starts at 1."]);
    expect(
      importSchemas.importMappingSchema
        .safeParse({ x: "E", y: "N", classCode: "Code" })
        .error?.issues.map((i) => i.message),
    ).toEqual(["Context is missing: fill it in."]);
    expect(fieldLabel(["scope", "contextIds", 0])).toBe("Contexts");
  });

  it("says what is wrong with a test in the form it names, not that it fits no form", () => {
    // A test may be asked for in the engine's shape or the one Loamwork asked for before; a value that fits
    // neither was answered "is not one of the forms Loamwork accepts", naming nothing to correct.
    const id = "6f1c2a8e-6a59-4a2b-9a57-6c1f3f0f9b21";
    const scope = { trenchId: id, contextIds: [id], classIds: [id] };
    const refused = (body: Record<string, unknown>) =>
      runSchemas.runCreateSchema.safeParse({ scope, tests: [], ...body }).error?.issues.map((i) => i.message);
    expect(refused({ squareTests: [{ type: "moran", style: "diagonal" }] })).toEqual([
      "Weights: pick one of binary, row.",
    ]);
    expect(refused({ squareTests: [{ kind: "moran", neighbours: "bishop" }] })).toEqual([
      "Neighbours: pick one of queen, rook, distance.",
    ]);
    expect(refused({ squareTests: [{ type: "moron" }] })).toEqual([
      "Type: pick one of moran, geary, local-moran, getis-ord.",
    ]);
    expect(refused({ tests: [{ type: "l-envelope", class: id, correction: "boarder" }] })).toEqual([
      "Edge correction: pick one of isotropic, translation, border.",
    ]);
  });
});
