import {
  exportSamplesQuery,
  sampleCreateSchema,
  sampleDeleteSchema,
  sampleListQuery,
  sampleStatusSchema,
  sampleUpdateSchema,
} from "@/lib/schemas/sample";
import { findsBulkSchema } from "@/lib/schemas/finds-bulk";
import { depositionQuery } from "@/lib/schemas/export";
import { directorOnly, everyone, recorders, type ApiOperation } from "../operation";
import { bulkDone, deletedSample, samplePage, sampleRecord, sampleStatusDone } from "../archive-responses";

/** API operations of the site archive's registers: samples (labels, bulk edits and the rest join here). */
export const archiveApi = {
  samplesList: {
    method: "GET",
    path: "/api/sites/{siteId}/samples",
    summary: "Samples register: filter by trench, context, type, status; page",
    roles: "member",
    input: sampleListQuery,
    from: "query",
    response: samplePage,
  },
  samplesCreate: {
    method: "POST",
    path: "/api/sites/{siteId}/samples",
    summary: "Record a sample (its number is allocated by the server)",
    roles: recorders,
    doing: "record samples",
    input: sampleCreateSchema,
    response: sampleRecord,
    successStatus: 201,
  },
  sampleRead: {
    method: "GET",
    path: "/api/sites/{siteId}/samples/{sampleId}",
    summary: "One sample",
    roles: "member",
    from: "none",
    response: sampleRecord,
  },
  sampleUpdate: {
    method: "PATCH",
    path: "/api/sites/{siteId}/samples/{sampleId}",
    summary: "Change a sample's sheet (locked with its context)",
    roles: recorders,
    doing: "change samples",
    input: sampleUpdateSchema,
    response: sampleRecord,
  },
  sampleDelete: {
    method: "DELETE",
    path: "/api/sites/{siteId}/samples/{sampleId}",
    summary: "Delete a sample with a reason (its number is never reused)",
    roles: recorders,
    doing: "delete samples",
    input: sampleDeleteSchema,
    from: "body",
    response: deletedSample,
  },
  samplesStatus: {
    method: "POST",
    path: "/api/sites/{siteId}/samples/status",
    summary: "Set the processing status of one or many samples, all or nothing",
    roles: everyone,
    doing: "record sample processing",
    input: sampleStatusSchema,
    response: sampleStatusDone,
  },
  exportSamples: {
    method: "GET",
    path: "/api/sites/{siteId}/export/samples",
    summary: "Samples register as CSV, with the register's filters",
    roles: "member",
    input: exportSamplesQuery,
    from: "query",
  },
  exportPackage: {
    method: "GET",
    path: "/api/sites/{siteId}/export/package",
    summary: "Deposition package: the site's (or a signed-off trench's) archive as a BagIt bag in one zip, streamed",
    roles: directorOnly,
    doing: "export the deposition package",
    input: depositionQuery,
    from: "query",
  },
  findsBulk: {
    method: "POST",
    path: "/api/sites/{siteId}/finds/bulk",
    summary: "Move, re-class or delete many finds at once, all or nothing (specialists re-class only)",
    roles: everyone,
    doing: "change finds",
    input: findsBulkSchema,
    response: bulkDone,
  },
} as const satisfies Record<string, ApiOperation>;
