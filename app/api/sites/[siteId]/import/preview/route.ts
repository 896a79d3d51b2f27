import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { previewImport } from "@/lib/server/import/commit";

export const POST = guardedRoute(api.importPreview, (ctx) => previewImport(ctx.db, siteActor(ctx), ctx.input));
