import { api } from "@/lib/server/api-catalog";
import { emptyBox } from "@/lib/server/box-empty";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const POST = guardedRoute(api.boxEmpty, (ctx) => emptyBox(ctx.db, siteActor(ctx), ctx.params.boxId, ctx.input));
