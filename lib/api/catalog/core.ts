import { z } from "zod";
import { artefactClassCreateSchema, artefactClassUpdateSchema } from "@/lib/schemas/artefact-class";
import { contextCreateSchema, contextUpdateSchema } from "@/lib/schemas/context";
import { findCreateSchema, findListQuery, findUpdateSchema } from "@/lib/schemas/find";
import { memberRoleSchema, siteCreateSchema, siteUpdateSchema } from "@/lib/schemas/site";
import { trenchCreateSchema, trenchUpdateSchema } from "@/lib/schemas/trench";
import { GEOMETRY_BODY_LIMIT, classers, directorOnly, everyone, recorders, type ApiOperation } from "../operation";
import { classRow, contextRow, createdSite, deletedFind, findPage, findSaved, memberRow, trenchRow } from "../responses";

/**
 * Sites, members, classes, trenches, contexts and finds. The whole table is assembled in lib/api/catalog.ts.
 */
export const coreApi = {
  sitesList: { method: "GET", path: "/api/sites", summary: "Sites you belong to, with your role", from: "none" },
  sitesCreate: { method: "POST", path: "/api/sites", summary: "Create a site (you become its director)", input: siteCreateSchema, response: createdSite, successStatus: 201 },
  siteRead: { method: "GET", path: "/api/sites/{siteId}", summary: "Site overview", roles: "member", from: "none" },
  siteUpdate: { method: "PATCH", path: "/api/sites/{siteId}", summary: "Change the site's name and grid", roles: directorOnly, doing: "change the site's settings", input: siteUpdateSchema },
  membersList: { method: "GET", path: "/api/sites/{siteId}/members", summary: "Members and their roles", roles: "member", from: "none", response: z.array(memberRow) },
  memberUpdate: { method: "PATCH", path: "/api/sites/{siteId}/members/{userId}", summary: "Change a member's role", roles: directorOnly, doing: "manage members", input: memberRoleSchema },
  memberRemove: { method: "DELETE", path: "/api/sites/{siteId}/members/{userId}", summary: "Remove a member", roles: directorOnly, doing: "manage members", from: "none" },
  classesList: { method: "GET", path: "/api/sites/{siteId}/classes", summary: "Artefact classes", roles: "member", from: "none", response: z.array(classRow) },
  classesCreate: { method: "POST", path: "/api/sites/{siteId}/classes", summary: "Add an artefact class", roles: classers, doing: "maintain artefact classes", input: artefactClassCreateSchema, response: classRow, successStatus: 201 },
  classUpdate: { method: "PATCH", path: "/api/sites/{siteId}/classes/{classId}", summary: "Change an artefact class", roles: classers, doing: "maintain artefact classes", input: artefactClassUpdateSchema, response: classRow },
  trenchesList: { method: "GET", path: "/api/sites/{siteId}/trenches", summary: "Trenches with outlines", roles: "member", from: "none" },
  trenchesCreate: { method: "POST", path: "/api/sites/{siteId}/trenches", summary: "Open a trench with its outline", roles: recorders, doing: "lay out trenches", input: trenchCreateSchema, successStatus: 201, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  trenchRead: { method: "GET", path: "/api/sites/{siteId}/trenches/{trenchId}", summary: "One trench", roles: "member", from: "none" },
  trenchUpdate: { method: "PATCH", path: "/api/sites/{siteId}/trenches/{trenchId}", summary: "Change a trench or its outline", roles: recorders, doing: "edit trenches", input: trenchUpdateSchema, response: trenchRow, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  trenchDelete: { method: "DELETE", path: "/api/sites/{siteId}/trenches/{trenchId}", summary: "Delete an empty trench", roles: directorOnly, doing: "delete trenches", from: "none" },
  contextsList: { method: "GET", path: "/api/sites/{siteId}/contexts", summary: "Context sheets (optionally of one trench)", roles: "member", input: z.object({ trenchId: z.string().uuid().optional() }), from: "query" },
  contextsCreate: { method: "POST", path: "/api/sites/{siteId}/contexts", summary: "Open a context sheet", roles: recorders, doing: "record contexts", input: contextCreateSchema, response: contextRow, successStatus: 201, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  contextRead: { method: "GET", path: "/api/sites/{siteId}/contexts/{contextId}", summary: "One context sheet", roles: "member", from: "none" },
  contextUpdate: { method: "PATCH", path: "/api/sites/{siteId}/contexts/{contextId}", summary: "Change a context sheet", roles: recorders, doing: "record contexts", input: contextUpdateSchema, response: contextRow, maxBodyBytes: GEOMETRY_BODY_LIMIT },
  contextDelete: { method: "DELETE", path: "/api/sites/{siteId}/contexts/{contextId}", summary: "Delete a context with no finds", roles: recorders, doing: "record contexts", from: "none" },
  findsList: { method: "GET", path: "/api/sites/{siteId}/finds", summary: "Finds register: filter, sort, page", roles: "member", input: findListQuery, from: "query", response: findPage },
  findsCreate: { method: "POST", path: "/api/sites/{siteId}/finds", summary: "Record a find (its number is allocated by the server)", roles: recorders, doing: "record finds", input: findCreateSchema, response: findSaved, successStatus: 201 },
  findRead: { method: "GET", path: "/api/sites/{siteId}/finds/{findId}", summary: "One find", roles: "member", from: "none" },
  findUpdate: { method: "PATCH", path: "/api/sites/{siteId}/finds/{findId}", summary: "Change a find (specialists may re-class)", roles: everyone, doing: "change finds", input: findUpdateSchema, response: findSaved },
  findDelete: { method: "DELETE", path: "/api/sites/{siteId}/finds/{findId}", summary: "Delete a find (its number is never reused)", roles: recorders, doing: "delete finds", from: "none", response: deletedFind },
} as const satisfies Record<string, ApiOperation>;

