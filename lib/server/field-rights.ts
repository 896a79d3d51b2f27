import "server-only";
import type { Role } from "@/db/schema";
import { PublicError } from "./errors";

const recorders = ["digger", "director"] as const;
const classers = ["specialist", "director"] as const;
const everyone = ["digger", "specialist", "director"] as const;
const directorOnly = ["director"] as const;

/**
 * Which roles may change each field of each record that can be updated. The catalogue's roles say who
 * may call an update at all; this table says which of the named fields each of them may change. Every
 * field of an update schema has a row (a test holds the table to the schemas): a field with no row is
 * refused to everyone. Specialists class finds, so on a find they may change the class and nothing else.
 */
export const fieldRights = {
  site: {
    name: directorOnly,
    gridDescription: directorOnly,
    gridOriginX: directorOnly,
    gridOriginY: directorOnly,
    crs: directorOnly,
    samplesShareFindNumbers: directorOnly,
    labelAddress: directorOnly,
    numberBlockSize: directorOnly,
    levelSpreadCaution: directorOnly,
  },
  member: { role: directorOnly },
  class: {
    code: classers,
    label: classers,
    material: classers,
    colour: classers,
    symbol: classers,
    humanRemains: classers,
  },
  trench: {
    code: recorders,
    name: recorders,
    outline: recorders,
    surfaceLevel: recorders,
    squareSize: directorOnly,
    squareOriginX: directorOnly,
    squareOriginY: directorOnly,
  },
  context: {
    number: recorders,
    type: recorders,
    colour: recorders,
    compaction: recorders,
    composition: recorders,
    inclusions: recorders,
    description: recorders,
    interpretation: recorders,
    extent: recorders,
    lengthM: recorders,
    widthM: recorders,
    thicknessM: recorders,
    excavatedBy: recorders,
    openedOn: recorders,
    closedOn: recorders,
    digMethod: recorders,
    sieveMeshMm: recorders,
  },
  find: {
    contextId: recorders,
    classId: everyone,
    x: recorders,
    y: recorders,
    z: recorders,
    count: recorders,
    weightG: recorders,
    description: recorders,
  },
  datum: { datumKind: directorOnly, datumName: directorOnly, levelTolerance: directorOnly },
  benchmark: { code: recorders, description: recorders, x: recorders, y: recorders, level: recorders },
  spit: { number: recorders, topLevel: recorders, baseLevel: recorders },
  sample: {
    contextId: recorders,
    spit: recorders,
    type: recorders,
    x: recorders,
    y: recorders,
    z: recorders,
    volumeL: recorders,
    purpose: recorders,
    takenBy: recorders,
    takenOn: recorders,
  },
  drawing: {
    kind: recorders,
    scale: recorders,
    contextIds: recorders,
    title: recorders,
    drawnBy: recorders,
    drawnOn: recorders,
  },
  // The finds store is kept by whoever processes finds: diggers, specialists and the director alike.
  box: { number: everyone, store: everyone, note: everyone },
  photo: {
    facing: recorders,
    scale: recorders,
    caption: recorders,
    takenBy: recorders,
  },
} satisfies Record<string, Record<string, readonly Role[]>>;

export type RightsRecord = keyof typeof fieldRights;

const recordWords: Record<RightsRecord, string> = {
  site: "the site",
  member: "a membership",
  class: "an artefact class",
  trench: "a trench",
  context: "a context",
  find: "a find",
  datum: "the site's datum",
  benchmark: "a benchmark",
  spit: "a spit",
  sample: "a sample",
  drawing: "a drawing",
  box: "a box",
  photo: "a record photo",
};

/** The fields of `record` that `role` may change (for forms that show the others read-only). */
export function changeableFields(record: RightsRecord, role: Role): string[] {
  const rights: Record<string, readonly Role[]> = fieldRights[record];
  return Object.entries(rights)
    .filter(([, roles]) => roles.includes(role))
    .map(([field]) => field);
}

/**
 * Refuses an update naming any field the caller's role may not change: 403, each such field named in
 * the message and under its own name in the field errors. Called before anything is read or written.
 */
export function assertFieldRights(record: RightsRecord, role: Role, input: object): void {
  const rights: Record<string, readonly Role[] | undefined> = fieldRights[record];
  const refused = Object.entries(input)
    .filter(([field, value]) => value !== undefined && !rights[field]?.includes(role))
    .map(([field]) => field);
  if (!refused.length) return;
  const fieldErrors = Object.fromEntries(refused.map((f) => [f, [`A ${role} may not change this field.`]]));
  const allowed = changeableFields(record, role);
  const may = allowed.length ? ` (a ${role} may change ${allowed.join(", ")})` : "";
  throw new PublicError(
    403,
    `A ${role} may not change ${refused.join(", ")} of ${recordWords[record]}${may}; nothing was changed.`,
    fieldErrors,
  );
}
