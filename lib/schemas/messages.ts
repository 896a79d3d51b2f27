import { z } from "zod";

/**
 * Loamwork's one error map for every zod schema, in the browser and on the server. A schema that says its
 * own message keeps it; every other refusal is worded here, naming the field as the forms and the import
 * label it, so no message written for developers ("Too small: expected number to be >=1") reaches a user.
 * Every schema module imports this file, so the map is in place wherever a schema parses.
 */

/** Field names as the forms, the import and the Patterns workspace show them, keyed by the schema's field name. */
export const fieldLabels: Record<string, string> = {
  // sites, grid, people
  code: "Code",
  name: "Name",
  gridDescription: "Grid description",
  gridOriginX: "Grid origin easting",
  gridOriginY: "Grid origin northing",
  crs: "Projection (CRS)",
  datumName: "Datum name",
  datumKind: "Datum kind",
  datumNote: "Datum note",
  email: "E-mail",
  password: "Password",
  token: "Link",
  role: "Role",
  reason: "Reason",
  // trenches and outlines
  trenchId: "Trench",
  outline: "Outline",
  extent: "Extent",
  type: "Type",
  coordinates: "Outline points",
  surfaceRl: "Surface level (RL)",
  squareSize: "Square size",
  squareOriginX: "Square grid origin x",
  squareOriginY: "Square grid origin y",
  // context sheets
  number: "Number",
  colour: "Colour",
  compaction: "Compaction",
  composition: "Composition",
  inclusions: "Inclusions",
  description: "Description",
  interpretation: "Interpretation",
  lengthM: "Length",
  widthM: "Width",
  thicknessM: "Thickness",
  excavatedBy: "Excavated by",
  openedOn: "Opened",
  closedOn: "Closed",
  digMethod: "Dug by",
  sieveMeshMm: "Sieve mesh",
  // relations
  contextId: "Context",
  reading: "Relation",
  otherId: "Other context",
  // finds and classes
  classId: "Class",
  x: "x (easting)",
  y: "y (northing)",
  z: "z (reduced level)",
  count: "Count",
  weightG: "Weight",
  method: "Recorded by",
  label: "Label",
  material: "Material",
  symbol: "Symbol",
  humanRemains: "Human remains",
  // import
  csv: "File",
  fileName: "File name",
  mapping: "Column mapping",
  stationPoint: "Station point ID",
  classCode: "Class code",
  contextNumber: "Context",
  // levels
  rl: "Reduced level",
  benchmarkId: "Benchmark",
  target: "Level of",
  backsight: "Backsight",
  foresight: "Foresight",
  intersight: "Intersight",
  instrumentHeight: "Instrument height",
  lines: "Readings",
  topRl: "Top level (RL)",
  baseRl: "Base level (RL)",
  spitId: "Spit",
  note: "Note",
  observedOn: "Date",
  levelTolerance: "Closure tolerance",
  station: "Station",
  targetId: "Levelled record",
  intermediate: "Intermediate sight",
  takenOn: "Date taken",
  startBenchmarkId: "Starting benchmark",
  closingBenchmarkId: "Closing benchmark",
  topLevel: "Top level (RL)",
  baseLevel: "Base level (RL)",
  surfaceLevel: "Ground surface level (RL)",
  scale: "Scale",
  title: "Title",
  drawnBy: "Drawn by",
  drawnOn: "Date drawn",
  // after the trench: processing, boxes, bulk changes
  processing: "Processing",
  sentTo: "Sent to",
  boxId: "Box",
  intoBoxId: "Box to move everything into",
  location: "Kept at",
  store: "Store",
  findIds: "Finds picked",
  sampleIds: "Samples picked",
  action: "Change",
  // lists, filters and exports
  page: "Page",
  pageSize: "Rows a page",
  recordedBy: "Recorder",
  from: "From",
  to: "To",
  q: "Search",
  sort: "Sort by",
  dir: "Order",
  format: "File format",
  coords: "Coordinates",
  recordType: "Record kind",
  recordId: "Record",
  actorId: "Person",
  limit: "Most entries",
  zReference: "Levels given as",
  samplesShareFindNumbers: "Samples numbered with finds",
  labelAddress: "Label address",
  numberBlockSize: "Numbers a device reserves at a time",
  levelSpreadCaution: "Vertical spread that may mix surfaces",
  // Patterns
  fun: "Function (K or L)",
  neighbours: "Neighbours",
  band: "Distance band",
  upper: "Band reaches (m)",
  lower: "Band starts at (m)",
  isolated: "Squares with no neighbours",
  style: "Weights",
  variable: "Counted",
  minArea: "Smallest square area",
  squareTests: "Square tests",
  scope: "Scope",
  contextIds: "Contexts",
  classIds: "Classes",
  levelFrom: "Lowest level (RL)",
  levelTo: "Highest level (RL)",
  spitIds: "Spits",
  tests: "Tests",
  params: "Settings",
  kind: "Test",
  correction: "Edge correction",
  alternative: "Alternative",
  cellSize: "Square size",
  class: "Class",
  nx: "Cells across",
  ny: "Cells up",
  bandwidth: "Bandwidth (m)",
  statistic: "Global test",
  null: "Null hypothesis",
  a: "First class",
  b: "Second class",
  reference: "Background",
  rmax: "Largest distance",
  nsim: "Simulations",
  level: "Significance level",
  seed: "Seed",
};

