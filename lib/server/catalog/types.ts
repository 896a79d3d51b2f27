import type { ZodType } from "zod";
import type { Role } from "@/db/schema";

/** One JSON API operation: its path, who may call it, and the zod schema of its input. */
export type ApiOperation = {
  method: "GET" | "POST" | "PATCH" | "DELETE";
  path: string;
  summary: string;
  /** Site roles allowed; "member" = any member; undefined = any signed-in user (not site-scoped). */
  roles?: readonly Role[] | "member";
  doing?: string;
  input?: ZodType;
  from?: "body" | "query" | "none";
  successStatus?: number;
  /** The largest request body read, in bytes; omitted = the JSON default (lib/server/http.ts). */
  maxBodyBytes?: number;
  /** Used before sign-in (password reset, invitation): no session, no role; a single-use token instead. */
  public?: true;
};

/** Role sets used across the catalogue. */
export const recorders = ["digger", "director"] as const;
export const classers = ["specialist", "director"] as const;
export const directorOnly = ["director"] as const;
export const everyone = ["digger", "specialist", "director"] as const;
export const analysts = ["specialist", "director"] as const;

/** Entries that carry an outline or extent: up to 2,000 vertices a ring, a few holes, written in full precision. */
export const GEOMETRY_BODY_LIMIT = 1024 * 1024;
