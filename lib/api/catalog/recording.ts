import { MAX_IMPORT_BODY_BYTES, importCommitSchema, importPreviewSchema } from "@/lib/schemas/import";
import { relationCreateSchema, relationListQuery } from "@/lib/schemas/relation";
import {
  exportContextsQuery,
  exportFindsQuery,
  exportGisQuery,
  exportTrenchesQuery,
  matrixImageQuery,
  matrixQuery,
} from "@/lib/schemas/export";
import { recorders, type ApiOperation } from "../operation";
import { importDone, importPreview, relationsAnswer } from "../responses";

/** API operations of context relations, the matrix, the finds register, imports and exports. */
export const recordingApi = {
  relationsList: {
    method: "GET",
    path: "/api/sites/{siteId}/relations",
    summary: "Stratigraphic relations (optionally of one context, read from its side)",
    roles: "member",
    input: relationListQuery,
    from: "query",
    response: relationsAnswer,
  },
  relationsCreate: {
    method: "POST",
    path: "/api/sites/{siteId}/relations",
    summary: "Relate two contexts (refused if it would make a loop)",
    roles: recorders,
    doing: "record relations",
    input: relationCreateSchema,
    successStatus: 201,
  },
  relationDelete: {
    method: "DELETE",
    path: "/api/sites/{siteId}/relations/{relationId}",
    summary: "Remove a relation",
    roles: recorders,
    doing: "record relations",
    from: "none",
  },
  matrixRead: {
    method: "GET",
    path: "/api/sites/{siteId}/matrix",
    summary: "Harris matrix: nodes, edges, redundant relations",
    roles: "member",
    input: matrixQuery,
    from: "query",
  },
  matrixImage: {
    method: "GET",
    path: "/api/sites/{siteId}/matrix/image",
    summary: "Harris matrix as SVG or PNG",
    roles: "member",
    input: matrixImageQuery,
    from: "query",
  },
  importMappingRead: {
    method: "GET",
    path: "/api/sites/{siteId}/import/mapping",
    summary: "The site's remembered total-station column mapping",
    roles: "member",
    from: "none",
  },
  importPreview: {
    method: "POST",
    path: "/api/sites/{siteId}/import/preview",
    summary: "Check a total-station CSV row by row (imports nothing; remembers a given mapping)",
    roles: recorders,
    doing: "import finds",
    input: importPreviewSchema,
    response: importPreview,
    maxBodyBytes: MAX_IMPORT_BODY_BYTES,
  },
  importCommit: {
    method: "POST",
    path: "/api/sites/{siteId}/import",
    summary: "Import every row of a total-station CSV, or none",
    roles: recorders,
    doing: "import finds",
    input: importCommitSchema,
    response: importDone,
    successStatus: 201,
    maxBodyBytes: MAX_IMPORT_BODY_BYTES,
  },
  exportFinds: {
    method: "GET",
    path: "/api/sites/{siteId}/export/finds",
    summary: "Finds as CSV or GeoJSON, with the register's filters",
    roles: "member",
    input: exportFindsQuery,
    from: "query",
  },
  exportContexts: {
    method: "GET",
    path: "/api/sites/{siteId}/export/contexts",
    summary: "Context sheets as CSV, or their extents as GeoJSON",
    roles: "member",
    input: exportContextsQuery,
    from: "query",
  },
  exportTrenches: {
    method: "GET",
    path: "/api/sites/{siteId}/export/trenches",
    summary: "Trench outlines as GeoJSON",
    roles: "member",
    input: exportTrenchesQuery,
    from: "query",
  },
  exportGis: {
    method: "GET",
    path: "/api/sites/{siteId}/export/gis",
    summary:
      "GIS layers as an OGC GeoPackage: in the site grid (a local engineering CRS), and in the site's projected CRS and WGS 84 when it is placed",
    roles: "member",
    input: exportGisQuery,
    from: "query",
  },
} as const satisfies Record<string, ApiOperation>;
