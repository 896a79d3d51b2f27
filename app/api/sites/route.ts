import { api } from "@/lib/server/api-catalog";
import { guardedRoute } from "@/lib/server/http";
import { createSite, listMySites } from "@/lib/server/sites";

export const GET = guardedRoute(api.sitesList, ({ db, userId }) => listMySites(db, userId));
export const POST = guardedRoute(api.sitesCreate, ({ db, userId, input }) => createSite(db, userId, input));
