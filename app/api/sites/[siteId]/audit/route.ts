import { api } from "@/lib/server/api-catalog";
import { listAudit } from "@/lib/server/audit-read";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.auditList, (ctx) => listAudit(ctx.db, siteActor(ctx).site.id, ctx.input));
