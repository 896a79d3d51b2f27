import { z, type ZodType } from "zod";
import type { roleSchema } from "@/lib/schemas/common";

type Role = z.infer<typeof roleSchema>;

/**
 * One JSON API operation: its path, who may call it, the zod schema of its input and, where the client
 * reads the answer, of its response. Pure data: the server's handlers and the browser's fetch layer both
 * read it.
 */
export type ApiOperation = {
  method: "GET" | "POST" | "PATCH" | "DELETE";
  path: string;
  summary: string;
  /** Site roles allowed; "member" = any member; undefined = any signed-in user (not site-scoped). */
  roles?: readonly Role[] | "member";
  doing?: string;
  input?: ZodType;
  from?: "body" | "query" | "none";
  /** The answer as it travels (JSON): the handler must return its input type, the client reads its output. */
  response?: ZodType;
  successStatus?: number;
  /** The largest request body read, in bytes; omitted = the JSON default (lib/server/http.ts). */
  maxBodyBytes?: number;
  /**
   * How a write sent with an Idempotency-Key keeps its answer: "atomic" (default) stores it in the write's
   * own transaction; "claim" first claims the key on its own, for writes that start work outside the
   * database after their commit (lib/server/idempotency.ts).
   */
  idempotency?: "atomic" | "claim";
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

/** A timestamp in a response: the server hands a Date or a string, JSON carries an ISO string. */
export const wireDate = z.union([z.string(), z.date()]).transform((d) => (d instanceof Date ? d.toISOString() : d));
