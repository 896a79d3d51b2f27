import { benchmarkCreateSchema, benchmarkUpdateSchema, datumUpdateSchema, levelRunCreateSchema, spitCreateSchema, spitUpdateSchema } from "@/lib/schemas/levels";
import { z } from "zod";
import { sectionCreateSchema, sectionExportQuery } from "@/lib/schemas/section";
import { directorOnly, everyone, recorders, wireDate, type ApiOperation } from "../operation";

/** A saved section of finds as the API answers it. */
export const sectionAnswer = z.object({
  id: z.string(), trenchId: z.string(), name: z.string(), startX: z.number(), startY: z.number(), endX: z.number(), endY: z.number(),
  halfWidth: z.number(), exaggeration: z.number(), createdBy: z.string().nullable(), createdAt: wireDate,
});

/** API operations of levels: the site datum, benchmarks, levelling runs and spits. Every height is a reduced level. */
export const levelsApi = {
  datumUpdate: { method: "PATCH", path: "/api/sites/{siteId}/datum", summary: "Set the site's height datum and the levelling tolerance (every z is a reduced level against it)", roles: directorOnly, doing: "set the site datum", input: datumUpdateSchema },
  benchmarksList: { method: "GET", path: "/api/sites/{siteId}/benchmarks", summary: "Temporary benchmarks with their reduced levels", roles: "member", from: "none" },
  benchmarksCreate: { method: "POST", path: "/api/sites/{siteId}/benchmarks", summary: "Add a temporary benchmark", roles: recorders, doing: "record benchmarks", input: benchmarkCreateSchema, successStatus: 201 },
  benchmarkUpdate: { method: "PATCH", path: "/api/sites/{siteId}/benchmarks/{benchmarkId}", summary: "Change a benchmark (its level is fixed once a run used it)", roles: recorders, doing: "record benchmarks", input: benchmarkUpdateSchema },
  benchmarkDelete: { method: "DELETE", path: "/api/sites/{siteId}/benchmarks/{benchmarkId}", summary: "Delete a benchmark no run used", roles: directorOnly, doing: "delete benchmarks", from: "none" },
  levelRunsList: { method: "GET", path: "/api/sites/{siteId}/level-runs", summary: "Levelling runs, newest first, with their closing errors", roles: "member", from: "none" },
  levelRunsCreate: { method: "POST", path: "/api/sites/{siteId}/level-runs", summary: "Book a levelling run; its reduced levels go to the finds, contexts and spits read", roles: recorders, doing: "record levels", input: levelRunCreateSchema, successStatus: 201 },
  levelRunRead: { method: "GET", path: "/api/sites/{siteId}/level-runs/{runId}", summary: "One levelling run with every reduced level", roles: "member", from: "none" },
  spitsList: { method: "GET", path: "/api/sites/{siteId}/contexts/{contextId}/spits", summary: "A context's spits, from the top", roles: "member", from: "none" },
  spitsCreate: { method: "POST", path: "/api/sites/{siteId}/contexts/{contextId}/spits", summary: "Add a spit to a context", roles: recorders, doing: "record spits", input: spitCreateSchema, successStatus: 201 },
  spitUpdate: { method: "PATCH", path: "/api/sites/{siteId}/contexts/{contextId}/spits/{spitId}", summary: "Change a spit's number or levels", roles: recorders, doing: "record spits", input: spitUpdateSchema },
  spitDelete: { method: "DELETE", path: "/api/sites/{siteId}/contexts/{contextId}/spits/{spitId}", summary: "Delete a spit that holds no finds", roles: recorders, doing: "record spits", from: "none" },
  sectionsList: { method: "GET", path: "/api/sites/{siteId}/trenches/{trenchId}/sections", summary: "A trench's saved sections of finds", roles: "member", from: "none", response: z.array(sectionAnswer) },
  sectionsCreate: { method: "POST", path: "/api/sites/{siteId}/trenches/{trenchId}/sections", summary: "Save a section line with its band and vertical exaggeration", roles: everyone, doing: "save sections", input: sectionCreateSchema, response: sectionAnswer, successStatus: 201 },
  sectionDelete: { method: "DELETE", path: "/api/sites/{siteId}/trenches/{trenchId}/sections/{sectionId}", summary: "Delete a saved section (the audit keeps it)", roles: everyone, doing: "delete sections", from: "none" },
  sectionExport: { method: "GET", path: "/api/sites/{siteId}/trenches/{trenchId}/sections/{sectionId}/export", summary: "A section of finds as SVG (marks carry find numbers), PNG or CSV; every height a reduced level", roles: "member", input: sectionExportQuery, from: "query" },
} as const satisfies Record<string, ApiOperation>;
