import { api } from "@/lib/server/api-catalog";
import { createDrawing, listDrawings } from "@/lib/server/drawings";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.drawingsList, (ctx) => listDrawings(ctx.db, siteActor(ctx).site.id, ctx.input));
export const POST = guardedRoute(api.drawingsCreate, (ctx) => createDrawing(ctx.db, siteActor(ctx), ctx.input));
