import { api } from "@/lib/server/api-catalog";
import { createBox, listBoxes } from "@/lib/server/boxes";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.boxesList, (ctx) => listBoxes(ctx.db, siteActor(ctx).site.id, ctx.input));
export const POST = guardedRoute(api.boxesCreate, (ctx) => createBox(ctx.db, siteActor(ctx), ctx.input));