/** "weightG" → "Weight g": a field with no label yet still reads as words. */
function words(key: string): string {
  const spaced = key
    .replace(/([a-z])([A-Z])/g, "$1 $2")
    .replace(/[_-]+/g, " ")
    .toLowerCase();
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

/** The label of the field an issue is about: its last named path segment (list positions skipped). */
export function fieldLabel(path: readonly PropertyKey[] | undefined): string {
  const key = [...(path ?? [])].reverse().find((p): p is string => typeof p === "string");
  if (!key) return "This value";
  return fieldLabels[key] ?? words(key);
}

const amount = (n: number | bigint) =>
  typeof n === "bigint" ? n.toString() : n.toLocaleString("en-GB", { maximumFractionDigits: 6 });
const typeWords: Record<string, string> = {
  number: "a number",
  int: "a whole number",
  string: "text",
  boolean: "yes or no",
  array: "a list",
  object: "a set of fields",
  date: "a date",
};
const formatWords: Record<string, string> = {
  uuid: "is not one of the records offered: pick one from the list",
  guid: "is not one of the records offered: pick one from the list",
  email: "is not an e-mail address",
  regex: "is not written in the expected form",
  date: "is not a date written YYYY-MM-DD",
  datetime: "is not a date and time",
  url: "is not a web address",
};

/** The keys that say which form of a record is meant (a test's type, a former request's kind). */
const FORM_KEYS = new Set(["type", "kind"]);

const missesItsForm = (issues: readonly z.core.$ZodIssue[]): boolean =>
  issues.some(
    (i) =>
      (i.path.length === 1 && FORM_KEYS.has(String(i.path[0]))) ||
      (i.code === "unrecognized_keys" && i.keys.some((k) => FORM_KEYS.has(k))),
  );

/**
 * A value that fits none of the forms a field accepts (a test in the engine's shape or in the one Loamwork
 * asked for before): what is wrong with it in the form it was meant as, i.e. the form whose type or kind it
 * names (else the form it comes nearest to), so that a misspelt option is named rather than the whole value
 * refused. Undefined when the union says nothing of its forms.
 */
function unionMessage(errors: readonly (readonly z.core.$ZodIssue[])[] | undefined): string | undefined {
  const forms = (errors ?? []).filter((e) => e.length > 0);
  if (!forms.length) return undefined;
  const rank = (e: readonly z.core.$ZodIssue[]) => (missesItsForm(e) ? 1_000 : 0) + e.length;
  const meant = forms.reduce((best, e) => (rank(e) < rank(best) ? e : best));
  return meant.map((i) => i.message).join(" ");
}

/** The message for one refused value, in words a recorder can act on. */
export function loamworkMessage(issue: z.core.$ZodRawIssue): string {
  const label = fieldLabel(issue.path);
  switch (issue.code) {
    case "invalid_type":
      if (issue.input === undefined) return `${label} is missing: fill it in.`;
      if (issue.input === null && issue.expected !== "null") return `${label} is empty: fill it in.`;
      return `${label} must be ${typeWords[issue.expected] ?? "of another kind"}.`;
    case "too_small":
      if (issue.origin === "string")
        return Number(issue.minimum) <= 1
          ? `${label} is empty: fill it in.`
          : `${label} needs at least ${amount(issue.minimum)} characters.`;
      if (issue.origin === "array" || issue.origin === "set")
        return `${label}: choose at least ${amount(issue.minimum)}.`;
      return issue.inclusive
        ? `${label} must be ${amount(issue.minimum)} or more.`
        : `${label} must be more than ${amount(issue.minimum)}.`;
    case "too_big":
      if (issue.origin === "string") return `${label} is longer than ${amount(issue.maximum)} characters; shorten it.`;
      if (issue.origin === "array" || issue.origin === "set")
        return `${label}: choose at most ${amount(issue.maximum)}.`;
      return issue.inclusive
        ? `${label} must be ${amount(issue.maximum)} or less.`
        : `${label} must be less than ${amount(issue.maximum)}.`;
    case "invalid_format":
      return `${label} ${formatWords[issue.format] ?? "is not written in the expected form"}.`;
    case "not_multiple_of":
      return `${label} must be a multiple of ${amount(issue.divisor)}.`;
    case "invalid_value":
      return issue.values.length === 1
        ? `${label} must be ${String(issue.values[0])}.`
        : `${label}: pick one of ${issue.values.map(String).join(", ")}.`;
    case "unrecognized_keys":
      return `${issue.keys.map((k) => `"${k}"`).join(", ")} ${issue.keys.length > 1 ? "are not fields" : "is not a field"} Loamwork keeps here.`;
    case "invalid_union":
      return unionMessage(issue.errors) ?? `${label} is not one of the forms Loamwork accepts.`;
    default:
      return `${label} is not valid.`;
  }
}

z.config({ customError: loamworkMessage });
