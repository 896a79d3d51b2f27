/**
 * The row types that pages and components show, taken from the schema (Drizzle's $inferSelect) and passed on
 * here so that components import them from lib/server as types, never from db/.
 */
export type { Context, PolygonJson, Role } from "@/db/schema";
