import { api } from "@/lib/server/api-catalog";
import { createBenchmark, listBenchmarks } from "@/lib/server/benchmarks";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.benchmarksList, (ctx) => listBenchmarks(ctx.db, siteActor(ctx).site.id));
export const POST = guardedRoute(api.benchmarksCreate, (ctx) => createBenchmark(ctx.db, siteActor(ctx), ctx.input));
