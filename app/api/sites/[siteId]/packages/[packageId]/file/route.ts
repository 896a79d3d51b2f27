import { api } from "@/lib/server/api-catalog";
import { packageFile } from "@/lib/server/export/package-jobs";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.packageFile, (ctx) =>
  packageFile(ctx.db, siteActor(ctx), ctx.params.packageId, ctx.req),
);
