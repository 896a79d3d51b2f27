import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { releaseNumberBlock } from "@/lib/server/number-blocks";

export const POST = guardedRoute(api.numberBlockRelease, (ctx) =>
  releaseNumberBlock(ctx.db, siteActor(ctx), ctx.params.blockId, ctx.input.reason),
);
