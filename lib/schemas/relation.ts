import { z } from "zod";
import "./messages";
import { uuid } from "./common";

/** The stored kinds: one row per pair, read "from <kind> to" (1005 cuts 1004). */
export const relationKinds = ["above", "cuts", "fills", "same_as"] as const;
export type RelationKind = (typeof relationKinds)[number];

/**
 * How a relation reads from one context's sheet. Each stored kind has two readings, one per side
 * (above/below, cuts/cut by, fills/filled by); "same as" reads the same from both.
 */
export const relationReadings = ["above", "below", "cuts", "cut_by", "fills", "filled_by", "same_as"] as const;
export type RelationReading = (typeof relationReadings)[number];

export const readingLabels: Record<RelationReading, string> = {
  above: "above",
  below: "below",
  cuts: "cuts",
  cut_by: "cut by",
  fills: "fills",
  filled_by: "filled by",
  same_as: "same as",
};

const forward: Record<RelationReading, { kind: RelationKind; reversed: boolean }> = {
  above: { kind: "above", reversed: false },
  below: { kind: "above", reversed: true },
  cuts: { kind: "cuts", reversed: false },
  cut_by: { kind: "cuts", reversed: true },
  fills: { kind: "fills", reversed: false },
  filled_by: { kind: "fills", reversed: true },
  same_as: { kind: "same_as", reversed: false },
};

const backward: Record<RelationKind, RelationReading> = {
  above: "below",
  cuts: "cut_by",
  fills: "filled_by",
  same_as: "same_as",
};

/** "1004 below 1002" as typed on 1004's sheet → the stored row "1002 above 1004". */
export function toStored(contextId: string, reading: RelationReading, otherId: string) {
  const f = forward[reading];
  return f.reversed
    ? { fromId: otherId, toId: contextId, kind: f.kind }
    : { fromId: contextId, toId: otherId, kind: f.kind };
}

/** The stored row as read from `viewpointId`'s sheet. */
export function readingFrom(
  row: { fromId: string; toId: string; kind: RelationKind },
  viewpointId: string,
): { reading: RelationReading; otherId: string } {
  if (row.fromId === viewpointId) return { reading: row.kind, otherId: row.toId };
  return { reading: backward[row.kind], otherId: row.fromId };
}

/** Adding a relation from one context's sheet: "this context <reading> that one". */
export const relationCreateSchema = z
  .object({
    contextId: uuid,
    reading: z.enum(relationReadings, { error: "Pick how the two contexts relate." }),
    otherId: uuid,
  })
  .refine((v) => v.contextId !== v.otherId, { message: "A context cannot relate to itself.", path: ["otherId"] });

export const relationListQuery = z.object({ contextId: uuid.optional() });

export type RelationCreate = z.infer<typeof relationCreateSchema>;
