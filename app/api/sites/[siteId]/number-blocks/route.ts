import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { deviceOf, listNumberBlocks, reserveNumberBlock } from "@/lib/server/number-blocks";

export const GET = guardedRoute(api.numberBlocksList, (ctx) =>
  listNumberBlocks(ctx.db, siteActor(ctx), ctx.input.kind),
);
export const POST = guardedRoute(api.numberBlocksCreate, (ctx) =>
  reserveNumberBlock(ctx.db, siteActor(ctx), ctx.input, deviceOf(ctx.req, ctx.input)),
);
