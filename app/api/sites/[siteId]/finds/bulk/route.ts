import { api } from "@/lib/server/api-catalog";
import { bulkEditFinds } from "@/lib/server/finds-bulk";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const POST = guardedRoute(api.findsBulk, (ctx) => bulkEditFinds(ctx.db, siteActor(ctx), ctx.input));
