import { api } from "@/lib/server/api-catalog";
import { createClass, listClasses } from "@/lib/server/artefact-classes";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.classesList, (ctx) => listClasses(ctx.db, siteActor(ctx).site.id));
export const POST = guardedRoute(api.classesCreate, (ctx) => createClass(ctx.db, siteActor(ctx), ctx.input));
