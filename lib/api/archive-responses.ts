import { z } from "zod";
import { drawingKinds } from "@/lib/schemas/drawing";
import { sampleStatuses, sampleTypes } from "@/lib/schemas/sample";
import { wireDate } from "./operation";

/** What the archive registers' operations answer (samples; labels and bulk edits add theirs here). */
const id = z.string();
const metresOrNull = z.number().nullable();

/** A sample as stored. */
export const sampleRecord = z.object({
  id,
  number: z.number(),
  trenchId: id,
  contextId: id,
  spitId: id.nullable(),
  /** The spit's number within the context. */
  spit: z.number().nullable(),
  type: z.enum(sampleTypes),
  status: z.enum(sampleStatuses),
  x: metresOrNull,
  y: metresOrNull,
  z: metresOrNull,
  volumeL: z.number().nullable(),
  purpose: z.string(),
  takenBy: id.nullable(),
  takenOn: z.string(),
  updatedAt: wireDate,
});

/** One row of the samples register: the sample with its trench, context and spit, the taker's name. */
export const sampleRow = sampleRecord.omit({ takenBy: true, updatedAt: true, spit: true }).extend({
  takenById: id.nullable(),
  takenBy: z.string().nullable(),
  trenchCode: z.string(),
  contextNumber: z.number(),
  contextState: z.enum(["open", "awaiting", "signed_off"]),
  spitNumber: z.number().nullable(),
});

export const samplePage = z.object({
  page: z.number(),
  pageSize: z.number(),
  total: z.number(),
  rows: z.array(sampleRow),
});
export const deletedSample = z.object({ deleted: id, number: z.number() });
export const sampleStatusDone = z.object({ changed: z.number(), status: z.enum(sampleStatuses) });

export type SampleRecord = z.output<typeof sampleRecord>;
export type SampleRow = z.output<typeof sampleRow>;

/** What a bulk edit of finds did: how many changed, and their numbers. */
export const bulkDone = z.object({
  action: z.enum(["move", "reclass", "delete"]),
  changed: z.number(),
  numbers: z.array(z.number()),
});

/** A drawing as stored, with the contexts it shows. */
export const drawingRecord = z.object({
  id,
  number: z.number(),
  trenchId: id,
  kind: z.enum(drawingKinds),
  scale: z.number(),
  title: z.string(),
  drawnBy: id.nullable(),
  drawnOn: z.string(),
  contextIds: z.array(id),
  contextNumbers: z.array(z.number()),
  updatedAt: wireDate,
});

/** One row of the drawing register; `state` is open until every context it shows is signed off. */
export const drawingRow = z.object({
  id,
  number: z.number(),
  kind: z.enum(drawingKinds),
  scale: z.number(),
  title: z.string(),
  drawnOn: z.string(),
  drawnById: id.nullable(),
  drawnBy: z.string().nullable(),
  trenchId: id,
  trenchCode: z.string(),
  contextNumbers: z.array(z.number()),
  state: z.enum(["open", "awaiting", "signed_off"]),
});

export const drawingPage = z.object({
  page: z.number(),
  pageSize: z.number(),
  total: z.number(),
  rows: z.array(drawingRow),
});
export const deletedDrawing = z.object({ deleted: id, number: z.number() });
export type DrawingRow = z.output<typeof drawingRow>;
