import { z } from "zod";
import type { PhotoView } from "@/lib/geometry/photo-fit-input";
import { roleSchema } from "@/lib/schemas/common";
import { importMappingSchema } from "@/lib/schemas/import";
import { findProcessingStates } from "@/lib/schemas/processing";
import { relationKinds, relationReadings } from "@/lib/schemas/relation";
import { wireDate } from "./operation";

/**
 * What the JSON API answers, for the operations whose answer a screen reads. The route handler's return
 * type must fit each schema's input (checked by the compiler in guardedRoute), the browser reads its
 * output (timestamps as ISO strings); fields a screen does not read may travel unlisted.
 */
const id = z.string();
const metresOrNull = z.number().nullable();
export const contextStates = z.enum(["open", "awaiting", "signed_off"]);

/** A find as stored (what recording or changing one answers). */
export const findRecord = z.object({
  id,
  number: z.number(),
  /** The total station's point ID of an imported find; null for finds placed or typed. */
  stationPoint: z.string().nullable().optional(),
  trenchId: id,
  contextId: id,
  classId: id,
  x: z.number(),
  y: z.number(),
  z: metresOrNull,
  count: z.number().nullable(),
  weightG: z.number().nullable(),
  description: z.string(),
  method: z.string(),
  recordedAt: wireDate,
  recordedBy: id.nullable(),
  /** Raised by every change; an edit sends the version it was made on as If-Match. */
  version: z.number().int(),
  /** After the trench (lib/schemas/processing.ts); absent from answers made on a device. */
  processing: z.enum(findProcessingStates).optional(),
  sentTo: z.string().optional(),
  boxId: id.nullable().optional(),
  location: z.string().optional(),
});

/** A find as saved, with a warning (not a refusal) when its level lies outside its context's recorded top and base. */
export const findSaved = findRecord.extend({ levelWarning: z.string().nullable() });

/** One row of the finds register: the find with its trench, context and class, the recorder's name. */
export const registerRow = findRecord.extend({
  recordedBy: z.string().nullable(),
  trenchCode: z.string(),
  contextNumber: z.number(),
  contextState: contextStates,
  classCode: z.string(),
  classLabel: z.string(),
  classColour: z.string(),
  classSymbol: z.string(),
  boxNumber: z.number().nullable().optional(),
});

export const findPage = z.object({
  page: z.number(),
  pageSize: z.number(),
  total: z.number(),
  rows: z.array(registerRow),
});

export const deletedFind = z.object({ deleted: id, number: z.number() });

export const classRow = z.object({
  id,
  code: z.string(),
  label: z.string(),
  material: z.string(),
  colour: z.string(),
  symbol: z.string(),
  humanRemains: z.boolean(),
});

const polygon = z.object({
  type: z.literal("Polygon"),
  coordinates: z.array(z.array(z.tuple([z.number(), z.number()]))),
});

export const contextRow = z.object({
  id,
  trenchId: id,
  number: z.number(),
  type: z.string(),
  state: contextStates,
  signedOffAt: wireDate.nullable(),
  extent: polygon.nullable(),
  version: z.number().int(),
});

export const trenchRow = z.object({
  id,
  code: z.string(),
  name: z.string(),
  outline: polygon.nullable(),
  version: z.number().int(),
});

export const createdSite = z.object({ id, code: z.string() });

/** A relation read from one context's side. */
export const relationReading = z.object({
  relationId: id,
  reading: z.enum(relationReadings),
  label: z.string(),
  otherId: id,
  otherNumber: z.number(),
  redundant: z.boolean(),
});
export const relationRow = z.object({ id, fromId: id, toId: id, kind: z.enum(relationKinds) });
/** With a context: its relations read from its side; without: every stored relation of the site. */
export const relationsAnswer = z.union([z.array(relationReading), z.array(relationRow)]);

export const memberRow = z.object({ userId: id, name: z.string(), email: z.string(), role: roleSchema });

const invitation = z.object({
  id,
  email: z.string(),
  role: roleSchema,
  expiresAt: wireDate,
  acceptedAt: wireDate.nullable(),
  createdAt: wireDate,
});
export const invitationRow = invitation.extend({
  status: z.enum(["pending", "accepted", "expired"]),
  invitedByName: z.string().nullable(),
});

const delivery = z.object({ sent: z.number(), failed: z.number(), error: z.string().optional() });
export const sentInvitation = z.object({ invitation, mail: delivery });

/** What a step of the sign-off flow answers: the context, and the mail it sent. */
export const signOffOutcome = z.object({
  context: z.object({ id, state: contextStates }),
  trenchSignedOff: z.boolean().optional(),
  mail: delivery,
});

/** Typed, not checked field by field: the photo view is built by one function on the server (toPhotoView). */
export const photoView = z.custom<PhotoView>();

export type FindRecord = z.output<typeof findRecord>;
export type RegisterRow = z.output<typeof registerRow>;
export type ClassRow = z.output<typeof classRow>;
export type ContextRow = z.output<typeof contextRow>;
export type RelationReadingRow = z.output<typeof relationReading>;

const rowError = z.object({ row: z.number(), reasons: z.array(z.string()) });

/** A checked total-station file: the mapping it settled on, a sample, and every row that cannot be imported. */
export const importPreview = z.object({
  headers: z.array(z.string()),
  mapping: importMappingSchema.partial(),
  mappingSource: z.enum(["given", "remembered", "guessed"]),
  rowCount: z.number(),
  sample: z.array(z.array(z.string())),
  mappingProblems: z.record(z.string(), z.array(z.string())),
  errors: z.array(rowError),
  /** Rows that pass but whose level lies outside their context's recorded top and base: warned of, counted. */
  warnings: z.array(rowError),
  validCount: z.number(),
});

export const importDone = z.object({
  imported: z.number(),
  firstNumber: z.number(),
  lastNumber: z.number(),
  importId: id,
  warnings: z.number(),
});
