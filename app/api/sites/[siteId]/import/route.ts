import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { commitImport } from "@/lib/server/import/commit";

export const POST = guardedRoute(api.importCommit, (ctx) => commitImport(ctx.db, siteActor(ctx), ctx.input));
