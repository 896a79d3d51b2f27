import { api } from "@/lib/server/api-catalog";
import { matrixImage } from "@/lib/server/export/matrix-image";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.matrixImage, (ctx) => matrixImage(ctx.db, siteActor(ctx).site, ctx.input));
