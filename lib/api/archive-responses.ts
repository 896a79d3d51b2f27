import { z } from "zod";
import { drawingKinds } from "@/lib/schemas/drawing";
import { photoSubjects } from "@/lib/schemas/record-photo";
import { sampleStatuses, sampleTypes } from "@/lib/schemas/sample";
import { findProcessingStates } from "@/lib/schemas/processing";
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
  /** The box it is in and where it is kept (after the trench). */
  boxId: id.nullable().optional(),
  location: z.string().optional(),
  updatedAt: wireDate,
});

/** One row of the samples register: the sample with its trench, context and spit, the taker's name. */
export const sampleRow = sampleRecord
  .omit({ takenBy: true, updatedAt: true, spit: true, boxId: true, location: true })
  .extend({
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
  action: z.enum(["move", "reclass", "delete", "process"]),
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

/** A box of the finds store as stored. */
export const boxRecord = z.object({
  id,
  number: z.number(),
  store: z.string(),
  note: z.string(),
  updatedAt: wireDate,
});
export const deletedBox = z.object({ deleted: id, number: z.number() });
/** A box emptied into another: the two boxes' numbers and the finds and samples moved, by number. */
export const boxEmptied = z.object({
  from: z.number(),
  into: z.number(),
  findNumbers: z.array(z.number()),
  sampleNumbers: z.array(z.number()),
});
export const boxPage = z.object({
  page: z.number(),
  pageSize: z.number(),
  total: z.number(),
  rows: z.array(
    z.object({ id, number: z.number(), store: z.string(), note: z.string(), finds: z.number(), samples: z.number() }),
  ),
});
/** A box with what is in it: its finds and samples, in number order. */
export const boxWithContents = boxRecord.extend({
  finds: z.array(
    z.object({
      id,
      number: z.number(),
      classCode: z.string(),
      classLabel: z.string(),
      contextNumber: z.number(),
      trenchCode: z.string(),
      processing: z.enum(findProcessingStates),
    }),
  ),
  samples: z.array(
    z.object({
      id,
      number: z.number(),
      type: z.enum(sampleTypes),
      typeLabel: z.string(),
      contextNumber: z.number(),
      trenchCode: z.string(),
      status: z.enum(sampleStatuses),
    }),
  ),
});
export const samplesStored = z.object({
  changed: z.number(),
  numbers: z.array(z.number()),
  boxNumber: z.number().nullable(),
});
/** The ids of every find the register's filters select (for "select all that match"). */
export const findIdsAnswer = z.object({ total: z.number(), ids: z.array(id), truncated: z.boolean() });
export type BoxWithContents = z.output<typeof boxWithContents>;
/** One entry of the photo register: what it is of, its sheet, and its files (member-only URLs). */
export const recordPhotoRow = z.object({
  id,
  number: z.number(),
  subject: z.enum(photoSubjects),
  contextId: id.nullable(),
  contextNumber: z.number().nullable(),
  findId: id.nullable(),
  findNumber: z.number().nullable(),
  trenchId: id,
  trenchCode: z.string(),
  /** The state of what it is of: the context's (or the find's context's), or the trench's sign-off. */
  state: z.enum(["open", "awaiting", "signed_off"]),
  /** Locked with what it is of: a context (or a find's context) not open, or a signed-off trench. */
  locked: z.boolean(),
  facing: z.number().nullable(),
  scale: z.string(),
  caption: z.string(),
  takenById: id.nullable(),
  takenBy: z.string().nullable(),
  takenAt: wireDate.nullable(),
  /** `camera`: the EXIF date the camera wrote; `upload`: none was in the file, so the upload's moment. */
  takenAtSource: z.enum(["camera", "upload"]),
  fileName: z.string(),
  width: z.number().nullable(),
  height: z.number().nullable(),
  thumbUrl: z.string(),
  displayUrl: z.string(),
  originalUrl: z.string(),
  createdAt: wireDate,
  updatedAt: wireDate,
});
export const recordPhotoPage = z.object({
  page: z.number(),
  pageSize: z.number(),
  total: z.number(),
  rows: z.array(recordPhotoRow),
});
export const deletedRecordPhoto = z.object({ deleted: id, number: z.number() });
export type RecordPhotoRow = z.output<typeof recordPhotoRow>;
