import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { listSignOffQueue } from "@/lib/server/sign-off";

export const GET = guardedRoute(api.signOffQueue, (ctx) => listSignOffQueue(ctx.db, siteActor(ctx).site.id));
