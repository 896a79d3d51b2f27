import { api } from "@/lib/server/api-catalog";
import { depositionPackage } from "@/lib/server/export/deposition";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.exportPackage, (ctx) => depositionPackage(ctx.db, siteActor(ctx), ctx.input));
