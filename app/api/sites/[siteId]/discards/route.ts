import { api } from "@/lib/server/api-catalog";
import { DEVICE_ID_HEADER } from "@/lib/api/offline";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { recordDiscard } from "@/lib/server/discards";

export const POST = guardedRoute(api.discardsCreate, (ctx) =>
  recordDiscard(ctx.db, siteActor(ctx), ctx.input, ctx.req.headers.get(DEVICE_ID_HEADER)),
);
