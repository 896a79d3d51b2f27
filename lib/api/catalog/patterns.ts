import { runCreateSchema, runListQuerySchema, scopeQuerySchema } from "@/lib/schemas/run";
import { z } from "zod";
import type { RunView, ScopeSummary } from "../patterns-responses";
import { analysts, type ApiOperation } from "../operation";

/** Typed, not checked field by field: each view is built by one function on the server. */
const runView = z.custom<RunView>();
const runListItem = z.custom<Omit<RunView, "result">>();
const scopeSummary = z.custom<ScopeSummary>();

/** API operations of distribution-test runs (the Patterns workspace, and scripts). */
export const patternsApi = {
  runScope: {
    method: "GET",
    path: "/api/sites/{siteId}/runs/scope",
    summary: "Finds per class in a scope, stratigraphic warnings and default parameters",
    roles: "member",
    input: scopeQuerySchema,
    from: "query",
    response: scopeSummary,
  },
  runsList: {
    method: "GET",
    path: "/api/sites/{siteId}/runs",
    summary: "Saved distribution-test runs, newest first, with out-of-date marks",
    roles: "member",
    input: runListQuerySchema,
    from: "query",
    response: z.array(runListItem),
  },
  runsCreate: {
    method: "POST",
    path: "/api/sites/{siteId}/runs",
    summary: "Start a distribution-test run (it executes as a job; poll it or follow its events)",
    roles: analysts,
    doing: "run distribution tests",
    input: runCreateSchema,
    response: runView,
    successStatus: 201,
    idempotency: "claim",
  },
  runRead: {
    method: "GET",
    path: "/api/sites/{siteId}/runs/{runId}",
    summary: "One run: status, progress, result, out-of-date mark",
    roles: "member",
    from: "none",
    response: runView,
  },
  runEvents: {
    method: "GET",
    path: "/api/sites/{siteId}/runs/{runId}/events",
    summary: "One run as server-sent events: the run, its progress as it happens, the run again when it ends",
    roles: "member",
    from: "none",
  },
  runCancel: {
    method: "POST",
    path: "/api/sites/{siteId}/runs/{runId}/cancel",
    summary: "Cancel a queued or running run",
    roles: analysts,
    doing: "cancel distribution-test runs",
    from: "none",
    response: runView,
  },
} as const satisfies Record<string, ApiOperation>;
