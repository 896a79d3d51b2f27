import { z } from "zod";
import { emptyQuery } from "@/lib/schemas/common";
import { artefactClassCreateSchema, artefactClassUpdateSchema } from "@/lib/schemas/artefact-class";
import { contextCreateSchema, contextUpdateSchema } from "@/lib/schemas/context";
import { findCreateSchema, findListQuery, findUpdateSchema } from "@/lib/schemas/find";
import { memberRoleSchema, siteCreateSchema, siteUpdateSchema } from "@/lib/schemas/site";
import { trenchCreateSchema, trenchUpdateSchema } from "@/lib/schemas/trench";
import { levelsApi } from "./catalog/levels";
import { patternsApi } from "./catalog/patterns";
import { planApi } from "./catalog/plan";
import { publicApi } from "./catalog/public";
import { recordingApi } from "./catalog/recording";
import { signOffApi } from "./catalog/sign-off";
import { GEOMETRY_BODY_LIMIT, classers, directorOnly, everyone, recorders, type ApiOperation } from "./catalog/types";

export type { ApiOperation } from "./catalog/types";

/**
 * Every JSON API operation in one table: its path, who may call it, and the zod schema of its input.
 * The route handlers, the OpenAPI document and the role × write test all read this table, so a new
 * route cannot skip any of them. Each feature keeps its operations in lib/server/catalog/<feature>.ts.
 */
const coreApi = {
  sitesList: { method: "GET", path: "/api/sites", summary: "Sites you belong to, with your role", from: "none" },
  sitesCreate: { method: "POST", path: "/api/sites", summary: "Create a site (you become its director)", input: siteCreateSchema, successStatus: 201 },
  siteRead: { method: "GET", path: "/api/sites/{siteId}", summary: "Site overview", roles: "member", from: "none" },
  siteUpdate: { method: "PATCH", path: "/api/sites/{siteId}", summary: "Change the site's name and grid", roles: directorOnly, doing: "change the site's settings", input: siteUpdateSchema },
  membersList: { method: "GET", path: "/api/sites/{siteId}/members", summary: "Members and their roles", roles: "member", from: "none" },
  memberUpdate: { method: "PATCH", path: "/api/sites/{siteId}/members/{userId}", summary: "Change a member's role", roles: directorOnly, doing: "manage members", input: memberRoleSchema },
  memberRemove: { method: "DELETE", path: "/api/sites/{siteId}/members/{userId}", summary: "Remove a member", roles: directorOnly, doing: "manage members", from: "none" },
  classesList: { method: "GET", path: "/api/sites/{siteId}/classes", summary: "Artefact classes", roles: "member", from: "none" },
  classesCreate: { method: "POST", path: "/api/sites/{siteId}/classes", summary: "Add an artefact class", roles: classers, doing: "maintain artefact classes", input: artefactClassCreateSchema, successStatus: 201 },
  classUpdate: { method: "PATCH", path: "/api/sites/{siteId}/classes/{classId}", summary: "Change an artefact class", roles: classers, doing: "maintain artefact classes", input: artefactClassUpdateSchema },
  trenchesList: { method: "GET", path: "/api/sites/{siteId}/trenches", summary: "Trenches with outlines", roles: "member", from: "none" },
  trenchesCreate: { method: "POST", path: "/api/sites/{siteId}/trenches", summary: "Open a trench with its outline", roles: recorders, doing: "lay out trenches", input: trenchCreateSchema, successStatus: 201, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  trenchRead: { method: "GET", path: "/api/sites/{siteId}/trenches/{trenchId}", summary: "One trench", roles: "member", from: "none" },
  trenchUpdate: { method: "PATCH", path: "/api/sites/{siteId}/trenches/{trenchId}", summary: "Change a trench or its outline", roles: recorders, doing: "edit trenches", input: trenchUpdateSchema, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  trenchDelete: { method: "DELETE", path: "/api/sites/{siteId}/trenches/{trenchId}", summary: "Delete an empty trench", roles: directorOnly, doing: "delete trenches", from: "none" },
  contextsList: { method: "GET", path: "/api/sites/{siteId}/contexts", summary: "Context sheets (optionally of one trench)", roles: "member", input: z.object({ trenchId: z.string().uuid().optional() }), from: "query" },
  contextsCreate: { method: "POST", path: "/api/sites/{siteId}/contexts", summary: "Open a context sheet", roles: recorders, doing: "record contexts", input: contextCreateSchema, successStatus: 201, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  contextRead: { method: "GET", path: "/api/sites/{siteId}/contexts/{contextId}", summary: "One context sheet", roles: "member", from: "none" },
  contextUpdate: { method: "PATCH", path: "/api/sites/{siteId}/contexts/{contextId}", summary: "Change a context sheet", roles: recorders, doing: "record contexts", input: contextUpdateSchema, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  contextDelete: { method: "DELETE", path: "/api/sites/{siteId}/contexts/{contextId}", summary: "Delete a context with no finds", roles: recorders, doing: "record contexts", from: "none" },
  findsList: { method: "GET", path: "/api/sites/{siteId}/finds", summary: "Finds register: filter, sort, page", roles: "member", input: findListQuery, from: "query" },
  findsCreate: { method: "POST", path: "/api/sites/{siteId}/finds", summary: "Record a find (its number is allocated by the server)", roles: recorders, doing: "record finds", input: findCreateSchema, successStatus: 201 },
  findRead: { method: "GET", path: "/api/sites/{siteId}/finds/{findId}", summary: "One find", roles: "member", from: "none" },
  findUpdate: { method: "PATCH", path: "/api/sites/{siteId}/finds/{findId}", summary: "Change a find (specialists may re-class)", roles: everyone, doing: "change finds", input: findUpdateSchema },
  findDelete: { method: "DELETE", path: "/api/sites/{siteId}/finds/{findId}", summary: "Delete a find (its number is never reused)", roles: recorders, doing: "delete finds", from: "none" },
} satisfies Record<string, ApiOperation>;

export const api = { ...coreApi, ...planApi, ...recordingApi, ...signOffApi, ...patternsApi, ...levelsApi, ...publicApi };

export type ApiName = keyof typeof api;
export const noInput = emptyQuery;
