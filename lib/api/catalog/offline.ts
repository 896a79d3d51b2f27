import { z } from "zod";
import {
  discardSchema,
  numberAccountingQuery,
  numberBlockCreateSchema,
  numberBlockListQuery,
  numberBlockReleaseSchema,
} from "@/lib/schemas/number-blocks";
import { everyone, recorders, wireDate, type ApiOperation } from "../operation";

/** A block of numbers as its holder sees it (lib/server/number-blocks.ts). */
export const numberBlockView = z.object({
  id: z.string(),
  kind: z.enum(["find", "context"]),
  first: z.number().int(),
  last: z.number().int(),
  size: z.number().int(),
  left: z.number().int(),
  free: z.array(z.number().int()),
  userId: z.string(),
  deviceId: z.string(),
  deviceLabel: z.string(),
  createdAt: wireDate,
  releasedAt: wireDate.nullable(),
});

const numberRange = z.object({
  first: z.number().int(),
  last: z.number().int(),
  status: z.enum(["find", "sample", "context", "reserved", "void", "unassigned"]),
  blockId: z.string().optional(),
  deviceId: z.string().optional(),
  deviceLabel: z.string().optional(),
  holder: z.string().nullable().optional(),
  reason: z.string().optional(),
  by: z.string().nullable().optional(),
});

export const numberAccountingView = z.object({
  kind: z.enum(["find", "context"]),
  highest: z.number().int(),
  totals: z.record(z.string(), z.number().int()),
  ranges: z.array(numberRange),
  overlaps: z.array(z.number().int()),
});

/**
 * Offline recording (issue 14; the contract is written in lib/api/offline.ts): number blocks held by a
 * device, the accounting of every number, and the audited discard of a refused operation.
 */
export const offlineApi = {
  numberBlocksList: {
    method: "GET",
    path: "/api/sites/{siteId}/number-blocks",
    summary: "Your blocks of reserved numbers not given back, with the numbers left",
    roles: recorders,
    doing: "hold blocks of numbers",
    input: numberBlockListQuery,
    from: "query",
    response: z.array(numberBlockView),
  },
  numberBlocksCreate: {
    method: "POST",
    path: "/api/sites/{siteId}/number-blocks",
    summary: "Reserve a block of find or context numbers for recording offline on one device",
    roles: recorders,
    doing: "hold blocks of numbers",
    input: numberBlockCreateSchema,
    response: numberBlockView,
    successStatus: 201,
  },
  numberBlockRelease: {
    method: "POST",
    path: "/api/sites/{siteId}/number-blocks/{blockId}/release",
    summary: "Give a block back: its unused numbers become void, with the reason",
    roles: recorders,
    doing: "give back blocks of numbers",
    input: numberBlockReleaseSchema,
    response: z.object({ block: numberBlockView, voided: z.number().int() }),
  },
  numberAccounting: {
    method: "GET",
    path: "/api/sites/{siteId}/number-accounting",
    summary:
      "Every number from 1 to the highest: record, sample, reserved (block, device, holder) or void (reason, who)",
    roles: "member",
    input: numberAccountingQuery,
    from: "query",
    response: numberAccountingView,
  },
  discardsCreate: {
    method: "POST",
    path: "/api/sites/{siteId}/discards",
    summary: "Record that a refused operation was thrown away on the device (kept on the audit trail)",
    roles: everyone,
    doing: "discard refused operations",
    input: discardSchema,
    response: z.object({ discarded: z.string() }),
    successStatus: 201,
  },
} as const satisfies Record<string, ApiOperation>;
