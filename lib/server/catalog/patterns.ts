import { runCreateSchema, runListQuerySchema, scopeQuerySchema } from "@/lib/server/analysis/run-schema";
import { analysts, type ApiOperation } from "./types";

/** API operations of distribution-test runs (the Patterns workspace, and scripts). */
export const patternsApi = {
  runScope: { method: "GET", path: "/api/sites/{siteId}/runs/scope", summary: "Finds per class in a scope, stratigraphic warnings and default parameters", roles: "member", input: scopeQuerySchema, from: "query" },
  runsList: { method: "GET", path: "/api/sites/{siteId}/runs", summary: "Saved distribution-test runs, newest first, with out-of-date marks", roles: "member", input: runListQuerySchema, from: "query" },
  runsCreate: { method: "POST", path: "/api/sites/{siteId}/runs", summary: "Start a distribution-test run (it executes as a job; poll it or follow its events)", roles: analysts, doing: "run distribution tests", input: runCreateSchema, successStatus: 201 },
  runRead: { method: "GET", path: "/api/sites/{siteId}/runs/{runId}", summary: "One run: status, progress, result, out-of-date mark", roles: "member", from: "none" },
  runEvents: { method: "GET", path: "/api/sites/{siteId}/runs/{runId}/events", summary: "One run as server-sent events: the run, its progress as it happens, the run again when it ends", roles: "member", from: "none" },
  runCancel: { method: "POST", path: "/api/sites/{siteId}/runs/{runId}/cancel", summary: "Cancel a queued or running run", roles: analysts, doing: "cancel distribution-test runs", from: "none" },
} satisfies Record<string, ApiOperation>;
