import { benchmarkCreateSchema, benchmarkUpdateSchema, datumUpdateSchema, levelRunCreateSchema, spitCreateSchema, spitUpdateSchema } from "@/lib/schemas/levels";
import { directorOnly, recorders, type ApiOperation } from "../operation";

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
} as const satisfies Record<string, ApiOperation>;
